import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EntryDetail, Revision } from '@shared/api/entries.ts';
import { figureListSchema, figureSchema, type Figure } from '@shared/api/figures.ts';
import { runCellResponseSchema } from '@shared/api/entries.ts';
import { createHash } from 'node:crypto';
import {
  SADDLE_BRANCH_CELL_ID,
  SADDLE_MODEL_CELL_ID,
  auditActionsFor,
  closeLogServer,
  demoNotebookId,
  logServer,
  saddleBranchTask,
  saddleDoc,
  saddleModel,
  signIn,
  startLogServer,
  type Client,
} from './entries-support.ts';

const sha = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');

describe('figures API', () => {
  let kofi: Client;
  let jun: Client;
  let notebook: string;
  let entryId: string;
  let revision: Revision;
  let base: string;

  beforeAll(async () => {
    await startLogServer();
    [kofi, jun] = await Promise.all([signIn('researcher'), signIn('reader')]);
    notebook = await demoNotebookId('stirredTank');
    const created = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Saddle-node figure', entryDate: '2026-11-22', tags: [] })).body as EntryDetail;
    entryId = created.entry.id;
    const run = runCellResponseSchema.parse(
      (await kofi.post(`/api/notebooks/${notebook}/entries/${entryId}/cells/${SADDLE_BRANCH_CELL_ID}/run`, { model: saddleModel, task: saddleBranchTask })).body,
    );
    const { cached: _cached, ...output } = run;
    const saved = await kofi.post(`/api/notebooks/${notebook}/entries/${entryId}/revisions`, {
      baseRevisionId: created.head.id, title: 'Saddle-node figure', entryDate: '2026-11-22', tags: [], document: saddleDoc(), outputs: { [SADDLE_BRANCH_CELL_ID]: output },
    });
    expect(saved.status).toBe(201);
    revision = saved.body as Revision;
    base = `/api/notebooks/${notebook}/entries/${entryId}/figures`;
  });
  afterAll(closeLogServer);

  it('renders a branch plot to SVG and PNG, stores both, and ties the figure to the revision and input hash', async () => {
    const res = await kofi.post(base, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID, caption: 'Fold of x′ = μ − x²' });
    expect(res.status).toBe(201);
    const figure = figureSchema.parse(res.body);
    expect(figure).toMatchObject({
      revisionId: revision.id,
      cellId: SADDLE_BRANCH_CELL_ID,
      cellKind: 'branch',
      inputHash: revision.outputs[SADDLE_BRANCH_CELL_ID].inputHash,
      engineVersion: revision.outputs[SADDLE_BRANCH_CELL_ID].engineVersion,
    });
    // The SVG is vega's: axis titles from the cell (μ is the parameter "mu", x the state).
    const svgRes = await jun.get(figure.svgUrl);
    expect(svgRes.status).toBe(302);
    const svg = await (await fetch(svgRes.headers.location as string)).text();
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('>mu</text>');
    expect(svg).toContain('Fold of x′ = μ − x²');
    expect(sha(svg)).toBe(figure.svgSha256);
    // The PNG: its signature, its stated size in the IHDR chunk (PNG specification, W3C 2003, §11.2.2), its hash.
    const png = Buffer.from(await (await fetch((await jun.get(figure.pngUrl)).headers.location as string)).arrayBuffer());
    expect(png.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
    expect(png.readUInt32BE(16)).toBe(figure.pngWidth);
    expect(png.readUInt32BE(20)).toBe(figure.pngHeight);
    expect(figure.pngWidth).toBeGreaterThan(560 * 2 - 1);
    expect(sha(png)).toBe(figure.pngSha256);
    expect(await auditActionsFor(entryId)).toContain('figure.attached');
    const list = figureListSchema.parse((await jun.get(base)).body);
    expect(list.figures.map((f) => f.id)).toContain(figure.id);
  });

  it('records the revision content hash in the audit event, so an approved record traces to its figures', async () => {
    const figure = (await kofi.post(base, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID })).body as Figure;
    const [event] = (await logServer().dataSource.query(`SELECT summary FROM audit_event WHERE action = 'figure.attached' AND entity_id = $1`, [figure.id])) as {
      summary: Record<string, string>;
    }[];
    expect(event.summary).toMatchObject({ revisionId: revision.id, revisionContentHash: revision.contentHash, inputHash: figure.inputHash });
  });

  it.each([
    ['a model cell', { cellId: SADDLE_MODEL_CELL_ID }, 422, 'cellId', 'has no plot'],
    ['an unknown variable', { cellId: SADDLE_BRANCH_CELL_ID, variable: 'temperature' }, 422, 'variable', '"temperature" is not a state variable'],
    ['a cell that is not in the revision', { cellId: '11111111-2222-4333-8444-555555555555' }, 404, undefined, 'No such cell'],
    ['a bad cell id', { cellId: 'nope' }, 400, 'cellId', 'cellId must be a cell id'],
  ])('refuses %s with a clear message', async (_label, body, status, path, message) => {
    const res = await kofi.post(base, { revisionId: revision.id, ...body });
    expect(res.status).toBe(status);
    expect(res.body.error.message + JSON.stringify(res.body.error.fields ?? [])).toContain(message);
    if (path) expect(res.body.error.fields[0].path).toBe(path);
  });

  it('refuses a cell that has no result in that revision', async () => {
    const bare = await kofi.post(`/api/notebooks/${notebook}/entries/${entryId}/revisions`, {
      baseRevisionId: revision.id, title: 'Saddle-node figure', entryDate: '2026-11-22', tags: [], document: saddleDoc('Not run yet.'), outputs: {},
    });
    expect(bare.status).toBe(201);
    const res = await kofi.post(base, { revisionId: (bare.body as Revision).id, cellId: SADDLE_BRANCH_CELL_ID });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toBe('This cell has no result in this revision: run it and record the revision first');
  });

  it('draws measured data over the branch, with error bars', async () => {
    const set = await kofi.post(`/api/notebooks/${notebook}/entries/${entryId}/measurements`, { name: 'Bench runs', csv: 'mu,x,error\n0.25,0.52,0.05\n1,0.97,0.1\n' });
    expect(set.status).toBe(201);
    const res = await kofi.post(base, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID, measurementSetIds: [set.body.id] });
    expect(res.status).toBe(201);
    const [row] = (await logServer().dataSource.query('SELECT spec FROM figure WHERE id = $1', [res.body.id])) as { spec: { layer: { data: { values: Record<string, number>[] } }[] } }[];
    const measured = row.spec.layer.flatMap((l) => l.data.values).filter((v) => 'low' in v);
    // (the shared branch spec names the parameter field "mu")
    const point = measured.find((v) => v.mu === 0.25);
    expect(point?.y).toBe(0.52);
    expect(point?.low).toBeCloseTo(0.47, 12);
    expect(point?.high).toBeCloseTo(0.57, 12);
    const other = await kofi.post(base, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID, measurementSetIds: ['11111111-2222-4333-8444-555555555555'] });
    expect(other.status).toBe(404);
  });

  it('refuses a figure while file storage is stopped, keeps nothing of it, and makes the next one once storage is back, without a restart', async () => {
    const app = logServer();
    const figureRows = async () => ((await app.dataSource.query('SELECT id FROM figure WHERE entry_id = $1', [entryId])) as { id: string }[]).map((r) => r.id);
    const before = await figureRows();
    const eventsBefore = (await auditActionsFor(entryId)).filter((a) => a === 'figure.attached').length;

    await app.stopStorage();
    try {
      const refused = await kofi.post(base, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID, caption: 'While storage is down' });
      expect(refused.status).toBe(503);
      expect(refused.body.error).toEqual({ code: 'storage_unavailable', message: 'File storage is not reachable right now, so the figure was not saved. Try again in a moment.' });
    } finally {
      await app.startStorage();
    }
    expect(await figureRows()).toEqual(before);
    expect((await auditActionsFor(entryId)).filter((a) => a === 'figure.attached')).toHaveLength(eventsBefore);

    const res = await kofi.post(base, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID, caption: 'After storage is back' });
    expect(res.status).toBe(201);
    const figure = figureSchema.parse(res.body);
    const png = Buffer.from(await (await fetch((await kofi.get(figure.pngUrl)).headers.location as string)).arrayBuffer());
    expect(sha(png)).toBe(figure.pngSha256);
  });

  it('lets readers see figures but not make them', async () => {
    expect((await jun.post(base, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID })).status).toBe(403);
  });
});
