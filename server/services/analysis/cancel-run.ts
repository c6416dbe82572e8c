import type { DataSource, EntityManager } from 'typeorm';
import { RUN_ERROR_CODES } from '@server/analysis/analysis-task.ts';
import type { RunQueue } from '@server/analysis/run-queue.ts';
import type { AnalysisRunEntity } from '@server/entities/analysis-run.entity.ts';
import { runErrorOutput, settleActiveRuns, type ActiveRunFilter } from './run-rows.ts';

/** Cancels the matching runs in progress inside a transaction; returns them as they were. */
export function cancelActiveRuns(manager: EntityManager, filter: ActiveRunFilter, reason?: string): Promise<AnalysisRunEntity[]> {
  const message = reason ? `The run was cancelled: ${reason}` : 'The run was cancelled';
  return settleActiveRuns(manager, filter, 'cancelled', (run) => runErrorOutput(run, RUN_ERROR_CODES.cancelled, message));
}

/** The pg-boss jobs of runs that were still waiting for a worker. */
export function waitingJobIds(runs: AnalysisRunEntity[]): string[] {
  return runs.filter((run) => run.status === 'queued' && run.jobId).map((run) => run.jobId as string);
}

/**
 * Cancels a run in progress from any instance: the row says "cancelled" (and holds the answer
 * its waiting request sends), the instance running it stops its worker on the notification, and
 * a run still waiting leaves the queue. False when no run was in progress.
 */
export async function cancelRun(deps: { dataSource: DataSource; queue: RunQueue }, filter: ActiveRunFilter, reason?: string): Promise<boolean> {
  const ended = await deps.dataSource.transaction((manager) => cancelActiveRuns(manager, filter, reason));
  await deps.queue.cancel(waitingJobIds(ended));
  return ended.length > 0;
}
