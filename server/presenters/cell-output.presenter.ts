import type { RunCellResponse, RunProgress } from '@shared/api/entries.ts';
import type { AnalysisOutcome } from '@server/analysis/analysis-task.ts';
import type { AnalysisResultEntity } from '@server/entities/analysis-result.entity.ts';
import type { AnalysisRunEntity } from '@server/entities/analysis-run.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';

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

/** A cell's run in progress (or none): "waiting" while it is queued for a worker on any instance. */
export function presentRunProgress(run: (AnalysisRunEntity & { startedBy: UserEntity }) | null, now = new Date()): RunProgress {
  if (!run) return { state: 'idle' };
  return {
    state: run.status === 'running' ? 'running' : 'waiting',
    startedBy: { id: run.startedBy.id, name: run.startedBy.name },
    acceptedAt: run.queuedAt.toISOString(),
    startedAt: run.startedAt?.toISOString() ?? null,
    elapsedMs: Math.max(0, now.getTime() - run.queuedAt.getTime()),
    budgetMs: run.budgetMs,
  };
}
