import { useMemo } from 'react';
import type { Revision, RevisionSummary } from '@shared/api/entries.ts';
import type { CommentAnchor } from '@shared/api/reviews.ts';
import { documentBlocks } from '@shared/diff/text-diff.ts';
import { compareRevisions } from '@shared/diff/revision-diff.ts';
import { extractCells } from '@shared/editor/document.ts';
import { latexToText, mathsAsText } from '@shared/editor/inline-maths.ts';
import { cellTitle } from '@shared/diff/cell-input-diff.ts';
import { Select } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { ErrorBoundary } from '@/components/ui/status-pages.tsx';
import { useRevision } from '@/features/entries/api/get-revision.ts';
import { formatDateTime } from '@/lib/format.ts';
import { CellChangeCard } from './cell-changes.tsx';
import { SignatureBlock } from './signature-block.tsx';
import { TextDiffView, blockLabel } from './text-diff-view.tsx';

export interface ComparePreset {
  label: string;
  fromId: string;
}

/** "#3 · Kofi Mensah · 1 Dec 2026, 14:02" */
export function revisionLabel(r: RevisionSummary): string {
  return `#${r.number} · ${r.author.name} · ${formatDateTime(r.createdAt)}${r.message ? ` · ${r.message}` : ''}`;
}

/** Choose the two revisions to compare: any two, with named shortcuts ("since you last looked"). */
export function ComparePicker({
  revisions,
  fromId,
  toId,
  presets,
  onChange,
}: {
  revisions: readonly RevisionSummary[];
  fromId: string;
  toId: string;
  presets: readonly ComparePreset[];
  onChange: (fromId: string, toId: string) => void;
}) {
  const options = revisions.map((r) => ({ value: r.id, label: revisionLabel(r) }));
  return (
    <div className="flex flex-wrap items-end gap-3 rounded-md border border-rule bg-paper p-3" role="group" aria-label="Revisions to compare">
      <label className="text-sm">
        <span className="mb-1 block text-xs text-ink-muted">Compare</span>
        <Select compact options={options} value={fromId} onChange={(e) => onChange(e.target.value, toId)} aria-label="Older revision" />
      </label>
      <span className="pb-1.5 text-ink-muted" aria-hidden="true">→</span>
      <label className="text-sm">
        <span className="mb-1 block text-xs text-ink-muted">with</span>
        <Select compact options={options} value={toId} onChange={(e) => onChange(fromId, e.target.value)} aria-label="Newer revision" />
      </label>
      {presets.length > 0 && (
        <div className="flex flex-wrap gap-1 pb-0.5">
          {presets.map((p) => (
            <button
              key={p.label}
              type="button"
              onClick={() => onChange(p.fromId, toId)}
              aria-pressed={p.fromId === fromId}
              className="rounded-sm px-2 py-1 text-xs text-accent hover:bg-accent-soft aria-pressed:bg-accent-soft aria-pressed:font-semibold"
            >
              {p.label}
            </button>
          ))}
        </div>
      )}
    </div>
  );
}

/** Words for where a comment points, read from the revision it was made on when that is loaded. */
export function useAnchorDescriber(revisions: readonly (Revision | undefined)[]) {
  return useMemo(() => {
    const byId = new Map(revisions.filter((r): r is Revision => !!r).map((r) => [r.id, r]));
    return (anchor: CommentAnchor): string => {
      const r = byId.get(anchor.revisionId);
      if (anchor.cellId) {
        const cell = r ? extractCells(r.document).find((c) => c.id === anchor.cellId) : undefined;
        return cell ? `Cell: ${cellTitle(cell)}` : 'A cell';
      }
      if (anchor.blockIndex !== undefined) {
        const block = r ? documentBlocks(r.document)[anchor.blockIndex] : undefined;
        const text = block ? (block.type === 'maths' ? latexToText(block.text) : mathsAsText(block.text)) : '';
        return block ? `“${text.slice(0, 60)}${text.length > 60 ? '…' : ''}”` : `Block ${anchor.blockIndex + 1}`;
      }
      return 'The whole revision';
    };
  }, [revisions]);
}

