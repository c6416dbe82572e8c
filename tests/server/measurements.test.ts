import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EntryDetail } from '@shared/api/entries.ts';
import { measurementSetListSchema, measurementSetSchema } from '@shared/api/measurements.ts';
import { parseMeasurementsCsv } from '@server/services/measurements/parse-measurements-csv.ts';
import { auditActionsFor, closeLogServer, demoNotebookId, signIn, startLogServer, type Client } from './entries-support.ts';

describe('measurements CSV reader', () => {
  it('reads parameter, value and a symmetric error column, sorted by parameter, skipping comments and blank lines', () => {
    const r = parseMeasurementsCsv('# lake survey 2025\nload,chlorophyll,error\n0.3,12.5,1.5\n\n0.1,4,0.5\n0.2,5.5,\n');
    expect(r).toEqual({
      ok: true,
      value: {
        parameterName: 'load',
        stateName: 'chlorophyll',
        rows: [
          { parameter: 0.1, value: 4, errorLow: 0.5, errorHigh: 0.5 },
          { parameter: 0.2, value: 5.5 },
          { parameter: 0.3, value: 12.5, errorLow: 1.5, errorHigh: 1.5 },
        ],
      },
    });
  });

  it('reads asymmetric error bars, semicolons, quotes and named columns', () => {
    const r = parseMeasurementsCsv('"run id";tau;"T (K)";error_low;error_high\nA;1.5;350;2;3\nB;2.5;420;1;4\n', { parameterColumn: 'tau', stateColumn: 'T (K)' });
    expect(r.ok && r.value.rows).toEqual([
      { parameter: 1.5, value: 350, errorLow: 2, errorHigh: 3 },
      { parameter: 2.5, value: 420, errorLow: 1, errorHigh: 4 },
    ]);
  });

  it.each([
    ['mu,x\n0.1,abc\n', 'csv.line2', 'Line 2: "x" is not a number: "abc"'],
    ['mu,x\n0.1\n', 'csv.line2', 'Line 2: has 1 values but the header has 2 columns; "x" is empty'],
    ['mu,x,error\n0.1,2,-1\n', 'csv.line2', 'Line 2: "error" must not be negative'],
    ['mu,x\n0,1\n0.1,2,3\n', 'csv.line3', 'Line 3: has 3 values'],
    ['mu,x\n', 'csv', 'The CSV has a header but no data rows'],
    ['', 'csv', 'The CSV is empty'],
    ['mu\n1\n', 'csv', 'the header needs at least two columns'],
    ['mu,x,error_low\n1,2,3\n', 'csv', 'Give both "error_low" and "error_high"'],
    ['mu,x\n1,2,\n0,1e999\n', 'csv.line2', 'Line 2: has 3 values'],
    ['mu,x\n1,0x10\n', 'csv.line2', '"x" is not a number: "0x10"'],
  ])('reports a bad file: %j', (csv, path, message) => {
    const r = parseMeasurementsCsv(csv);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems).toContainEqual({ path, message: expect.stringContaining(message) });
  });

  it('names a missing column and lists the ones there are', () => {
    const r = parseMeasurementsCsv('mu,x\n1,2\n', { stateColumn: 'y' });
    expect(r).toEqual({ ok: false, problems: [{ path: 'stateColumn', message: 'No column "y" in the header (columns: mu, x)' }] });
  });

  it('lists the first bad rows one by one and counts the rest', () => {
    const csv = 'mu,x\n' + Array.from({ length: 30 }, (_, i) => `${i},bad`).join('\n');
    const r = parseMeasurementsCsv(csv);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.problems).toHaveLength(21);
      expect(r.problems[20]).toEqual({ path: 'csv', message: '10 more bad rows not listed' });
    }
  });
});

describe('measurements CSV reader on arbitrary input', () => {
  it('never throws: it returns rows or problems that each name a field', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 400 }), (csv) => {
        const r = parseMeasurementsCsv(csv);
        if (r.ok) for (const row of r.value.rows) expect(Number.isFinite(row.parameter) && Number.isFinite(row.value)).toBe(true);
        else expect(r.problems.every((p) => p.path.length > 0 && p.message.length > 0)).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it('reads back any table of finite numbers it is given', () => {
    const value = fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e12, max: 1e12 });
    fc.assert(
      fc.property(fc.array(fc.tuple(value, value), { minLength: 1, maxLength: 40 }), (pairs) => {
        const r = parseMeasurementsCsv(`p,v\n${pairs.map(([a, b]) => `${a},${b}`).join('\n')}`);
        expect(r.ok).toBe(true);
        if (r.ok) expect(r.value.rows.map((x) => [x.parameter, x.value]).sort((a, b) => a[0] - b[0])).toEqual([...pairs].sort((a, b) => a[0] - b[0]).map(([a, b]) => [a + 0, b + 0]));
      }),
      { numRuns: 200 },
    );
  });
});

describe('measurements API', () => {
  let mira: Client;
  let jun: Client;
  let kofi: Client;
  let base: string;
  let entryId: string;

  beforeAll(async () => {
    await startLogServer();
    [mira, jun, kofi] = await Promise.all([signIn('researcher2'), signIn('reader'), signIn('researcher')]);
    const notebook = await demoNotebookId('shallowLake');
    const created = (await mira.post(`/api/notebooks/${notebook}/entries`, { title: 'Survey data', entryDate: '2026-11-23', tags: [] })).body as EntryDetail;
    entryId = created.entry.id;
    base = `/api/notebooks/${notebook}/entries/${entryId}/measurements`;
  });
  afterAll(closeLogServer);

  it('imports a CSV with an audit event, and lists it for readers', async () => {
    const res = await mira.post(base, { name: 'Summer survey', csv: 'load,turbidity,error\n0.2,1.1,0.1\n0.4,6.3,0.4\n' });
    expect(res.status).toBe(201);
    const set = measurementSetSchema.parse(res.body);
    expect(set).toMatchObject({ parameterName: 'load', stateName: 'turbidity', rows: [{ parameter: 0.2, value: 1.1 }, { parameter: 0.4, value: 6.3 }] });
    expect(await auditActionsFor(entryId)).toContain('measurements.imported');
    const list = measurementSetListSchema.parse((await jun.get(base)).body);
    expect(list.sets.map((s) => s.id)).toEqual([set.id]);
    expect((await jun.get(`${base}/${set.id}`)).body.name).toBe('Summer survey');
  });

  it('answers bad rows with 400 naming each line', async () => {
    const res = await mira.post(base, { name: 'Bad', csv: 'load,turbidity\n0.2,x\n0.3,\n' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      { path: 'csv.line2', message: 'Line 2: "turbidity" is not a number: "x"' },
      { path: 'csv.line3', message: 'Line 3: "turbidity" is empty' },
    ]);
  });

  it('checks the request itself', async () => {
    const res = await mira.post(base, { csv: 'a,b\n1,2\n' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('name');
  });

  it('keeps readers and non-members out', async () => {
    expect((await jun.post(base, { name: 'x', csv: 'a,b\n1,2\n' })).status).toBe(403);
    expect((await kofi.get(base)).status).toBe(404);
  });
});
