import type { StopReason } from '@shared/engine/contract.ts';
import type { Tolerances } from '../defaults.ts';
import { luFactor, luLogDeterminant, luSolve, type LuFactors } from '../linalg/lu.ts';
import { allFinite, dot, norm2, normInf } from '../linalg/vector.ts';
import type { BorderedFactors, CoordinateBound, CurveSystem } from './curve-system.ts';

export interface CurvePoint {
  y: Float64Array;
  /** What `FollowOptions.describe` returned for this point (e.g. its stability). */
  data?: unknown;
  /** Unit tangent, oriented along the direction of travel. */
  tangent: Float64Array;
  /** ‖G(y)‖₂. */
  residual: number;
}

export interface FollowOptions {
  step: { initial: number; min: number; max: number };
  /** Points to produce, the start included. */
  maxPoints: number;
  bounds: CoordinateBound[];
  /** Date.now() value after which the curve stops with "time-limit". */
  deadline: number;
  tolerances: Tolerances;
  /** Called once per accepted point, inside the time budget; the value is kept as `data`. */
  describe?: (point: CurvePoint) => unknown;
}

export interface FollowResult {
  points: CurvePoint[];
  stopReason: StopReason;
}

/** Work arrays for one system size. */
class Workspace {
  readonly m: Float64Array;
  readonly rhs: Float64Array;
  readonly d: Float64Array;
  readonly g: Float64Array;
  readonly lu: LuFactors;
  constructor(readonly size: number) {
    this.m = new Float64Array(size * size);
    this.rhs = new Float64Array(size);
    this.d = new Float64Array(size);
    this.g = new Float64Array(size - 1);
    this.lu = { n: size, lu: new Float64Array(size * size), pivot: new Int32Array(size), singular: false, pivotRatio: 1 };
  }
  /** Fill the bordered matrix [DG(y); rowᵀ] and factor it (structured when the system offers it). */
  factorBordered(system: CurveSystem, y: Float64Array, row: Float64Array): BorderedFactors {
    const structured = system.factorBordered?.(y, row);
    if (structured) return structured;
    const s = this.size;
    system.jacobian(y, this.m);
    this.m.set(row, (s - 1) * s);
    const f = luFactor(this.m, s, false, this.lu);
    return { singular: f.singular, solve: (b, out) => luSolve(f, b, out), determinant: () => luLogDeterminant(f) };
  }
}

/**
 * Unit tangent of the curve G(y) = 0 at y: the solution of [DG(y); guessᵀ]·t = [0; 1],
 * normalised, so it points to the same side as `guess`. Returns null when the bordered matrix is
 * singular (the guess is orthogonal to the curve or y is a singular point of G).
 */
export function curveTangent(system: CurveSystem, y: Float64Array, guess: Float64Array, ws = new Workspace(system.dimension)): Float64Array | null {
  const f = ws.factorBordered(system, y, guess);
  if (f.singular) return null;
  ws.rhs.fill(0);
  ws.rhs[ws.size - 1] = 1;
  const t = f.solve(ws.rhs, new Float64Array(ws.size));
  const len = norm2(t);
  if (!(len > 0) || !Number.isFinite(len)) return null;
  for (let i = 0; i < t.length; i++) t[i] /= len;
  return t;
}

/**
 * Newton's method for G(z) = 0 together with one extra scalar equation rowᵀ·z = target
 * (Keller's pseudo-arclength condition when row is the tangent; a coordinate condition when
 * row is a unit vector). Converged when ‖Δz‖∞ ≤ correctorStep·(1 + ‖z‖∞). z is updated in place.
 */
export function correct(
  system: CurveSystem,
  z: Float64Array,
  row: Float64Array,
  target: number,
  maxIterations: number,
  tolerances: Tolerances,
  ws = new Workspace(system.dimension),
): { converged: boolean; iterations: number } {
  const s = ws.size;
  for (let it = 1; it <= maxIterations; it++) {
    system.evaluate(z, ws.g);
    if (!allFinite(ws.g, s - 1)) return { converged: false, iterations: it };
    const f = ws.factorBordered(system, z, row);
    // Singular at a point that already solves both equations (e.g. exactly at a branch point).
    if (f.singular) return { converged: normInf(ws.g, s - 1) <= tolerances.newtonResidual * (1 + normInf(z, s)) * 1e-3 && Math.abs(dot(row, z, s) - target) <= tolerances.correctorStep * (1 + normInf(z, s)), iterations: it };
    ws.rhs.set(ws.g);
    ws.rhs[s - 1] = dot(row, z, s) - target;
    f.solve(ws.rhs, ws.d);
    for (let i = 0; i < s; i++) z[i] -= ws.d[i];
    if (!allFinite(z, s)) return { converged: false, iterations: it };
    if (normInf(ws.d, s) <= tolerances.correctorStep * (1 + normInf(z, s))) return { converged: true, iterations: it };
  }
  return { converged: false, iterations: maxIterations };
}

