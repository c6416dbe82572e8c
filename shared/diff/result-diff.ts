import type {
  BranchEvent,
  BranchPoint,
  ContinuationResult,
  EquilibriaResult,
  FoldCurveResult,
  Point,
  SimulateResult,
  Stability,
  Values,
} from '../engine/contract.ts';
import type { AnalysisCellKind } from '../cells/kinds.ts';
import { resultFor, type CellOutput } from '../cells/output.ts';
import { displayName, formatAssignment, formatDelta, formatPoint, formatValue, plural } from './format.ts';

/**
 * Results of two runs of a cell compared by what they mean, not as JSON: folds and cusps matched
 * by nearness and described as moved / new / gone, equilibria counted and matched by state,
 * stability of matching stretches of a branch, the parameter range covered, the final state of a
 * trajectory, and the engine that computed them.
 *
 * Matching: events of one kind are paired greedily, nearest first, by distance in parameters
 * (and state) scaled by the extent of both results; pairs farther apart than `MATCH_DISTANCE`
 * are not the same event. Greedy nearest-first pairing is optimal when events are well separated
 * relative to how far they move, which is the case a reviewer reads (common practice).
 */

export type ResultChangeKind = 'moved' | 'appeared' | 'disappeared' | 'changed' | 'unchanged';
export type ResultTopic = 'fold' | 'hopf' | 'branch-point' | 'cusp' | 'equilibria' | 'stability' | 'range' | 'final-state' | 'stop' | 'engine' | 'run';

export interface ResultChange {
  kind: ResultChangeKind;
  topic: ResultTopic;
  sentence: string;
  /** For moved events: the parameter values before and after and their difference. */
  before?: number;
  after?: number;
  delta?: number;
}

/** Matched events farther apart than this (in scaled distance) count as different events. */
export const MATCH_DISTANCE = 0.25;
/** A change of the covered parameter range is reported when an end moves by more than this share of the extent. */
export const RANGE_SHARE = 0.02;
/** A parameter difference below this share of the extent is "unchanged" (printing precision). */
export const UNCHANGED_SHARE = 1e-9;

interface Located {
  coords: number[];
}

/** Greedy nearest-first matching of two lists; returns index pairs and the unmatched indices. */
export function matchNearest<T extends Located>(a: readonly T[], b: readonly T[], scale: readonly number[], limit = MATCH_DISTANCE) {
  const candidates: { i: number; j: number; d: number }[] = [];
  a.forEach((x, i) =>
    b.forEach((y, j) => {
      let s = 0;
      x.coords.forEach((c, k) => {
        const w = scale[k] > 0 ? scale[k] : 1;
        s += ((c - y.coords[k]) / w) ** 2;
      });
      candidates.push({ i, j, d: Math.sqrt(s) });
    }),
  );
  candidates.sort((p, q) => p.d - q.d);
  const usedA = new Set<number>();
  const usedB = new Set<number>();
  const pairs: { i: number; j: number }[] = [];
  for (const c of candidates) {
    if (c.d > limit || usedA.has(c.i) || usedB.has(c.j)) continue;
    usedA.add(c.i);
    usedB.add(c.j);
    pairs.push({ i: c.i, j: c.j });
  }
  return {
    pairs: pairs.sort((p, q) => p.j - q.j),
    onlyA: a.map((_, i) => i).filter((i) => !usedA.has(i)),
    onlyB: b.map((_, j) => j).filter((j) => !usedB.has(j)),
  };
}

function extent(values: readonly number[]): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  return hi > lo ? hi - lo : Number.isFinite(lo) ? Math.max(1, Math.abs(lo)) : 1;
}

function stateNames(...states: Record<string, unknown>[]): string[] {
  return [...new Set(states.flatMap((s) => Object.keys(s)))].sort();
}

const STABILITY_WORDS: Record<Stability, string> = { stable: 'stable', unstable: 'unstable', neutral: 'neutral' };

// ---------------------------------------------------------------------------------------------
// Branches
// ---------------------------------------------------------------------------------------------

/** A stretch of a branch between folds (or ends), with its most common stability. */
interface Stretch {
  from: number;
  to: number;
  stability: Stability;
  /** Mid parameter and mean of the first state variable (for matching and naming). */
  mid: number;
  level: number;
  lo: number;
  hi: number;
}

