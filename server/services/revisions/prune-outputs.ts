import type { CellOutputs } from '@shared/cells/output.ts';
import { extractCells, type DocumentJson } from '@shared/editor/document.ts';

/** Keeps only the outputs of cells the document still holds (a deleted cell's output goes with it). */
export function pruneOutputs(document: DocumentJson, outputs: CellOutputs): CellOutputs {
  const ids = new Set(extractCells(document).map((c) => c.id));
  return Object.fromEntries(Object.entries(outputs).filter(([id]) => ids.has(id)));
}
