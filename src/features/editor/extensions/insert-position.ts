import { NodeSelection, type EditorState } from '@tiptap/pm/state';

/**
 * Where a new block goes: after the selected block (a selected cell or equation is never
 * replaced), in place of an empty paragraph the cursor sits in, else after the top-level block
 * holding the cursor.
 */
export function blockInsertPosition(state: EditorState): { from: number; to: number } {
  const { selection } = state;
  if (selection instanceof NodeSelection) return { from: selection.to, to: selection.to };
  const $from = selection.$from;
  if ($from.depth === 0) return { from: selection.to, to: selection.to };
  const parent = $from.parent;
  if (parent.isTextblock && parent.content.size === 0 && $from.depth === 1)
    return { from: $from.before(1), to: $from.after(1) };
  const after = $from.after(1);
  return { from: after, to: after };
}
