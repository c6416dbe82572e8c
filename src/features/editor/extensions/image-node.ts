import { Node, mergeAttributes } from '@tiptap/core';
import { blockInsertPosition } from './insert-position.ts';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    figureImage: {
      insertImage: (attrs: { src: string; alt?: string; title?: string }) => ReturnType;
    };
  }
}

/** A picture as its own block, with a description for readers who cannot see it. */
export const ImageNode = Node.create({
  name: 'image',
  group: 'block',
  atom: true,
  draggable: true,
  addAttributes: () => ({ src: { default: '' }, alt: { default: null }, title: { default: null } }),
  parseHTML: () => [{ tag: 'img[src]' }],
  renderHTML: ({ HTMLAttributes }) => [
    'img',
    mergeAttributes(HTMLAttributes, {
      class: 'mx-auto my-4 max-h-[28rem] rounded-md border border-rule',
      loading: 'lazy',
    }),
  ],
  addCommands() {
    return {
      insertImage:
        (attrs) =>
        ({ state, commands }) =>
          commands.insertContentAt(blockInsertPosition(state), { type: this.name, attrs }),
    };
  },
});
