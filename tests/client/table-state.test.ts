import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compareValues, nextSort, paginate, sortRows } from '@/components/ui/table-state.ts';

type Row = { name: string; n: number | null };
const rows: Row[] = [
  { name: 'Okafor', n: 3 },
  { name: 'castellanos', n: null },
  { name: 'Mensah', n: 10 },
  { name: 'Halvorsen', n: 2 },
];
const value = (r: Row, key: string) => (key === 'name' ? r.name : r.n);

describe('sortRows', () => {
  it('sorts text without regard to case, numbers by value, and keeps empty values last both ways', () => {
    expect(sortRows(rows, { key: 'name', direction: 'ascending' }, value).map((r) => r.name)).toEqual([
      'castellanos',
      'Halvorsen',
      'Mensah',
      'Okafor',
    ]);
    expect(sortRows(rows, { key: 'n', direction: 'ascending' }, value).map((r) => r.n)).toEqual([
      2,
      3,
      10,
      null,
    ]);
    expect(sortRows(rows, { key: 'n', direction: 'descending' }, value).map((r) => r.n)).toEqual([
      10,
      3,
      2,
      null,
    ]);
  });

  it('orders numbers inside text naturally ("item 2" before "item 10")', () => {
    expect(compareValues('item 2', 'item 10')).toBeLessThan(0);
  });

  it('is a stable permutation of its input for any rows', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ k: fc.integer({ min: 0, max: 3 }), id: fc.nat() })), (input) => {
        const out = sortRows(input, { key: 'k', direction: 'ascending' }, (r) => r.k);
        expect(out).toHaveLength(input.length);
        for (let i = 1; i < out.length; i++) {
          expect(out[i - 1].k).toBeLessThanOrEqual(out[i].k);
          // rows with equal keys keep their original order
          if (out[i - 1].k === out[i].k)
            expect(input.indexOf(out[i - 1])).toBeLessThan(input.indexOf(out[i]));
        }
      }),
    );
  });

  it('returns a copy when unsorted', () => {
    const out = sortRows(rows, null, value);
    expect(out).toEqual(rows);
    expect(out).not.toBe(rows);
  });
});

describe('nextSort', () => {
  it('goes ascending, then descending, and starts ascending on a new column', () => {
    const a = nextSort(null, 'name');
    expect(a).toEqual({ key: 'name', direction: 'ascending' });
    const b = nextSort(a, 'name');
    expect(b).toEqual({ key: 'name', direction: 'descending' });
    expect(nextSort(b, 'name')).toEqual({ key: 'name', direction: 'ascending' });
    expect(nextSort(b, 'email')).toEqual({ key: 'email', direction: 'ascending' });
  });
});

describe('paginate', () => {
  const items = Array.from({ length: 23 }, (_, i) => i + 1);
  it('cuts pages and reports the range shown', () => {
    expect(paginate(items, 1, 10)).toMatchObject({
      rows: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10],
      pageCount: 3,
      first: 1,
      last: 10,
      total: 23,
    });
    expect(paginate(items, 3, 10)).toMatchObject({ rows: [21, 22, 23], page: 3, first: 21, last: 23 });
  });
  it('clamps pages past either end', () => {
    expect(paginate(items, 9, 10).page).toBe(3);
    expect(paginate(items, 0, 10).page).toBe(1);
  });
  it('shows one empty page for no rows', () => {
    expect(paginate([], 1, 10)).toEqual({ rows: [], page: 1, pageCount: 1, first: 0, last: 0, total: 0 });
  });
  it('rejects a page size that is not a positive whole number', () => {
    expect(() => paginate(items, 1, 0)).toThrow(/pageSize/);
    expect(() => paginate(items, 1, 2.5)).toThrow(/pageSize/);
  });
  it('every row appears on exactly one page', () => {
    fc.assert(
      fc.property(fc.array(fc.nat(), { maxLength: 200 }), fc.integer({ min: 1, max: 30 }), (list, size) => {
        const { pageCount } = paginate(list, 1, size);
        const all = Array.from({ length: pageCount }, (_, i) => paginate(list, i + 1, size).rows).flat();
        expect(all).toEqual(list);
      }),
    );
  });
});
