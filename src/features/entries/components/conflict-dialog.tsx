import type { Revision } from '@shared/api/entries.ts';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { TextDiff, type DiffSide } from './text-diff.tsx';

type ConflictDialogProps = {
  open: boolean;
  /** The revision the edit started from (null while it loads). */
  base: DiffSide | null;
  mine: DiffSide;
  current: Revision;
  onRebase: () => void;
  onTakeTheirs: () => void;
  onClose: () => void;
};

/**
 * Someone recorded a revision while this edit was open. Shows what they changed and what the
 * author changed, each against the common starting point, and offers to rebase the author's
 * changes onto the new revision (nothing is overwritten) or to drop them.
 */
export function ConflictDialog({
  open,
  base,
  mine,
  current,
  onRebase,
  onTakeTheirs,
  onClose,
}: ConflictDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Someone recorded a newer revision"
      description={`${current.author.name} recorded revision #${current.number} on ${new Date(current.createdAt).toLocaleString()}${current.message ? ` — “${current.message}”` : ''}. Your changes were not recorded.`}
    >
      <div className="space-y-4">
        <section>
          <h3 className="mb-1 text-sm font-semibold">What changed meanwhile (revision #{current.number})</h3>
          {base ? <TextDiff from={base} to={current} /> : <p className="text-sm text-ink-muted">Loading…</p>}
        </section>
        <section>
          <h3 className="mb-1 text-sm font-semibold">Your changes</h3>
          {base ? (
            <TextDiff from={base} to={mine} emptyText="You changed nothing." />
          ) : (
            <p className="text-sm text-ink-muted">Loading…</p>
          )}
        </section>
        <p className="text-sm text-ink-muted">
          Rebasing applies your changes on top of revision #{current.number}. Where you both changed the same
          block, both versions are kept, theirs first, for you to tidy before recording.
        </p>
        <div className="flex flex-wrap justify-end gap-2">
          <Button variant="danger" onClick={onTakeTheirs}>
            Discard my changes
          </Button>
          <Button onClick={onRebase} disabled={!base}>
            Rebase my changes onto #{current.number}
          </Button>
        </div>
      </div>
    </Dialog>
  );
}
