import type { DataSource } from 'typeorm';
import type { RunCellInput, RunCellResponse } from '@shared/api/entries.ts';
import { analyzeRequestSchema, ENGINE_ERROR_CODES, type AnalyzeResult } from '@shared/engine/contract.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import type { AnalysisPool } from '@server/analysis/analysis-pool.ts';
import type { AnalysisOutcome } from '@server/analysis/analysis-task.ts';
import { runRegistry } from '@server/analysis/run-registry.ts';
import { AnalysisResultEntity } from '@server/entities/analysis-result.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { presentRunOutcome, presentStoredResult } from '@server/presenters/cell-output.presenter.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { requestInputHash } from './request-hash.ts';

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
 * hash. Runs happen outside any transaction (they may take seconds); the result and the audit
 * event are written together afterwards. Successful runs are stored (the latest run of an input
 * replaces an earlier one); request errors come back as an error output with the field path and
 * are not stored. A cancelled run writes nothing.
 */
export async function runCell(deps: { dataSource: DataSource; pool: AnalysisPool }, props: RunCellProps): Promise<RunCellResponse> {
  const { model, task, timeLimitMs } = props.request;
  const inputHash = requestInputHash(ENGINE_VERSION, { model, task });
  const budgetCheck = analyzeRequestSchema.shape.timeLimitMs.safeParse(timeLimitMs);
  if (!budgetCheck.success) {
    const message = `timeLimitMs: ${budgetCheck.error.issues[0]?.message ?? 'not a valid time budget'}`;
    return presentRunOutcome(
      { status: 'error', error: { code: ENGINE_ERROR_CODES.invalidRequest, message, path: 'timeLimitMs' }, elapsedMs: 0 },
      { inputHash, engineVersion: ENGINE_VERSION, computedAt: new Date() },
    );
  }
  const stored = await deps.dataSource.manager.findOne(AnalysisResultEntity, { where: { inputHash } });
  if (stored && !stoppedByTimeLimit(stored.result)) return presentStoredResult(stored);

  const budgetMs = budgetCheck.data ?? ENGINE_DEFAULTS.timeLimitMs;
  const run = runRegistry.begin({ entryId: props.entry.id, cellId: props.cellId, startedBy: props.actor, budgetMs });
  const signal = props.signal ? AbortSignal.any([props.signal, run.controller.signal]) : run.controller.signal;
  let outcome: AnalysisOutcome;
  try {
    const request = { model, task, ...(budgetCheck.data !== undefined ? { timeLimitMs: budgetCheck.data } : {}) };
    outcome = await deps.pool.run(request, { budgetMs, signal, onStart: () => runRegistry.markStarted(run) });
  } finally {
    runRegistry.finish(run);
  }
  const computedAt = new Date();
  const output = presentRunOutcome(outcome, { inputHash, engineVersion: ENGINE_VERSION, computedAt });
  if (signal.aborted) return output;

  await deps.dataSource.transaction(async (manager) => {
    if (outcome.status === 'ok') {
      await manager
        .createQueryBuilder()
        .insert()
        .into(AnalysisResultEntity)
        .values({
          inputHash,
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
      actorId: props.actor.id,
      action: 'cell.run',
      entityType: 'cell',
      entityId: props.cellId,
      notebookId: props.entry.notebookId,
      summary: {
        entryId: props.entry.id,
        inputHash,
        engineVersion: ENGINE_VERSION,
        status: outcome.status,
        elapsedMs: outcome.elapsedMs,
        ...(outcome.status === 'error' ? { errorCode: outcome.error.code } : {}),
      },
    });
  });
  return output;
}
