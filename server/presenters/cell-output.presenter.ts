import type { RunCellResponse, RunProgress } from '@shared/api/entries.ts';
import type { ActiveRun } from '@server/analysis/run-registry.ts';
import type { AnalysisOutcome } from '@server/analysis/analysis-task.ts';
import type { AnalysisResultEntity } from '@server/entities/analysis-result.entity.ts';

/** A fresh run's outcome as a cell output. */
export function presentRunOutcome(
  outcome: AnalysisOutcome,
  meta: { inputHash: string; engineVersion: string; computedAt: Date },
): RunCellResponse {
  const base = {
    inputHash: meta.inputHash,
    engineVersion: meta.engineVersion,
    computedAt: meta.computedAt.toISOString(),
    elapsedMs: outcome.elapsedMs,
    cached: false,
  };
  return outcome.status === 'ok' ? { ...base, status: 'ok', result: outcome.result } : { ...base, status: 'error', error: outcome.error };
}

/** A stored earlier run as a cell output (marked cached; computedAt is when it was first computed). */
export function presentStoredResult(row: AnalysisResultEntity): RunCellResponse {
  return {
    inputHash: row.inputHash,
    engineVersion: row.engineVersion,
    computedAt: row.computedAt.toISOString(),
    status: 'ok',
    result: row.result,
    elapsedMs: row.elapsedMs,
    cached: true,
  };
}

/** A cell's run in progress (or none). */
export function presentRunProgress(run: ActiveRun | null, now = new Date()): RunProgress {
  if (!run) return { state: 'idle' };
  return {
    state: run.startedAt ? 'running' : 'waiting',
    startedBy: { id: run.startedBy.id, name: run.startedBy.name },
    acceptedAt: run.acceptedAt.toISOString(),
    startedAt: run.startedAt?.toISOString() ?? null,
    elapsedMs: now.getTime() - run.acceptedAt.getTime(),
    budgetMs: run.budgetMs,
  };
}
