export { EntryEditor } from './components/entry-editor.tsx';
export { newCellId } from './extensions/cell-node.ts';
