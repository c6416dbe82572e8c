import PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCellResponseSchema, type EntryDetail } from '@shared/api/entries.ts';
import { ANALYSIS_QUEUE, type AnalysisJobData } from '@server/analysis/run-queue.ts';
import { RUN_ERROR_CODES } from '@server/analysis/analysis-task.ts';
import { createTestApp, makeNotebook, makeUser, signIn, type Agent, type TestApp } from '../support/test-app.ts';

/**
 * The run queue seen from an instance with no analysis workers (ANALYSIS_WORKERS=0): nothing
 * here computes, so the tests play the part of the other instances with their own pg-boss client.
 */
describe('cell runs on a queue-only instance', () => {
  let t: TestApp;
  let agent: Agent;
  let csrf: string;
  let runUrl: (cellId: string) => string;
  let boss: PgBoss;
  let owner: { entryId: string; notebookId: string; userId: string };
  const request = {
    model: { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] },
    task: { kind: 'equilibria', box: { x: [-2, 2] }, starts: 4 },
  };
  const post = (cellId: string, body: object) => agent.post(runUrl(cellId)).set('x-csrf-token', csrf).send(body);
  const runRow = async (cellId: string) =>
    ((await t.dataSource.query(`SELECT id, status, job_id FROM analysis_run WHERE cell_id = $1`, [cellId])) as { id: string; status: string; job_id: string }[])[0];

  beforeAll(async () => {
    t = await createTestApp({ env: { ANALYSIS_WORKERS: '0' }, runWait: { queueWaitMs: 1500, pollMs: 200 }, runSweepIntervalMs: 200 });
    const person = await makeUser(t.dataSource, { label: 'queue' });
    const notebook = await makeNotebook(t.dataSource, person.user);
    ({ agent, csrf } = await signIn(t.app, person));
    const entry = (await agent.post(`/api/notebooks/${notebook.id}/entries`).set('x-csrf-token', csrf).send({ title: 'Queue', entryDate: '2026-12-01' })).body as EntryDetail;
    runUrl = (cellId) => `/api/notebooks/${notebook.id}/entries/${entry.entry.id}/cells/${cellId}/run`;
    owner = { entryId: entry.entry.id, notebookId: notebook.id, userId: person.user.id };
    boss = new PgBoss({ connectionString: t.env.DATABASE_URL, max: 2, supervise: false, schedule: false, migrate: false });
    await boss.start();
  });
  afterAll(async () => {
    await boss?.stop({ graceful: false });
    await t?.close();
  });

  it('answers "the analysis queue is busy" when no instance takes the run in time, and takes the job off the queue', async () => {
    const cellId = crypto.randomUUID();
    const res = await post(cellId, request);
    expect(res.status).toBe(200);
    const output = runCellResponseSchema.parse(res.body);
    expect(output).toMatchObject({ status: 'error', cached: false, error: { code: 'run_queue_busy' } });
    expect(output.error?.message).toMatch(/analysis queue is busy/);
    const row = await runRow(cellId);
    expect(row.status).toBe('failed');
    expect((await boss.getJobById(ANALYSIS_QUEUE, row.job_id))?.state).toBe('cancelled');
  });

  it('fails the run with a clear message when the instance that took it stops and its job fails', async () => {
    const cellId = crypto.randomUUID();
    const pending = post(cellId, request).then((r) => r);
    // Another instance takes the job and marks the run running, then dies: pg-boss fails the job at its expiry.
    let jobs: PgBoss.Job<AnalysisJobData>[] = [];
    for (let i = 0; i < 50 && jobs.length === 0; i += 1) {
      await new Promise((r) => setTimeout(r, 20));
      jobs = (await boss.fetch<AnalysisJobData>(ANALYSIS_QUEUE)).filter(Boolean);
    }
    expect(jobs).toHaveLength(1);
    await t.dataSource.query(`UPDATE analysis_run SET status = 'running', started_at = now(), instance = 'gone' WHERE id = $1`, [jobs[0].data.runId]);
    await boss.fail(ANALYSIS_QUEUE, jobs[0].id, { message: 'job failed by timeout in active state' });

    const output = runCellResponseSchema.parse((await pending).body);
    expect(output).toMatchObject({ status: 'error', error: { code: RUN_ERROR_CODES.lost } });
    expect(output.error?.message).toMatch(/stopped before it finished/);
    expect((await runRow(cellId)).status).toBe('failed');
  });

  it('sweeps away the runs of every cell that ended over an hour ago or were abandoned unended, on an instance with no workers, and keeps the rest', async () => {
    const insert = async (purpose: string, status: string, endedAgo: string | null, queuedAgo = '3 hours'): Promise<string> => {
      const [{ id }] = (await t.dataSource.query(
        `INSERT INTO analysis_run (notebook_id, entry_id, cell_id, purpose, input_hash, request, started_by_id, status, budget_ms, output, queued_at, finished_at)
         VALUES ($1, $2, gen_random_uuid(), $3, 'sweep', '{}', $4, $5, 1000, CASE WHEN $6::interval IS NULL THEN NULL ELSE '{}'::jsonb END,
                 now() - $7::interval, now() - $6::interval)
         RETURNING id`,
        [owner.notebookId, owner.entryId, purpose, owner.userId, status, endedAgo, queuedAgo],
      )) as { id: string }[];
      return id;
    };
    const old = [
      await insert('cell', 'finished', '2 hours'),
      await insert('reproducibility', 'cancelled', '61 minutes'),
      await insert('cell', 'failed', '1 day'),
      await insert('reproducibility', 'running', null, '2 days'),
    ];
    const kept = [await insert('cell', 'finished', '10 minutes'), await insert('reproducibility', 'finished', '59 minutes'), await insert('cell', 'running', null)];
    const left = async () => ((await t.dataSource.query(`SELECT id FROM analysis_run WHERE input_hash = 'sweep'`)) as { id: string }[]).map((r) => r.id);
    let ids = await left();
    for (let i = 0; i < 50 && old.some((id) => ids.includes(id)); i += 1) {
      await new Promise((r) => setTimeout(r, 100));
      ids = await left();
    }
    expect(ids.sort()).toEqual([...kept].sort());
    await t.dataSource.query(`DELETE FROM analysis_run WHERE input_hash = 'sweep'`);
  });
});