function stretches(result: ContinuationResult, yName: string): Stretch[] {
  const { points, events } = result.branch;
  if (points.length === 0) return [];
  const cuts = events.filter((e) => e.kind === 'fold').map((e) => e.after + 1).sort((x, y) => x - y);
  const bounds = [0, ...cuts.filter((c) => c > 0 && c < points.length), points.length];
  const out: Stretch[] = [];
  for (let k = 0; k + 1 < bounds.length; k++) {
    const seg = points.slice(bounds[k], bounds[k + 1]);
    if (seg.length === 0) continue;
    const counts = new Map<Stability, number>();
    for (const p of seg) counts.set(p.stability, (counts.get(p.stability) ?? 0) + 1);
    const stability = [...counts.entries()].sort((x, y) => y[1] - x[1])[0][0];
    const ps = seg.map((p) => p.parameter);
    const lo = Math.min(...ps);
    const hi = Math.max(...ps);
    out.push({ from: bounds[k], to: bounds[k + 1], stability, mid: (lo + hi) / 2, level: seg.reduce((s, p) => s + (p.state[yName] ?? 0), 0) / seg.length, lo, hi });
  }
  return out;
}

/** "upper", "middle", "lower" when stretches overlap in the parameter; otherwise by position along the parameter. */
function stretchNames(list: readonly Stretch[], parameter: string): string[] {
  if (list.length === 1) return ['the branch'];
  const order = list.map((_, i) => i).sort((x, y) => list[y].level - list[x].level);
  const overlapping = list.every((s, i) => list.every((t, j) => i === j || (s.lo < t.hi && t.lo < s.hi)));
  if (overlapping && list.length <= 3) {
    const words = list.length === 2 ? ['upper', 'lower'] : ['upper', 'middle', 'lower'];
    const names: string[] = [];
    order.forEach((idx, rank) => (names[idx] = `the ${words[rank]} branch`));
    return names;
  }
  return list.map((s) => `the stretch from ${formatAssignment(parameter, s.lo)} to ${formatValue(s.hi)}`);
}

export function diffBranches(older: ContinuationResult, newer: ContinuationResult, parameter: string): ResultChange[] {
  const out: ResultChange[] = [];
  const a = older.branch;
  const b = newer.branch;
  const names = stateNames(a.points[0]?.state ?? {}, b.points[0]?.state ?? {});
  const yName = names[0] ?? '';
  const allParams = [...a.points, ...b.points].map((p) => p.parameter);
  const pScale = extent(allParams);
  const sScales = names.map((n) => extent([...a.points, ...b.points].map((p) => p.state[n] ?? 0)));
  const p = (v: number) => formatAssignment(parameter, v, pScale);
  const at = (st: Values) => formatPoint(st, names, sScales);

  // Events, kind by kind (folds, Hopf points, branch points): matched by nearness.
  const kinds = [...new Set([...a.events, ...b.events].map((e) => e.kind))];
  const loc = (e: BranchEvent) => ({ coords: [e.parameter, ...names.map((n) => e.state[n] ?? 0)] });
  for (const kind of kinds) {
    const ea = a.events.filter((e) => e.kind === kind);
    const eb = b.events.filter((e) => e.kind === kind);
    const noun = EVENT_NOUNS[kind] ?? kind;
    const Noun = noun.charAt(0).toUpperCase() + noun.slice(1);
    const m = matchNearest(ea.map(loc), eb.map(loc), [pScale, ...sScales]);
    for (const { i, j } of m.pairs) {
      const before = ea[i].parameter;
      const after = eb[j].parameter;
      const delta = after - before;
      if (Math.abs(delta) <= UNCHANGED_SHARE * pScale || formatValue(before, pScale) === formatValue(after, pScale)) {
        out.push({ kind: 'unchanged', topic: kind, sentence: `${Noun} unchanged at ${p(after)}`, before, after, delta });
      } else {
        out.push({ kind: 'moved', topic: kind, sentence: `${Noun} moved from ${p(before)} to ${p(after)} (${formatDelta(delta, pScale)})`, before, after, delta });
      }
      const detail = eventDetailChange(ea[i], eb[j]);
      if (detail) out.push({ kind: 'changed', topic: kind, sentence: `${Noun} at ${p(after)}: ${detail}` });
    }
    for (const j of m.onlyB) {
      out.push({ kind: 'appeared', topic: kind, sentence: `New ${noun} at ${p(eb[j].parameter)} (${at(eb[j].state)})`, after: eb[j].parameter });
    }
    for (const i of m.onlyA) {
      out.push({ kind: 'disappeared', topic: kind, sentence: `${Noun} disappeared (was at ${p(ea[i].parameter)})`, before: ea[i].parameter });
    }
  }

  // Stability of matching stretches.
  const sa = stretches(older, yName);
  const sb = stretches(newer, yName);
  const levelScale = extent([...a.points, ...b.points].map((pt) => pt.state[yName] ?? 0));
  const sm = matchNearest(
    sa.map((s) => ({ coords: [s.mid, s.level] })),
    sb.map((s) => ({ coords: [s.mid, s.level] })),
    [pScale, levelScale],
    1,
  );
  const namesB = stretchNames(sb, parameter);
  for (const { i, j } of sm.pairs) {
    if (sa[i].stability !== sb[j].stability) {
      out.push({
        kind: 'changed',
        topic: 'stability',
        sentence: `Stability of ${namesB[j]} changed: ${STABILITY_WORDS[sa[i].stability]} → ${STABILITY_WORDS[sb[j].stability]}`,
      });
    }
  }

  // Range covered.
  const range = (pts: readonly BranchPoint[]) => (pts.length ? [Math.min(...pts.map((x) => x.parameter)), Math.max(...pts.map((x) => x.parameter))] : null);
  const ra = range(a.points);
  const rb = range(b.points);
  // Ends that moved by less than RANGE_SHARE of the extent are the folds moving, not a new range.
  if (ra && rb && (Math.abs(ra[0] - rb[0]) > RANGE_SHARE * pScale || Math.abs(ra[1] - rb[1]) > RANGE_SHARE * pScale)) {
    const n = displayName(parameter);
    out.push({
      kind: 'changed',
      topic: 'range',
      sentence: `Range covered changed from ${n} ∈ [${formatValue(ra[0], pScale)}, ${formatValue(ra[1], pScale)}] to [${formatValue(rb[0], pScale)}, ${formatValue(rb[1], pScale)}]`,
    });
  }
  if (a.stopReason !== b.stopReason) {
    out.push({ kind: 'changed', topic: 'stop', sentence: `The branch now ends because of ${STOP_WORDS[b.stopReason] ?? b.stopReason} (before: ${STOP_WORDS[a.stopReason] ?? a.stopReason})` });
  }
  return out;
}

