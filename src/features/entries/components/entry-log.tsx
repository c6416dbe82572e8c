import { useEffect, useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router';
import {
  ENTRY_STATUSES,
  ENTRY_STATUS_LABELS,
  createEntrySchema,
  type EntryStatus,
  type EntrySummary,
  type ListEntriesQuery,
} from '@shared/api/entries.ts';
import { Badge, type BadgeTone } from '@/components/ui/badge.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { EmptyState } from '@/components/ui/empty-state.tsx';
import { Field } from '@/components/ui/field.tsx';
import { Input, Select } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonRows } from '@/components/ui/skeleton.tsx';
import { paths } from '@/config/paths.ts';
import { isApiError } from '@/lib/api-error.ts';
import { useCreateEntry } from '../api/create-entry.ts';
import { useEntries } from '../api/get-entries.ts';
import { getEntryQueryOptions } from '../api/get-entry.ts';
import { usePrefetchOnIntent } from '@/lib/prefetch.ts';

const STATUS_TONE: Record<EntryStatus, BadgeTone> = {
  draft: 'neutral',
  'in-review': 'accent',
  approved: 'success',
  'changes-requested': 'unstable',
};

export function EntryStatusBadge({ status }: { status: EntryStatus }) {
  return <Badge tone={STATUS_TONE[status]}>{ENTRY_STATUS_LABELS[status]}</Badge>;
}

