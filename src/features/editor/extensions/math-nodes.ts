import { InputRule, Node, mergeAttributes } from '@tiptap/core';
import { ReactNodeViewRenderer } from '@tiptap/react';
import { MathView } from '../components/math-view.tsx';
import { blockInsertPosition } from './insert-position.ts';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    maths: {
      /** Insert inline maths at the cursor (opens its LaTeX field). */
      insertInlineMath: (latex?: string) => ReturnType;
      /** Insert a displayed equation as its own block. */
      insertDisplayMath: (latex?: string) => ReturnType;
    };
  }
}

const latexAttr = {
  latex: {
    default: '',
    parseHTML: (el: HTMLElement) => el.getAttribute('data-latex') ?? el.textContent ?? '',
    renderHTML: (attrs: { latex?: string }) => ({ 'data-latex': attrs.latex ?? '' }),
  },
};

/**
 * Inline maths: `$…$` typed in text becomes a formula (the opening `$` must not follow a
 * letter, digit or another `$`, so prices like "5$" and `$$` stay text).
 */
export const InlineMath = Node.create({
  name: 'inlineMath',
  group: 'inline',
  inline: true,
  atom: true,
  selectable: true,
  addAttributes: () => latexAttr,
  parseHTML: () => [{ tag: 'span[data-inline-math]' }],
  renderHTML: ({ HTMLAttributes, node }) => [
    'span',
    mergeAttributes(HTMLAttributes, { 'data-inline-math': '' }),
    `$${node.attrs.latex as string}$`,
  ],
  renderText: ({ node }) => `$${node.attrs.latex as string}$`,
  addNodeView: () => ReactNodeViewRenderer(MathView, { as: 'span' }),
  addCommands() {
    return {
      insertInlineMath:
        (latex = '') =>
        ({ commands }) =>
          commands.insertContent({ type: this.name, attrs: { latex } }),
    };
  },
  addInputRules() {
    return [
      new InputRule({
        find: /(^|[^\w$\\])\$([^$\n]*[^$\s\\])\$$/,
        handler: ({ state, range, match }) => {
          const from = range.from + match[1].length;
          state.tr.replaceWith(from, range.to, this.type.create({ latex: match[2] }));
        },
      }),
    ];
  },
});

/** Display maths: a centred equation on its own line; `$$` then space at the start of an empty paragraph makes one. */
export const DisplayMath = Node.create({
  name: 'displayMath',
  group: 'block',
  atom: true,
  selectable: true,
  draggable: true,
  addAttributes: () => latexAttr,
  parseHTML: () => [{ tag: 'div[data-display-math]' }],
  renderHTML: ({ HTMLAttributes, node }) => [
    'div',
    mergeAttributes(HTMLAttributes, { 'data-display-math': '' }),
    `$$${node.attrs.latex as string}$$`,
  ],
  renderText: ({ node }) => `$$${node.attrs.latex as string}$$`,
  addNodeView: () => ReactNodeViewRenderer(MathView),
  addCommands() {
    return {
      insertDisplayMath:
        (latex = '') =>
        ({ state, commands }) =>
          commands.insertContentAt(blockInsertPosition(state), { type: this.name, attrs: { latex } }),
    };
  },
  addInputRules() {
    return [
      new InputRule({
        find: /^\$\$\s$/,
        handler: ({ range, chain }) => {
          chain()
            .deleteRange(range)
            .insertContent({ type: this.name, attrs: { latex: '' } })
            .run();
        },
      }),
    ];
  },
});
