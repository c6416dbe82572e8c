import type { CellOutput } from '@shared/cells/output.ts';
import type { AnalyzeResult } from '@shared/engine/contract.ts';

/** One CSV field (RFC 4180 §2: quote when it holds a separator, quote or line break; double inner quotes). */
export function csvField(value: unknown): string {
  const s = value === null || value === undefined ? '' : typeof value === 'number' ? numberText(value) : String(value);
  return /[",\r\n]/.test(s) || /^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Numbers round-trip exactly (shortest representation that reads back the same double). */
function numberText(n: number): string {
  return Number.isFinite(n) ? String(n) : '';
}

export function csvTable(header: string[], rows: unknown[][]): string {
  return [header, ...rows].map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}

const eigenText = (list: readonly { re: number; im: number }[]) =>
  list.map((e) => (e.im === 0 ? String(e.re) : `${e.re}${e.im < 0 ? '-' : '+'}${Math.abs(e.im)}i`)).join(' ');

/**
 * The rows of a result as CSV: branch points (parameter, state, stability, the event at or
 * after the point), fold-curve points (two parameters, state, normal-form a and b), trajectory
 * samples (t and each variable), or equilibria (state, stability, eigenvalues).
 */
export function resultCsv(result: AnalyzeResult, names: { parameter?: string; parameters?: readonly [string, string] }): string {
  if ('branch' in result) {
    const vars = Object.keys(result.branch.points[0]?.state ?? {});
    const eventAfter = new Map(result.branch.events.map((e) => [e.after, e.kind]));
    return csvTable(
      ['index', names.parameter ?? 'parameter', ...vars, 'stability', 'unstable_dimension', 'event_after_point', 'eigenvalues'],
      result.branch.points.map((p, i) => [i, p.parameter, ...vars.map((v) => p.state[v]), p.stability, p.unstableDimension, eventAfter.get(i) ?? '', eigenText(p.eigenvalues)]),
    );
  }
  if ('curve' in result) {
    const [p1, p2] = names.parameters ?? (Object.keys(result.curve.points[0]?.parameters ?? {}) as [string, string]);
    const vars = Object.keys(result.curve.points[0]?.state ?? {});
    const cuspAfter = new Map(result.curve.events.map((e) => [e.after, e.kind]));
    return csvTable(
      ['index', p1, p2, ...vars, 'event_after_point'],
      result.curve.points.map((p, i) => [i, p.parameters[p1], p.parameters[p2], ...vars.map((v) => p.state[v]), cuspAfter.get(i) ?? '']),
    );
  }
  if ('trajectory' in result) {
    const vars = Object.keys(result.trajectory.state);
    return csvTable(['t', ...vars], result.trajectory.t.map((t, i) => [t, ...vars.map((v) => result.trajectory.state[v][i])]));
  }
  const vars = Object.keys(result.equilibria[0]?.state ?? {});
  return csvTable(
    ['index', ...vars, 'stability', 'unstable_dimension', 'eigenvalues'],
    result.equilibria.map((p, i) => [i, ...vars.map((v) => p.state[v]), p.stability, p.unstableDimension, eigenText(p.eigenvalues)]),
  );
}

/** A cell output that carries a result, narrowed. */
export function okResult(output: CellOutput | undefined): AnalyzeResult | null {
  return output?.status === 'ok' && output.result ? (output.result as AnalyzeResult) : null;
}
