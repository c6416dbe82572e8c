import type { DataSource, EntityManager } from 'typeorm';
import type { RunCellResponse } from '@shared/api/entries.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import type { AnalysisOutcome } from '@server/analysis/analysis-task.ts';
import { RUN_CHANNELS, type RunChannel } from '@server/analysis/run-notifications.ts';
import { ACTIVE_RUN_STATUSES, AnalysisRunEntity, type AnalysisRunStatus } from '@server/entities/analysis-run.entity.ts';
import { presentRunOutcome } from '@server/presenters/cell-output.presenter.ts';

/** Which runs in progress to end: one run, or the cell's own run (never a reproducibility rerun of it). */
export type ActiveRunFilter = { id: string } | { entryId: string; cellId: string };

/** Sends a run notification; inside a transaction it is delivered at commit. */
export async function notifyRun(manager: EntityManager, channel: RunChannel, runId: string): Promise<void> {
  await manager.query('SELECT pg_notify($1, $2)', [channel, runId]);
}

/** The output of a run that ended without an engine answer (cancelled, queue busy, instance gone). */
export function runErrorOutput(run: Pick<AnalysisRunEntity, 'inputHash'>, code: string, message: string, elapsedMs = 0): RunCellResponse {
  const outcome: AnalysisOutcome = { status: 'error', error: { code, message }, elapsedMs };
  return presentRunOutcome(outcome, { inputHash: run.inputHash, engineVersion: ENGINE_VERSION, computedAt: new Date() });
}

/**
 * Ends the matching runs still queued or running (locking their rows): stores the output and the
 * status, and notifies their waiting requests and, for a run that did not finish, the instance
 * running it, which stops its worker. Returns the runs it ended as they were before; none when
 * they had already ended (a run ends once).
 */
export async function settleActiveRuns(
  manager: EntityManager,
  filter: ActiveRunFilter,
  status: Exclude<AnalysisRunStatus, 'queued' | 'running'>,
  output: (run: AnalysisRunEntity) => RunCellResponse,
): Promise<AnalysisRunEntity[]> {
  const runs = await manager
    .createQueryBuilder(AnalysisRunEntity, 'r')
    .where('id' in filter ? filter : { ...filter, purpose: 'cell' })
    .andWhere('r.status IN (:...active)', { active: ACTIVE_RUN_STATUSES })
    .setLock('pessimistic_write')
    .getMany();
  for (const run of runs) {
    await manager.update(AnalysisRunEntity, run.id, { status, output: output(run), finishedAt: new Date() });
    await notifyRun(manager, RUN_CHANNELS.settled, run.id);
    if (status !== 'finished' && run.status === 'running') await notifyRun(manager, RUN_CHANNELS.cancelled, run.id);
  }
  return runs;
}

/**
 * Fails one run still in progress with a run error (the waiting request answers it); returns the
 * run as it was, or nothing when it had already ended.
 */
export function failRun(dataSource: DataSource, runId: string, code: string, message: string): Promise<AnalysisRunEntity[]> {
  return dataSource.transaction((manager) => settleActiveRuns(manager, { id: runId }, 'failed', (run) => runErrorOutput(run, code, message)));
}

/** How long an ended run's row is kept (its request has long been answered; the audit trail stays). */
export const ENDED_RUN_RETENTION_MS = 60 * 60_000;

/**
 * Age past which a run still marked queued or running was abandoned (the instances that queued
 * and ran it both stopped): far beyond the longest wait in the queue plus the longest budget.
 */
export const ABANDONED_RUN_AGE_MS = 24 * 60 * 60_000;

/**
 * Deletes the runs of every cell that ended more than `retentionMs` ago, and those abandoned
 * unended; returns how many. Every instance sweeps now and then: one pass at a time across
 * instances (an advisory lock that makes the others skip their turn), so concurrent passes never
 * contend on rows.
 */
export async function pruneEndedRuns(dataSource: DataSource, retentionMs = ENDED_RUN_RETENTION_MS): Promise<number> {
  return dataSource.transaction(async (manager) => {
    const [{ locked }] = (await manager.query(`SELECT pg_try_advisory_xact_lock(hashtextextended('analysis_run:prune', 0)) AS locked`)) as { locked: boolean }[];
    if (!locked) return 0;
    const [, deleted] = (await manager.query(
      `DELETE FROM analysis_run
       WHERE finished_at < now() - make_interval(secs => $1)
          OR (finished_at IS NULL AND queued_at < now() - make_interval(secs => $2))`,
      [retentionMs / 1000, ABANDONED_RUN_AGE_MS / 1000],
    )) as [unknown, number];
    return deleted;
  });
}
