import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi, type MockInstance } from 'vitest';
import { runCellResponseSchema, runProgressSchema, type EntryDetail, type Revision, type RunCellResponse, type RunProgress } from '@shared/api/entries.ts';
import { inputHash } from '@shared/cells/hash.ts';
import { resolveCellRequest } from '@shared/cells/resolve.ts';
import type { ContinuationResult } from '@shared/engine/contract.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import {
  RUNAWAY_REQUEST,
  SADDLE_BRANCH_CELL_ID,
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

/**
 * Cell runs through the API. Reference: x' = μ − x² has its one fold at μ = 0, x = 0 with
 * a = 1, b = −2 (closed form; Strogatz, "Nonlinear Dynamics and Chaos", §3.1).
 */
describe('cell runs API', () => {
  let kofi: Client;
  let jun: Client;
  let mira: Client;
  let notebook: string;
  let entry: EntryDetail;
  let consoleError: MockInstance;
  const runUrl = (cellId: string) => `/api/notebooks/${notebook}/entries/${entry.entry.id}/cells/${cellId}/run`;

  beforeAll(async () => {
    await startLogServer();
    [kofi, jun, mira] = await Promise.all([signIn('researcher'), signIn('reader'), signIn('researcher2')]);
    // Kofi researches and Jun reads in the stirred-tank notebook; Mira is not a member of it.
    notebook = await demoNotebookId('stirredTank');
    entry = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Saddle-node check', entryDate: '2026-11-20' })).body as EntryDetail;
  });
  afterAll(closeLogServer);
  beforeEach(() => {
    consoleError = vi.spyOn(console, 'error');
  });
  afterEach(() => {
    // The server log shows no unhandled error in any of these cases.
    expect(consoleError).not.toHaveBeenCalled();
    consoleError.mockRestore();
  });

  it('runs a branch cell in the worker pool, stamps the output, then answers the same request from the store', async () => {
    const resolution = resolveCellRequest(saddleDoc(), SADDLE_BRANCH_CELL_ID);
    expect(resolution.ok).toBe(true);
    if (!resolution.ok) return;
    const res = await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), resolution.request);
    expect(res.status).toBe(200);
    const output = runCellResponseSchema.parse(res.body);
    expect(output).toMatchObject({ status: 'ok', engineVersion: ENGINE_VERSION, cached: false });
    // The same hash the client computes from the resolved request (Web Crypto).
    expect(output.inputHash).toBe(await inputHash(ENGINE_VERSION, resolution.request));
    expect(Date.parse(output.computedAt)).toBeGreaterThan(Date.now() - 60_000);
    const folds = (output.result as ContinuationResult).branch.events;
    expect(folds).toHaveLength(1);
    const fold = folds[0];
    if (fold.kind !== 'fold') throw new Error(`expected a fold, got ${fold.kind}`);
    expect(fold.parameter).toBeCloseTo(0, 6);
    expect(fold.normalForm.a).toBeCloseTo(1, 4);
    expect(fold.normalForm.b).toBeCloseTo(-2, 4);
    expect(await auditActionsFor(entry.entry.id)).toContain('cell.run');

    // Same model and task, defaults left out: same hash, answered from the store.
    const again = (await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: saddleBranchTask })).body as RunCellResponse;
    expect(again).toMatchObject({ status: 'ok', cached: true, inputHash: output.inputHash, computedAt: output.computedAt });
    expect(again.result).toEqual(output.result);

    // The output is saved beside the document in a revision.
    const saved = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/revisions`, {
      baseRevisionId: entry.head.id, title: 'Saddle-node check', entryDate: '2026-11-20', tags: [], document: saddleDoc(), outputs: { [SADDLE_BRANCH_CELL_ID]: output },
    });
    expect(saved.status).toBe(201);
    expect((saved.body as Revision).outputs[SADDLE_BRANCH_CELL_ID].inputHash).toBe(output.inputHash);
    entry = ((await kofi.get(`/api/notebooks/${notebook}/entries/${entry.entry.id}`)).body as EntryDetail);
  });

  it('records only results the server computed', async () => {
    const run = runCellResponseSchema.parse((await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: saddleBranchTask })).body);
    const { cached: _cached, ...output } = run;
    const result = output.result as ContinuationResult;
    const tampered = { ...output, result: { ...result, branch: { ...result.branch, events: [] } } };
    const neverRun = { ...output, inputHash: 'f'.repeat(64) };
    const save = (outputs: Record<string, unknown>) =>
      kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/revisions`, {
        baseRevisionId: entry.head.id, title: 'Saddle-node check', entryDate: '2026-11-20', tags: [], document: saddleDoc(), outputs,
      });
    const bad = await save({ [SADDLE_BRANCH_CELL_ID]: tampered });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual([{ path: `outputs.${SADDLE_BRANCH_CELL_ID}.result`, message: expect.stringMatching(/differs/) }]);
    const unknown = await save({ [SADDLE_BRANCH_CELL_ID]: neverRun });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields[0].path).toBe(`outputs.${SADDLE_BRANCH_CELL_ID}.inputHash`);
  });

  it('reports bad cell input as an error output naming the field, and the entry still saves', async () => {
    const badModel = { ...saddleModel, variables: [{ name: 'x', rhs: 'mu - * x' }] };
    const res = await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: badModel, task: saddleBranchTask });
    expect(res.status).toBe(200);
    const output = runCellResponseSchema.parse(res.body);
    expect(output.status).toBe('error');
    expect(output.error).toMatchObject({ path: 'model.variables[0].rhs' });
    expect(output.error?.message.length).toBeGreaterThan(5);

    const unknownParameter = (await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: { ...saddleBranchTask, parameter: 'nu' } })).body as RunCellResponse;
    expect(unknownParameter.status).toBe('error');
    expect(unknownParameter.error?.path).toBe('task.parameter');

    const badBudget = (await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: saddleBranchTask, timeLimitMs: -5 })).body as RunCellResponse;
    expect(badBudget.status).toBe('error');
    expect(badBudget.error?.path).toBe('timeLimitMs');

    const doc = saddleDoc('With a typo in the model.');
    const saved = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/revisions`, {
      baseRevisionId: entry.head.id, title: 'Saddle-node check', entryDate: '2026-11-20', tags: [], document: doc, outputs: { [SADDLE_BRANCH_CELL_ID]: output },
    });
    expect(saved.status).toBe(201);
    expect((saved.body as Revision).outputs[SADDLE_BRANCH_CELL_ID].status).toBe('error');
    entry = ((await kofi.get(`/api/notebooks/${notebook}/entries/${entry.entry.id}`)).body as EntryDetail);
  });

  it('answers a body that is not a request with 400 and the field', async () => {
    const res = await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['model', 'task']);
    expect((await kofi.post(runUrl('not-a-cell'), { model: saddleModel, task: saddleBranchTask })).status).toBe(400);
  });

  it('lets only researchers and PIs of the notebook run cells', async () => {
    expect((await jun.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: saddleBranchTask })).status).toBe(403);
    expect((await mira.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: saddleBranchTask })).status).toBe(404);
  });

  it('cancels the run when the caller closes the request, freeing the worker', async () => {
    const cellId = crypto.randomUUID();
    // With a 60 s budget it would hold the worker for a minute.
    const runaway = { ...RUNAWAY_REQUEST, timeLimitMs: 60_000 };
    const pending = kofi.post(runUrl(cellId), runaway);
    const aborted = new Promise<void>((resolve) => {
      setTimeout(() => {
        (pending as unknown as { abort(): void }).abort();
        resolve();
      }, 500);
    });
    await Promise.all([pending.then(() => undefined, () => undefined), aborted]);
    // The run ends (it would otherwise hold its worker for a minute).
    let state = 'running';
    for (let i = 0; i < 100 && state !== 'idle'; i += 1) {
      state = runProgressSchema.parse((await kofi.get(runUrl(cellId))).body).state;
      if (state !== 'idle') await new Promise((r) => setTimeout(r, 50));
    }
    expect(state).toBe('idle');

    // With the worker stopped, the next run goes through well within the test's time limit.
    const next = (await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: { ...saddleBranchTask, bounds: { min: -1, max: 3 } } })).body as RunCellResponse;
    expect(next.status).toBe('ok');
    // A cancelled run records nothing.
    const rows = (await logServer().dataSource.query(`SELECT 1 FROM audit_event WHERE action = 'cell.run' AND entity_id = $1`, [cellId])) as unknown[];
    expect(rows).toHaveLength(0);
  });

  it('shows a long run in progress and cancels it on request', async () => {
    const cellId = crypto.randomUUID();
    const runaway = { ...RUNAWAY_REQUEST, timeLimitMs: 60_000 };
    const pending = kofi.post(runUrl(cellId), runaway).then((r) => r);
    let progress: RunProgress = { state: 'idle' };
    for (let i = 0; i < 100 && progress.state !== 'running'; i += 1) {
      await new Promise((r) => setTimeout(r, 50));
      progress = runProgressSchema.parse((await jun.get(runUrl(cellId))).body);
    }
    expect(progress).toMatchObject({ state: 'running', startedBy: { name: 'Kofi Mensah' }, budgetMs: 60_000 });
    if (progress.state === 'running') expect(progress.startedAt).not.toBeNull();

    expect((await jun.delete(runUrl(cellId))).status).toBe(403);
    expect((await kofi.delete(runUrl(cellId))).status).toBe(204);
    const answer = (await pending).body as RunCellResponse;
    expect(answer.status).toBe('error');
    expect(answer.error?.code).toBe('run_cancelled');
    expect(((await jun.get(runUrl(cellId))).body as RunProgress).state).toBe('idle');
    expect((await kofi.delete(runUrl(cellId))).status).toBe(404);
  });

  it('validates a model for the form with paths and positions', async () => {
    const bad = await jun.post('/api/engine/validate-model', { model: { variables: [{ name: 'x', rhs: 'mu - * x' }, { name: 'y', rhs: 'z + 1' }], parameters: [{ name: 'mu', value: 1 }] } });
    expect(bad.status).toBe(200);
    const paths = bad.body.errors.map((e: { path: string }) => e.path);
    expect(paths).toEqual(['model.variables[0].rhs', 'model.variables[1].rhs']);
    expect(typeof bad.body.errors[1].position).toBe('number');
    const good = await jun.post('/api/engine/validate-model', { model: saddleModel });
    expect(good.body).toEqual({ errors: [] });
    const shape = await jun.post('/api/engine/validate-model', { model: { variables: [] } });
    expect(shape.body.errors[0].path).toBe('model.variables');
  });
});
