import type { ReactNodeViewProps } from '@tiptap/react';
import { Placeholder } from '@tiptap/extensions';
import StarterKit from '@tiptap/starter-kit';
import type { ComponentType } from 'react';
import { CellNode } from './cell-node.ts';
import { ImageNode } from './image-node.ts';
import { DisplayMath, InlineMath } from './math-nodes.ts';

/**
 * Every node and mark the entry body allows; the names match `shared/editor/document.ts`,
 * which the server validates against.
 */
export function editorExtensions(cellView: ComponentType<ReactNodeViewProps> | null) {
  return [
    StarterKit.configure({
      heading: { levels: [1, 2, 3, 4] },
      link: {
        openOnClick: false,
        autolink: true,
        defaultProtocol: 'https',
        protocols: ['http', 'https', 'mailto'],
      },
    }),
    Placeholder.configure({
      placeholder: ({ node }) =>
        node.type.name === 'heading'
          ? 'Heading'
          : 'Write here. Type $…$ for maths, $$ and a space for an equation.',
    }),
    InlineMath,
    DisplayMath,
    ImageNode,
    CellNode.configure({ view: cellView }),
  ];
}
