import { performance } from 'node:perf_hooks';
import { analyze } from '../engine/analyze.ts';
import { EngineRequestError } from '../engine/errors.ts';
import { RUN_ERROR_CODES, type AnalysisOutcome, type AnalysisProgress, type AnalysisTask } from './analysis-task.ts';

/**
 * Runs one engine analysis in a worker thread. A bad request comes back as an error value with
 * the field path; any other failure as a "run_failed" value. Loaded by piscina (see analysis-pool.ts).
 */
export default async function runAnalysis(task: AnalysisTask): Promise<AnalysisOutcome> {
  task.progress?.postMessage({ type: 'started' } satisfies AnalysisProgress);
  task.progress?.close();
  const started = performance.now();
  const elapsed = () => Math.round((performance.now() - started) * 1000) / 1000;
  try {
    const result = await analyze(task.request, { timeLimitMs: task.budgetMs });
    return { status: 'ok', result, elapsedMs: elapsed() };
  } catch (error) {
    if (error instanceof EngineRequestError) return { status: 'error', error: error.toJSON().error, elapsedMs: elapsed() };
    const message = error instanceof Error ? error.message : String(error);
    return {
      status: 'error',
      error: { code: RUN_ERROR_CODES.crashed, message: `The analysis failed unexpectedly: ${message}` },
      elapsedMs: elapsed(),
    };
  }
}
