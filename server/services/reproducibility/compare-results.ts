import { REPRODUCIBILITY_RELATIVE_TOLERANCE } from '@shared/api/reviews.ts';
import type { AnalyzeResult, Values } from '@shared/engine/contract.ts';

/**
 * Compares a stored engine result with a rerun, and says in words what differs.
 * Numbers agree when |rerun − stored| ≤ tol · max(1, |stored|) (tol defaults to
 * REPRODUCIBILITY_RELATIVE_TOLERANCE, 1e-6). Events are matched by kind and nearest parameter;
 * points are compared one by one when both runs have the same count.
 */

/** At most this many point-by-point differences are listed per result (then "and N more"). */
const MAX_LISTED = 5;

const fmt = (x: number) => (Number.isFinite(x) ? x.toPrecision(6).replace(/\.?0+e/, 'e') : String(x));
const fmtFixed = (x: number) => (Math.abs(x) >= 1e-3 && Math.abs(x) < 1e6 ? x.toFixed(6) : x.toExponential(6));

export function close(stored: number, rerun: number, tol: number): boolean {
  if (!Number.isFinite(stored) || !Number.isFinite(rerun)) return Object.is(stored, rerun);
  return Math.abs(rerun - stored) <= tol * Math.max(1, Math.abs(stored));
}

function valuesDiffer(label: string, stored: Values, rerun: Values, tol: number): string[] {
  const out: string[] = [];
  for (const key of new Set([...Object.keys(stored), ...Object.keys(rerun)])) {
    const a = stored[key];
    const b = rerun[key];
    if (a === undefined || b === undefined) out.push(`${label}: ${key} is ${a === undefined ? 'missing from the stored result' : 'missing from the rerun'}`);
    else if (!close(a, b, tol)) out.push(`${label}: ${key} stored ${fmtFixed(a)}, rerun ${fmtFixed(b)}`);
  }
  return out;
}

function capped(lines: string[]): string[] {
  return lines.length <= MAX_LISTED ? lines : [...lines.slice(0, MAX_LISTED), `and ${lines.length - MAX_LISTED} more differences`];
}

/** Matches events (same kind) to the rerun's nearest by scalar position; reports missing, extra and moved ones. */
function compareEvents<E extends { kind: string }>(
  stored: readonly E[],
  rerun: readonly E[],
  position: (e: E) => number,
  describe: (e: E) => string,
  detail: (a: E, b: E) => string[],
  tol: number,
): string[] {
  const out: string[] = [];
  const unused = new Set(rerun.map((_, i) => i));
  for (const a of stored) {
    let best = -1;
    for (const i of unused) {
      const b = rerun[i];
      if (b.kind !== a.kind) continue;
      if (best < 0 || Math.abs(position(b) - position(a)) < Math.abs(position(rerun[best]) - position(a))) best = i;
    }
    if (best < 0) {
      out.push(`${describe(a)}: in the stored result, not found by the rerun`);
      continue;
    }
    unused.delete(best);
    const b = rerun[best];
    if (!close(position(a), position(b), tol)) out.push(`${describe(a)}: stored ${fmtFixed(position(a))}, rerun ${fmtFixed(position(b))}`);
    out.push(...detail(a, b));
  }
  for (const i of unused) out.push(`${describe(rerun[i])}: found by the rerun, not in the stored result`);
  return out;
}

function comparePointLists<P>(
  what: string,
  stored: readonly P[],
  rerun: readonly P[],
  diff: (a: P, b: P, index: number) => string[],
): string[] {
  if (stored.length !== rerun.length) return [`${what}: stored ${stored.length} points, rerun ${rerun.length} points`];
  return capped(stored.flatMap((a, i) => diff(a, rerun[i], i)));
}

function stopReasons(stored: { stopReason: string; stopReasonAtStart?: string }, rerun: { stopReason: string; stopReasonAtStart?: string }): string[] {
  const out: string[] = [];
  if (stored.stopReason !== rerun.stopReason) out.push(`stopped because: stored "${stored.stopReason}", rerun "${rerun.stopReason}"`);
  if ((stored.stopReasonAtStart ?? null) !== (rerun.stopReasonAtStart ?? null)) {
    out.push(`stopped at the start because: stored "${stored.stopReasonAtStart ?? 'none'}", rerun "${rerun.stopReasonAtStart ?? 'none'}"`);
  }
  return out;
}

const paramsAt = (p: Values) =>
  Object.entries(p)
    .map(([k, v]) => `${k} = ${fmt(v)}`)
    .join(', ');