/** The comparison itself: title, text blocks, then each cell's input and result changes. */
export function RevisionComparison({
  older,
  newer,
  onCommentBlock,
  onCommentCell,
  commentCounts,
  showSignatures = true,
}: {
  older: Revision;
  newer: Revision;
  /** Show the newer revision's signatures below the comparison (off where the page shows them already). */
  showSignatures?: boolean;
  onCommentBlock?: (blockIndex: number, label: string) => void;
  onCommentCell?: (cellId: string, label: string) => void;
  commentCounts?: Record<string, number>;
}) {
  const diff = useMemo(() => compareRevisions(older, newer), [older, newer]);
  const changedCells = diff.cells.filter((c) => c.status !== 'same');
  const sameCells = diff.cells.length - changedCells.length;
  return (
    <div className="space-y-6" data-testid="revision-comparison">
      <p className="text-sm text-ink-muted" aria-live="polite">
        {older.id === newer.id
          ? 'You are comparing a revision with itself.'
          : `${diff.summary.blocksChanged} text ${diff.summary.blocksChanged === 1 ? 'block' : 'blocks'} changed · ${diff.summary.cellsChanged} ${diff.summary.cellsChanged === 1 ? 'cell' : 'cells'} changed · ${diff.summary.resultChanges} ${diff.summary.resultChanges === 1 ? 'change' : 'changes'} in results`}
      </p>
      {diff.title && (
        <p className="text-sm">
          Title: <del className="bg-unstable-soft text-unstable">{diff.title.before}</del> → <ins className="bg-success-soft text-success">{diff.title.after}</ins>
        </p>
      )}
      <section aria-labelledby="text-changes">
        <h3 id="text-changes" className="mb-2 font-serif text-lg font-bold">Text</h3>
        <TextDiffView
          blocks={diff.blocks}
          commentCounts={commentCounts}
          onComment={
            onCommentBlock || onCommentCell
              ? (b) => {
                  const label = blockLabel(b).slice(0, 60);
                  if (b.cellId && onCommentCell) onCommentCell(b.cellId, `the cell “${label}”`);
                  else if (b.newIndex !== undefined && onCommentBlock) onCommentBlock(b.newIndex, `“${label}${label.length >= 60 ? '…' : ''}”`);
                }
              : undefined
          }
        />
      </section>
      <section aria-labelledby="cell-changes">
        <h3 id="cell-changes" className="mb-2 font-serif text-lg font-bold">Cells and results</h3>
        {diff.cells.length === 0 && <p className="text-sm text-ink-muted">Neither revision has computation cells.</p>}
        <div className="space-y-3">
          {changedCells.map((c) => (
            <ErrorBoundary key={c.cellId}>
              <CellChangeCard
                cell={c}
                olderOutputs={older.outputs}
                newerOutputs={newer.outputs}
                commentCount={commentCounts?.[`cell:${c.cellId}`] ?? 0}
                onComment={onCommentCell ? (id) => onCommentCell(id, `the cell ${c.title}`) : undefined}
              />
            </ErrorBoundary>
          ))}
        </div>
        {sameCells > 0 && <p className="mt-2 text-xs text-ink-muted">{sameCells === 1 ? '1 cell is' : `${sameCells} cells are`} the same in both revisions.</p>}
      </section>
      {showSignatures && newer.signatures.length > 0 && (
        <section aria-label="Signatures on the newer revision" className="space-y-2">
          {newer.signatures.map((s) => (
            <SignatureBlock key={s.id} signature={s} />
          ))}
        </section>
      )}
    </div>
  );
}

/** Loads two revisions and compares them. */
export function LoadedComparison({
  notebookId,
  entryId,
  fromId,
  toId,
  children,
}: {
  notebookId: string;
  entryId: string;
  fromId: string;
  toId: string;
  children: (older: Revision, newer: Revision) => React.ReactNode;
}) {
  const older = useRevision(notebookId, entryId, fromId);
  const newer = useRevision(notebookId, entryId, toId);
  if (older.isError) return <QueryError error={older.error} what="the older revision" onRetry={() => void older.refetch()} />;
  if (newer.isError) return <QueryError error={newer.error} what="the newer revision" onRetry={() => void newer.refetch()} />;
  if (!older.data || !newer.data) return <SkeletonBlock lines={6} label="Loading both revisions" />;
  return <>{children(older.data, newer.data)}</>;
}
