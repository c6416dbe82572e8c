/** Sorting and paging of rows held in the client; pure so it can be tested without a browser. */
export type SortDirection = 'ascending' | 'descending';
export type SortState = { key: string; direction: SortDirection } | null;
export type SortValue = string | number | boolean | null | undefined;

const collator = new Intl.Collator('en', { sensitivity: 'base', numeric: true });

export function compareValues(a: SortValue, b: SortValue): number {
  if (a == null && b == null) return 0;
  if (a == null) return 1; // empty values last, whichever the direction
  if (b == null) return -1;
  if (typeof a === 'string' && typeof b === 'string') return collator.compare(a, b);
  return Number(a) - Number(b);
}

/** A stable sort: rows that compare equal keep their order. */
export function sortRows<T>(
  rows: readonly T[],
  sort: SortState,
  value: (row: T, key: string) => SortValue,
): T[] {
  if (!sort) return [...rows];
  const sign = sort.direction === 'ascending' ? 1 : -1;
  return rows
    .map((row, index) => ({ row, index, v: value(row, sort.key) }))
    .sort((x, y) => {
      if (x.v == null || y.v == null) return compareValues(x.v, y.v) || x.index - y.index;
      return sign * compareValues(x.v, y.v) || x.index - y.index;
    })
    .map((x) => x.row);
}

/** Clicking a header: first ascending, then descending, then back to ascending. */
export function nextSort(current: SortState, key: string): SortState {
  if (current?.key === key)
    return { key, direction: current.direction === 'ascending' ? 'descending' : 'ascending' };
  return { key, direction: 'ascending' };
}

export type Page<T> = {
  rows: T[];
  page: number;
  pageCount: number;
  first: number;
  last: number;
  total: number;
};

/** One page of rows (pages count from 1); a page beyond the end is clamped to the last. */
export function paginate<T>(rows: readonly T[], page: number, pageSize: number): Page<T> {
  if (!Number.isInteger(pageSize) || pageSize < 1)
    throw new RangeError(`pageSize must be a positive whole number, got ${pageSize}`);
  const total = rows.length;
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const p = Math.min(Math.max(1, Math.floor(page) || 1), pageCount);
  const start = (p - 1) * pageSize;
  const slice = rows.slice(start, start + pageSize);
  return { rows: slice, page: p, pageCount, first: total ? start + 1 : 0, last: start + slice.length, total };
}
