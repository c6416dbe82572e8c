import { randomUUID } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import type { RunCellInput, RunCellResponse } from '@shared/api/entries.ts';
import { analyzeRequestSchema, ENGINE_ERROR_CODES, type AnalyzeResult } from '@shared/engine/contract.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import { DEFAULT_GRACE_MS, type AnalysisPool } from '@server/analysis/analysis-pool.ts';
import { RUN_ERROR_CODES } from '@server/analysis/analysis-task.ts';
import { RUN_CHANNELS } from '@server/analysis/run-notifications.ts';
import type { RunQueue } from '@server/analysis/run-queue.ts';
import { AnalysisResultEntity } from '@server/entities/analysis-result.entity.ts';
import { AnalysisRunEntity } from '@server/entities/analysis-run.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { presentRunOutcome, presentStoredResult } from '@server/presenters/cell-output.presenter.ts';
import { cancelActiveRuns, cancelRun, waitingJobIds } from './cancel-run.ts';
import { executeRun } from './execute-run.ts';
import { requestInputHash } from './request-hash.ts';
import { failRun, runErrorOutput } from './run-rows.ts';

/**
 * A run cut short by its time budget depends on the machine's load and the budget: it is stored
 * (so its output can be recorded) but never answers a later run, which computes afresh.
 */
function stoppedByTimeLimit(result: AnalyzeResult): boolean {
  const reasons = [
    'stopReason' in result ? result.stopReason : undefined,
    'branch' in result ? result.branch.stopReason : undefined,
    'branch' in result ? result.branch.stopReasonAtStart : undefined,
    'curve' in result ? result.curve.stopReason : undefined,
    'curve' in result ? result.curve.stopReasonAtStart : undefined,
  ];
  return reasons.includes('time-limit');
}

export interface RunCellDeps {
  dataSource: DataSource;
  queue: RunQueue;
}

export interface RunCellProps {
  actor: { id: string; name: string };
  /** The entry the cell belongs to (loaded and authorized for "run"). */
  entry: EntryEntity;
  cellId: string;
  request: RunCellInput;
  /** Aborted when the caller goes away: the run is cancelled (as is a run superseded or cancelled by DELETE). */
  signal?: AbortSignal;
}

/**
 * Runs a cell's engine request, or answers from the store of earlier runs with the same input
 * hash. A run is a row (analysis_run) and a job in the queue every instance shares: this
 * instance queues it (superseding the cell's earlier run), and waits for whichever instance's
 * worker takes it to write its output (see execute-run.ts), woken by a notification or, failing
 * that, a slow poll. The engine's time budget starts when a worker takes the run, not while it
 * waits; a run that waits longer than the queue limit fails as "queue busy". Returns null when
 * the caller went away (the run is cancelled).
 */
export async function runCell(deps: RunCellDeps, props: RunCellProps): Promise<RunCellResponse | null> {
  const prepared = await prepareRun(deps.dataSource, props);
  if ('answer' in prepared) return prepared.answer;
  const { run, superseded } = prepared;
  await deps.queue.cancel(waitingJobIds(superseded));
  await queueRun(deps, run);
  return awaitRun(deps, run, props.signal);
}

export interface RerunCellProps {
  actor: { id: string };
  /** The entry whose revision is being checked. */
  entry: Pick<EntryEntity, 'id' | 'notebookId'>;
  cellId: string;
  /** The engine request the revision's cell resolves to. */
  request: { model: unknown; task: unknown };
  /** The engine's time budget (from when a worker takes the rerun). */
  budgetMs: number;
  /** Aborting it cancels the rerun (queued or running); the answer is then null. */
  signal?: AbortSignal;
}

/**
 * A rerun of a cell for the reproducibility check before signing: computed afresh (never answered
 * from the store) through the same queue as cell runs, by whichever instance has a free worker.
 * Its row is a "reproducibility" run: it does not supersede the cell's own run in progress nor is
 * superseded by one, and its worker stores neither a result nor an audit event (the signature
 * keeps the check's report). Returns the rerun's output, or null when `signal` ended it first.
 */
export async function rerunCell(deps: RunCellDeps, props: RerunCellProps): Promise<RunCellResponse | null> {
  const run = await deps.dataSource.manager.save(newRerun(deps.dataSource.manager, props));
  await queueRun(deps, run);
  return awaitRun(deps, run, props.signal);
}