/** Local calendar date as YYYY-MM-DD. */
export function today(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

function formatDay(date: string): string {
  const d = new Date(`${date}T12:00:00`);
  return Number.isNaN(d.getTime())
    ? date
    : d.toLocaleDateString(undefined, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' });
}

/** Entries grouped by their date, in the order given (newest first). */
export function groupByDay(entries: readonly EntrySummary[]): { date: string; entries: EntrySummary[] }[] {
  const groups: { date: string; entries: EntrySummary[] }[] = [];
  for (const e of entries) {
    const last = groups[groups.length - 1];
    if (last && last.date === e.entryDate) last.entries.push(e);
    else groups.push({ date: e.entryDate, entries: [e] });
  }
  return groups;
}

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

function NewEntryDialog({
  notebookId,
  open,
  onClose,
}: {
  notebookId: string;
  open: boolean;
  onClose: () => void;
}) {
  const [title, setTitle] = useState('');
  const [date, setDate] = useState(today);
  const [tags, setTags] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const create = useCreateEntry(notebookId);
  const navigate = useNavigate();
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="New entry"
      description="A dated page of the log: notes, equations and computation cells."
    >
      <form
        className="space-y-4"
        onSubmit={(e) => {
          e.preventDefault();
          const input = {
            title,
            entryDate: date,
            tags: tags
              .split(',')
              .map((t) => t.trim())
              .filter(Boolean),
          };
          const parsed = createEntrySchema.safeParse(input);
          if (!parsed.success) {
            const errs: Record<string, string> = {};
            for (const i of parsed.error.issues) errs[String(i.path[0] ?? '_')] ??= i.message;
            setErrors(errs);
            return;
          }
          setErrors({});
          create.mutate(parsed.data, {
            onSuccess: (detail) => {
              onClose();
              void navigate(paths.entry.getHref(notebookId, detail.entry.id));
            },
            onError: (err) => {
              const errs: Record<string, string> = {};
              if (isApiError(err)) for (const f of err.fields) errs[f.path.split('.')[0]] ??= f.message;
              setErrors(
                Object.keys(errs).length
                  ? errs
                  : { _: err instanceof Error ? err.message : 'The entry was not created' },
              );
            },
          });
        }}
      >
        <Field label="Title" error={errors.title}>
          <Input
            value={title}
            onChange={(e) => setTitle(e.target.value)}
            placeholder="Ignition fold of the first-order stirred tank"
            autoFocus
          />
        </Field>
        <div className="grid grid-cols-2 gap-3">
          <Field label="Date" error={errors.entryDate}>
            <Input type="date" value={date} onChange={(e) => setDate(e.target.value)} />
          </Field>
          <Field label="Tags" help="Separated by commas" error={errors.tags}>
            <Input value={tags} onChange={(e) => setTags(e.target.value)} placeholder="ignition, folds" />
          </Field>
        </div>
        {errors._ && <p className="text-sm font-medium text-unstable">{errors._}</p>}
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" busy={create.isPending}>
            Create entry
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

/** The notebook's dated log: newest first, grouped by day, with search, filters and "New entry". */
export function EntryLog({ notebookId, canWrite }: { notebookId: string; canWrite: boolean }) {
  const [q, setQ] = useState('');
  const [status, setStatus] = useState<EntryStatus | ''>('');
  const [tag, setTag] = useState('');
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [creating, setCreating] = useState(false);
  const dq = useDebounced(q.trim(), 300);
  const dtag = useDebounced(tag.trim(), 300);
  const filters: ListEntriesQuery = useMemo(
    () => ({
      q: dq || undefined,
      status: status || undefined,
      tag: dtag || undefined,
      from: from || undefined,
      to: to || undefined,
    }),
    [dq, status, dtag, from, to],
  );
  const entries = useEntries(notebookId, filters);
  const prefetch = usePrefetchOnIntent();
  const filtered = Boolean(dq || status || dtag || from || to);

  return (
    <section aria-labelledby="entry-log-title">
      <div className="mb-4 flex flex-wrap items-end gap-3">
        <h2 id="entry-log-title" className="mr-auto font-serif text-2xl font-bold">
          Log
        </h2>
        {canWrite && <Button onClick={() => setCreating(true)}>New entry</Button>}
      </div>
      <div className="mb-5 flex flex-wrap items-end gap-3 rounded-md border border-rule bg-surface px-3 py-3">
        <label className="min-w-56 flex-1">
          <span className="mb-1 block text-xs font-medium text-ink-muted">Search</span>
          <Input
            type="search"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            placeholder="Words in titles, text and cells"
            className="h-9"
          />
        </label>
        <label className="w-44">
          <span className="mb-1 block text-xs font-medium text-ink-muted">Status</span>
          <Select
            value={status}
            onChange={(e) => setStatus(e.target.value as EntryStatus | '')}
            className="h-9"
          >
            <option value="">Any</option>
            {ENTRY_STATUSES.map((s) => (
              <option key={s} value={s}>
                {ENTRY_STATUS_LABELS[s]}
              </option>
            ))}
          </Select>
        </label>
        <label className="w-36">
          <span className="mb-1 block text-xs font-medium text-ink-muted">Tag</span>
          <Input value={tag} onChange={(e) => setTag(e.target.value)} className="h-9" />
        </label>
        <label className="w-40">
          <span className="mb-1 block text-xs font-medium text-ink-muted">From</span>
          <Input type="date" value={from} onChange={(e) => setFrom(e.target.value)} className="h-9" />
        </label>
        <label className="w-40">
          <span className="mb-1 block text-xs font-medium text-ink-muted">To</span>
          <Input type="date" value={to} onChange={(e) => setTo(e.target.value)} className="h-9" />
        </label>
      </div>
      {entries.isPending ? (
        <SkeletonRows rows={6} rowHeight="h-11" label="Loading the log" />
      ) : entries.isError ? (
        <QueryError error={entries.error} what="the log" onRetry={() => void entries.refetch()} />
      ) : entries.data.entries.length === 0 ? (
        <EmptyState
          title={filtered ? 'No entries match' : 'No entries yet'}
          action={
            !filtered && canWrite ? (
              <Button onClick={() => setCreating(true)}>Write the first entry</Button>
            ) : undefined
          }
        >
          {filtered
            ? 'Try fewer words or clear a filter.'
            : 'Each entry is a dated page: notes, equations and computation cells.'}
        </EmptyState>
      ) : (
        <ol className="space-y-6">
          {groupByDay(entries.data.entries).map((g) => (
            <li key={g.date}>
              <h3 className="mb-2 border-b border-rule pb-1 text-sm font-semibold text-ink-muted">
                <time dateTime={g.date}>{formatDay(g.date)}</time>
              </h3>
              <ul className="space-y-1">
                {g.entries.map((e) => (
                  <li
                    key={e.id}
                    className="flex flex-wrap items-baseline gap-x-3 gap-y-1 rounded-md px-2 py-2 hover:bg-sunken"
                  >
                    <Link to={paths.entry.getHref(notebookId, e.id)} {...prefetch((qc) => qc.prefetchQuery(getEntryQueryOptions(notebookId, e.id)))} className="font-serif text-lg font-bold">
                      {e.title}
                    </Link>
                    <EntryStatusBadge status={e.status} />
                    {e.tags.map((t) => (
                      <button
                        key={t}
                        type="button"
                        onClick={() => setTag(t)}
                        className="rounded-sm bg-sunken px-1.5 text-xs text-ink-muted hover:text-ink"
                        title={`Show entries tagged ${t}`}
                      >
                        #{t}
                      </button>
                    ))}
                    <span className="ml-auto text-xs text-ink-muted">
                      {e.author.name} · {e.revisionCount} revision{e.revisionCount === 1 ? '' : 's'} · updated{' '}
                      {new Date(e.updatedAt).toLocaleString(undefined, {
                        dateStyle: 'medium',
                        timeStyle: 'short',
                      })}
                    </span>
                  </li>
                ))}
              </ul>
            </li>
          ))}
        </ol>
      )}
      {canWrite && (
        <NewEntryDialog notebookId={notebookId} open={creating} onClose={() => setCreating(false)} />
      )}
    </section>
  );
}
