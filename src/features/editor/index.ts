export { EntryEditor } from './components/entry-editor.tsx';
export { KatexFormula, renderLatex } from './components/katex-formula.tsx';
export { newCellId } from './extensions/cell-node.ts';