function newRerun(manager: EntityManager, props: Omit<RerunCellProps, 'signal'>): AnalysisRunEntity {
  const request = { model: props.request.model, task: props.request.task as AnalysisRunEntity['request']['task'] };
  return newRun(manager, { ...props, purpose: 'reproducibility', inputHash: requestInputHash(ENGINE_VERSION, request), request });
}

/** Sends a run's job; a run that could not be queued fails at once (it must not stay "waiting"). */
async function queueRun(deps: RunCellDeps, run: AnalysisRunEntity): Promise<void> {
  try {
    await deps.queue.send(run.jobId as string, { runId: run.id }, run.budgetMs + DEFAULT_GRACE_MS);
  } catch (error) {
    await failRun(deps.dataSource, run.id, RUN_ERROR_CODES.lost, 'The run could not be queued; try again in a moment');
    throw error;
  }
}

/** A new run's row, queued now with a job id of its own. */
function newRun(
  manager: EntityManager,
  props: Pick<RerunCellProps, 'actor' | 'entry' | 'cellId' | 'budgetMs'> & Pick<AnalysisRunEntity, 'purpose' | 'inputHash' | 'request'>,
): AnalysisRunEntity {
  return manager.create(AnalysisRunEntity, {
    notebookId: props.entry.notebookId,
    entryId: props.entry.id,
    cellId: props.cellId,
    purpose: props.purpose,
    inputHash: props.inputHash,
    request: props.request,
    startedById: props.actor.id,
    status: 'queued',
    budgetMs: props.budgetMs,
    jobId: randomUUID(),
    queuedAt: new Date(),
  });
}

/**
 * The same run computed at once in the given pool, without the queue or waiting: for the demo
 * seed, which records entries before any server runs. Stores the same rows and audit event.
 */
export async function runCellInPool(deps: InPoolDeps, props: Omit<RunCellProps, 'signal'>): Promise<RunCellResponse> {
  const prepared = await prepareRun(deps.dataSource, props);
  if ('answer' in prepared) return prepared.answer;
  return executeInPool(deps, prepared.run);
}

/** A reproducibility rerun computed at once in the given pool (the demo seed signs before any server runs). */
export async function rerunCellInPool(deps: InPoolDeps, props: Omit<RerunCellProps, 'signal'>): Promise<RunCellResponse> {
  return executeInPool(deps, await deps.dataSource.manager.save(newRerun(deps.dataSource.manager, props)));
}

interface InPoolDeps {
  dataSource: DataSource;
  pool: AnalysisPool;
}

async function executeInPool(deps: InPoolDeps, queued: AnalysisRunEntity): Promise<RunCellResponse> {
  await executeRun({ dataSource: deps.dataSource, pool: deps.pool, instance: 'seed' }, queued.id);
  const run = await deps.dataSource.manager.findOneByOrFail(AnalysisRunEntity, { id: queued.id });
  return run.output ?? runErrorOutput(run, RUN_ERROR_CODES.crashed, 'The run ended without an output');
}

/**
 * What every run starts with: a bad budget or a stored result answers at once; otherwise the
 * run's row is queued, superseding (cancelling) the cell's run in progress.
 */
