import type { CellReproducibility, ReproducibilityReport } from '@shared/api/reviews.ts';
import { REPRODUCIBILITY_RELATIVE_TOLERANCE } from '@shared/api/reviews.ts';
import { resolveFromCells } from '@shared/cells/resolve.ts';
import { isAnalysisKind } from '@shared/cells/kinds.ts';
import type { CellOutputs } from '@shared/cells/output.ts';
import { extractCells, type DocumentJson } from '@shared/editor/document.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';
import type { AnalysisPool } from '@server/analysis/analysis-pool.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import { requestInputHash } from '@server/services/analysis/request-hash.ts';
import { compareResults } from './compare-results.ts';

export interface ReproduceOptions {
  /** Total time for every rerun together (default 60 s); cells left when it runs out are "not-checked". */
  totalBudgetMs?: number;
  tolerance?: number;
}

const stoppedByTimeLimit = (r: unknown): boolean => JSON.stringify(r).includes('"time-limit"');

/**
 * Reruns every analysis cell of a revision with the current engine (through the worker pool,
 * never answering from the store of earlier runs) and compares each result with the output the
 * revision stores. Cells without a stored output, or whose stored run was cut short by its time
 * budget, are "not-checked" with the reason. Runs one cell at a time, within a total time budget.
 */
export async function checkReproducibility(
  pool: AnalysisPool,
  revision: { document: DocumentJson; outputs: CellOutputs },
  options: ReproduceOptions = {},
): Promise<ReproducibilityReport> {
  const tol = options.tolerance ?? REPRODUCIBILITY_RELATIVE_TOLERANCE;
  const deadline = Date.now() + (options.totalBudgetMs ?? 60_000);
  const cells = extractCells(revision.document);
  const results: CellReproducibility[] = [];

  for (const cell of cells) {
    if (!isAnalysisKind(cell.kind)) continue;
    const report = (status: CellReproducibility['status'], differences: string[]) => results.push({ cellId: cell.id, kind: cell.kind, status, differences });
    const stored = revision.outputs[cell.id];
    if (!stored) {
      report('not-checked', ['the cell has no stored result to compare with']);
      continue;
    }
    const resolution = resolveFromCells(cells, cell);
    if (!resolution.ok) {
      report('not-checked', [`the cell's input cannot be run: ${resolution.problems.map((p) => `${p.path || 'cell'}: ${p.message}`).join('; ')}`]);
      continue;
    }
    if (stored.status === 'ok' && stoppedByTimeLimit(stored.result)) {
      report('not-checked', ['the stored run was cut short by its time budget, so a rerun cannot be compared']);
      continue;
    }
    const remaining = deadline - Date.now();
    if (remaining < 1000) {
      report('not-checked', ['the time for the reproducibility check ran out before this cell']);
      continue;
    }
    const notes: string[] = [];
    if (requestInputHash(stored.engineVersion, resolution.request) !== stored.inputHash) {
      notes.push('the stored result was computed from an earlier input of this cell');
    }
    if (stored.engineVersion !== ENGINE_VERSION) notes.push(`engine: stored ${stored.engineVersion}, rerun ${ENGINE_VERSION}`);

    const task = resolution.request.task as { timeLimitMs?: number };
    const budgetMs = Math.min(remaining, task.timeLimitMs ?? ENGINE_DEFAULTS.timeLimitMs);
    const outcome = await pool.run({ model: resolution.request.model, task: resolution.request.task }, { budgetMs });

    let differences: string[];
    if (stored.status === 'error' || outcome.status === 'error') {
      const a = stored.status === 'error' ? `error "${stored.error?.code}"` : 'a result';
      const b = outcome.status === 'error' ? `error "${outcome.error.code}"` : 'a result';
      differences = stored.status === 'error' && outcome.status === 'error' && stored.error?.code === outcome.error.code ? [] : [`stored ${a}, rerun ${b}`];
    } else if (stoppedByTimeLimit(outcome.result)) {
      report('not-checked', [...notes, 'the rerun was cut short by its time budget']);
      continue;
    } else {
      const parameter = 'parameter' in resolution.request.task ? String(resolution.request.task.parameter) : null;
      differences = stored.result ? compareResults(stored.result, outcome.result, parameter, tol) : ['the stored output has no result'];
    }
    const engineOnly = notes.filter((n) => n.startsWith('engine:'));
    const inputNotes = notes.filter((n) => !n.startsWith('engine:'));
    if (differences.length === 0 && inputNotes.length === 0) report('reproduced', engineOnly);
    else report('differs', [...inputNotes, ...differences, ...(differences.length ? engineOnly : [])]);
  }

  const status = results.some((c) => c.status === 'differs')
    ? 'differs'
    : results.length > 0 && results.every((c) => c.status === 'reproduced')
      ? 'reproduced'
      : 'not-checked';
  return {
    status,
    differences: results.flatMap((c) => (c.status === 'reproduced' ? [] : c.differences.map((d) => `cell ${c.cellId} (${c.kind}): ${d}`))),
    cells: results,
    engineVersion: ENGINE_VERSION,
    checkedAt: new Date().toISOString(),
    tolerance: tol,
  };
}
