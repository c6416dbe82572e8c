import { describe, expect, it } from 'vitest';
import { actionWords, summaryWords } from '@/features/audit/components/audit-log.tsx';
import { auditSearch, auditCsvHref } from '@/features/audit/api/get-audit.ts';

describe('audit trail wording', () => {
  it.each([
    ['review.changes_requested', 'review: changes requested'],
    ['auth.signed_in', 'auth: signed in'],
    ['entry', 'entry'],
  ])('reads %s as "%s"', (action, words) => {
    expect(actionWords(action)).toBe(words);
  });

  it('shows a recorded change as before → after, then the other fields', () => {
    expect(summaryWords({ before: { status: 'in-review' }, after: { status: 'approved' }, meaning: 'approved' })).toBe('status: in-review → approved · meaning: approved');
    expect(summaryWords({ before: null, after: { lastSeenRevisionId: 'r2' } })).toBe('lastSeenRevisionId: — → r2');
    expect(summaryWords({ number: 4, mentions: [] })).toBe('number: 4 · mentions: []');
  });
});

describe('audit requests', () => {
  it('leaves empty filters out of the query string', () => {
    expect(auditSearch({ entryId: 'e1', action: '', from: undefined, page: 2 })).toBe('?entryId=e1&page=2');
    expect(auditSearch({})).toBe('');
  });

  it('asks for CSV with the same filters and no paging', () => {
    expect(auditCsvHref({ notebookId: 'n1', action: 'review', page: 3, pageSize: 50 })).toBe('/api/audit?notebookId=n1&action=review&format=csv');
  });
});
