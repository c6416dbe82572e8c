import type { CellOutputs } from '@shared/cells/output.ts';
import { isAnalysisKind } from '@shared/cells/kinds.ts';
import type { CellDiff } from '@shared/diff/revision-diff.ts';
import type { ResultChange, ResultChangeKind } from '@shared/diff/result-diff.ts';
import type { InputChange } from '@shared/diff/cell-input-diff.ts';
import { Badge, type BadgeTone } from '@/components/ui/badge.tsx';
import { ErrorBoundary } from '@/components/ui/status-pages.tsx';
import { OverlayPlot } from './overlay-plot.tsx';

const RESULT_BADGE: Record<ResultChangeKind, { tone: BadgeTone; words: string }> = {
  moved: { tone: 'warning', words: 'Moved' },
  appeared: { tone: 'success', words: 'New' },
  disappeared: { tone: 'unstable', words: 'Gone' },
  changed: { tone: 'accent', words: 'Changed' },
  unchanged: { tone: 'neutral', words: 'Same' },
};
const INPUT_BADGE: Record<InputChange['kind'], { tone: BadgeTone; words: string }> = {
  changed: { tone: 'warning', words: 'Changed' },
  added: { tone: 'success', words: 'Added' },
  removed: { tone: 'unstable', words: 'Removed' },
};
const CELL_BADGE: Record<CellDiff['status'], { tone: BadgeTone; words: string }> = {
  same: { tone: 'neutral', words: 'Unchanged' },
  changed: { tone: 'warning', words: 'Changed' },
  added: { tone: 'success', words: 'New cell' },
  removed: { tone: 'unstable', words: 'Cell removed' },
};

function ResultList({ changes }: { changes: ResultChange[] }) {
  const shown = changes.filter((c) => c.kind !== 'unchanged');
  const same = changes.filter((c) => c.kind === 'unchanged');
  return (
    <ul className="space-y-1" aria-label="Changes to the results">
      {shown.map((c, i) => (
        <li key={i} className="flex items-baseline gap-2 text-sm">
          <Badge tone={RESULT_BADGE[c.kind].tone}>{RESULT_BADGE[c.kind].words}</Badge>
          <span>{c.sentence}</span>
        </li>
      ))}
      {same.length > 0 && (
        <li className="text-xs text-ink-muted">
          Unchanged: {same.map((c) => c.sentence.replace(/ unchanged at /, ' at ')).join('; ')}
        </li>
      )}
    </ul>
  );
}

/** One cell's changes: inputs field by field, results by meaning, and the two plots overlaid. */
export function CellChangeCard({
  cell,
  olderOutputs,
  newerOutputs,
  onComment,
  commentCount = 0,
}: {
  cell: CellDiff;
  olderOutputs: CellOutputs;
  newerOutputs: CellOutputs;
  onComment?: (cellId: string) => void;
  commentCount?: number;
}) {
  const badge = CELL_BADGE[cell.status];
  const older = cell.older ? olderOutputs[cell.older.id] : undefined;
  const newer = cell.newer ? newerOutputs[cell.newer.id] : undefined;
  const showPlot = isAnalysisKind(cell.kind) && (older || newer) && cell.results.some((r) => r.kind !== 'unchanged');
  return (
    <article className="rounded-lg border border-rule bg-surface p-4" aria-label={`Cell: ${cell.title}`} data-testid="cell-change">
      <header className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h4 className="font-serif font-bold">{cell.title}</h4>
        <div className="flex items-center gap-2">
          <Badge tone={badge.tone}>{badge.words}</Badge>
          {onComment && cell.status !== 'removed' && (
            <button type="button" className="rounded-sm px-1.5 text-xs text-accent hover:bg-accent-soft" onClick={() => onComment(cell.cellId)} aria-label={`Comment on the cell ${cell.title}`}>
              {commentCount > 0 ? `${commentCount} ${commentCount === 1 ? 'comment' : 'comments'}` : 'Comment'}
            </button>
          )}
        </div>
      </header>
      {cell.changes.length > 0 && (
        <section className="mb-3">
          <h5 className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Inputs</h5>
          <ul className="space-y-1" aria-label="Changes to the inputs">
            {cell.changes.map((c) => (
              <li key={c.field} className="flex items-baseline gap-2 text-sm">
                <Badge tone={INPUT_BADGE[c.kind].tone}>{INPUT_BADGE[c.kind].words}</Badge>
                <span className="font-mono text-[0.8rem]">{c.sentence}</span>
              </li>
            ))}
          </ul>
        </section>
      )}
      {cell.results.length > 0 && (
        <section>
          <h5 className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Results</h5>
          <ResultList changes={cell.results} />
        </section>
      )}
      {cell.status === 'same' && <p className="text-sm text-ink-muted">Inputs and results are the same in both revisions.</p>}
      {showPlot && isAnalysisKind(cell.kind) && (
        <ErrorBoundary>
          <OverlayPlot kind={cell.kind} older={older} newer={newer} input={(cell.newer ?? cell.older)!.input} title={cell.title} />
        </ErrorBoundary>
      )}
    </article>
  );
}
