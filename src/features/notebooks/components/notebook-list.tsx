import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';
import { NotebookRoleBadge } from '@/components/ui/badge.tsx';
import { EmptyState } from '@/components/ui/empty-state.tsx';
import { Skeleton } from '@/components/ui/skeleton.tsx';
import { formatDate } from '@/lib/format.ts';
import { useNotebooks } from '../api/get-notebooks.ts';
import { getNotebookQueryOptions } from '../api/get-notebook.ts';
import { getEntriesQueryOptions } from '@/features/entries/api/get-entries.ts';
import { usePrefetchOnIntent } from '@/lib/prefetch.ts';
import { QueryError } from '@/components/ui/query-error.tsx';

export function NotebookList() {
  const notebooks = useNotebooks();
  const prefetch = usePrefetchOnIntent();
  if (notebooks.isPending)
    return (
      <ul role="status" aria-label="Loading notebooks" className="grid gap-4 md:grid-cols-2">
        {[0, 1, 2].map((i) => (
          <li key={i} className="rounded-lg border border-rule bg-surface p-5">
            <Skeleton className="mb-3 h-5 w-2/3" />
            <Skeleton className="mb-2 h-3.5 w-full" />
            <Skeleton className="h-3.5 w-1/2" />
          </li>
        ))}
      </ul>
    );
  if (notebooks.isError)
    return (
      <QueryError error={notebooks.error} onRetry={() => void notebooks.refetch()} what="your notebooks" />
    );
  if (notebooks.data.length === 0)
    return (
      <EmptyState title="No notebooks yet">
        A notebook holds one study: its model, the entries that record each analysis, and the people who work
        on it. When a principal investigator adds you to a notebook it will appear here.
      </EmptyState>
    );
  return (
    <ul className="grid gap-4 md:grid-cols-2" aria-label="Your notebooks">
      {notebooks.data.map((n) => (
        <li key={n.id}>
          <Link
            to={paths.notebook.getHref(n.id)}
            {...prefetch((qc) => qc.prefetchQuery(getNotebookQueryOptions(n.id)), (qc) => qc.prefetchQuery(getEntriesQueryOptions(n.id)))}
            className="group block h-full rounded-lg border border-rule bg-surface p-5 text-ink no-underline shadow-sm transition-colors hover:border-accent hover:text-ink"
          >
            <div className="mb-2 flex items-start justify-between gap-3">
              <h3 className="font-serif text-lg leading-snug font-bold group-hover:text-accent">{n.title}</h3>
              <NotebookRoleBadge role={n.role} />
            </div>
            {n.description && (
              <p className="line-clamp-3 font-serif text-sm leading-relaxed text-ink-muted">
                {n.description}
              </p>
            )}
            <p className="mt-3 text-xs text-ink-muted">
              <span className="figures">{n.memberCount}</span> {n.memberCount === 1 ? 'member' : 'members'} ·
              updated {formatDate(n.updatedAt)}
            </p>
          </Link>
        </li>
      ))}
    </ul>
  );
}
