import type { CellOutputs } from '@shared/cells/output.ts';
import type { DocNode, DocumentCell } from '@shared/editor/document.ts';
import type {
  ContinuationResult,
  EquilibriaResult,
  FoldCurveResult,
  SimulateResult,
} from '@shared/engine/contract.ts';
import type { DemoNotebookKey, DemoPersonKey } from '../demo-people.ts';

/** The engine results of a revision's cells, by cell id; each accessor throws when the cell has no such result. */
export interface CellResults {
  equilibria(cellId: string): EquilibriaResult;
  branch(cellId: string): ContinuationResult;
  foldMap(cellId: string): FoldCurveResult;
  trajectory(cellId: string): SimulateResult;
  outputs: CellOutputs;
}

/**
 * One revision as its author saves it: the cells it holds (they are run first, through the run
 * service) and the body, written once the results are known so the prose can quote them.
 */
export interface ScenarioRevision {
  author: DemoPersonKey;
  message: string;
  cells: DocumentCell[];
  body(results: CellResults): DocNode[];
}

export interface ScenarioEntry {
  /** Stable name within the scenario (reviews and comments refer to entries by it). */
  key: string;
  title: string;
  /** Days before the seed date. */
  daysAgo: number;
  tags: string[];
  /** Who creates the entry. */
  author: DemoPersonKey;
  /** Saved in order on top of the entry's first (empty) revision. */
  revisions: ScenarioRevision[];
}

export interface ScenarioNotebook {
  notebook: DemoNotebookKey;
  entries: ScenarioEntry[];
}
