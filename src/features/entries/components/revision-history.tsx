import type { Revision } from '@shared/api/entries.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { Button } from '@/components/ui/button.tsx';
import { cn } from '@/components/ui/cn.ts';
import { ConfirmButton } from '@/components/ui/dialog.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { useRevision } from '../api/get-revision.ts';
import { useRevisions } from '../api/get-revisions.ts';
import { EntryDocument } from './entry-document.tsx';

/** Every revision of the entry, newest first; pick one to read it. */
export function RevisionHistory({
  notebookId,
  entryId,
  headId,
  openId,
  onOpen,
}: {
  notebookId: string;
  entryId: string;
  headId: string;
  openId: string | null;
  onOpen: (id: string | null) => void;
}) {
  const revisions = useRevisions(notebookId, entryId);
  if (revisions.isPending) return <SkeletonBlock lines={4} label="Loading the history" />;
  if (revisions.isError)
    return <QueryError error={revisions.error} what="the history" onRetry={() => void revisions.refetch()} />;
  const list = revisions.data.revisions;
  const byId = new Map(list.map((r) => [r.id, r.number]));
  return (
    <nav aria-label="Revision history">
      <ol className="space-y-1">
        {list.map((r) => (
          <li key={r.id}>
            <button
              type="button"
              onClick={() => onOpen(r.id === openId ? null : r.id)}
              aria-current={r.id === openId ? 'true' : undefined}
              className={cn(
                'block w-full rounded-md border px-3 py-2 text-left text-sm hover:bg-sunken',
                r.id === openId ? 'border-accent bg-accent-soft' : 'border-transparent',
              )}
            >
              <span className="flex items-center gap-2">
                <span className="font-semibold">#{r.number}</span>
                {r.id === headId && <Badge tone="accent">current</Badge>}
                <span className="ml-auto text-xs text-ink-muted">
                  {new Date(r.createdAt).toLocaleString(undefined, {
                    dateStyle: 'medium',
                    timeStyle: 'short',
                  })}
                </span>
              </span>
              <span className="block text-xs text-ink-muted">{r.author.name}</span>
              {r.message && <span className="mt-0.5 block text-xs text-ink">{r.message}</span>}
              {r.restoredFromId && (
                <span className="mt-0.5 block text-xs text-warning">
                  restores #{byId.get(r.restoredFromId) ?? '?'}
                </span>
              )}
            </button>
          </li>
        ))}
      </ol>
    </nav>
  );
}

/** One old revision, read-only, with the action to restore it as a new revision. */
export function RevisionReader({
  notebookId,
  entryId,
  revisionId,
  headId,
  canRestore,
  restoring,
  onRestore,
  onClose,
}: {
  notebookId: string;
  entryId: string;
  revisionId: string;
  headId: string;
  canRestore: boolean;
  restoring: boolean;
  onRestore: (r: Revision) => void;
  onClose: () => void;
}) {
  const q = useRevision(notebookId, entryId, revisionId);
  if (q.isPending) return <SkeletonBlock lines={6} label="Loading the revision" />;
  if (q.isError) return <QueryError error={q.error} what="the revision" onRetry={() => void q.refetch()} />;
  const r = q.data;
  return (
    <article aria-label={`Revision ${r.number}`} className="space-y-3">
      <div className="flex flex-wrap items-center gap-3 rounded-md border border-warning/40 bg-warning-soft px-4 py-2 text-sm">
        <span>
          Reading revision <b>#{r.number}</b> by {r.author.name}, {new Date(r.createdAt).toLocaleString()} —
          read-only.
        </span>
        <div className="ml-auto flex gap-2">
          {canRestore && r.id !== headId && (
            <ConfirmButton
              label="Restore as a new revision"
              variant="primary"
              busy={restoring}
              title={`Restore revision #${r.number}?`}
              description="Its text and results become a new revision on top of the history (nothing recorded is lost). Changes you have not recorded yet are replaced."
              keepLabel="Keep reading"
              confirmLabel="Restore"
              onConfirm={(close) => {
                close();
                onRestore(r);
              }}
            />
          )}
          <Button size="sm" variant="secondary" onClick={onClose}>
            Back to editing
          </Button>
        </div>
      </div>
      <header>
        <h2 className="font-serif text-2xl font-bold">{r.title}</h2>
        <p className="text-sm text-ink-muted">
          {r.entryDate}
          {r.tags.length > 0 && ` · ${r.tags.join(', ')}`}
        </p>
      </header>
      <EntryDocument
        notebookId={notebookId}
        entryId={entryId}
        document={r.document}
        outputs={r.outputs}
        editable={false}
        editorKey={`rev:${r.id}`}
        label={`Revision ${r.number} body`}
      />
    </article>
  );
}
