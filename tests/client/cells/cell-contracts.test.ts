import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, hashPayload, inputHash } from '@shared/cells/hash.ts';
import { checkCellInput } from '@shared/cells/inputs.ts';
import { cellFreshness, cellsUsingModel, resolveCellRequest } from '@shared/cells/resolve.ts';
import {
  documentSchema,
  documentToPlainText,
  extractCells,
  type DocumentJson,
} from '@shared/editor/document.ts';
import { defaultCellInput } from '@/features/cells/components/default-cell-input.ts';

const MODEL = '7f1e2c1a-1b2c-4d3e-8f90-123456789abc';
const BRANCH = '0d9c8b7a-6f5e-4d3c-9b2a-abcdefabcdef';

function entry(value = 0.1, bounds = { min: 0, max: 1 }): DocumentJson {
  return {
    type: 'doc',
    content: [
      {
        type: 'paragraph',
        content: [
          { type: 'text', text: 'Rate ' },
          { type: 'inlineMath', attrs: { latex: 'k e^{x}' } },
        ],
      },
      {
        type: 'cell',
        attrs: {
          id: MODEL,
          kind: 'model',
          input: {
            name: 'Saddle-node',
            variables: [{ name: 'x', rhs: 'mu - x^2' }],
            parameters: [{ name: 'mu', value }],
            definitions: [],
          },
        },
      },
      {
        type: 'cell',
        attrs: {
          id: BRANCH,
          kind: 'branch',
          input: { modelCellId: MODEL, task: { kind: 'continuation', parameter: 'mu', bounds } },
        },
      },
    ],
  };
}

describe('canonicalJson', () => {
  it('sorts keys at every depth and keeps array order (RFC 8785-style canonical form, common practice)', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, 1], c: 'x' } })).toBe('{"a":{"c":"x","d":[3,1]},"b":1}');
    expect(canonicalJson({ a: undefined, b: null })).toBe('{"b":null}');
  });
  it('refuses numbers JSON cannot spell', () => {
    expect(() => canonicalJson({ x: Number.NaN })).toThrow(/no JSON form/);
  });
  it('writes them as null when asked, as JSON.stringify does', () => {
    expect(canonicalJson({ x: Number.NaN, y: [Number.POSITIVE_INFINITY] }, { nonFinite: 'null' })).toBe('{"x":null,"y":[null]}');
    expect(canonicalJson({ when: new Date('2026-01-02T03:04:05.000Z') })).toBe('{"when":"2026-01-02T03:04:05.000Z"}');
  });
  it('hashes like node:crypto sha256 of the same text (the server side)', async () => {
    const request = { model: { variables: [] }, task: { kind: 'equilibria' } };
    const expected = createHash('sha256').update(hashPayload('1.0.0', request)).digest('hex');
    expect(await inputHash('1.0.0', request)).toBe(expected);
  });
});

describe('documentSchema', () => {
  it('accepts a document with text, maths and cells, and extracts the cells in order', () => {
    const doc = entry();
    expect(documentSchema.safeParse(doc).success).toBe(true);
    expect(extractCells(doc).map((c) => c.kind)).toEqual(['model', 'branch']);
    expect(documentToPlainText(doc).split('\n')[0]).toBe('Rate $k e^{x}$');
  });
  it.each([
    [{ type: 'doc', content: [{ type: 'script' }] }, 'content.0.type', 'Unknown node type'],
    [
      { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'heading' }] }] },
      'content.0.content.0.type',
      'cannot sit inside',
    ],
    [
      { type: 'doc', content: [{ type: 'cell', attrs: { id: 'x', kind: 'model', input: {} } }] },
      'content.0.attrs.id',
      'UUID',
    ],
    [
      {
        type: 'doc',
        content: [
          {
            type: 'paragraph',
            content: [
              { type: 'text', text: 'a', marks: [{ type: 'link', attrs: { href: 'javascript:alert(1)' } }] },
            ],
          },
        ],
      },
      'content.0.content.0.marks.0.attrs.href',
      'not allowed',
    ],
  ])('rejects %j at %s', (doc, path, message) => {
    const r = documentSchema.safeParse(doc);
    expect(r.success).toBe(false);
    const issue = r.error!.issues.find((i) => i.path.join('.') === path);
    expect(issue?.message).toContain(message);
  });
  it('accepts a cell whose input is invalid (the entry can still be saved)', () => {
    const doc = entry();
    (doc.content![1].attrs!.input as { variables: { rhs: string }[] }).variables[0].rhs = '';
    expect(documentSchema.safeParse(doc).success).toBe(true);
  });
});

