import { analyzeRequestSchema, type Model, type Task } from '../engine/contract.ts';
import { extractCells, type DocumentCell, type DocumentJson } from '../editor/document.ts';
import { inputHash } from './hash.ts';
import {
  checkCellInput,
  problemsFromZod,
  toEngineModel,
  TASK_KIND_BY_CELL,
  type FieldProblem,
} from './inputs.ts';
import { isAnalysisKind } from './kinds.ts';
import type { CellOutput } from './output.ts';

/** The engine request an analysis cell sends: the model of its model cell and its own task. */
export interface ResolvedRequest {
  model: Model;
  task: Task;
}

export type Resolution =
  { ok: true; request: ResolvedRequest; modelCell: DocumentCell } | { ok: false; problems: FieldProblem[] };

/**
 * Resolve an analysis cell's engine request from the document: find the model cell named by
 * `input.modelCellId`, check both inputs, and build `{ model, task }` with the contract's
 * defaults filled in (so that the same request always hashes the same, whichever defaults the
 * author left out).
 *
 * Problem paths: "modelCellId" when the model cell is missing, "model.<field>" for the model
 * cell's own fields (e.g. "model.variables[0].rhs"), "task.<field>" for the cell's task.
 */
export function resolveCellRequest(doc: DocumentJson, cellId: string): Resolution {
  const cells = extractCells(doc);
  const cell = cells.find((c) => c.id === cellId);
  if (!cell) return { ok: false, problems: [{ path: '', message: 'This cell is not in the entry' }] };
  return resolveFromCells(cells, cell);
}

/** As `resolveCellRequest`, with the document's cells already extracted. */
export function resolveFromCells(cells: readonly DocumentCell[], cell: DocumentCell): Resolution {
  if (!isAnalysisKind(cell.kind)) {
    return { ok: false, problems: [{ path: '', message: 'A model cell does not run by itself' }] };
  }
  const modelCellId = cell.input.modelCellId;
  const modelCell = cells.find((c) => c.id === modelCellId && c.kind === 'model');
  if (!modelCell) {
    return {
      ok: false,
      problems: [
        {
          path: 'modelCellId',
          message:
            typeof modelCellId === 'string' && modelCellId
              ? 'The chosen model cell is no longer in this entry'
              : 'Choose a model cell',
        },
      ],
    };
  }
  const problems: FieldProblem[] = [];
  const model = checkCellInput('model', modelCell.input);
  if (!model.ok)
    problems.push(...model.problems.map((p) => ({ ...p, path: p.path ? `model.${p.path}` : 'model' })));
  const own = checkCellInput(cell.kind, cell.input);
  if (!own.ok) problems.push(...own.problems);
  if (!model.ok || !own.ok) return { ok: false, problems };

  const task = own.value.task;
  if (task.kind !== TASK_KIND_BY_CELL[cell.kind]) {
    return {
      ok: false,
      problems: [{ path: 'task.kind', message: `This cell runs a "${TASK_KIND_BY_CELL[cell.kind]}" task` }],
    };
  }
  const parsed = analyzeRequestSchema.safeParse({ model: toEngineModel(model.value), task });
  if (!parsed.success) return { ok: false, problems: problemsFromZod(parsed.error) };
  return { ok: true, request: { model: parsed.data.model, task: parsed.data.task }, modelCell };
}

/** Analysis cells that use the given model cell, in reading order. */
export function cellsUsingModel(doc: DocumentJson, modelCellId: string): DocumentCell[] {
  return extractCells(doc).filter((c) => isAnalysisKind(c.kind) && c.input.modelCellId === modelCellId);
}

export type Freshness = 'never-run' | 'up-to-date' | 'stale' | 'invalid';

/**
 * Is an output still the output of the cell's current request? Stale when the hash of the
 * current resolved request (with the engine version the output records) differs from
 * `output.inputHash`; "invalid" when the current input cannot be resolved at all.
 */
export async function cellFreshness(
  resolution: Resolution,
  output: CellOutput | undefined,
): Promise<Freshness> {
  if (!resolution.ok) return 'invalid';
  if (!output) return 'never-run';
  const hash = await inputHash(output.engineVersion, resolution.request);
  return hash === output.inputHash ? 'up-to-date' : 'stale';
}

/** Whether a cell needs a run: stale, never run, or its last run failed on an older input. */
export function needsRun(freshness: Freshness): boolean {
  return freshness === 'stale' || freshness === 'never-run';
}
