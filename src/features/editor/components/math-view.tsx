import { NodeViewWrapper, type NodeViewProps } from '@tiptap/react';
import { useEffect, useRef, useState } from 'react';
import { cn } from '@/components/ui/cn.ts';
import { KatexFormula, renderLatex } from '@/components/ui/katex-formula.tsx';

/**
 * Node view of inline and display maths: the typeset formula; click it (when editing) to open
 * a small field with its LaTeX and a live preview. Enter (inline) or Ctrl+Enter (display) keeps
 * the change, Escape throws it away; an empty formula is removed.
 */
export function MathView({ node, updateAttributes, deleteNode, editor, selected }: NodeViewProps) {
  const display = node.type.name === 'displayMath';
  const latex = String(node.attrs.latex ?? '');
  const [editing, setEditing] = useState(latex === '' && editor.isEditable);
  const [draft, setDraft] = useState(latex);
  const field = useRef<HTMLTextAreaElement & HTMLInputElement>(null);

  useEffect(() => {
    if (editing) field.current?.focus();
  }, [editing]);

  const open = () => {
    if (!editor.isEditable) return;
    setDraft(latex);
    setEditing(true);
  };
  const commit = () => {
    setEditing(false);
    if (draft.trim() === '') deleteNode();
    else if (draft !== latex) updateAttributes({ latex: draft });
    editor.commands.focus();
  };
  const cancel = () => {
    setEditing(false);
    if (latex === '') deleteNode();
    else editor.commands.focus();
  };
  const preview = renderLatex(draft, display);
  const Tag = display ? 'div' : 'span';

  return (
    <NodeViewWrapper
      as={Tag}
      className={cn(display ? 'my-4 block' : 'inline', 'relative')}
      data-math={display ? 'display' : 'inline'}
    >
      <Tag
        role={editor.isEditable ? 'button' : undefined}
        tabIndex={editor.isEditable ? 0 : undefined}
        title={editor.isEditable ? 'Click or press Enter to edit the formula' : undefined}
        onClick={open}
        onKeyDown={(e) => {
          if (e.key === 'Enter') {
            e.preventDefault();
            open();
          }
        }}
        className={cn(
          'rounded-sm',
          display ? 'block overflow-x-auto py-1 text-center' : 'px-0.5',
          editor.isEditable && 'cursor-pointer hover:bg-accent-soft',
          selected && 'ring-2 ring-accent',
        )}
      >
        <KatexFormula latex={latex} display={display} />
      </Tag>
      {editing && (
        <span
          contentEditable={false}
          className={cn(
            'z-20 block rounded-md border border-rule-strong bg-surface p-2 text-left shadow-lg',
            display ? 'mt-2' : 'absolute top-full left-0 mt-1 w-[26rem]',
          )}
        >
          {display ? (
            <textarea
              ref={field}
              value={draft}
              rows={3}
              aria-label="LaTeX of the equation"
              onChange={(e) => setDraft(e.target.value)}
              onKeyDown={(e) => {
                if (e.key === 'Enter' && (e.ctrlKey || e.metaKey)) commit();
                if (e.key === 'Escape') cancel();
              }}
              onBlur={commit}
              className="block w-full rounded-sm border border-rule bg-paper p-2 font-mono text-sm text-ink"
              placeholder="\dot{x} = \mu - x^2"
            />
          ) : (
            <input
              ref={field}
              value={draft}
              aria-label="LaTeX of the formula"
              onChange={(e) => setDraft(e.target.value)}
              onKeyDown={(e) => {
                if (e.key === 'Enter') {
                  e.preventDefault();
                  commit();
                }
                if (e.key === 'Escape') cancel();
              }}
              onBlur={commit}
              className="block h-8 w-full rounded-sm border border-rule bg-paper px-2 font-mono text-sm text-ink"
              placeholder="e^{-E/RT}"
            />
          )}
          <span className="mt-1 block text-xs text-ink-muted">
            {preview.error ? (
              <span className="text-unstable">{preview.error}</span>
            ) : display ? (
              'Ctrl+Enter to keep, Escape to cancel'
            ) : (
              'Enter to keep, Escape to cancel'
            )}
          </span>
        </span>
      )}
    </NodeViewWrapper>
  );
}
