import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCellResponseSchema, type EntryDetail } from '@shared/api/entries.ts';
import type { DocumentJson } from '@shared/editor/document.ts';
import { searchResponseSchema, type SearchHit } from '@shared/api/search.ts';
import { snippetParts } from '@server/services/search/search-entries.ts';
import { closeLogServer, demoNotebookId, signIn, startLogServer, type Client } from './entries-support.ts';

const MODEL = 'a1b2c3d4-0000-4000-8000-000000000001';
const ANALYSIS = 'a1b2c3d4-0000-4000-8000-000000000002';
const TAG = `search-${Date.now().toString(36)}`;

/** One entry with a text, a model and an analysis cell, run and recorded. */
async function recordEntry(who: Client, notebook: string, props: { title: string; text: string; model: object; kind: 'branch' | 'fold-map'; task: object }) {
  const created = (await who.post(`/api/notebooks/${notebook}/entries`, { title: props.title, entryDate: '2026-11-25', tags: [TAG] })).body as EntryDetail;
  const document: DocumentJson = {
    type: 'doc',
    content: [
      { type: 'paragraph', content: [{ type: 'text', text: props.text }] },
      { type: 'cell', attrs: { id: MODEL, kind: 'model', input: { name: props.title, ...props.model } } },
      { type: 'cell', attrs: { id: ANALYSIS, kind: props.kind, input: { modelCellId: MODEL, task: props.task } } },
    ],
  };
  const run = runCellResponseSchema.parse((await who.post(`/api/notebooks/${notebook}/entries/${created.entry.id}/cells/${ANALYSIS}/run`, { model: props.model, task: props.task })).body);
  const { cached: _cached, ...output } = run;
  expect(output.status).toBe('ok');
  const saved = await who.post(`/api/notebooks/${notebook}/entries/${created.entry.id}/revisions`, {
    baseRevisionId: created.head.id, title: props.title, entryDate: '2026-11-25', tags: [TAG], document, outputs: { [ANALYSIS]: output },
  });
  expect(saved.status).toBe(201);
  return created.entry.id;
}

