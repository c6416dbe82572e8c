import { NavLink } from 'react-router';
import { paths } from '@/config/paths.ts';
import { cn } from '@/components/ui/cn.ts';
import { EmptyState } from '@/components/ui/empty-state.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { formatDateTime } from '@/lib/format.ts';
import { useOutbox } from '../api/get-outbox.ts';

export function OutboxList() {
  const outbox = useOutbox();
  if (outbox.isPending) return <SkeletonBlock lines={5} label="Loading messages" />;
  if (outbox.isError)
    return <QueryError error={outbox.error} what="the outbox" onRetry={() => void outbox.refetch()} />;
  if (outbox.data.length === 0)
    return (
      <EmptyState title="No mail sent yet">
        Invites and password-reset messages sent by this installation appear here instead of going out.
      </EmptyState>
    );
  return (
    <ul
      aria-label="Messages"
      className="divide-y divide-rule overflow-hidden rounded-lg border border-rule bg-surface"
    >
      {outbox.data.map((m) => (
        <li key={m.id}>
          <NavLink
            to={paths.outboxMessage.getHref(m.id)}
            className={({ isActive }) =>
              cn(
                'block px-4 py-3 text-ink no-underline hover:bg-paper hover:text-ink',
                isActive && 'bg-accent-soft',
              )
            }
          >
            <p className="truncate text-sm font-medium">{m.subject}</p>
            <p className="truncate text-xs text-ink-muted">
              to {m.to.join(', ')} · <span className="figures">{formatDateTime(m.receivedAt)}</span>
            </p>
          </NavLink>
        </li>
      ))}
    </ul>
  );
}
