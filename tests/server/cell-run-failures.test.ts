import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCellResponseSchema, type EntryDetail, type Revision } from '@shared/api/entries.ts';
import { getAnalysisPool } from '@server/analysis/analysis-pool.ts';
import { RUN_ERROR_CODES } from '@server/analysis/analysis-task.ts';
import {
  SADDLE_BRANCH_CELL_ID,
  closeLogServer,
  demoNotebookId,
  logServer,
  saddleBranchTask,
  saddleModel,
  signIn,
  startLogServer,
  type Client,
} from './entries-support.ts';

/**
 * A cell whose run kills its worker, through the API: the app's pool here has one worker with a
 * 64 MB heap, so a run that needs more runs out of memory. The run answers an error output the
 * cell shows (and a revision records), the worker is replaced, and the next cell runs.
 */
describe('a cell run that crashes its worker', () => {
  let kofi: Client;
  let notebook: string;
  let entry: EntryDetail;
  const MODEL_CELL_ID = '3a9d8c7b-6e5f-4a1b-8c2d-0e1f2a3b4c5d';
  const HUNGRY_CELL_ID = '5c1e2b7d-0a4f-4e8b-9c3d-7e6f5a4b3c21';
  // 100 variables sampled 100 000 times: the trajectory alone needs about 80 MB of numbers.
  const hungry = {
    model: { variables: Array.from({ length: 100 }, (_, i) => ({ name: `x${i}`, rhs: `-x${i}` })), parameters: [], definitions: [] },
    task: { kind: 'simulate', initial: {}, time: { start: 0, end: 1, samples: 100_000 } },
    timeLimitMs: 30_000,
  };

  beforeAll(async () => {
    getAnalysisPool({ maxThreads: 1, maxHeapMb: 64 });
    await startLogServer();
    kofi = await signIn('researcher');
    notebook = await demoNotebookId('stirredTank');
    entry = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Out of memory', entryDate: '2026-12-03' })).body as EntryDetail;
  });
  afterAll(closeLogServer);

  const runUrl = (cellId: string) => `/api/notebooks/${notebook}/entries/${entry.entry.id}/cells/${cellId}/run`;

  it('answers an error output naming the failure, records it with the revision, and runs the next cell on a fresh worker', async () => {
    const res = await kofi.post(runUrl(HUNGRY_CELL_ID), hungry);
    expect(res.status).toBe(200);
    const failed = runCellResponseSchema.parse(res.body);
    expect(failed.status).toBe('error');
    expect(failed.error?.code).toBe(RUN_ERROR_CODES.crashed);
    expect(failed.error?.message).toMatch(/^The analysis worker failed: .*memory/i);

    // The failure is an output like any other: a revision records it with its message.
    const { cached: _cached, ...output } = failed;
    const doc = {
      type: 'doc',
      content: [
        { type: 'cell', attrs: { id: MODEL_CELL_ID, kind: 'model', input: { name: 'Many decays', ...hungry.model } } },
        { type: 'cell', attrs: { id: HUNGRY_CELL_ID, kind: 'trajectory', input: { modelCellId: MODEL_CELL_ID, task: hungry.task } } },
      ],
    };
    const saved = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/revisions`, {
      baseRevisionId: entry.head.id, title: 'Out of memory', entryDate: '2026-12-03', tags: [], document: doc, outputs: { [HUNGRY_CELL_ID]: output },
    });
    expect(saved.status).toBe(201);
    expect((saved.body as Revision).outputs[HUNGRY_CELL_ID]).toMatchObject({ status: 'error', error: { message: failed.error?.message } });

    // The failed run is in the audit trail with its code, and it cached nothing.
    const [event] = (await logServer().dataSource.query(
      `SELECT summary FROM audit_event WHERE action = 'cell.run' AND entity_id = $1`, [HUNGRY_CELL_ID],
    )) as { summary: { status: string; errorCode: string } }[];
    expect(event.summary).toMatchObject({ status: 'error', errorCode: RUN_ERROR_CODES.crashed });
    const cached = (await logServer().dataSource.query('SELECT 1 FROM analysis_result WHERE input_hash = $1', [failed.inputHash])) as unknown[];
    expect(cached).toHaveLength(0);

    // The pool replaced the worker: the next cell runs and finds the fold.
    const next = runCellResponseSchema.parse((await kofi.post(runUrl(SADDLE_BRANCH_CELL_ID), { model: saddleModel, task: { ...saddleBranchTask, bounds: { min: -1, max: 2.5 } } })).body);
    expect(next.status).toBe('ok');
    expect(next.cached).toBe(false);
  });
});