describe('search API', () => {
  let kofi: Client;
  let jun: Client;
  let notebook: string;
  const ids: Record<string, string> = {};

  beforeAll(async () => {
    await startLogServer();
    [kofi, jun] = await Promise.all([signIn('researcher'), signIn('reader')]);
    notebook = await demoNotebookId('geneSwitch');
    // ẋ = h + r x − x³: the fold curve 27h² = 4r³ has a cusp at (h, r) = (0, 0) (Strogatz, Nonlinear Dynamics and Chaos, §3.6).
    ids.cusp = await recordEntry(kofi, notebook, {
      title: 'Cusp of the switch',
      text: 'Two folds meet where the bistable wedge closes.',
      model: { variables: [{ name: 'x', rhs: 'h + r*x - x^3' }], parameters: [{ name: 'h', value: -2 / (3 * Math.sqrt(3)) }, { name: 'r', value: 1 }], definitions: [] },
      kind: 'fold-map',
      task: { kind: 'fold-curve', parameters: ['h', 'r'], start: { parameters: {}, state: { x: 0.6 } }, bounds: { h: [-1, 1], r: [-1, 2] } },
    });
    // ẋ = μ − 1/4 − x²: one fold at μ = 1/4 (closed form: equilibria x = ±√(μ − 1/4)).
    ids.shifted = await recordEntry(kofi, notebook, {
      title: 'Shifted saddle-node',
      text: 'Hysteresis appears once the loading passes a quarter.',
      model: { variables: [{ name: 'x', rhs: 'mu - 0.25 - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] },
      kind: 'branch',
      task: { kind: 'continuation', parameter: 'mu', start: { x: 0.8 }, bounds: { min: -1, max: 2 } },
    });
    // ẋ = μ − x²: the fold at μ = 0.
    ids.plain = await recordEntry(kofi, notebook, {
      title: 'Plain saddle-node',
      text: 'Hysteresis, hysteresis and more hysteresis: the switch remembers its past.',
      model: { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] },
      kind: 'branch',
      task: { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 2 } },
    });
  });
  afterAll(closeLogServer);

  const search = async (who: Client, query: Record<string, string>) => {
    const res = await who.get(`/api/search?${new URLSearchParams({ tag: TAG, ...query })}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return searchResponseSchema.parse(res.body).results;
  };
  const idsOf = (hits: SearchHit[]) => hits.map((h) => h.entryId);

  it('finds words in the text (stemmed), ranked, with the matched words marked in the snippet', async () => {
    const hits = await search(kofi, { q: 'hysteresis' });
    expect(idsOf(hits)).toEqual([ids.plain, ids.shifted]);
    expect(hits[0].rank).toBeGreaterThan(hits[1].rank);
    expect(hits[0].snippet.filter((p) => p.hit).map((p) => p.text.toLowerCase())).toContain('hysteresis');
    expect(idsOf(await search(kofi, { q: 'remembering' }))).toEqual([ids.plain]);
  });

  it('takes phrases and excluded words', async () => {
    expect(idsOf(await search(kofi, { q: '"bistable wedge"' }))).toEqual([ids.cusp]);
    expect(idsOf(await search(kofi, { q: 'hysteresis -quarter' }))).toEqual([ids.plain]);
  });

  it('finds entries with a cusp', async () => {
    const hits = await search(kofi, { contains: 'cusp' });
    expect(idsOf(hits)).toEqual([ids.cusp]);
    expect(hits[0].events[0].kind).toBe('cusp');
    expect(Math.abs(hits[0].events[0].parameters.h)).toBeLessThan(1e-8);
  });

  it('finds folds with the parameter between bounds, on branches in a named parameter', async () => {
    const between = await search(kofi, { contains: 'fold', min: '0.2', max: '0.3' });
    expect(idsOf(between)).toEqual([ids.shifted]);
    expect(Math.abs(between[0].events[0].parameters.mu - 0.25)).toBeLessThan(1e-8);
    expect(idsOf(await search(kofi, { contains: 'fold', min: '0.2', max: '0.3', parameter: 'mu' }))).toEqual([ids.shifted]);
    expect(await search(kofi, { contains: 'fold', min: '0.2', max: '0.3', parameter: 'temperature' })).toEqual([]);
    expect(new Set(idsOf(await search(kofi, { contains: 'fold' })))).toEqual(new Set([ids.shifted, ids.plain]));
  });

  it('filters by author, status and date', async () => {
    const me = await kofi.user();
    expect(idsOf(await search(kofi, { author: me.id, q: 'saddle' })).sort()).toEqual([ids.plain, ids.shifted].sort());
    expect(await search(kofi, { status: 'approved' })).toEqual([]);
    expect(await search(kofi, { from: '2026-11-26' })).toEqual([]);
    expect((await search(kofi, { from: '2026-11-25', to: '2026-11-25' })).length).toBe(3);
  });

  it('searches only the notebooks the person belongs to', async () => {
    expect(await search(jun, { q: 'hysteresis' })).toEqual([]);
  });

  it.each([
    [{ min: 'abc', contains: 'fold' }, 'min', 'min must be a number'],
    [{ min: '0.1' }, 'contains', 'A parameter range needs contains = fold, hopf or branch-point'],
    [{ contains: 'wobble' }, 'contains', 'contains is one of fold, hopf, branch-point, cusp'],
    [{ contains: 'fold', min: '1', max: '0' }, 'max', 'max must not be below min'],
    [{ limit: '1000' }, 'limit', ''],
  ])('answers bad filters with the field and why: %j', async (query, path, message) => {
    const res = await kofi.get(`/api/search?${new URLSearchParams(query)}`);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toContainEqual({ path, message: expect.stringContaining(message) });
  });
});

describe('search snippets', () => {
  it('splits the highlighted text into plain parts and hits, keeping markup as text', () => {
    expect(snippetParts('a <b> \u0002fold\u0003 at \u0002μ\u0003')).toEqual([
      { text: 'a <b> ', hit: false },
      { text: 'fold', hit: true },
      { text: ' at ', hit: false },
      { text: 'μ', hit: true },
    ]);
  });

  it('leaves out heading marks', () => {
    expect(snippetParts('tank ## Aim Follow the \u0002ignition\u0003')).toEqual([
      { text: 'tank Aim Follow the ', hit: false },
      { text: 'ignition', hit: true },
    ]);
  });

  it('gives whole formulas as maths parts (a hit inside flags the formula) and a formula cut at an edge as words', () => {
    expect(snippetParts('{1}{\\tau}$ is the \u0002residence\u0003 time … the rate $k e^{-\u0002E\u0003/RT}$ grows $\\frac{a}{')).toEqual([
      { text: '1/τ is the ', hit: false },
      { text: 'residence', hit: true },
      { text: ' time … the rate ', hit: false },
      { text: 'k e^{-E/RT}', hit: true, maths: true },
      { text: ' grows a/', hit: false },
    ]);
  });
});
