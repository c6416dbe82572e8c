import { describe, expect, it } from 'vitest';
import type { DocNode, DocumentJson } from '@shared/editor/document.ts';
import { collapseUnchanged, describeUnchanged, diffDocuments, documentBlocks } from '@shared/diff/text-diff.ts';

const p = (text: string): DocNode => ({ type: 'paragraph', content: text ? [{ type: 'text', text }] : [] });
const doc = (...content: DocNode[]): DocumentJson => ({ type: 'doc', content });
const cell = (id: string, name: string): DocNode => ({ type: 'cell', attrs: { id, kind: 'model', input: { name } } });
const CELL = '3f2b1c4d-5e6f-4a8b-9c0d-1e2f3a4b5c6d';

describe('documentBlocks', () => {
  it('flattens headings, lists, quotes, maths and cells into readable blocks', () => {
    const blocks = documentBlocks(
      doc(
        { type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'Ignition' }] },
        { type: 'orderedList', attrs: { start: 1 }, content: [{ type: 'listItem', content: [p('first')] }, { type: 'listItem', content: [p('second')] }] },
        { type: 'blockquote', content: [p('quoted')] },
        { type: 'displayMath', attrs: { latex: 'x^2' } },
        cell(CELL, 'Tank'),
        p(''),
      ),
    );
    expect(blocks.map((b) => [b.type, b.prefix, b.text])).toEqual([
      ['heading', '##', 'Ignition'],
      ['list-item', '1.', 'first'],
      ['list-item', '2.', 'second'],
      ['quote', '> ', 'quoted'],
      ['maths', '', 'x^2'],
      ['cell', '', 'Model cell “Tank”'],
    ]);
  });
});

describe('diffDocuments', () => {
  it('marks changed words inside a changed paragraph and keeps the rest whole', () => {
    const before = doc(p('The fold sits at mu = 0.25 for this tank.'), p('Unchanged text.'));
    const after = doc(p('The fold sits at mu = 0.2471 for this tank.'), p('Unchanged text.'), p('A new closing remark.'));
    const blocks = diffDocuments(before, after);
    expect(blocks.map((b) => b.status)).toEqual(['changed', 'same', 'added']);
    const parts = blocks[0].parts;
    expect(parts.filter((x) => x.kind === 'removed').map((x) => x.text.trim())).toEqual(['0.25']);
    expect(parts.filter((x) => x.kind === 'added').map((x) => x.text.trim())).toEqual(['0.2471']);
    // Reassembling the kept and added parts gives the new text; kept and removed, the old.
    expect(parts.filter((x) => x.kind !== 'removed').map((x) => x.text).join('')).toBe('The fold sits at mu = 0.2471 for this tank.');
    expect(parts.filter((x) => x.kind !== 'added').map((x) => x.text).join('')).toBe('The fold sits at mu = 0.25 for this tank.');
    expect(blocks[0].newIndex).toBe(0);
    expect(blocks[2].newIndex).toBe(2);
  });

  it('keeps an unrelated rewrite as a deletion and an insertion', () => {
    const blocks = diffDocuments(doc(p('Alpha beta gamma delta.')), doc(p('Something else entirely here.')));
    expect(blocks.map((b) => b.status)).toEqual(['added', 'removed']);
    expect(blocks[1].oldIndex).toBe(0);
    expect(blocks[1].newIndex).toBeUndefined();
  });

  it('aligns cells by id even when they are renamed', () => {
    const blocks = diffDocuments(doc(p('Intro'), cell(CELL, 'Tank')), doc(p('Intro'), cell(CELL, 'Stirred tank')));
    expect(blocks.map((b) => b.status)).toEqual(['same', 'changed']);
    expect(blocks[1].cellId).toBe(CELL);
  });
});

describe('collapseUnchanged', () => {
  it('folds a long unchanged run, keeping one block of context beside the change', () => {
    const before = doc(p('one'), p('two'), p('three'), p('four'), p('five'), p('six'), p('the end'));
    const after = doc(p('one'), p('two'), p('three'), p('four'), p('five'), p('six'), p('the real end'));
    const items = collapseUnchanged(diffDocuments(before, after));
    expect(items.map((i) => i.kind)).toEqual(['unchanged', 'block', 'block']);
    const folded = items[0];
    if (folded.kind !== 'unchanged') throw new Error('expected a folded run');
    expect(folded.blocks.map((b) => b.parts[0].text)).toEqual(['one', 'two', 'three', 'four', 'five']);
    expect(describeUnchanged(folded.blocks)).toBe('5 unchanged paragraphs');
  });

  it('leaves short runs visible', () => {
    const items = collapseUnchanged(diffDocuments(doc(p('a'), p('b')), doc(p('a'), p('c'))));
    expect(items.every((i) => i.kind === 'block')).toBe(true);
  });
});
