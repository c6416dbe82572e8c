import { useEditorState, type Editor } from '@tiptap/react';
import { useState } from 'react';
import { CELL_KINDS, CELL_KIND_DESCRIPTIONS, CELL_KIND_LABELS, type CellKind } from '@shared/cells/kinds.ts';
import { Button } from '@/components/ui/button.tsx';
import { cn } from '@/components/ui/cn.ts';
import { Dialog } from '@/components/ui/dialog.tsx';
import { Field } from '@/components/ui/field.tsx';
import { Input } from '@/components/ui/input.tsx';

type ToolbarProps = {
  editor: Editor;
  /** The starting input of a newly inserted cell of this kind. */
  createCellInput: (kind: CellKind) => Record<string, unknown>;
};

/** A toolbar button; its visible text is its name, or `label` when it shows only a symbol. */
function Tool({
  label,
  active,
  onClick,
  children,
  disabled,
  symbol,
}: {
  label: string;
  active?: boolean;
  onClick: () => void;
  children: React.ReactNode;
  disabled?: boolean;
  symbol?: boolean;
}) {
  return (
    <button
      type="button"
      title={label}
      aria-label={symbol ? label : undefined}
      aria-pressed={active}
      disabled={disabled}
      onMouseDown={(e) => e.preventDefault()}
      onClick={onClick}
      className={cn(
        'inline-flex h-8 min-w-8 items-center justify-center rounded-sm px-2 text-sm text-ink hover:bg-sunken disabled:opacity-40',
        active && 'bg-accent-soft text-accent',
      )}
    >
      {children}
    </button>
  );
}

const Sep = () => <span aria-hidden="true" className="mx-1 h-5 w-px bg-rule" />;

/** Formatting and insert controls above the entry body. */
export function EditorToolbar({ editor, createCellInput }: ToolbarProps) {
  const state = useEditorState({
    editor,
    selector: ({ editor: e }) => ({
      bold: e.isActive('bold'),
      italic: e.isActive('italic'),
      strike: e.isActive('strike'),
      code: e.isActive('code'),
      h2: e.isActive('heading', { level: 2 }),
      h3: e.isActive('heading', { level: 3 }),
      bullet: e.isActive('bulletList'),
      ordered: e.isActive('orderedList'),
      quote: e.isActive('blockquote'),
      codeBlock: e.isActive('codeBlock'),
      link: e.isActive('link'),
      canUndo: e.can().undo(),
      canRedo: e.can().redo(),
    }),
  });
  const [menu, setMenu] = useState(false);
  const [linkOpen, setLinkOpen] = useState(false);
  const [imageOpen, setImageOpen] = useState(false);
  const c = () => editor.chain().focus();

  const insertCell = (kind: CellKind) => {
    setMenu(false);
    c().insertCell(kind, createCellInput(kind)).run();
  };

  return (
    <div
      role="toolbar"
      aria-label="Formatting"
      className="sticky top-0 z-30 flex flex-wrap items-center gap-0.5 border-b border-rule bg-surface/95 px-2 py-1.5 backdrop-blur"
    >
      <Tool symbol label="Bold" active={state.bold} onClick={() => c().toggleBold().run()}>
        <b>B</b>
      </Tool>
      <Tool symbol label="Italic" active={state.italic} onClick={() => c().toggleItalic().run()}>
        <i className="font-serif">I</i>
      </Tool>
      <Tool symbol label="Strike through" active={state.strike} onClick={() => c().toggleStrike().run()}>
        <s>S</s>
      </Tool>
      <Tool symbol label="Code" active={state.code} onClick={() => c().toggleCode().run()}>
        <span className="font-mono text-xs">{'</>'}</span>
      </Tool>
      <Tool
        label="Link"
        active={state.link}
        onClick={() => (state.link ? c().unsetLink().run() : setLinkOpen(true))}
      >
        <span className="underline">link</span>
      </Tool>
      <Sep />
      <Tool label="Heading" active={state.h2} onClick={() => c().toggleHeading({ level: 2 }).run()}>
        Heading
      </Tool>
      <Tool label="Subheading" active={state.h3} onClick={() => c().toggleHeading({ level: 3 }).run()}>
        Subheading
      </Tool>
      <Tool label="List" active={state.bullet} onClick={() => c().toggleBulletList().run()}>
        • List
      </Tool>
      <Tool label="Numbered list" active={state.ordered} onClick={() => c().toggleOrderedList().run()}>
        <span aria-hidden="true">1.</span>&nbsp;Numbered list
      </Tool>
      <Tool symbol label="Quote" active={state.quote} onClick={() => c().toggleBlockquote().run()}>
        “ ”
      </Tool>
      <Tool symbol label="Code block" active={state.codeBlock} onClick={() => c().toggleCodeBlock().run()}>
        <span className="font-mono text-xs">{'{ }'}</span>
      </Tool>
      <Sep />
      <Tool label="Formula" onClick={() => c().insertInlineMath('').run()}>
        <span aria-hidden="true" className="font-serif italic">
          x²
        </span>
        &nbsp;Formula
      </Tool>
      <Tool label="Equation" onClick={() => c().insertDisplayMath('').run()}>
        Equation
      </Tool>
      <Tool label="Picture" onClick={() => setImageOpen(true)}>
        Picture
      </Tool>
      <Sep />
      <Tool symbol label="Undo" disabled={!state.canUndo} onClick={() => c().undo().run()}>
        ↶
      </Tool>
      <Tool symbol label="Redo" disabled={!state.canRedo} onClick={() => c().redo().run()}>
        ↷
      </Tool>
      <div className="relative ml-auto">
        <Button
          size="sm"
          variant="secondary"
          aria-haspopup="menu"
          aria-expanded={menu}
          onClick={() => setMenu((m) => !m)}
        >
          + Add cell
        </Button>
        {menu && (
          <div
            role="menu"
            className="absolute right-0 z-40 mt-1 w-80 rounded-md border border-rule bg-surface p-1 shadow-xl"
            onKeyDown={(e) => e.key === 'Escape' && setMenu(false)}
          >
            {CELL_KINDS.map((kind) => (
              <button
                key={kind}
                type="button"
                role="menuitem"
                onClick={() => insertCell(kind)}
                className="block w-full rounded-sm px-3 py-2 text-left hover:bg-sunken"
              >
                <span className="block text-sm font-medium text-ink">{CELL_KIND_LABELS[kind]}</span>
                <span className="block text-xs text-ink-muted">{CELL_KIND_DESCRIPTIONS[kind]}</span>
              </button>
            ))}
          </div>
        )}
      </div>
      <LinkDialog
        open={linkOpen}
        onClose={() => setLinkOpen(false)}
        onSubmit={(href) => c().extendMarkRange('link').setLink({ href }).run()}
      />
      <ImageDialog
        open={imageOpen}
        onClose={() => setImageOpen(false)}
        onSubmit={(src, alt) => c().insertImage({ src, alt }).run()}
      />
    </div>
  );
}

