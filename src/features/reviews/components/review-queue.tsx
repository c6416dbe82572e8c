import { Link } from 'react-router';
import { getEntryQueryOptions } from '@/features/entries/api/get-entry.ts';
import { usePrefetchOnIntent } from '@/lib/prefetch.ts';
import { getReviewQueryOptions } from '../api/get-review.ts';
import type { ReviewQueueItem } from '@shared/api/reviews.ts';
import { paths } from '@/config/paths.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { EmptyState } from '@/components/ui/empty-state.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonRows } from '@/components/ui/skeleton.tsx';
import { DataTable, type Column } from '@/components/ui/table.tsx';
import { formatDateTime } from '@/lib/format.ts';
import { useReviewQueue } from '../api/get-review-queue.ts';

/** "3 days", "5 hours", "just now": how long an entry has waited. */
export function waitingFor(iso: string, now = Date.now()): string {
  const ms = now - new Date(iso).getTime();
  if (!Number.isFinite(ms) || ms < 60_000) return 'just now';
  const minutes = Math.floor(ms / 60_000);
  if (minutes < 60) return `${minutes} ${minutes === 1 ? 'minute' : 'minutes'}`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return `${hours} ${hours === 1 ? 'hour' : 'hours'}`;
  const days = Math.floor(hours / 24);
  return `${days} days`;
}

/** The entry's review page, loaded ahead when the pointer rests on the link or it takes focus. */
function ReviewLink({ item }: { item: ReviewQueueItem }) {
  const prefetch = usePrefetchOnIntent();
  const { notebookId, entryId } = item.review;
  return (
    <Link to={paths.entryReview.getHref(notebookId, entryId)} {...prefetch((qc) => qc.prefetchQuery(getEntryQueryOptions(notebookId, entryId)), (qc) => qc.prefetchQuery(getReviewQueryOptions(notebookId, entryId)))} className="font-medium">
      {item.entryTitle}
    </Link>
  );
}

const columns: Column<ReviewQueueItem>[] = [
  {
    key: 'entry',
    header: 'Entry',
    cell: (i) => (
      <span className="flex flex-col">
        <ReviewLink item={i} />
        <span className="text-xs text-ink-muted">{i.notebookTitle}</span>
      </span>
    ),
    sortValue: (i) => i.entryTitle.toLowerCase(),
  },
  { key: 'by', header: 'Submitted by', cell: (i) => i.review.requestedBy.name, sortValue: (i) => i.review.requestedBy.name },
  { key: 'note', header: 'Note', cell: (i) => <span className="line-clamp-2 max-w-xs text-ink-muted">{i.review.note || '—'}</span> },
  {
    key: 'seen',
    header: 'For you',
    cell: (i) =>
      i.lastSeenRevisionId === null ? <Badge tone="accent">New</Badge> : i.changedSinceSeen ? <Badge tone="warning">Changed since you looked</Badge> : <Badge>Seen</Badge>,
  },
  {
    key: 'age',
    header: 'Waiting',
    cell: (i) => <time dateTime={i.review.createdAt} title={formatDateTime(i.review.createdAt)}>{waitingFor(i.review.createdAt)}</time>,
    sortValue: (i) => i.review.createdAt,
  },
];

/** Entries awaiting the signed-in PI, across notebooks, oldest first. */
export function ReviewQueue() {
  const queue = useReviewQueue();
  if (queue.isPending) return <SkeletonRows rows={4} rowHeight="h-14" header label="Loading your review queue" />;
  if (queue.isError) return <QueryError error={queue.error} what="your review queue" onRetry={() => void queue.refetch()} />;
  return (
    <DataTable
      caption="Entries awaiting your review"
      columns={columns}
      rows={queue.data.items}
      rowKey={(i) => i.review.id}
      pageSize={20}
      empty={<EmptyState title="Nothing awaits your review">When a researcher submits an entry in a notebook where you are PI, it appears here.</EmptyState>}
    />
  );
}