/**
 * Follow the curve G(y) = 0 from a point on it by pseudo-arclength continuation (Keller 1977;
 * Allgower & Georg, Introduction to Numerical Continuation Methods, ch. 2–3; Kuznetsov,
 * Elements of Applied Bifurcation Theory, 3rd ed., §10.2): Euler predictor along the tangent,
 * Newton corrector on the bordered system [G; tᵀ(z − z_pred)] = 0, step halved on corrector
 * failure or a sharp turn and grown after easy steps. Folds of the curve's projection are passed
 * through. Stops at a bound (ending on a point exactly at it when that converges), after
 * `maxPoints` points, when the curve returns to its start ("closed"), when the step falls below
 * its minimum, or at the deadline. Expected failure is a stop reason, never an exception.
 */
export function followCurve(system: CurveSystem, start: Float64Array, direction: Float64Array, options: FollowOptions): FollowResult {
  const { tolerances: tol, step } = options;
  const size = system.dimension;
  const ws = new Workspace(size);
  const t0 = curveTangent(system, start, direction, ws);
  if (!t0) return { points: [], stopReason: 'step-too-small' };
  system.evaluate(start, ws.g);
  const points: CurvePoint[] = [];
  const push = (pt: CurvePoint) => {
    if (options.describe) pt.data = options.describe(pt);
    points.push(pt);
  };
  push({ y: start.slice(), tangent: t0, residual: norm2(ws.g) });
  let y = points[0].y;
  let t = t0;
  let h = step.initial;
  const z = new Float64Array(size);
  let travelled = 0;
  while (points.length < options.maxPoints) {
    if (Date.now() > options.deadline) return { points, stopReason: 'time-limit' };
    for (let i = 0; i < size; i++) z[i] = y[i] + h * t[i];
    const target = dot(t, z);
    const { converged, iterations } = correct(system, z, t, target, tol.correctorMaxIterations, tol, ws);
    let tn: Float64Array | null = null;
    let accept = converged;
    if (accept) {
      tn = curveTangent(system, z, t, ws);
      // Reject sharp turns and correctors that wandered far from the prediction.
      let dist = 0;
      for (let i = 0; i < size; i++) dist += (z[i] - y[i] - h * t[i]) ** 2;
      accept = tn !== null && (dot(tn, t) >= tol.tangentCosMin || h <= step.min) && Math.sqrt(dist) <= Math.max(h, step.min);
    }
    if (!accept) {
      if (h <= step.min) return { points, stopReason: 'step-too-small' };
      h = Math.max(h * tol.stepCut, step.min);
      continue;
    }
    const next = z.slice();
    const segment = Math.sqrt(next.reduce((s, v, i) => s + (v - y[i]) ** 2, 0));
    const outside = options.bounds.find((b) => next[b.index] < b.min || next[b.index] > b.max);
    if (outside) {
      const edge = landOnBound(system, y, next, outside, tol, ws);
      if (edge) push(edge);
      return { points, stopReason: 'bounds' };
    }
    system.evaluate(next, ws.g);
    push({ y: next, tangent: tn!, residual: norm2(ws.g) });
    travelled += segment;
    if (points.length > 3 && travelled > 3 * segment && dot(tn!, points[0].tangent) > 0 && distanceToSegment(points[0].y, y, next) <= 0.05 * segment + 1e-9 * (1 + normInf(next)))
      return { points, stopReason: 'closed' };
    y = next;
    t = tn!;
    if (iterations <= tol.correctorFastIterations) h = Math.min(h * tol.stepGrow, step.max);
  }
  return { points, stopReason: 'max-points' };
}

/** The point of the curve where coordinate b.index equals the bound it crossed between y and z. */
function landOnBound(system: CurveSystem, y: Float64Array, z: Float64Array, b: CoordinateBound, tol: Tolerances, ws: Workspace): CurvePoint | null {
  const value = z[b.index] > b.max ? b.max : b.min;
  const s = (value - y[b.index]) / (z[b.index] - y[b.index]);
  const u = y.map((v, i) => v + s * (z[i] - v));
  const row = new Float64Array(y.length);
  row[b.index] = 1;
  const { converged } = correct(system, u, row, value, tol.newtonMaxIterations, tol, ws);
  if (!converged) return null;
  u[b.index] = value;
  const direction = z.map((v, i) => v - y[i]);
  const tangent = curveTangent(system, u, direction, ws);
  if (!tangent) return null;
  system.evaluate(u, ws.g);
  return { y: u, tangent, residual: norm2(ws.g) };
}

function distanceToSegment(p: Float64Array, a: Float64Array, b: Float64Array): number {
  let ab = 0;
  let ap = 0;
  for (let i = 0; i < p.length; i++) {
    ab += (b[i] - a[i]) ** 2;
    ap += (p[i] - a[i]) * (b[i] - a[i]);
  }
  const s = ab > 0 ? Math.min(1, Math.max(0, ap / ab)) : 0;
  let d = 0;
  for (let i = 0; i < p.length; i++) d += (p[i] - a[i] - s * (b[i] - a[i])) ** 2;
  return Math.sqrt(d);
}