describe('resolveCellRequest', () => {
  it('builds { model, task } from the model cell, with the contract defaults filled in', () => {
    const r = resolveCellRequest(entry(), BRANCH);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.request.model).toEqual({
      variables: [{ name: 'x', rhs: 'mu - x^2' }],
      parameters: [{ name: 'mu', value: 0.1 }],
      definitions: [],
    });
    expect(r.request.task).toMatchObject({
      kind: 'continuation',
      parameter: 'mu',
      direction: 'both',
      maxPoints: 500,
    });
  });
  it('names the field of each problem, in the model cell and in the task', () => {
    const doc = entry(0.1, { min: 2, max: 1 });
    (doc.content![1].attrs!.input as { variables: { rhs: string }[] }).variables[0].rhs = '';
    const r = resolveCellRequest(doc, BRANCH);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems).toEqual([
      { path: 'model.variables[0].rhs', message: 'Enter the right-hand side' },
      { path: 'task.bounds', message: 'bounds.min must be below bounds.max' },
    ]);
  });
  it('says when the model cell is gone', () => {
    const doc = entry();
    doc.content!.splice(1, 1);
    const r = resolveCellRequest(doc, BRANCH);
    expect(!r.ok && r.problems[0]).toEqual({
      path: 'modelCellId',
      message: 'The chosen model cell is no longer in this entry',
    });
  });
});

describe('stale check', () => {
  it('is up to date for the hash it was computed from, stale after a parameter change', async () => {
    const r = resolveCellRequest(entry(0.1), BRANCH);
    if (!r.ok) throw new Error('resolves');
    const output = {
      inputHash: await inputHash('2.0.0', r.request),
      engineVersion: '2.0.0',
      computedAt: '2026-12-01T10:00:00Z',
      status: 'ok' as const,
      elapsedMs: 3,
    };
    expect(await cellFreshness(r, output)).toBe('up-to-date');
    expect(await cellFreshness(resolveCellRequest(entry(0.2), BRANCH), output)).toBe('stale');
    expect(await cellFreshness(r, undefined)).toBe('never-run');
    expect(cellsUsingModel(entry(), MODEL).map((c) => c.id)).toEqual([BRANCH]);
  });
  it('does not change when the author spells out a default', async () => {
    const plain = resolveCellRequest(entry(), BRANCH);
    const doc = entry();
    (doc.content![2].attrs!.input as { task: Record<string, unknown> }).task.direction = 'both';
    const spelled = resolveCellRequest(doc, BRANCH);
    if (!plain.ok || !spelled.ok) throw new Error('resolves');
    expect(await inputHash('1', spelled.request)).toBe(await inputHash('1', plain.request));
  });
});

describe('defaultCellInput', () => {
  it('gives a new branch cell the last model and a valid task around its first parameter', () => {
    const cells = extractCells(entry(0.1));
    const input = defaultCellInput('branch', cells);
    expect(input.modelCellId).toBe(MODEL);
    expect(checkCellInput('branch', input).ok).toBe(true);
    for (const kind of ['equilibria', 'trajectory'] as const)
      expect(checkCellInput(kind, defaultCellInput(kind, cells)).ok).toBe(true);
  });
});
