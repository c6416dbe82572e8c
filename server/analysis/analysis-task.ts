import type { AnalyzeResult, EngineFieldError } from '@shared/engine/contract.ts';

import type { MessagePort } from 'node:worker_threads';

/**
 * What the main thread sends a worker: the engine request as received, its time budget, and a
 * port on which the worker says when it starts (a run may first wait for a free worker).
 */
export interface AnalysisTask {
  request: unknown;
  budgetMs: number;
  progress?: MessagePort;
}

/** Messages a worker posts on the task's progress port. */
export type AnalysisProgress = { type: 'started' };

/** What a worker answers. Request errors are values, never thrown across the thread boundary. */
export type AnalysisOutcome =
  | { status: 'ok'; result: AnalyzeResult; elapsedMs: number }
  | { status: 'error'; error: EngineFieldError; elapsedMs: number };

/** Stable codes of run failures that are not the request's fault. */
export const RUN_ERROR_CODES = {
  /** The run went past its hard time limit and the worker was stopped. */
  timeLimit: 'run_time_limit',
  /** The worker thread died or the engine failed unexpectedly. */
  crashed: 'run_failed',
  /** The run never got its answer computed: it could not be queued, or the instance running it stopped. */
  lost: 'run_lost',
  /** The caller went away (closed the request), cancelled it or ran the cell again, and the run was stopped. */
  cancelled: 'run_cancelled',
  /** No worker on any instance took the run before the waiting request's limit. */
  queueBusy: 'run_queue_busy',
} as const;
