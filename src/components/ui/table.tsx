import { useMemo, useState, type ReactNode } from 'react';
import { cn } from './cn.ts';
import { nextSort, paginate, sortRows, type SortState, type SortValue } from './table-state.ts';

export type Column<T> = {
  key: string;
  header: string;
  cell: (row: T) => ReactNode;
  /** Present when the column can be sorted. */
  sortValue?: (row: T) => SortValue;
  className?: string;
  /** Numbers align right in a monospaced face. */
  numeric?: boolean;
};

type DataTableProps<T> = {
  caption: string;
  columns: Column<T>[];
  rows: readonly T[];
  rowKey: (row: T) => string;
  initialSort?: SortState;
  pageSize?: number;
  empty?: ReactNode;
};

/** A table with sortable headers (aria-sort) and pagination. */
export function DataTable<T>({
  caption,
  columns,
  rows,
  rowKey,
  initialSort = null,
  pageSize = 10,
  empty,
}: DataTableProps<T>) {
  const [sort, setSort] = useState<SortState>(initialSort);
  const [page, setPage] = useState(1);
  const sorted = useMemo(
    () => sortRows(rows, sort, (row, key) => columns.find((c) => c.key === key)?.sortValue?.(row)),
    [rows, sort, columns],
  );
  const view = paginate(sorted, page, pageSize);

  if (rows.length === 0 && empty) return <>{empty}</>;

  return (
    <div>
      <div className="overflow-x-auto rounded-lg border border-rule bg-surface">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">{caption}</caption>
          <thead className="border-b border-rule bg-sunken text-xs tracking-wide text-ink-muted uppercase">
            <tr>
              {columns.map((c) => {
                const active = sort?.key === c.key;
                return (
                  <th
                    key={c.key}
                    scope="col"
                    aria-sort={c.sortValue ? (active ? sort!.direction : 'none') : undefined}
                    className={cn(
                      'px-4 py-2.5 font-semibold whitespace-nowrap',
                      c.numeric && 'text-right',
                      c.className,
                    )}
                  >
                    {c.sortValue ? (
                      <button
                        type="button"
                        className="inline-flex items-center gap-1 rounded-sm uppercase hover:text-ink"
                        onClick={() => {
                          setSort((s) => nextSort(s, c.key));
                          setPage(1);
                        }}
                      >
                        {c.header}
                        <span aria-hidden="true" className={cn('text-[0.7em]', !active && 'opacity-40')}>
                          {active ? (sort!.direction === 'ascending' ? '▲' : '▼') : '◆'}
                        </span>
                        <span className="sr-only">
                          {active ? `, sorted ${sort!.direction}` : ', sortable'}
                        </span>
                      </button>
                    ) : (
                      c.header
                    )}
                  </th>
                );
              })}
            </tr>
          </thead>
          <tbody>
            {view.rows.map((row) => (
              <tr key={rowKey(row)} className="border-b border-rule last:border-b-0 hover:bg-paper">
                {columns.map((c) => (
                  <td
                    key={c.key}
                    className={cn('px-4 py-2.5 align-middle', c.numeric && 'figures text-right', c.className)}
                  >
                    {c.cell(row)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {view.pageCount > 1 && (
        <nav
          aria-label={`${caption}: pages`}
          className="mt-3 flex items-center justify-between gap-3 text-sm text-ink-muted"
        >
          <span className="figures">
            {view.first}–{view.last} of {view.total}
          </span>
          <span className="flex items-center gap-2">
            <button
              type="button"
              className="rounded-md border border-rule-strong bg-surface px-3 py-1 text-ink disabled:opacity-50"
              disabled={view.page <= 1}
              onClick={() => setPage(view.page - 1)}
            >
              Previous
            </button>
            <span className="figures" aria-current="page">
              Page {view.page} of {view.pageCount}
            </span>
            <button
              type="button"
              className="rounded-md border border-rule-strong bg-surface px-3 py-1 text-ink disabled:opacity-50"
              disabled={view.page >= view.pageCount}
              onClick={() => setPage(view.page + 1)}
            >
              Next
            </button>
          </span>
        </nav>
      )}
    </div>
  );
}
