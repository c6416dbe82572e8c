import { Node, mergeAttributes } from '@tiptap/core';
import { Plugin, PluginKey } from '@tiptap/pm/state';
import type { Node as PmNode } from '@tiptap/pm/model';
import { ReactNodeViewRenderer, type ReactNodeViewProps } from '@tiptap/react';
import type { ComponentType } from 'react';
import type { CellKind } from '@shared/cells/kinds.ts';
import { blockInsertPosition } from './insert-position.ts';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    cell: {
      /** Insert a new cell after the current block. */
      insertCell: (kind: CellKind, input: Record<string, unknown>) => ReturnType;
      /** Move the cell at `pos` one block up or down within its parent. */
      moveCell: (pos: number, direction: 'up' | 'down') => ReturnType;
      /** Insert a copy of the cell at `pos` (with a new id) right after it. */
      duplicateCell: (pos: number) => ReturnType;
    };
  }
}

export interface CellNodeOptions {
  /** The React component that draws a cell (provided by the page that composes the editor). */
  view: ComponentType<ReactNodeViewProps> | null;
}

export const newCellId = (): string => crypto.randomUUID();

/**
 * A computation cell: an atom block holding `{ id, kind, input }`. Outputs live beside the
 * document, keyed by id, so ids stay unique: a pasted or duplicated cell gets a fresh id.
 */
export const CellNode = Node.create<CellNodeOptions>({
  name: 'cell',
  group: 'block',
  atom: true,
  draggable: true,
  selectable: true,
  isolating: true,
  addOptions: () => ({ view: null }),
  addAttributes: () => ({
    id: {
      default: null,
      parseHTML: (el) => el.getAttribute('data-cell-id'),
      renderHTML: (a) => ({ 'data-cell-id': a.id as string }),
    },
    kind: {
      default: 'model',
      parseHTML: (el) => el.getAttribute('data-kind'),
      renderHTML: (a) => ({ 'data-kind': a.kind as string }),
    },
    input: {
      default: {},
      parseHTML: (el) => {
        try {
          return JSON.parse(el.getAttribute('data-input') ?? '{}') as Record<string, unknown>;
        } catch {
          return {};
        }
      },
      renderHTML: (a) => ({ 'data-input': JSON.stringify(a.input ?? {}) }),
    },
  }),
  parseHTML: () => [{ tag: 'div[data-cell]' }],
  renderHTML: ({ HTMLAttributes }) => ['div', mergeAttributes(HTMLAttributes, { 'data-cell': '' })],
  renderText: ({ node }) => `[${node.attrs.kind as string} cell]`,
  addNodeView() {
    const view = this.options.view;
    if (!view) return null;
    return ReactNodeViewRenderer(view, { className: 'bf-cell-node my-5' });
  },
  addCommands() {
    return {
      insertCell:
        (kind, input) =>
        ({ state, commands }) =>
          commands.insertContentAt(blockInsertPosition(state), {
            type: this.name,
            attrs: { id: newCellId(), kind, input },
          }),
      moveCell:
        (pos, direction) =>
        ({ state, tr, dispatch }) => {
          const node = state.doc.nodeAt(pos);
          if (!node || node.type.name !== this.name) return false;
          const $pos = state.doc.resolve(pos);
          const index = $pos.index();
          const parent = $pos.parent;
          if (direction === 'up') {
            if (index === 0) return false;
            const prev = parent.child(index - 1);
            if (dispatch)
              tr.delete(pos, pos + node.nodeSize)
                .insert(pos - prev.nodeSize, node)
                .scrollIntoView();
          } else {
            if (index + 1 >= parent.childCount) return false;
            const next = parent.child(index + 1);
            if (dispatch)
              tr.delete(pos, pos + node.nodeSize)
                .insert(pos + next.nodeSize, node)
                .scrollIntoView();
          }
          return true;
        },
      duplicateCell:
        (pos) =>
        ({ state, tr, dispatch }) => {
          const node = state.doc.nodeAt(pos);
          if (!node || node.type.name !== this.name) return false;
          const copy = node.type.create({
            ...node.attrs,
            id: newCellId(),
            input: structuredClone(node.attrs.input),
          });
          if (dispatch) tr.insert(pos + node.nodeSize, copy);
          return true;
        },
    };
  },
  addProseMirrorPlugins() {
    const typeName = this.name;
    return [
      new Plugin({
        key: new PluginKey('unique-cell-ids'),
        appendTransaction: (transactions, _old, state) => {
          if (!transactions.some((t) => t.docChanged)) return null;
          const seen = new Set<string>();
          const fixes: { pos: number; node: PmNode }[] = [];
          state.doc.descendants((node, pos) => {
            if (node.type.name !== typeName) return true;
            const id = node.attrs.id as string | null;
            if (!id || seen.has(id)) fixes.push({ pos, node });
            else seen.add(id);
            return false;
          });
          if (fixes.length === 0) return null;
          const tr = state.tr;
          for (const { pos, node } of fixes)
            tr.setNodeMarkup(pos, undefined, { ...node.attrs, id: newCellId() });
          return tr;
        },
      }),
    ];
  },
});
