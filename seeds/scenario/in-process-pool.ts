import type { AnalysisPool, RunOptions } from '@server/analysis/analysis-pool.ts';
import type { AnalysisOutcome } from '@server/analysis/analysis-task.ts';
import runAnalysis from '@server/analysis/analysis.worker.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';

/**
 * The analysis pool's interface, answered on the calling thread by the very function the pool's
 * workers run. The demo seed computes a few dozen small analyses before the server starts:
 * starting a worker thread (which loads the engine through tsx) would cost more than all of
 * them together. Runs are not cancellable; the engine still keeps to its time budget.
 */
export function inProcessPool(): AnalysisPool {
  const pool = {
    async run(request: unknown, options: RunOptions = {}): Promise<AnalysisOutcome> {
      options.onStart?.();
      return runAnalysis({ request, budgetMs: options.budgetMs ?? ENGINE_DEFAULTS.timeLimitMs });
    },
    async close(): Promise<void> {},
  };
  // AnalysisPool is a class with private fields; the run service and the reproducibility check only call `run`.
  return pool as unknown as AnalysisPool;
}
