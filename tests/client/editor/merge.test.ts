import { describe, expect, it } from 'vitest';
import { documentToPlainText, type DocumentJson } from '@shared/editor/document.ts';
import { mergeDocuments, mergeValue } from '@shared/editor/merge.ts';

const p = (text: string) => ({ type: 'paragraph', content: [{ type: 'text', text }] });
const doc = (...lines: string[]): DocumentJson => ({ type: 'doc', content: lines.map(p) });
const text = (d: DocumentJson) => documentToPlainText(d).split('\n');

// Expected results follow the usual three-way merge rules (common practice: a change on one
// side only is taken; identical changes once; overlapping different changes are a conflict).
describe('mergeDocuments', () => {
  const base = doc('a', 'b', 'c', 'd');

  it('takes changes each side made to different blocks', () => {
    const mine = doc('a', 'B mine', 'c', 'd');
    const theirs = doc('a', 'b', 'c', 'd', 'e theirs');
    const r = mergeDocuments(base, mine, theirs);
    expect(r.conflicts).toBe(0);
    expect(text(r.doc)).toEqual(['a', 'B mine', 'c', 'd', 'e theirs']);
  });

  it('takes an identical change once', () => {
    const both = doc('a', 'X', 'c', 'd');
    const r = mergeDocuments(base, both, both);
    expect(r.conflicts).toBe(0);
    expect(text(r.doc)).toEqual(['a', 'X', 'c', 'd']);
  });

  it('keeps both versions of a block both sides changed, theirs first, and counts the conflict', () => {
    const r = mergeDocuments(base, doc('a', 'b', 'mine', 'd'), doc('a', 'b', 'theirs', 'd'));
    expect(r.conflicts).toBe(1);
    expect(text(r.doc)).toEqual(['a', 'b', 'theirs', 'mine', 'd']);
  });

  it('applies a deletion on one side and an insertion elsewhere on the other', () => {
    const r = mergeDocuments(base, doc('b', 'c', 'd'), doc('a', 'b', 'c', 'inserted', 'd'));
    expect(r.conflicts).toBe(0);
    expect(text(r.doc)).toEqual(['b', 'c', 'inserted', 'd']);
  });

  it('treats two insertions at the same place as a conflict and keeps both', () => {
    const r = mergeDocuments(doc('a'), doc('a', 'm'), doc('a', 't'));
    expect(r.conflicts).toBe(1);
    expect(text(r.doc)).toEqual(['a', 't', 'm']);
  });

  it('returns theirs when I changed nothing', () => {
    const theirs = doc('q', 'r');
    expect(mergeDocuments(base, base, theirs).doc).toEqual(theirs);
  });
});

describe('mergeValue', () => {
  it('takes the changed side, mine when both changed', () => {
    expect(mergeValue('t', 't', 'x')).toBe('x');
    expect(mergeValue('t', 'y', 't')).toBe('y');
    expect(mergeValue(['a'], ['b'], ['c'])).toEqual(['b']);
  });
});
