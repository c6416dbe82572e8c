export { CellNodeView } from './components/cell-node-view.tsx';
export { defaultCellInput } from './components/default-cell-input.ts';
export { CellsContext, type CellsRuntime } from './runtime/cells-context.tsx';
export { useCellRunner } from './runtime/use-cell-runner.ts';
