import { describe, expect, it } from 'vitest';
import type { AuditEvent } from '@shared/api/audit.ts';
import { actionWords } from '@/features/audit/components/audit-log.tsx';
import { auditDetails } from '@/features/audit/components/audit-details.tsx';
import { auditSearch, auditCsvHref } from '@/features/audit/api/get-audit.ts';

describe('audit trail wording', () => {
  it.each([
    ['review.changes_requested', 'review: changes requested'],
    ['auth.signed_in', 'auth: signed in'],
    ['entry', 'entry'],
  ])('reads %s as "%s"', (action, words) => {
    expect(actionWords(action)).toBe(words);
  });

});

const NB = '11111111-1111-4111-8111-111111111111';
const ENTRY = '22222222-2222-4222-8222-222222222222';
const REV = '33333333-3333-4333-8333-333333333333';
const REVIEW = '44444444-4444-4444-8444-444444444444';
const GONE = '55555555-5555-4555-8555-555555555555';
const HASH = 'ab'.repeat(32);

const event = (over: Partial<AuditEvent>): AuditEvent => ({
  sequence: '7',
  occurredAt: '2026-12-04T08:00:00Z',
  actor: null,
  action: 'review.approved',
  entityType: 'review',
  entityId: REVIEW,
  notebookId: NB,
  summary: {},
  hash: HASH,
  prevHash: HASH,
  references: {
    [NB]: { kind: 'notebook', label: 'Stirred tank', notebookId: NB },
    [ENTRY]: { kind: 'entry', label: 'Ignition', notebookId: NB, entryId: ENTRY },
    [REV]: { kind: 'revision', label: 'revision 4', notebookId: NB, entryId: ENTRY },
    [REVIEW]: { kind: 'review', label: 'review of “Ignition”', notebookId: NB, entryId: ENTRY },
  },
  ...over,
});

describe('audit details', () => {
  it('names the subject and notebook in words, linked, with the ids as tooltips', () => {
    const d = auditDetails(event({ summary: { entryId: ENTRY, revisionId: REV, contentHash: HASH, before: { status: 'in-review' }, after: { status: 'approved' } } }));
    expect(d.subject).toEqual({ text: 'review of “Ignition”', href: `/notebooks/${NB}/entries/${ENTRY}/review`, title: REVIEW });
    expect(d.notebook).toEqual({ text: 'Stirred tank', href: `/notebooks/${NB}`, title: NB });
    expect(d.lines).toEqual([
      { label: 'status', values: [{ text: 'in-review' }, { text: 'approved' }] },
      { label: 'revision', values: [{ text: 'revision 4', href: `/notebooks/${NB}/entries/${ENTRY}`, title: REV }] },
      { label: 'content hash', values: [{ text: 'abababababab'.slice(0, 10) + '…', title: HASH }] },
    ]);
  });

  it('reads a recorded revision as its entry and number, and an id that names nothing as a short id', () => {
    const d = auditDetails(event({ action: 'revision.recorded', entityType: 'revision', entityId: REV, summary: { entryId: ENTRY, number: 4, parentId: GONE } }));
    expect(d.subject?.text).toBe('Ignition, revision 4');
    expect(d.lines).toEqual([{ label: 'follows', values: [{ text: '55555555…', title: GONE }] }]);
  });

  it('reads numbers, sizes, times and empty lists in words', () => {
    const d = auditDetails(event({ entityId: null, notebookId: null, summary: { elapsedMs: 1534, byteSize: 2048, mentions: [], blockIndex: 0 } }));
    expect(d.subject).toBeUndefined();
    expect(d.lines.map((l) => `${l.label}: ${l.values.map((v) => v.text).join(' → ')}`)).toEqual(['time: 1.5 s', 'size: 2.0 kB', 'block: 1']);
  });

  it('reads a membership change as the person it was about', () => {
    const PERSON = '66666666-6666-4666-8666-666666666666';
    const d = auditDetails(
      event({
        action: 'membership.added',
        entityType: 'membership',
        entityId: GONE,
        summary: { userId: PERSON, role: 'reader' },
        references: { [NB]: { kind: 'notebook', label: 'Stirred tank', notebookId: NB }, [PERSON]: { kind: 'person', label: 'Jun Okafor' } },
      }),
    );
    expect(d.subject).toEqual({ text: 'Jun Okafor', title: `membership ${GONE}` });
    expect(d.notebook?.text).toBe('Stirred tank');
    expect(d.lines).toEqual([{ label: 'role', values: [{ text: 'reader' }] }]);
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
