import type { ReactNodeViewProps } from '@tiptap/react';
import { EditorContent, useEditor, type Editor } from '@tiptap/react';
import { useEffect, useMemo, useRef, type ComponentType } from 'react';
import type { CellKind } from '@shared/cells/kinds.ts';
import type { DocumentJson } from '@shared/editor/document.ts';
import { editorExtensions } from '../extensions/editor-extensions.ts';
import { EditorToolbar } from './editor-toolbar.tsx';

type EntryEditorProps = {
  /** The starting document. Later changes to this prop are ignored: remount (key) to load another. */
  initialContent: DocumentJson;
  editable: boolean;
  onChange?: (doc: DocumentJson) => void;
  /** Draws cell nodes (the cells feature's node view). */
  cellView: ComponentType<ReactNodeViewProps> | null;
  createCellInput: (kind: CellKind) => Record<string, unknown>;
  onEditor?: (editor: Editor | null) => void;
  label?: string;
};

/** The rich-text body of an entry, with maths, pictures and computation cells. */
export function EntryEditor({
  initialContent,
  editable,
  onChange,
  cellView,
  createCellInput,
  onEditor,
  label = 'Entry body',
}: EntryEditorProps) {
  const onChangeRef = useRef(onChange);
  useEffect(() => {
    onChangeRef.current = onChange;
  }, [onChange]);
  const extensions = useMemo(() => editorExtensions(cellView), [cellView]);
  const editor = useEditor({
    extensions,
    content: initialContent,
    editable,
    editorProps: {
      attributes: {
        // Text keeps a readable measure; cells take the full width of the page.
        class:
          'bf-prose prose-log max-w-none! min-h-[16rem] px-6 py-6 focus:outline-none [&>*:not(.bf-cell-node)]:mx-auto [&>*:not(.bf-cell-node)]:max-w-[40rem]',
        'aria-label': label,
        role: 'textbox',
        'aria-multiline': 'true',
      },
    },
    onUpdate: ({ editor: e }) => onChangeRef.current?.(e.getJSON() as DocumentJson),
  });
  useEffect(() => {
    editor.setEditable(editable);
  }, [editor, editable]);
  useEffect(() => {
    onEditor?.(editor);
    return () => onEditor?.(null);
  }, [editor, onEditor]);

  return (
    <div className="rounded-lg border border-rule bg-surface shadow-sm">
      {editable && <EditorToolbar editor={editor} createCellInput={createCellInput} />}
      <EditorContent editor={editor} />
    </div>
  );
}