function LinkDialog({
  open,
  onClose,
  onSubmit,
}: {
  open: boolean;
  onClose: () => void;
  onSubmit: (href: string) => void;
}) {
  const [href, setHref] = useState('');
  const [error, setError] = useState<string>();
  return (
    <Dialog open={open} onClose={onClose} title="Link">
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (!/^(https?:\/\/|mailto:)/i.test(href.trim())) {
            setError('Start the address with https://, http:// or mailto:');
            return;
          }
          onSubmit(href.trim());
          setHref('');
          setError(undefined);
          onClose();
        }}
        className="space-y-4"
      >
        <Field label="Address" error={error}>
          <Input value={href} onChange={(e) => setHref(e.target.value)} placeholder="https://" autoFocus />
        </Field>
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit">Add link</Button>
        </div>
      </form>
    </Dialog>
  );
}

function ImageDialog({
  open,
  onClose,
  onSubmit,
}: {
  open: boolean;
  onClose: () => void;
  onSubmit: (src: string, alt: string) => void;
}) {
  const [src, setSrc] = useState('');
  const [alt, setAlt] = useState('');
  const [error, setError] = useState<string>();
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Picture"
      description="A picture from an address; describe it for readers who cannot see it."
    >
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (!/^(https?:\/\/|\/)/i.test(src.trim())) {
            setError('Enter an address starting with https:// or /');
            return;
          }
          onSubmit(src.trim(), alt.trim());
          setSrc('');
          setAlt('');
          setError(undefined);
          onClose();
        }}
        className="space-y-4"
      >
        <Field label="Address" error={error}>
          <Input value={src} onChange={(e) => setSrc(e.target.value)} placeholder="https://" autoFocus />
        </Field>
        <Field label="Description">
          <Input
            value={alt}
            onChange={(e) => setAlt(e.target.value)}
            placeholder="Phase portrait at μ = 0.3"
          />
        </Field>
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit">Insert</Button>
        </div>
      </form>
    </Dialog>
  );
}
