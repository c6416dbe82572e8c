import { createContext, useContext, type ReactNode } from 'react';
import type { CellOutput, CellOutputs } from '@shared/cells/output.ts';
import type { Freshness } from '@shared/cells/resolve.ts';
import type { FieldProblem } from '@shared/cells/inputs.ts';
import type { DocumentCell, DocumentJson } from '@shared/editor/document.ts';
import type { Model } from '@shared/engine/contract.ts';

export interface RunState {
  /** Date.now() when the run started. */
  startedAt: number;
}

/** What every cell of one open entry shares: outputs, runs in flight and how to start them. */
export interface CellsRuntime {
  readOnly: boolean;
  doc: DocumentJson;
  cells: DocumentCell[];
  outputs: CellOutputs;
  /** Runs in flight, by cell id. */
  running: Record<string, RunState>;
  /** Freshness of each analysis cell's output against its current input. */
  freshness: Record<string, Freshness>;
  /** Problems that keep each cell from running (field paths relative to the cell, or "model.…"). */
  problems: Record<string, FieldProblem[]>;
  /** A run that failed before an output arrived (network, permission): the previous output is kept. */
  runErrors: Record<string, string>;
  /** Cells whose last output came from the server's store of earlier runs. */
  cached: Record<string, boolean>;
  run: (cellId: string) => void;
  cancel: (cellId: string) => void;
  /** Run every stale (or never run) cell, one after another in reading order. */
  runAllStale: () => void;
  /** Live check of a model by the engine's parser. */
  validateModel: (model: Model, signal: AbortSignal) => Promise<FieldProblem[]>;
  /**
   * Extra actions the page composes under an analysis cell's result (e.g. "attach as figure");
   * given the cell, returns nothing to add nothing.
   */
  cellExtras?: (cell: { id: string; kind: DocumentCell['kind'] }) => ReactNode;
}

export const CellsContext = createContext<CellsRuntime | null>(null);

export function useCellsRuntime(): CellsRuntime {
  const ctx = useContext(CellsContext);
  if (!ctx) throw new Error('Cells are drawn inside a CellsContext provider');
  return ctx;
}

export function useCellOutput(cellId: string): CellOutput | undefined {
  return useCellsRuntime().outputs[cellId];
}
