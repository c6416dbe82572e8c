import os from 'node:os';
import { MessageChannel } from 'node:worker_threads';
import { performance } from 'node:perf_hooks';
import { Piscina } from 'piscina';
import { ENGINE_DEFAULTS, ENGINE_LIMITS } from '@shared/engine/limits.ts';
import { HttpError } from '@server/errors/index.ts';
import { RUN_ERROR_CODES, type AnalysisOutcome, type AnalysisTask } from './analysis-task.ts';

/** Time past the engine's own budget before a worker is stopped by force. */
export const DEFAULT_GRACE_MS = 2000;

export interface AnalysisPoolOptions {
  /** Worker threads (default: cores − 1, at least 1). */
  maxThreads?: number;
  /** Runs allowed to wait for a free worker before new ones are refused (default 16). */
  maxQueue?: number;
  /** Time past the engine's own budget before a worker is stopped by force (default 2000 ms). */
  graceMs?: number;
  /** Heap limit of each worker in MB (default 1024): a run that needs more fails alone. */
  maxHeapMb?: number;
  /** Workers kept warm once started (default 1): loading the engine in a fresh worker takes a second or more. */
  minThreads?: number;
}

export interface RunOptions {
  /** The engine's time budget (it stops itself and returns what it has). */
  budgetMs?: number;
  /** Stop the worker by force after this long (default budget + grace). */
  hardLimitMs?: number;
  /** Aborting it cancels the run (the worker is stopped and replaced). */
  signal?: AbortSignal;
  /** Called when a worker picks the run up (before that it waits in the queue). */
  onStart?: () => void;
}

/** 503: the pool has as many runs waiting as it accepts. */
export class AnalysisPoolBusyError extends HttpError {
  constructor() {
    super(503, 'analysis_busy', 'Every analysis worker is busy and the queue is full; try again in a moment');
  }
}

/**
 * Engine analyses in worker threads (piscina). A run that goes past its hard limit, or whose
 * caller aborts, has its worker terminated; piscina starts a fresh one, so a runaway or
 * crashing analysis never blocks the server. Failures come back as error outcomes, never throws
 * (except AnalysisPoolBusyError when the queue is full).
 *
 * The worker is TypeScript loaded through tsx's loader (`--import tsx`); the server always runs under tsx.
 */
export class AnalysisPool {
  private readonly piscina: Piscina<AnalysisTask, AnalysisOutcome>;
  private readonly graceMs: number;
  /** Runs accepted and not yet finished (running or waiting), and how many may be. */
  private inFlight = 0;
  private readonly capacity: number;

  constructor(options: AnalysisPoolOptions = {}) {
    const threads = options.maxThreads ?? Math.max(1, os.availableParallelism() - 1);
    this.graceMs = options.graceMs ?? DEFAULT_GRACE_MS;
    this.capacity = threads + (options.maxQueue ?? 16);
    this.piscina = new Piscina<AnalysisTask, AnalysisOutcome>({
      filename: new URL('./analysis.worker.ts', import.meta.url).href,
      execArgv: ['--import', 'tsx'],
      minThreads: Math.min(options.minThreads ?? 1, threads),
      maxThreads: threads,
      idleTimeout: 60_000,
      resourceLimits: { maxOldGenerationSizeMb: options.maxHeapMb ?? 1024 },
    });
    // A worker that fails outside a task (e.g. while starting) must not take the server down;
    // piscina replaces it and the affected run reports the failure.
    this.piscina.on('error', (error: unknown) => {
      console.error('[analysis-pool] a worker failed:', error instanceof Error ? error.message : error);
    });
  }

  async run(request: unknown, options: RunOptions = {}): Promise<AnalysisOutcome> {
    const budgetMs = Math.min(Math.max(1, options.budgetMs ?? ENGINE_DEFAULTS.timeLimitMs), ENGINE_LIMITS.timeLimitMsMax);
    const hardLimitMs = options.hardLimitMs ?? budgetMs + this.graceMs;
    const timeout = AbortSignal.timeout(hardLimitMs);
    const signal = options.signal ? AbortSignal.any([options.signal, timeout]) : timeout;
    if (this.inFlight >= this.capacity) throw new AnalysisPoolBusyError();
    this.inFlight += 1;
    const started = performance.now();
    const channel = options.onStart ? new MessageChannel() : null;
    if (channel && options.onStart) {
      const onStart = options.onStart;
      channel.port1.once('message', () => onStart());
      channel.port1.unref();
    }
    try {
      const task: AnalysisTask = channel ? { request, budgetMs, progress: channel.port2 } : { request, budgetMs };
      return await this.piscina.run(task, { signal, ...(channel ? { transferList: [channel.port2] } : {}) });
    } catch (error) {
      const elapsedMs = Math.round(performance.now() - started);
      if (options.signal?.aborted) {
        return { status: 'error', error: { code: RUN_ERROR_CODES.cancelled, message: 'The run was cancelled' }, elapsedMs };
      }
      if (timeout.aborted) {
        return {
          status: 'error',
          error: {
            code: RUN_ERROR_CODES.timeLimit,
            message: `The analysis ran past its time limit (${(hardLimitMs / 1000).toFixed(1)} s) and was stopped; ask for fewer points or a smaller range`,
          },
          elapsedMs,
        };
      }
      const message = error instanceof Error ? error.message : String(error);
      return { status: 'error', error: { code: RUN_ERROR_CODES.crashed, message: `The analysis worker failed: ${message}` }, elapsedMs };
    } finally {
      this.inFlight -= 1;
      channel?.port1.close();
    }
  }

  async close(): Promise<void> {
    await this.piscina.destroy();
  }
}

let shared: AnalysisPool | null = null;

/** The server's one pool, created on first use (with `options`, e.g. ANALYSIS_WORKERS threads). */
export function getAnalysisPool(options?: AnalysisPoolOptions): AnalysisPool {
  shared ??= new AnalysisPool(options);
  return shared;
}

/** Stops the server's pool (at shutdown and after tests). */
export async function closeAnalysisPool(): Promise<void> {
  const pool = shared;
  shared = null;
  if (pool) await pool.close();
}
