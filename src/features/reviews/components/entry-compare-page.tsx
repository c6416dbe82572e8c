import { useMemo } from 'react';
import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';
import { PageHeader } from '@/components/ui/app-shell.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { useRevisions } from '@/features/entries/api/get-revisions.ts';
import { useReview } from '../api/get-review.ts';
import { comparePresets } from './entry-review-page.tsx';
import { ComparePicker, LoadedComparison, RevisionComparison } from './revision-compare.tsx';

/**
 * Any two revisions of an entry side by side in meaning: text, cell inputs, results. Without a
 * choice in the address, the newest revision is compared with the one before it.
 */
export function EntryComparePage({
  notebookId,
  entryId,
  fromId,
  toId,
  onChange,
}: {
  notebookId: string;
  entryId: string;
  fromId: string | null;
  toId: string | null;
  onChange: (fromId: string, toId: string) => void;
}) {
  const revisions = useRevisions(notebookId, entryId);
  const review = useReview(notebookId, entryId);
  const list = useMemo(() => revisions.data?.revisions ?? [], [revisions.data]);
  if (revisions.isError) return <QueryError error={revisions.error} what="the revisions" onRetry={() => void revisions.refetch()} />;
  if (!revisions.data || review.isPending) return <SkeletonBlock lines={6} label="Loading the revisions" />;
  const to = toId ?? list[0]?.id;
  const from = fromId ?? list.find((r) => r.id === to)?.parentId ?? to;
  if (!to || !from) return <p className="text-sm text-ink-muted">This entry has no revisions to compare.</p>;
  return (
    <div>
      <PageHeader eyebrow="Compare revisions" title={list[0]?.title ?? 'Entry'}>
        <Link to={paths.entry.getHref(notebookId, entryId)} className="font-sans text-accent">
          Open the entry
        </Link>
      </PageHeader>
      <div className="space-y-4">
        <ComparePicker revisions={list} fromId={from} toId={to} presets={comparePresets(list, review.data ?? null, to)} onChange={onChange} />
        <LoadedComparison notebookId={notebookId} entryId={entryId} fromId={from} toId={to}>
          {(a, b) => <RevisionComparison older={a} newer={b} />}
        </LoadedComparison>
      </div>
    </div>
  );
}
