import type { CellReproducibility, ReproducibilityReport } from '@shared/api/reviews.ts';
import { REPRODUCIBILITY_RELATIVE_TOLERANCE } from '@shared/api/reviews.ts';
import { resolveFromCells } from '@shared/cells/resolve.ts';
import { isAnalysisKind } from '@shared/cells/kinds.ts';
import type { CellOutputs } from '@shared/cells/output.ts';
import { extractCells, type DocumentJson } from '@shared/editor/document.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';
import type { RunCellResponse } from '@shared/api/entries.ts';
import { DEFAULT_GRACE_MS } from '@server/analysis/analysis-pool.ts';
import { RUN_ERROR_CODES } from '@server/analysis/analysis-task.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import { requestInputHash } from '@server/services/analysis/request-hash.ts';
import { compareResults } from './compare-results.ts';

export interface ReproduceOptions {
  /** Total time for every rerun together (default 60 s); cells left when it runs out are "not-checked". */
  totalBudgetMs?: number;
  tolerance?: number;
}

/**
 * Computes one cell afresh with the current engine, never from the store of earlier runs, within
 * `budgetMs` of engine time; `signal` ends it (the answer is then null).
 */
export type RerunCell = (props: { cellId: string; request: { model: unknown; task: unknown }; budgetMs: number; signal: AbortSignal }) => Promise<RunCellResponse | null>;

/**
 * Rerun failures that say nothing about the cell: the rerun was not computed (no worker free,
 * cancelled, or the instance running it stopped). A worker that crashed on the cell is a result.
 */
const NOT_COMPUTED_CODES: readonly string[] = [RUN_ERROR_CODES.queueBusy, RUN_ERROR_CODES.cancelled, RUN_ERROR_CODES.lost];

const stoppedByTimeLimit = (r: unknown): boolean => JSON.stringify(r).includes('"time-limit"');

/**
 * Reruns every analysis cell of a revision with the current engine (through `rerun`, which
 * queues it for any instance's worker, never answering from the store of earlier runs) and
 * compares each result with the output the revision stores. Cells without a stored output, or
 * whose stored run was cut short by its time budget, are "not-checked" with the reason. Runs one
 * cell at a time within a total time budget: a rerun still waiting or running when it is spent
 * (plus the pool's grace) is cancelled, and it and the cells after it are "not-checked".
 */
export async function checkReproducibility(
  rerun: RerunCell,
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
    const output = await rerun({
      cellId: cell.id,
      request: { model: resolution.request.model, task: resolution.request.task },
      budgetMs,
      signal: AbortSignal.timeout(remaining + DEFAULT_GRACE_MS),
    });
    if (!output) {
      report('not-checked', [...notes, 'the time for the reproducibility check ran out before the rerun of this cell ended']);
      continue;
    }
    if (output.status === 'error' && NOT_COMPUTED_CODES.includes(output.error?.code ?? '')) {
      report('not-checked', [...notes, `the rerun was not computed: ${output.error?.message ?? 'no reason given'}`]);
      continue;
    }

    let differences: string[];
    if (stored.status === 'error' || output.status === 'error') {
      const a = stored.status === 'error' ? `error "${stored.error?.code}"` : 'a result';
      const b = output.status === 'error' ? `error "${output.error?.code}"` : 'a result';
      differences = stored.status === 'error' && output.status === 'error' && stored.error?.code === output.error?.code ? [] : [`stored ${a}, rerun ${b}`];
    } else if (stoppedByTimeLimit(output.result)) {
      report('not-checked', [...notes, 'the rerun was cut short by its time budget']);
      continue;
    } else {
      const parameter = 'parameter' in resolution.request.task ? String(resolution.request.task.parameter) : null;
      differences = !stored.result ? ['the stored output has no result'] : !output.result ? ['the rerun has no result'] : compareResults(stored.result, output.result, parameter, tol);
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
