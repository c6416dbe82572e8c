import type { DataSource } from 'typeorm';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import type { AnalysisPool } from '@server/analysis/analysis-pool.ts';
import { RUN_ERROR_CODES, type AnalysisOutcome } from '@server/analysis/analysis-task.ts';
import { RUN_CHANNELS, type RunNotifications } from '@server/analysis/run-notifications.ts';
import { AnalysisResultEntity } from '@server/entities/analysis-result.entity.ts';
import { AnalysisRunEntity } from '@server/entities/analysis-run.entity.ts';
import { presentRunOutcome } from '@server/presenters/cell-output.presenter.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { failRun, settleActiveRuns } from './run-rows.ts';

export interface ExecuteRunDeps {
  dataSource: DataSource;
  pool: AnalysisPool;
  /** This instance's listener; without it (the demo seed) a run cannot be cancelled. */
  notifications?: RunNotifications;
  /** This instance's name, stored on the run. */
  instance: string;
}

/**
 * A worker's part of a cell run (a pg-boss job): takes the run if it is still queued (a run
 * cancelled while it waited is skipped), runs it in this instance's pool, and stores the result,
 * the `cell.run` audit event and the run's output and status in one transaction, which notifies
 * the waiting request. A reproducibility rerun stores only its output and status: the check
 * compares it, and the signature keeps the check's report. A cancel notification for the run
 * stops its worker thread; a run that was cancelled meanwhile writes nothing.
 */
export async function executeRun(deps: ExecuteRunDeps, runId: string): Promise<void> {
  const controller = new AbortController();
  const stopListening = deps.notifications?.on(RUN_CHANNELS.cancelled, runId, () => controller.abort());
  try {
    const claimed = await deps.dataSource
      .createQueryBuilder()
      .update(AnalysisRunEntity)
      .set({ status: 'running', startedAt: () => 'now()', instance: deps.instance })
      .where(`id = :runId AND status = 'queued'`, { runId })
      .execute();
    if (!claimed.affected) return;
    const run = await deps.dataSource.manager.findOneByOrFail(AnalysisRunEntity, { id: runId });
    const { model, task, timeLimitMs } = run.request;
    const request = { model, task, ...(timeLimitMs !== undefined ? { timeLimitMs } : {}) };
    let outcome: AnalysisOutcome;
    try {
      outcome = await deps.pool.run(request, { budgetMs: run.budgetMs, signal: controller.signal });
    } catch (error) {
      // The pool refused it (it holds as many runs as it accepts): the run fails, saying why.
      await failRun(deps.dataSource, run.id, RUN_ERROR_CODES.crashed, error instanceof Error ? error.message : String(error));
      return;
    }
    if (controller.signal.aborted) return;

    const computedAt = new Date();
    const output = presentRunOutcome(outcome, { inputHash: run.inputHash, engineVersion: ENGINE_VERSION, computedAt });
    await deps.dataSource.transaction(async (manager) => {
      const settled = await settleActiveRuns(manager, { id: run.id }, 'finished', () => output);
      if (!settled.length || run.purpose === 'reproducibility') return;
      if (outcome.status === 'ok') {
        await manager
          .createQueryBuilder()
          .insert()
          .into(AnalysisResultEntity)
          .values({
            inputHash: run.inputHash,
            engineVersion: ENGINE_VERSION,
            taskKind: typeof task.kind === 'string' ? task.kind : 'unknown',
            result: outcome.result,
            elapsedMs: outcome.elapsedMs,
            computedAt,
          })
          .orUpdate(['engine_version', 'task_kind', 'result', 'elapsed_ms', 'computed_at'], ['input_hash'])
          .execute();
      }
      await recordEvent(manager, {
        actorId: run.startedById,
        action: 'cell.run',
        entityType: 'cell',
        entityId: run.cellId,
        notebookId: run.notebookId,
        summary: {
          entryId: run.entryId,
          inputHash: run.inputHash,
          engineVersion: ENGINE_VERSION,
          status: outcome.status,
          elapsedMs: outcome.elapsedMs,
          ...(outcome.status === 'error' ? { errorCode: outcome.error.code } : {}),
        },
      });
    });
  } finally {
    stopListening?.();
  }
}
