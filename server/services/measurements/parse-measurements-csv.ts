import { MEASUREMENT_LIMITS, type MeasurementRow } from '@shared/api/measurements.ts';
import type { FieldProblem } from '@server/errors/index.ts';

export interface ParsedMeasurements {
  parameterName: string;
  stateName: string;
  rows: MeasurementRow[];
}

/** Splits one CSV line on `sep`, honouring double quotes ("" inside quotes is a quote; RFC 4180 §2). */
function splitLine(line: string, sep: string): string[] {
  const cells: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (quoted) {
      if (c === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cur += c;
    } else if (c === '"') quoted = true;
    else if (c === sep) {
      cells.push(cur.trim());
      cur = '';
    } else cur += c;
  }
  cells.push(cur.trim());
  return cells;
}

/** A decimal number with "." as the point (1e-3 and leading signs allowed); null otherwise. */
function readNumber(text: string): number | null {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text)) return null;
  const n = Number(text);
  return Number.isFinite(n) ? n : null;
}

/**
 * Reads measured data from CSV text (format in shared/api/measurements.ts). Returns the rows, or
 * the problems, each naming the line ("line 7") and the column, at most
 * MEASUREMENT_LIMITS.problemsReported of them plus a count of the rest.
 */
export function parseMeasurementsCsv(
  csv: string,
  options: { parameterColumn?: string; stateColumn?: string } = {},
): { ok: true; value: ParsedMeasurements } | { ok: false; problems: FieldProblem[] } {
  const lines = csv.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const numbered = lines.map((text, i) => ({ text, line: i + 1 })).filter((l) => l.text.trim() !== '' && !l.text.trimStart().startsWith('#'));
  if (numbered.length === 0) return { ok: false, problems: [{ path: 'csv', message: 'The CSV is empty: it needs a header row and data rows' }] };
  const headerLine = numbered[0];
  const sep = headerLine.text.includes(';') && !headerLine.text.includes(',') ? ';' : ',';
  const header = splitLine(headerLine.text, sep);
  const lower = header.map((h) => h.toLowerCase());
  const find = (name: string) => lower.indexOf(name.toLowerCase());

  const problems: FieldProblem[] = [];
  const pick = (wanted: string | undefined, fallback: number, field: string): number => {
    if (wanted === undefined) return fallback;
    const i = find(wanted);
    if (i < 0) problems.push({ path: field, message: `No column "${wanted}" in the header (columns: ${header.join(', ')})` });
    return i;
  };
  const pIdx = pick(options.parameterColumn, 0, 'parameterColumn');
  const sIdx = pick(options.stateColumn, 1, 'stateColumn');
  if (header.length < 2) problems.push({ path: 'csv', message: `Line ${headerLine.line}: the header needs at least two columns (parameter and observed state)` });
  const errIdx = find('error');
  const lowIdx = find('error_low');
  const highIdx = find('error_high');
  if ((lowIdx < 0) !== (highIdx < 0)) {
    problems.push({ path: 'csv', message: 'Give both "error_low" and "error_high", or one "error" column' });
  }
  if (problems.length) return { ok: false, problems };

  const data = numbered.slice(1);
  if (data.length === 0) return { ok: false, problems: [{ path: 'csv', message: 'The CSV has a header but no data rows' }] };
  if (data.length > MEASUREMENT_LIMITS.rowsMax) {
    return { ok: false, problems: [{ path: 'csv', message: `At most ${MEASUREMENT_LIMITS.rowsMax} data rows (this file has ${data.length})` }] };
  }
  const rows: MeasurementRow[] = [];
  let badRows = 0;
  for (const { text, line } of data) {
    const cells = splitLine(text, sep);
    const rowProblems: string[] = [];
    const cell = (i: number, name: string, nonNegative = false): number | undefined => {
      const raw = cells[i] ?? '';
      if (raw === '') {
        rowProblems.push(`"${name}" is empty`);
        return undefined;
      }
      const n = readNumber(raw);
      if (n === null) rowProblems.push(`"${name}" is not a number: "${raw.slice(0, 40)}"`);
      else if (nonNegative && n < 0) rowProblems.push(`"${name}" must not be negative`);
      return n ?? undefined;
    };
    if (cells.length !== header.length) rowProblems.push(`has ${cells.length} values but the header has ${header.length} columns`);
    const parameter = cell(pIdx, header[pIdx]);
    const value = cell(sIdx, header[sIdx]);
    const row: MeasurementRow = { parameter: parameter ?? NaN, value: value ?? NaN };
    if (errIdx >= 0 && (cells[errIdx] ?? '') !== '') {
      const e = cell(errIdx, header[errIdx], true);
      if (e !== undefined) Object.assign(row, { errorLow: e, errorHigh: e });
    } else if (lowIdx >= 0 && ((cells[lowIdx] ?? '') !== '' || (cells[highIdx] ?? '') !== '')) {
      const lo = cell(lowIdx, header[lowIdx], true);
      const hi = cell(highIdx, header[highIdx], true);
      if (lo !== undefined && hi !== undefined) Object.assign(row, { errorLow: lo, errorHigh: hi });
    }
    if (rowProblems.length) {
      badRows += 1;
      if (problems.length < MEASUREMENT_LIMITS.problemsReported) problems.push({ path: `csv.line${line}`, message: `Line ${line}: ${rowProblems.join('; ')}` });
      continue;
    }
    rows.push(row);
  }
  if (badRows > problems.length) {
    problems.push({ path: 'csv', message: `${badRows - problems.length} more bad rows not listed` });
  }
  if (problems.length) return { ok: false, problems };
  rows.sort((a, b) => a.parameter - b.parameter);
  return { ok: true, value: { parameterName: header[pIdx], stateName: header[sIdx], rows } };
}
