import type { EntityManager } from 'typeorm';
import type { RunCellResponse } from '@shared/api/entries.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import type { AnalysisOutcome } from '@server/analysis/analysis-task.ts';
import { RUN_CHANNELS, type RunChannel } from '@server/analysis/run-notifications.ts';
import { ACTIVE_RUN_STATUSES, AnalysisRunEntity, type AnalysisRunStatus } from '@server/entities/analysis-run.entity.ts';
import { presentRunOutcome } from '@server/presenters/cell-output.presenter.ts';

/** Which runs in progress to end: one run, or the cell's run. */
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
    .where(filter)
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
