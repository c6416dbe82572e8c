import { useMemo, useState, type ReactNode } from 'react';
import { collapseUnchanged, describeUnchanged, type BlockDiff, type DiffPart } from '@shared/diff/text-diff.ts';
import { latexToText, mathsAsText, splitMaths } from '@shared/editor/inline-maths.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { cn } from '@/components/ui/cn.ts';
import { KatexFormula } from '@/components/ui/katex-formula.tsx';

const STATUS_WORDS: Record<BlockDiff['status'], string> = { same: '', added: 'Added', removed: 'Removed', changed: 'Changed' };

/**
 * One part of a block: its text with inline formulas typeset (a displayed equation whole).
 * Formulas are one token in the diff, so a part never holds half of one; each formula inside an
 * insertion or deletion carries the change as a drawn line (struck or underlined).
 */
function PartContent({ part, display }: { part: DiffPart; display: boolean }) {
  const change = part.kind === 'same' ? undefined : part.kind;
  const formula = (latex: string, key: number, isDisplay: boolean) => (
    <span key={key} className={cn('bf-diff-maths', isDisplay && 'my-1 max-w-full overflow-x-auto')} data-change={change}>
      <KatexFormula latex={latex} display={isDisplay} fallback={latexToText(latex)} />
    </span>
  );
  if (display) return part.text === '' ? null : formula(part.text, 0, true);
  // Punctuation right after a formula stays on its line (a line may otherwise break after KaTeX's box).
  const segments = splitMaths(part.text);
  const out: ReactNode[] = [];
  segments.forEach((s, i) => {
    if (s.kind === 'maths') {
      // (glued to the text after it, below, when there is some)
      if (segments[i + 1]?.kind !== 'text') out.push(formula(s.latex, i, false));
      return;
    }
    const prev = segments[i - 1];
    const glued = prev?.kind === 'maths' ? (/^[,.;:!?)\]]+/.exec(s.text)?.[0] ?? '') : '';
    if (prev?.kind === 'maths') out.push(<span key={`m${i}`} className="whitespace-nowrap">{formula(prev.latex, i - 1, false)}{glued}</span>);
    out.push(<span key={i}>{s.text.slice(glued.length)}</span>);
  });
  return <>{out}</>;
}

/** A block's text for labels: formulas as readable words, removed words left out. */
export function blockLabel(block: BlockDiff): string {
  const kept = block.parts.map((p) => (p.kind === 'removed' ? '' : p.text)).join('');
  return block.type === 'maths' ? latexToText(kept) : mathsAsText(kept);
}

function BlockView({ block, onComment, commentCount }: { block: BlockDiff; onComment?: (block: BlockDiff) => void; commentCount: number }) {
  const text = block.parts.map((p) => p.text).join('');
  const display = block.type === 'maths';
  const body = block.parts.map((part, i) =>
    part.kind === 'same' ? (
      <PartContent key={i} part={part} display={display} />
    ) : part.kind === 'added' ? (
      <ins key={i} className={cn('mx-px rounded-sm bg-success-soft px-px text-success underline decoration-success/60', display && 'block no-underline')}>
        <PartContent part={part} display={display} />
      </ins>
    ) : (
      <del key={i} className={cn('mx-px rounded-sm bg-unstable-soft px-px text-unstable', display && 'block')}>
        <PartContent part={part} display={display} />
      </del>
    ),
  );
  const commentable = onComment && block.newIndex !== undefined;
  return (
    <li
      className={cn(
        'group relative flex gap-3 border-l-4 py-1.5 pr-2 pl-3',
        block.status === 'same' && 'border-transparent',
        block.status === 'added' && 'border-success bg-success-soft/40',
        block.status === 'removed' && 'border-unstable bg-unstable-soft/40',
        block.status === 'changed' && 'border-warning',
      )}
      data-status={block.status}
    >
      <div className={cn('min-w-0 flex-1 font-serif leading-relaxed', block.type === 'heading' && 'font-bold', block.type === 'code' && 'font-mono text-sm', block.type === 'cell' && 'font-sans text-sm text-ink-muted italic')}>
        {block.prefix && <span className="mr-2 font-mono text-xs text-ink-muted" aria-hidden="true">{block.prefix}</span>}
        {STATUS_WORDS[block.status] && <span className="sr-only">{STATUS_WORDS[block.status]}: </span>}
        {text.trim() === '' && block.type === 'paragraph' ? <span className="text-ink-muted">(empty paragraph)</span> : body}
      </div>
      <div className="flex shrink-0 items-start gap-1">
        {block.status !== 'same' && <Badge tone={block.status === 'added' ? 'success' : block.status === 'removed' ? 'unstable' : 'warning'}>{STATUS_WORDS[block.status]}</Badge>}
        {commentable && (
          <button
            type="button"
            onClick={() => onComment(block)}
            className={cn('rounded-sm px-1.5 text-xs hover:bg-accent-soft', commentCount === 0 ? 'text-ink-muted group-hover:text-accent' : 'font-semibold text-accent')}
            aria-label={`Comment on this ${block.type === 'cell' ? 'cell' : 'block'}: ${blockLabel(block).slice(0, 40)}`}
          >
            {commentCount > 0 ? `${commentCount} ${commentCount === 1 ? 'comment' : 'comments'}` : 'Comment'}
          </button>
        )}
      </div>
    </li>
  );
}

/**
 * The document diff as readable blocks: insertions and deletions marked inside changed blocks,
 * long unchanged stretches folded behind a "show N unchanged paragraphs" button.
 */
export function TextDiffView({
  blocks,
  onComment,
  commentCounts = {},
}: {
  blocks: readonly BlockDiff[];
  onComment?: (block: BlockDiff) => void;
  /** Open threads per anchor key ("block:3", "cell:<id>"). */
  commentCounts?: Record<string, number>;
}) {
  const items = useMemo(() => collapseUnchanged(blocks), [blocks]);
  const [opened, setOpened] = useState<Set<number>>(new Set());
  if (blocks.length === 0) return <p className="text-sm text-ink-muted">Both revisions are empty.</p>;
  const count = (b: BlockDiff) => commentCounts[b.cellId ? `cell:${b.cellId}` : `block:${b.newIndex}`] ?? 0;
  return (
    <ol className="space-y-0.5" aria-label="Changes to the text">
      {items.map((item, i) => {
        if (item.kind === 'block') return <BlockView key={i} block={item.block} onComment={onComment} commentCount={count(item.block)} />;
        if (opened.has(i)) return item.blocks.map((b, k) => <BlockView key={`${i}:${k}`} block={b} onComment={onComment} commentCount={count(b)} />);
        return (
          <li key={i} className="py-1 pl-4">
            <button type="button" onClick={() => setOpened(new Set(opened).add(i))} className="rounded-sm px-2 py-0.5 text-xs text-accent hover:bg-accent-soft">
              Show {describeUnchanged(item.blocks)}
            </button>
          </li>
        );
      })}
    </ol>
  );
}