/** Branch events in words. */
export const EVENT_NOUNS: Record<BranchEvent['kind'], string> = { fold: 'fold', hopf: 'Hopf point', 'branch-point': 'branch point' };

/** What else about a matched event changed in meaning: the side the equilibria are on, criticality, type. */
function eventDetailChange(a: BranchEvent, b: BranchEvent): string | null {
  if (a.kind === 'fold' && b.kind === 'fold' && a.normalForm.equilibriaSide !== b.normalForm.equilibriaSide) {
    return `the pair of equilibria now exists ${b.normalForm.equilibriaSide} it (before: ${a.normalForm.equilibriaSide})`;
  }
  if (a.kind === 'hopf' && b.kind === 'hopf' && a.criticality !== b.criticality) return `now ${b.criticality} (before: ${a.criticality})`;
  if (a.kind === 'branch-point' && b.kind === 'branch-point' && a.type !== b.type) return `now ${b.type} (before: ${a.type})`;
  return null;
}

const STOP_WORDS: Record<string, string> = {
  bounds: 'the parameter bounds',
  'max-points': 'the limit on points',
  closed: 'the branch closing on itself',
  'step-too-small': 'a step too small to continue',
  'time-limit': 'the time budget',
  'start-not-converged': 'a start that did not converge',
  end: 'reaching the end time',
  'not-finite': 'the solution leaving the number range',
  completed: 'completing the search',
};

// ---------------------------------------------------------------------------------------------
// Equilibria
// ---------------------------------------------------------------------------------------------

export function diffEquilibria(older: EquilibriaResult, newer: EquilibriaResult): ResultChange[] {
  const out: ResultChange[] = [];
  const a = older.equilibria;
  const b = newer.equilibria;
  const names = stateNames(...[...a, ...b].map((e) => e.state));
  if (a.length !== b.length) {
    out.push({ kind: 'changed', topic: 'equilibria', sentence: `${a.length} → ${plural(b.length, 'equilibrium', 'equilibria')}`, before: a.length, after: b.length });
  }
  const scales = names.map((n) => extent([...a, ...b].map((e) => e.state[n] ?? 0)));
  const at = (st: Values) => formatPoint(st, names, scales);
  const loc = (e: Point) => ({ coords: names.map((n) => e.state[n] ?? 0) });
  const m = matchNearest(a.map(loc), b.map(loc), scales);
  for (const { i, j } of m.pairs) {
    if (a[i].stability !== b[j].stability) {
      out.push({
        kind: 'changed',
        topic: 'stability',
        sentence: `Equilibrium at ${at(b[j].state)} changed from ${STABILITY_WORDS[a[i].stability]} to ${STABILITY_WORDS[b[j].stability]}`,
      });
    }
  }
  for (const j of m.onlyB) out.push({ kind: 'appeared', topic: 'equilibria', sentence: `New ${STABILITY_WORDS[b[j].stability]} equilibrium at ${at(b[j].state)}` });
  for (const i of m.onlyA) out.push({ kind: 'disappeared', topic: 'equilibria', sentence: `Equilibrium at ${at(a[i].state)} (${STABILITY_WORDS[a[i].stability]}) disappeared` });
  return out;
}

