import { useState, type FormEvent } from 'react';
import { REVIEW_LIMITS, type CommentAnchor, type CommentThread } from '@shared/api/reviews.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { Button } from '@/components/ui/button.tsx';
import { FormAlert } from '@/components/ui/form.tsx';
import { Textarea } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { ApiError } from '@/lib/api-error.ts';
import { formatDateTime } from '@/lib/format.ts';
import { useComments, useCreateComment, useSetThreadResolved } from '../api/comments.ts';

/** The key threads are counted under: "cell:<id>", "block:<n>", or "revision". */
export function anchorKey(anchor: Pick<CommentAnchor, 'blockIndex' | 'cellId'>): string {
  if (anchor.cellId) return `cell:${anchor.cellId}`;
  if (anchor.blockIndex !== undefined) return `block:${anchor.blockIndex}`;
  return 'revision';
}

/** Open threads of one revision, per anchor key (for the counts beside blocks and cells). */
export function openThreadCounts(threads: readonly CommentThread[], revisionId: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const t of threads) {
    if (t.anchor.revisionId !== revisionId || t.resolvedAt) continue;
    const k = anchorKey(t.anchor);
    out[k] = (out[k] ?? 0) + 1;
  }
  return out;
}

export interface AnchorChoice {
  anchor: CommentAnchor;
  /** "Paragraph: The fold sits…", "Cell: Model “Tank”". */
  label: string;
}

function CommentForm({ onSubmit, busy, error, placeholder, submitLabel, autoFocus }: { onSubmit: (body: string, done: () => void) => void; busy: boolean; error: unknown; placeholder: string; submitLabel: string; autoFocus?: boolean }) {
  const [body, setBody] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onSubmit(body, () => setBody(''));
  };
  return (
    <form onSubmit={submit} className="space-y-2">
      {error instanceof ApiError && <FormAlert>{error.fieldMessage('body') ?? error.message}</FormAlert>}
      <Textarea rows={3} aria-label={placeholder} placeholder={placeholder} maxLength={REVIEW_LIMITS.commentMax} value={body} onChange={(e) => setBody(e.target.value)} autoFocus={autoFocus} />
      <div className="flex justify-end">
        <Button type="submit" size="sm" busy={busy} disabled={body.trim() === ''}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}

function Thread({ thread, notebookId, entryId, label, current }: { thread: CommentThread; notebookId: string; entryId: string; label: string; current: boolean }) {
  const [replying, setReplying] = useState(false);
  const reply = useCreateComment(notebookId, entryId);
  const resolve = useSetThreadResolved(notebookId, entryId);
  const resolved = thread.resolvedAt !== null;
  return (
    <li className={`rounded-md border p-3 ${resolved ? 'border-rule bg-sunken' : 'border-rule-strong bg-surface'}`} data-testid="comment-thread">
      <p className="mb-1 flex flex-wrap items-center gap-2 text-xs text-ink-muted">
        <span>{label}</span>
        {!current && <Badge>earlier revision</Badge>}
        {thread.kind === 'changes-requested' && <Badge tone="warning">Changes requested</Badge>}
        {resolved && <Badge tone="success">Resolved</Badge>}
      </p>
      {[thread, ...thread.replies].map((c) => (
        <div key={c.id} className="mt-2 first:mt-0">
          <p className="text-xs">
            <strong className="font-semibold text-ink">{c.author.name}</strong> <span className="text-ink-muted">{formatDateTime(c.createdAt)}</span>
          </p>
          <p className="text-sm whitespace-pre-wrap">{c.body}</p>
        </div>
      ))}
      {resolved && thread.resolvedBy && <p className="mt-2 text-xs text-ink-muted">Resolved by {thread.resolvedBy.name}.</p>}
      <div className="mt-2 flex gap-2">
        {!resolved && (
          <Button size="sm" variant="quiet" onClick={() => setReplying((v) => !v)}>
            Reply
          </Button>
        )}
        <Button size="sm" variant="quiet" busy={resolve.isPending} onClick={() => resolve.mutate({ commentId: thread.id, resolved: !resolved })}>
          {resolved ? 'Reopen' : 'Resolve'}
        </Button>
      </div>
      {replying && (
        <div className="mt-2">
          <CommentForm
            autoFocus
            placeholder="Your reply"
            submitLabel="Reply"
            busy={reply.isPending}
            error={reply.error}
            onSubmit={(body, done) =>
              reply.mutate({ anchor: thread.anchor, parentId: thread.id, body }, { onSuccess: () => { done(); setReplying(false); } })
            }
          />
        </div>
      )}
    </li>
  );
}

/**
 * Comment threads of the entry, beside the diff. A new comment goes on the block or cell picked
 * in the diff (or on the revision as a whole); threads can be answered, resolved and reopened.
 */
export function CommentsPanel({
  notebookId,
  entryId,
  revisionId,
  target,
  onClearTarget,
  describeAnchor,
}: {
  notebookId: string;
  entryId: string;
  /** The revision being read: new comments anchor to it. */
  revisionId: string;
  target: AnchorChoice | null;
  onClearTarget: () => void;
  describeAnchor: (anchor: CommentAnchor) => string;
}) {
  const comments = useComments(notebookId, entryId);
  const create = useCreateComment(notebookId, entryId);
  const [showResolved, setShowResolved] = useState(false);
  const anchor: CommentAnchor = target?.anchor ?? { revisionId };
  return (
    <aside aria-label="Comments" className="space-y-4">
      <h3 className="font-serif text-lg font-bold">Comments</h3>
      <div className="rounded-md border border-rule bg-paper p-3">
        <p className="mb-2 flex items-center justify-between gap-2 text-xs text-ink-muted">
          <span>{target ? `On ${target.label}` : 'On this revision as a whole'}</span>
          {target && (
            <button type="button" className="text-accent" onClick={onClearTarget}>
              Comment on the whole revision instead
            </button>
          )}
        </p>
        <CommentForm
          key={anchorKey(anchor)}
          autoFocus={target !== null}
          placeholder="Write a comment"
          submitLabel="Add comment"
          busy={create.isPending}
          error={create.error}
          onSubmit={(body, done) => create.mutate({ anchor, body }, { onSuccess: () => { done(); onClearTarget(); } })}
        />
      </div>
      {comments.isPending && <SkeletonBlock lines={3} label="Loading comments" />}
      {comments.isError && <QueryError error={comments.error} what="the comments" onRetry={() => void comments.refetch()} />}
      {comments.data && (() => {
        const threads = comments.data.threads.filter((t) => showResolved || !t.resolvedAt);
        const hidden = comments.data.threads.length - threads.length;
        return (
          <>
            {threads.length === 0 && <p className="text-sm text-ink-muted">No open comments.</p>}
            <ul className="space-y-3">
              {threads.map((t) => (
                <Thread key={t.id} thread={t} notebookId={notebookId} entryId={entryId} label={describeAnchor(t.anchor)} current={t.anchor.revisionId === revisionId} />
              ))}
            </ul>
            {(hidden > 0 || showResolved) && (
              <Button size="sm" variant="quiet" onClick={() => setShowResolved((v) => !v)}>
                {showResolved ? 'Hide resolved threads' : `Show ${hidden} resolved ${hidden === 1 ? 'thread' : 'threads'}`}
              </Button>
            )}
          </>
        );
      })()}
    </aside>
  );
}
