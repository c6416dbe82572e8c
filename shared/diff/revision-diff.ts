import { isAnalysisKind } from '../cells/kinds.ts';
import type { CellOutputs } from '../cells/output.ts';
import type { DocumentJson } from '../editor/document.ts';
import { diffCells, type CellPair } from './cell-input-diff.ts';
import { diffCellOutputs, resultContextFromInput, type ResultChange } from './result-diff.ts';
import { diffDocuments, type BlockDiff } from './text-diff.ts';

/** What two revisions hold that the comparison reads. */
export interface ComparableRevision {
  title: string;
  document: DocumentJson;
  outputs: CellOutputs;
}

export interface CellDiff extends CellPair {
  /** Result changes (analysis cells with an output on either side). */
  results: ResultChange[];
}

export interface RevisionDiff {
  title: { before: string; after: string } | null;
  blocks: BlockDiff[];
  cells: CellDiff[];
  /** Counts for a one-line summary. */
  summary: { blocksChanged: number; cellsChanged: number; resultChanges: number };
}

/** The whole comparison of two revisions of an entry: text, cell inputs, cell results. */
export function compareRevisions(older: ComparableRevision, newer: ComparableRevision): RevisionDiff {
  const blocks = diffDocuments(older.document, newer.document);
  const cells: CellDiff[] = diffCells(older.document, newer.document).map((pair) => {
    if (!isAnalysisKind(pair.kind)) return { ...pair, results: [] };
    const before = pair.older ? older.outputs[pair.older.id] : undefined;
    const after = pair.newer ? newer.outputs[pair.newer.id] : undefined;
    const results = diffCellOutputs(pair.kind, before, after, resultContextFromInput(pair.newer?.input ?? pair.older?.input));
    const meaningful = results.some((r) => r.kind !== 'unchanged');
    return { ...pair, status: pair.status === 'same' && meaningful ? 'changed' : pair.status, results };
  });
  return {
    title: older.title !== newer.title ? { before: older.title, after: newer.title } : null,
    blocks,
    cells,
    summary: {
      blocksChanged: blocks.filter((b) => b.status !== 'same').length,
      cellsChanged: cells.filter((c) => c.status !== 'same').length,
      resultChanges: cells.reduce((n, c) => n + c.results.filter((r) => r.kind !== 'unchanged').length, 0),
    },
  };
}