/** The differences between a stored result and its rerun (empty when they agree within `tol`). */
export function compareResults(stored: AnalyzeResult, rerun: AnalyzeResult, parameterName: string | null, tol = REPRODUCIBILITY_RELATIVE_TOLERANCE): string[] {
  if ('branch' in stored && 'branch' in rerun) {
    const name = parameterName ?? 'parameter';
    const s = stored.branch;
    const r = rerun.branch;
    return [
      ...stopReasons(s, r),
      ...compareEvents(
        s.events,
        r.events,
        (e) => e.parameter,
        (e) => `${e.kind} near ${name} = ${e.parameter.toFixed(4)}`,
        (a, b) => valuesDiffer(`${a.kind} near ${name} = ${a.parameter.toFixed(4)}`, a.state, b.state, tol),
        tol,
      ),
      ...comparePointLists('branch', s.points, r.points, (a, b, i) => [
        ...(close(a.parameter, b.parameter, tol) ? [] : [`branch point ${i + 1}: ${name} stored ${fmtFixed(a.parameter)}, rerun ${fmtFixed(b.parameter)}`]),
        ...valuesDiffer(`branch point ${i + 1}`, a.state, b.state, tol),
        ...(a.stability === b.stability ? [] : [`branch point ${i + 1}: stored ${a.stability}, rerun ${b.stability}`]),
      ]),
    ];
  }
  if ('curve' in stored && 'curve' in rerun) {
    const s = stored.curve;
    const r = rerun.curve;
    const first = (v: Values) => Object.values(v)[0] ?? 0;
    return [
      ...stopReasons(s, r),
      ...compareEvents(
        s.events,
        r.events,
        (e) => first(e.parameters),
        (e) => `${e.kind} near ${paramsAt(e.parameters)}`,
        (a, b) => valuesDiffer(`${a.kind} near ${paramsAt(a.parameters)}`, a.parameters, b.parameters, tol),
        tol,
      ),
      ...comparePointLists<{ parameters: Values; state: Values }>('curve', s.points, r.points, (a, b, i) => [
        ...valuesDiffer(`curve point ${i + 1}`, a.parameters, b.parameters, tol),
        ...valuesDiffer(`curve point ${i + 1}`, a.state, b.state, tol),
      ]),
    ];
  }
  if ('equilibria' in stored && 'equilibria' in rerun) {
    if (stored.equilibria.length !== rerun.equilibria.length) {
      return [`equilibria: stored ${stored.equilibria.length}, rerun ${rerun.equilibria.length}`];
    }
    const dist = (a: Values, b: Values) => Math.hypot(...Object.keys(a).map((k) => a[k] - (b[k] ?? Number.NaN)));
    const unused = new Set(rerun.equilibria.map((_, i) => i));
    const out: string[] = [];
    stored.equilibria.forEach((a, n) => {
      let best = -1;
      for (const i of unused) if (best < 0 || dist(a.state, rerun.equilibria[i].state) < dist(a.state, rerun.equilibria[best].state)) best = i;
      unused.delete(best);
      const b = rerun.equilibria[best];
      out.push(...valuesDiffer(`equilibrium ${n + 1}`, a.state, b.state, tol));
      if (a.stability !== b.stability) out.push(`equilibrium ${n + 1}: stored ${a.stability}, rerun ${b.stability}`);
    });
    return capped(out);
  }
  if ('trajectory' in stored && 'trajectory' in rerun) {
    const s = stored.trajectory;
    const r = rerun.trajectory;
    const out = stored.stopReason === rerun.stopReason ? [] : [`stopped because: stored "${stored.stopReason}", rerun "${rerun.stopReason}"`];
    if (s.t.length !== r.t.length) return [...out, `trajectory: stored ${s.t.length} samples, rerun ${r.t.length} samples`];
    const lines: string[] = [];
    s.t.forEach((t, i) => {
      if (!close(t, r.t[i], tol)) lines.push(`sample ${i + 1}: time stored ${fmtFixed(t)}, rerun ${fmtFixed(r.t[i])}`);
      const at = (v: Record<string, number[]>) => Object.fromEntries(Object.entries(v).map(([k, xs]) => [k, xs[i]]));
      lines.push(...valuesDiffer(`at t = ${fmt(t)}`, at(s.state), at(r.state), tol));
    });
    return [...out, ...capped(lines)];
  }
  return ['the rerun gave a different kind of result than the stored one'];
}
