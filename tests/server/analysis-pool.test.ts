import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AnalysisPool } from '@server/analysis/analysis-pool.ts';
import { RUN_ERROR_CODES } from '@server/analysis/analysis-task.ts';
import type { ContinuationResult, SimulateResult } from '@shared/engine/contract.ts';
import { RUNAWAY_REQUEST } from './entries-support.ts';

/**
 * The worker pool runs real engine analyses in worker threads. Reference values:
 * the scalar saddle-node x' = μ − x² has equilibria x = ±√μ for μ > 0 and one fold at
 * μ = 0, x = 0 (closed form; Strogatz, "Nonlinear Dynamics and Chaos", §3.1, the saddle-node
 * normal form). There f_μ = 1 and f_xx = −2, so with v = w = 1: a = 1, b = −2.
 */
const saddleNode = {
  model: { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] },
  task: { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 2 } },
};

const runaway = RUNAWAY_REQUEST;

describe('AnalysisPool', () => {
  let pool: AnalysisPool;
  beforeAll(() => {
    pool = new AnalysisPool({ maxThreads: 1, maxQueue: 1, graceMs: 500 });
  });
  afterAll(async () => {
    await pool.close();
  });

  it('runs a continuation in a worker and finds the fold of the saddle-node', async () => {
    const outcome = await pool.run(saddleNode, { budgetMs: 10_000 });
    expect(outcome.status).toBe('ok');
    if (outcome.status !== 'ok') return;
    const { branch } = outcome.result as ContinuationResult;
    const folds = branch.events.filter((e) => e.kind === 'fold');
    expect(folds).toHaveLength(1);
    expect(folds[0].parameter).toBeCloseTo(0, 6);
    expect(folds[0].state.x).toBeCloseTo(0, 4);
    expect(folds[0].normalForm.a).toBeCloseTo(1, 4);
    expect(folds[0].normalForm.b).toBeCloseTo(-2, 4);
    expect(outcome.elapsedMs).toBeGreaterThan(0);
  });

  it('reports a bad request as an error value with the field path', async () => {
    const outcome = await pool.run({ ...saddleNode, model: { ...saddleNode.model, variables: [{ name: 'x', rhs: 'mu - * x' }] } });
    expect(outcome.status).toBe('error');
    if (outcome.status !== 'error') return;
    expect(outcome.error.path).toBe('model.variables[0].rhs');
    expect(outcome.error.message.length).toBeGreaterThan(0);
  });

  it('returns what was computed when the engine budget runs out (stop reason time-limit)', async () => {
    const outcome = await pool.run(runaway, { budgetMs: 200 });
    expect(outcome.status).toBe('ok');
    if (outcome.status !== 'ok') return;
    expect((outcome.result as SimulateResult).stopReason).toBe('time-limit');
  });

  it('stops a worker that runs past its hard limit, reports it, and keeps serving', async () => {
    const started = Date.now();
    const outcome = await pool.run(runaway, { budgetMs: 60_000, hardLimitMs: 300 });
    expect(outcome.status).toBe('error');
    if (outcome.status === 'error') expect(outcome.error.code).toBe(RUN_ERROR_CODES.timeLimit);
    expect(Date.now() - started).toBeLessThan(5_000);
    const next = await pool.run(saddleNode);
    expect(next.status).toBe('ok');
  });

  it('cancels a run when its signal is aborted', async () => {
    const cancel = new AbortController();
    setTimeout(() => cancel.abort(), 200);
    const outcome = await pool.run(runaway, { budgetMs: 60_000, signal: cancel.signal });
    expect(outcome.status).toBe('error');
    if (outcome.status === 'error') expect(outcome.error.code).toBe(RUN_ERROR_CODES.cancelled);
  });

  it('refuses new runs with a clear error when the queue is full', async () => {
    const cancel = new AbortController();
    const busy = pool.run(runaway, { budgetMs: 60_000, signal: cancel.signal });
    // Once the one worker is busy, one run may wait; the next is refused.
    await new Promise((r) => setTimeout(r, 1000));
    const queued = pool.run(saddleNode);
    try {
      await expect(pool.run(saddleNode)).rejects.toThrow(/busy and the queue is full/);
    } finally {
      cancel.abort();
    }
    expect((await busy).status).toBe('error');
    expect((await queued).status).toBe('ok');
  });
});

describe('AnalysisPool with a small heap', () => {
  it('reports a worker that runs out of memory as a failed run, and keeps serving', async () => {
    const pool = new AnalysisPool({ maxThreads: 1, maxHeapMb: 64 });
    try {
      // 100 variables sampled 100 000 times: the trajectory alone needs about 80 MB of numbers.
      const variables = Array.from({ length: 100 }, (_, i) => ({ name: `x${i}`, rhs: `-x${i}` }));
      const outcome = await pool.run({ model: { variables }, task: { kind: 'simulate', time: { end: 1, samples: 100_000 } } }, { budgetMs: 30_000 });
      expect(outcome.status).toBe('error');
      if (outcome.status === 'error') {
        expect(outcome.error.code).toBe(RUN_ERROR_CODES.crashed);
        expect(outcome.error.message).toMatch(/memory/i);
      }
      expect((await pool.run(saddleNode)).status).toBe('ok');
    } finally {
      await pool.close();
    }
  });
});
