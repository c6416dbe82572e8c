import { describe, expect, it } from 'vitest';
import type { DocNode, DocumentJson } from '@shared/editor/document.ts';
import { diffCells } from '@shared/diff/cell-input-diff.ts';

const MODEL = '0b7e5c2a-1d3f-4e6a-8b9c-0d1e2f3a4b5c';
const BRANCH = '1c8f6d3b-2e4a-4f7b-9c0d-1e2f3a4b5c6d';
const doc = (...cells: { id: string; kind: string; input: Record<string, unknown> }[]): DocumentJson => ({
  type: 'doc',
  content: cells.map((attrs): DocNode => ({ type: 'cell', attrs })),
});
const model = (mu: number, rhs = 'mu - x^2', extra: Record<string, unknown> = {}) => ({
  id: MODEL,
  kind: 'model',
  input: { name: 'Saddle-node', variables: [{ name: 'x', rhs }], parameters: [{ name: 'mu', value: mu }], definitions: [], ...extra },
});
const branch = (max: number, id = BRANCH) => ({
  id,
  kind: 'branch',
  input: { modelCellId: MODEL, task: { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max }, step: { initial: 0.01, min: 1e-6, max: 0.1 } } },
});

describe('diffCells', () => {
  it('lists parameter and equation changes of a model cell field by field', () => {
    const [pair] = diffCells(doc(model(0.3)), doc(model(0.35, 'mu + 0.01 - x^2')));
    expect(pair.status).toBe('changed');
    expect(pair.title).toBe('Model “Saddle-node”');
    expect(pair.changes.map((c) => c.sentence)).toEqual([
      'Equation for x′ changed: x′ = mu - x^2 → x′ = mu + 0.01 - x^2',
      'Parameter μ 0.3 → 0.35',
    ]);
    expect(pair.changes[1]).toMatchObject({ field: 'parameters.mu.value', before: 0.3, after: 0.35 });
  });

  it('reports added and removed parameters and variables', () => {
    const after = model(0.3, 'mu - x^2 + k*y', { variables: [{ name: 'x', rhs: 'mu - x^2 + k*y' }, { name: 'y', rhs: 'x - y' }], parameters: [{ name: 'k', value: 2 }] });
    const sentences = diffCells(doc(model(0.3)), doc(after))[0].changes.map((c) => c.sentence);
    expect(sentences).toContain('New variable y: y′ = x - y');
    expect(sentences).toContain('New parameter k = 2');
    expect(sentences).toContain('Parameter μ removed');
  });

  it('names changed task settings of an analysis cell in words', () => {
    const pairs = diffCells(doc(model(0.3), branch(1)), doc(model(0.3), branch(2)));
    expect(pairs.map((p) => p.status)).toEqual(['same', 'changed']);
    expect(pairs[1].changes.map((c) => c.sentence)).toEqual(['Upper end of the parameter range changed: 1 → 2']);
  });

  it('matches a re-created cell by kind and name, and reports cells added or removed', () => {
    const OTHER = '2d9a7e4c-3f5b-4a8c-9d0e-1f2a3b4c5d6e';
    const renamedId = { ...model(0.3), id: OTHER };
    const pairs = diffCells(doc(model(0.3), branch(1)), doc(renamedId));
    expect(pairs.map((p) => [p.status, p.kind])).toEqual([['same', 'model'], ['removed', 'branch']]);
    expect(pairs[0].olderCellId).toBe(MODEL);
    const added = diffCells(doc(model(0.3)), doc(model(0.3), branch(1)));
    expect(added.map((p) => p.status)).toEqual(['same', 'added']);
  });
});
