import type { DataSource } from 'typeorm';
import { getAnalysisPool } from '@server/analysis/analysis-pool.ts';
import { RunQueue, type RunWaitLimits } from '@server/analysis/run-queue.ts';
import type { Env } from '@server/env.ts';
import { executeRun } from '@server/services/analysis/execute-run.ts';
import { pruneEndedRuns } from '@server/services/analysis/run-rows.ts';

/**
 * This instance's part of the shared cell-run queue: ANALYSIS_WORKERS pg-boss workers, each
 * running one run at a time in the instance's worker-thread pool (sized to match, and started
 * now so the first run does not wait for the engine to load). With 0 workers the instance only
 * queues runs and waits for other instances to compute them. Every instance also sweeps away
 * the rows of runs (of any cell) that ended over an hour ago, one instance's pass at a time.
 */
export async function startAnalysisRunWorker(
  env: Pick<Env, 'DATABASE_URL' | 'ANALYSIS_WORKERS' | 'INSTANCE_NAME'>,
  dataSource: DataSource,
  options: { wait?: Partial<RunWaitLimits>; sweepIntervalMs?: number } = {},
): Promise<RunQueue> {
  const workers = env.ANALYSIS_WORKERS;
  const pool = workers > 0 ? getAnalysisPool({ maxThreads: workers }) : null;
  return RunQueue.start({
    databaseUrl: env.DATABASE_URL,
    workers,
    wait: options.wait,
    sweep: () => pruneEndedRuns(dataSource),
    sweepIntervalMs: options.sweepIntervalMs,
    handle: async (job, notifications) => {
      if (pool) await executeRun({ dataSource, pool, notifications, instance: env.INSTANCE_NAME }, job.runId);
    },
  });
}