// ---------------------------------------------------------------------------------------------
// Fold curves
// ---------------------------------------------------------------------------------------------

export function diffFoldCurves(older: FoldCurveResult, newer: FoldCurveResult, parameters: readonly [string, string]): ResultChange[] {
  const out: ResultChange[] = [];
  const a = older.curve.events.filter((e) => e.kind === 'cusp');
  const b = newer.curve.events.filter((e) => e.kind === 'cusp');
  const pts = [...older.curve.points, ...newer.curve.points];
  const scales = parameters.map((n) => extent(pts.map((pt) => pt.parameters[n] ?? 0)));
  const loc = (e: (typeof a)[number]) => ({ coords: parameters.map((n) => e.parameters[n] ?? 0) });
  const m = matchNearest(a.map(loc), b.map(loc), scales);
  const at = (v: Values) => formatPoint(v, parameters, scales);
  for (const { i, j } of m.pairs) {
    const before = at(a[i].parameters);
    const after = at(b[j].parameters);
    if (before === after) out.push({ kind: 'unchanged', topic: 'cusp', sentence: `Cusp unchanged at ${after}` });
    else {
      const deltas = parameters
        .map((n, k) => ({ n, d: (b[j].parameters[n] ?? 0) - (a[i].parameters[n] ?? 0), s: scales[k] }))
        .filter(({ d, s }) => formatDelta(d, s) !== '±0.0000')
        .map(({ n, d, s }) => `${displayName(n)} ${formatDelta(d, s)}`)
        .join(', ');
      const newer = parameters.map((n, k) => formatValue(b[j].parameters[n] ?? 0, scales[k])).join(', ');
      out.push({ kind: 'moved', topic: 'cusp', sentence: `Cusp moved from ${before} to (${newer}) (${deltas})` });
    }
  }
  for (const j of m.onlyB) out.push({ kind: 'appeared', topic: 'cusp', sentence: `New cusp at ${at(b[j].parameters)}` });
  for (const i of m.onlyA) out.push({ kind: 'disappeared', topic: 'cusp', sentence: `Cusp disappeared (was at ${at(a[i].parameters)})` });
  const range = (r: FoldCurveResult, n: string, s: number) => {
    const v = r.curve.points.map((pt) => pt.parameters[n]);
    return v.length ? `[${formatValue(Math.min(...v), s)}, ${formatValue(Math.max(...v), s)}]` : '(none)';
  };
  for (const [k, n] of parameters.entries()) {
    const ra = range(older, n, scales[k]);
    const rb = range(newer, n, scales[k]);
    if (ra !== rb) out.push({ kind: 'changed', topic: 'range', sentence: `Fold curve now spans ${displayName(n)} ∈ ${rb} (before: ${ra})` });
  }
  if (older.curve.stopReason !== newer.curve.stopReason) {
    out.push({ kind: 'changed', topic: 'stop', sentence: `The fold curve now ends because of ${STOP_WORDS[newer.curve.stopReason]} (before: ${STOP_WORDS[older.curve.stopReason]})` });
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Trajectories
// ---------------------------------------------------------------------------------------------

export function diffTrajectories(older: SimulateResult, newer: SimulateResult): ResultChange[] {
  const out: ResultChange[] = [];
  const ta = older.trajectory;
  const tb = newer.trajectory;
  const endA = ta.t.at(-1);
  const endB = tb.t.at(-1);
  if (endA !== undefined && endB !== undefined && formatValue(endA) !== formatValue(endB)) {
    out.push({ kind: 'changed', topic: 'range', sentence: `Simulated until t = ${formatValue(endB)} (before: t = ${formatValue(endA)})` });
  }
  for (const n of stateNames(ta.state, tb.state)) {
    const fa = ta.state[n]?.at(-1);
    const fb = tb.state[n]?.at(-1);
    if (fa === undefined && fb !== undefined) out.push({ kind: 'appeared', topic: 'final-state', sentence: `New variable ${displayName(n)} ends at ${formatValue(fb)}` });
    else if (fb === undefined && fa !== undefined) out.push({ kind: 'disappeared', topic: 'final-state', sentence: `Variable ${displayName(n)} no longer simulated (ended at ${formatValue(fa)})` });
    else if (fa !== undefined && fb !== undefined && formatValue(fa) !== formatValue(fb)) {
      out.push({ kind: 'changed', topic: 'final-state', sentence: `Final ${displayName(n)} changed from ${formatValue(fa)} to ${formatValue(fb)} (${formatDelta(fb - fa)})`, before: fa, after: fb, delta: fb - fa });
    }
  }
  if (older.stopReason !== newer.stopReason) {
    out.push({ kind: 'changed', topic: 'stop', sentence: `The simulation now ends because of ${STOP_WORDS[newer.stopReason]} (before: ${STOP_WORDS[older.stopReason]})` });
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// One cell
// ---------------------------------------------------------------------------------------------

/** What the result comparison needs from a cell's input: the parameter names of its task. */
export interface ResultContext {
  /** Continuation parameter (branch cells). */
  parameter?: string;
  /** The two parameters (fold-map cells). */
  parameters?: readonly [string, string];
}

export function resultContextFromInput(input: Record<string, unknown> | undefined): ResultContext {
  const task = (input?.task ?? {}) as Record<string, unknown>;
  const ctx: ResultContext = {};
  if (typeof task.parameter === 'string') ctx.parameter = task.parameter;
  if (Array.isArray(task.parameters) && task.parameters.length === 2 && task.parameters.every((x) => typeof x === 'string')) {
    ctx.parameters = [task.parameters[0], task.parameters[1]];
  }
  return ctx;
}

/** Compare two outputs of one analysis cell. */
export function diffCellOutputs(kind: AnalysisCellKind, older: CellOutput | undefined, newer: CellOutput | undefined, ctx: ResultContext): ResultChange[] {
  if (!older && !newer) return [];
  if (!older) return [{ kind: 'appeared', topic: 'run', sentence: newer!.status === 'ok' ? 'Computed in this revision (no result before)' : 'Run in this revision, with an error' }];
  if (!newer) return [{ kind: 'disappeared', topic: 'run', sentence: 'No result in this revision (there was one before)' }];
  if (older.status === 'error' && newer.status === 'error') {
    return older.error?.message === newer.error?.message ? [] : [{ kind: 'changed', topic: 'run', sentence: `Still fails, now with: ${newer.error?.message ?? 'an error'}` }];
  }
  if (newer.status === 'error') return [{ kind: 'changed', topic: 'run', sentence: `Now fails: ${newer.error?.message ?? 'an error'}` }];
  if (older.status === 'error') return [{ kind: 'changed', topic: 'run', sentence: 'Now computes (it failed before)' }, ...engineNote(older, newer)];
  const out: ResultChange[] = [];
  if (kind === 'branch') {
    const a = resultFor('branch', older);
    const b = resultFor('branch', newer);
    if (a && b) out.push(...diffBranches(a, b, ctx.parameter ?? 'parameter'));
  } else if (kind === 'equilibria') {
    const a = resultFor('equilibria', older);
    const b = resultFor('equilibria', newer);
    if (a && b) out.push(...diffEquilibria(a, b));
  } else if (kind === 'fold-map') {
    const a = resultFor('fold-map', older);
    const b = resultFor('fold-map', newer);
    const params = ctx.parameters ?? (b ? (Object.keys(b.curve.points[0]?.parameters ?? {}).slice(0, 2) as [string, string]) : undefined);
    if (a && b && params && params.length === 2) out.push(...diffFoldCurves(a, b, params));
  } else if (kind === 'trajectory') {
    const a = resultFor('trajectory', older);
    const b = resultFor('trajectory', newer);
    if (a && b) out.push(...diffTrajectories(a, b));
  }
  out.push(...engineNote(older, newer));
  return out;
}

function engineNote(older: CellOutput, newer: CellOutput): ResultChange[] {
  return older.engineVersion !== newer.engineVersion
    ? [{ kind: 'changed', topic: 'engine', sentence: `Computed with engine ${newer.engineVersion} (before: ${older.engineVersion})` }]
    : [];
}