async function prepareRun(
  dataSource: DataSource,
  props: Omit<RunCellProps, 'signal'>,
): Promise<{ answer: RunCellResponse } | { run: AnalysisRunEntity; superseded: AnalysisRunEntity[] }> {
  const { model, task, timeLimitMs } = props.request;
  const inputHash = requestInputHash(ENGINE_VERSION, { model, task });
  const budgetCheck = analyzeRequestSchema.shape.timeLimitMs.safeParse(timeLimitMs);
  if (!budgetCheck.success) {
    const message = `timeLimitMs: ${budgetCheck.error.issues[0]?.message ?? 'not a valid time budget'}`;
    const answer = presentRunOutcome(
      { status: 'error', error: { code: ENGINE_ERROR_CODES.invalidRequest, message, path: 'timeLimitMs' }, elapsedMs: 0 },
      { inputHash, engineVersion: ENGINE_VERSION, computedAt: new Date() },
    );
    return { answer };
  }
  const stored = await dataSource.manager.findOneBy(AnalysisResultEntity, { inputHash });
  if (stored && !stoppedByTimeLimit(stored.result)) return { answer: presentStoredResult(stored) };

  const budgetMs = budgetCheck.data ?? ENGINE_DEFAULTS.timeLimitMs;
  const request = { model, task: task as AnalysisRunEntity['request']['task'], ...(budgetCheck.data !== undefined ? { timeLimitMs: budgetCheck.data } : {}) };
  return dataSource.transaction(async (manager) => {
    // One run in progress per cell: concurrent starts of the same cell take turns here.
    await manager.query('SELECT pg_advisory_xact_lock(hashtextextended($1, 0))', [`analysis_run:${props.entry.id}:${props.cellId}`]);
    const superseded = await cancelActiveRuns(manager, { entryId: props.entry.id, cellId: props.cellId }, 'a newer run of this cell replaced it');
    const run = await manager.save(newRun(manager, { ...props, purpose: 'cell', inputHash, request, budgetMs }));
    return { run, superseded };
  });
}

/**
 * Waits until the run is over and returns its output. Each turn reads the row; between turns it
 * sleeps until the run's "settled" notification, the caller going away, or the poll interval.
 * On a poll it also checks the run's job: one that pg-boss failed (the instance running it
 * stopped and the job expired) or that is gone fails the run with a clear message.
 */
async function awaitRun(deps: RunCellDeps, first: AnalysisRunEntity, signal?: AbortSignal): Promise<RunCellResponse | null> {
  const { wait } = deps.queue;
  const hardLimitMs = first.budgetMs + DEFAULT_GRACE_MS;
  let wake: (() => void) | null = null;
  const onWake = () => wake?.();
  const stopListening = deps.queue.notifications.on(RUN_CHANNELS.settled, first.id, onWake);
  signal?.addEventListener('abort', onWake);
  let polled = false;
  try {
    for (;;) {
      let timer: NodeJS.Timeout | undefined;
      const woken = new Promise<boolean>((resolve) => {
        wake = () => resolve(false);
        timer = setTimeout(() => resolve(true), wait.pollMs);
      });
      const run = await deps.dataSource.manager.findOneBy(AnalysisRunEntity, { id: first.id });
      if (!run) return runErrorOutput(first, RUN_ERROR_CODES.cancelled, 'The run was removed with its entry');
      if (run.output) return run.output;
      if (signal?.aborted) {
        await cancelRun(deps, { id: run.id }, 'its request was closed');
        return null;
      }
      await failIfOverdue(deps, run, hardLimitMs, polled);
      polled = await woken;
      clearTimeout(timer);
    }
  } finally {
    wake = null;
    stopListening();
    signal?.removeEventListener('abort', onWake);
  }
}

/** Fails a run that waited in the queue too long, or whose worker is gone (checked on polls). */
async function failIfOverdue(deps: RunCellDeps, run: AnalysisRunEntity, hardLimitMs: number, checkJob: boolean): Promise<void> {
  const now = Date.now();
  let failure: { code: string; message: string } | null = null;
  if (run.status === 'queued' && now - run.queuedAt.getTime() > deps.queue.wait.queueWaitMs) {
    const seconds = Math.round(deps.queue.wait.queueWaitMs / 1000);
    failure = { code: RUN_ERROR_CODES.queueBusy, message: `The analysis queue is busy: no worker was free for this run within ${seconds} s; try again in a moment` };
  } else if (run.status === 'running' && run.startedAt && now - run.startedAt.getTime() > deps.queue.runningLimitMs(hardLimitMs)) {
    failure = { code: RUN_ERROR_CODES.lost, message: 'The server running this analysis stopped answering before it finished; run it again' };
  } else if (checkJob && run.jobId) {
    const state = await deps.queue.jobState(run.jobId);
    if (state === 'failed' || state === 'cancelled' || state === 'completed' || state === null) {
      failure = { code: RUN_ERROR_CODES.lost, message: 'The server running this analysis stopped before it finished; run it again' };
    }
  }
  if (!failure) return;
  const ended = await failRun(deps.dataSource, run.id, failure.code, failure.message);
  await deps.queue.cancel(waitingJobIds(ended));
}
