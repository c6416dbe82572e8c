import { useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router';
import { ENTRY_STATUS_LABELS, type RevisionSummary } from '@shared/api/entries.ts';
import { REVIEW_STATUS_LABELS, type ReviewDetail } from '@shared/api/reviews.ts';
import { paths } from '@/config/paths.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { PageHeader } from '@/components/ui/app-shell.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { ErrorBoundary } from '@/components/ui/status-pages.tsx';
import { useEntry } from '@/features/entries/api/get-entry.ts';
import { useRevisions } from '@/features/entries/api/get-revisions.ts';
import { useRevision } from '@/features/entries/api/get-revision.ts';
import { formatDateTime } from '@/lib/format.ts';
import { useMarkSeen } from '../api/decide-review.ts';
import { useComments } from '../api/comments.ts';
import { useReview } from '../api/get-review.ts';
import { CommentsPanel, openThreadCounts, type AnchorChoice } from './comments-panel.tsx';
import { ApproveButton, RequestChangesButton } from './decision-dialogs.tsx';
import { ComparePicker, LoadedComparison, RevisionComparison, useAnchorDescriber, type ComparePreset } from './revision-compare.tsx';
import { SignatureBlock } from './signature-block.tsx';
import { SubmitForReviewButton } from './submit-for-review-button.tsx';

/** Named starting points for the comparison, newest-first revisions given. */
export function comparePresets(
  revisions: readonly RevisionSummary[],
  review: ReviewDetail | null,
  toId: string,
  /** The caller's last-seen revision when the page opened (opening it marks the current one seen). */
  seen: string | null = review?.myLastSeenRevisionId ?? null,
): ComparePreset[] {
  const out: ComparePreset[] = [];
  const to = revisions.find((r) => r.id === toId);
  if (seen && seen !== toId) out.push({ label: 'Since you last looked', fromId: seen });
  const submitted = review ? revisions.find((r) => r.id === review.review.submittedRevisionId) : undefined;
  if (submitted && submitted.id !== toId) out.push({ label: 'Since it was submitted', fromId: submitted.id });
  const before = submitted?.parentId ?? to?.parentId;
  if (before && !out.some((p) => p.fromId === before)) out.push({ label: submitted ? 'Before it was submitted' : 'Previous revision', fromId: before });
  const first = revisions.at(-1);
  if (first && first.id !== toId && !out.some((p) => p.fromId === first.id)) out.push({ label: 'First revision', fromId: first.id });
  return out;
}

/**
 * The PI's review of one entry: where it stands, the comparison (default: what changed since
 * they last looked, otherwise since before it was submitted), comment threads on blocks and
 * cells, and the decision — request changes or approve with a signature.
 */
export function EntryReviewPage({ notebookId, entryId, isPi, canWrite, me }: { notebookId: string; entryId: string; isPi: boolean; canWrite: boolean; me: { id: string; name: string } }) {
  const entry = useEntry(notebookId, entryId);
  const review = useReview(notebookId, entryId);
  const revisions = useRevisions(notebookId, entryId);
  const comments = useComments(notebookId, entryId);
  const markSeen = useMarkSeen(notebookId, entryId);
  const [choice, setChoice] = useState<{ fromId: string; toId: string; seenAtOpen: string | null } | null>(null);
  const [target, setTarget] = useState<AnchorChoice | null>(null);

  const detail = review.data ?? null;
  const list = useMemo(() => revisions.data?.revisions ?? [], [revisions.data]);
  const defaultTo = detail?.review.revisionId ?? entry.data?.head.id ?? '';
  const presets = useMemo(
    () => comparePresets(list, detail, choice?.toId ?? defaultTo, choice ? choice.seenAtOpen : (detail?.myLastSeenRevisionId ?? null)),
    [list, detail, choice, defaultTo],
  );

  // The first comparison shown is fixed once the data is in (marking as seen must not move it):
  // state adjusted while rendering, before the effect below marks the revision as seen.
  if (!choice && entry.data && !review.isPending && revisions.data) {
    setChoice({ fromId: presets[0]?.fromId ?? defaultTo, toId: defaultTo, seenAtOpen: detail?.myLastSeenRevisionId ?? null });
  }

  // A PI who opened the open review has seen its current revision.
  const marked = useRef<string | null>(null);
  const open = detail?.review.status === 'open';
  useEffect(() => {
    if (!isPi || !open || !detail || marked.current === detail.review.revisionId) return;
    if (detail.myLastSeenRevisionId === detail.review.revisionId) return;
    marked.current = detail.review.revisionId;
    markSeen.mutate({ revisionId: detail.review.revisionId });
  }, [isPi, open, detail, markSeen]);

  const older = useRevision(notebookId, entryId, choice?.fromId ?? null);
  const newer = useRevision(notebookId, entryId, choice?.toId ?? null);
  const describeAnchor = useAnchorDescriber([older.data, newer.data]);

  if (entry.isError) return <QueryError error={entry.error} what="the entry" onRetry={() => void entry.refetch()} />;
  if (review.isError) return <QueryError error={review.error} what="the review" onRetry={() => void review.refetch()} />;
  if (revisions.isError) return <QueryError error={revisions.error} what="the revisions" onRetry={() => void revisions.refetch()} />;
  if (!entry.data || review.isPending || !revisions.data || !choice) return <SkeletonBlock lines={8} label="Loading the review" />;

  const e = entry.data.entry;
  const r = detail?.review;
  const ownEntry = r ? r.requestedBy.id === me.id || e.author.id === me.id : false;
  const canDecide = isPi && open && !ownEntry;
  const counts = comments.data ? openThreadCounts(comments.data.threads, choice.toId) : {};
  const underReview = list.find((x) => x.id === r?.revisionId);

  return (
    <div>
      <PageHeader
        eyebrow="Review"
        title={e.title}
        actions={
          canDecide && r ? (
            <div className="flex gap-2">
              <RequestChangesButton notebookId={notebookId} entryId={entryId} revisionId={r.revisionId} />
              <ApproveButton notebookId={notebookId} entryId={entryId} revisionId={r.revisionId} signerName={me.name} />
            </div>
          ) : canWrite && !open && !(r?.status === 'approved' && r.revisionId === entry.data.head.id) ? (
            <SubmitForReviewButton notebookId={notebookId} entryId={entryId} revisionId={entry.data.head.id} label={r ? 'Submit again for review' : 'Submit for review'} />
          ) : undefined
        }
      >
        <span className="flex flex-wrap items-center gap-2 font-sans">
          <Badge tone={e.status === 'approved' ? 'success' : e.status === 'changes-requested' ? 'warning' : e.status === 'in-review' ? 'accent' : 'neutral'}>{ENTRY_STATUS_LABELS[e.status]}</Badge>
          {r && (
            <span>
              {REVIEW_STATUS_LABELS[r.status]} · submitted by {r.requestedBy.name} on {formatDateTime(r.createdAt)}
              {underReview ? ` · revision #${underReview.number} under review` : ''}
            </span>
          )}
          {!r && <span>Not submitted for review yet.</span>}
          <Link to={paths.entry.getHref(notebookId, entryId)} className="text-accent">
            Open the entry
          </Link>
        </span>
      </PageHeader>
      {r?.note && (
        <blockquote className="mb-6 border-l-4 border-accent pl-4 font-serif text-sm">
          <span className="text-xs text-ink-muted">Note from {r.requestedBy.name}:</span>
          <p>{r.note}</p>
        </blockquote>
      )}
      {isPi && ownEntry && open && <p className="mb-4 text-sm text-warning">You wrote this entry, so another PI has to review it.</p>}
      {detail && detail.signatures.length > 0 && (
        <div className="mb-6 space-y-2">
          {detail.signatures.map((s) => (
            <SignatureBlock key={s.id} signature={s} />
          ))}
        </div>
      )}
      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className="space-y-4">
          <ComparePicker revisions={list} fromId={choice.fromId} toId={choice.toId} presets={presets} onChange={(fromId, toId) => setChoice({ fromId, toId, seenAtOpen: choice.seenAtOpen })} />
          <LoadedComparison notebookId={notebookId} entryId={entryId} fromId={choice.fromId} toId={choice.toId}>
            {(a, b) => (
              <RevisionComparison
                older={a}
                newer={b}
                commentCounts={counts}
                showSignatures={!(detail && detail.signatures.length > 0 && b.id === detail.review.revisionId)}
                onCommentBlock={(blockIndex, label) => setTarget({ anchor: { revisionId: b.id, blockIndex }, label })}
                onCommentCell={(cellId, label) => setTarget({ anchor: { revisionId: b.id, cellId }, label })}
              />
            )}
          </LoadedComparison>
        </div>
        <ErrorBoundary>
          <CommentsPanel notebookId={notebookId} entryId={entryId} revisionId={choice.toId} target={target} onClearTarget={() => setTarget(null)} describeAnchor={describeAnchor} />
        </ErrorBoundary>
      </div>
    </div>
  );
}
