import { useState, type FormEvent } from 'react';
import { AUDIT_LIMITS, type AuditEvent, type AuditQueryInput } from '@shared/api/audit.ts';
import { buttonClass, Button } from '@/components/ui/button.tsx';
import { EmptyState } from '@/components/ui/empty-state.tsx';
import { Input, Select } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonRows } from '@/components/ui/skeleton.tsx';
import { ApiError } from '@/lib/api-error.ts';
import { formatDateTime } from '@/lib/format.ts';
import { auditCsvHref, useAudit } from '../api/get-audit.ts';
import { AuditDetailsView } from './audit-details.tsx';

/** Kinds of action a filter can pick, by prefix (the server matches "review" to every "review.…"). */
export const AUDIT_ACTION_GROUPS: { value: string; label: string }[] = [
  { value: '', label: 'Every action' },
  { value: 'review', label: 'Reviews and signatures' },
  { value: 'review.approved', label: 'Approvals (signed)' },
  { value: 'review.signature_failed', label: 'Failed signatures' },
  { value: 'review.changes_requested', label: 'Changes requested' },
  { value: 'comment', label: 'Comments' },
  { value: 'revision', label: 'Revisions' },
  { value: 'entry', label: 'Entries' },
  { value: 'cell', label: 'Cell runs' },
  { value: 'membership', label: 'Membership' },
  { value: 'notebook', label: 'Notebooks' },
  { value: 'auth', label: 'Sign-ins and passwords' },
];

/** "review.changes_requested" → "review: changes requested". */
export function actionWords(action: string): string {
  const [group, verb] = action.split('.');
  return verb ? `${group}: ${verb.replace(/_/g, ' ')}` : action.replace(/_/g, ' ');
}

export interface AuditScope {
  notebookId?: string;
  entryId?: string;
  actorId?: string;
}

/**
 * The audit trail for one entry, notebook or person: filter by action, person and dates; page
 * through; download the same filter as CSV.
 */
export function AuditLog({ scope }: { scope: AuditScope }) {
  const [filters, setFilters] = useState<{ action: string; actorId: string; from: string; to: string }>({ action: '', actorId: scope.actorId ?? '', from: '', to: '' });
  const [draft, setDraft] = useState(filters);
  const [page, setPage] = useState(1);
  const query: AuditQueryInput = {
    notebookId: scope.notebookId,
    entryId: scope.entryId,
    actorId: filters.actorId || undefined,
    action: filters.action || undefined,
    from: filters.from || undefined,
    to: filters.to || undefined,
    page,
    pageSize: AUDIT_LIMITS.pageSizeDefault,
  };
  const audit = useAudit(query);
  const apply = (e: FormEvent) => {
    e.preventDefault();
    setFilters(draft);
    setPage(1);
  };
  const people = new Map<string, string>();
  for (const ev of audit.data?.events ?? []) if (ev.actor) people.set(ev.actor.id, ev.actor.name);
  if (filters.actorId && !people.has(filters.actorId)) {
    const named = audit.data?.events.map((ev) => ev.references[filters.actorId]).find(Boolean);
    people.set(filters.actorId, named?.label ?? 'The chosen person');
  }
  const total = audit.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / AUDIT_LIMITS.pageSizeDefault));
  const fieldError = audit.error instanceof ApiError ? audit.error : null;

  return (
    <div className="space-y-4">
      <form onSubmit={apply} className="flex flex-wrap items-end gap-3 rounded-md border border-rule bg-paper p-3" aria-label="Filter the audit trail">
        <label className="text-sm">
          <span className="mb-1 block text-xs text-ink-muted">Action</span>
          <Select compact options={AUDIT_ACTION_GROUPS} value={draft.action} onChange={(e) => setDraft({ ...draft, action: e.target.value })} />
        </label>
        <label className="text-sm">
          <span className="mb-1 block text-xs text-ink-muted">Person</span>
          <Select compact value={draft.actorId} onChange={(e) => setDraft({ ...draft, actorId: e.target.value })}>
            <option value="">Everyone</option>
            {[...people].map(([id, name]) => (
              <option key={id} value={id}>
                {name}
              </option>
            ))}
          </Select>
        </label>
        <label className="text-sm">
          <span className="mb-1 block text-xs text-ink-muted">From</span>
          <Input type="date" className="h-8 w-40 text-sm" value={draft.from} onChange={(e) => setDraft({ ...draft, from: e.target.value })} />
        </label>
        <label className="text-sm">
          <span className="mb-1 block text-xs text-ink-muted">To (inclusive)</span>
          <Input type="date" className="h-8 w-40 text-sm" value={draft.to} onChange={(e) => setDraft({ ...draft, to: e.target.value })} />
        </label>
        <Button type="submit" size="sm">
          Apply
        </Button>
        <a href={auditCsvHref(query)} className={buttonClass('secondary', 'sm', 'ml-auto')} download>
          Download CSV
        </a>
      </form>
      {audit.isPending && <SkeletonRows rows={8} rowHeight="h-14" header label="Loading the audit trail" />}
      {audit.isError && <QueryError error={audit.error} what={fieldError?.fields.length ? `the audit trail (${fieldError.fields.map((f) => f.message).join('; ')})` : 'the audit trail'} />}
      {audit.data && audit.data.events.length === 0 && <EmptyState title="Nothing recorded">No recorded action matches these filters.</EmptyState>}
      {audit.data && audit.data.events.length > 0 && (
        <>
          <div className="overflow-x-auto rounded-lg border border-rule bg-surface">
            <table className="w-full border-collapse text-left text-sm">
              <caption className="sr-only">Audit trail, page {page} of {pages}</caption>
              <thead className="border-b border-rule bg-sunken text-xs tracking-wide text-ink-muted uppercase">
                <tr>
                  <th scope="col" className="px-3 py-2">#</th>
                  <th scope="col" className="px-3 py-2">When</th>
                  <th scope="col" className="px-3 py-2">Who</th>
                  <th scope="col" className="px-3 py-2">Action</th>
                  <th scope="col" className="px-3 py-2">Details</th>
                </tr>
              </thead>
              <tbody>
                {audit.data.events.map((ev: AuditEvent) => (
                  <tr key={ev.sequence} className="border-b border-rule last:border-0 align-top">
                    <td className="px-3 py-2 font-mono text-xs text-ink-muted">{ev.sequence}</td>
                    <td className="px-3 py-2 whitespace-nowrap">{formatDateTime(ev.occurredAt)}</td>
                    <td className="px-3 py-2">{ev.actor?.name ?? 'System'}</td>
                    <td className="px-3 py-2 whitespace-nowrap">{actionWords(ev.action)}</td>
                    <td className="max-w-md px-3 py-2 break-words">
                      <AuditDetailsView event={ev} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <nav aria-label="Pages of the audit trail" className="flex items-center justify-between text-sm">
            <span className="text-ink-muted">
              {total} {total === 1 ? 'action' : 'actions'} · page {page} of {pages}
            </span>
            <span className="flex gap-2">
              <Button size="sm" variant="secondary" disabled={page <= 1} onClick={() => setPage(page - 1)}>
                Previous
              </Button>
              <Button size="sm" variant="secondary" disabled={page >= pages} onClick={() => setPage(page + 1)}>
                Next
              </Button>
            </span>
          </nav>
        </>
      )}
    </div>
  );
}
