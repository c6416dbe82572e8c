import type { CodimensionTwoEvent, HopfCurve, HopfCurvePoint, HopfCurveTask, StopReason } from '@shared/engine/contract.ts';
import { locateAlongCurve } from '../bifurcation/cusp.ts';
import { HopfSystem } from '../bifurcation/hopf-system.ts';
import { hopfTest } from '../bifurcation/hopf.ts';
import { complexNullVector, hopfCoefficients } from '../bifurcation/lyapunov.ts';
import { followCurve, type CurvePoint, type FollowResult } from '../continuation/pseudo-arclength.ts';
import { luFactor, luLogDeterminant } from '../linalg/lu.ts';
import type { CompiledModel } from '../model/compile.ts';
import { newtonSolve } from '../newton.ts';
import { convergeStart, followBothWays } from './continuation.ts';
import { pastDeadline, type TaskContext } from './context.ts';
import { named, vectorFrom } from './present.ts';
import { twoParameterSetup } from './two-parameter.ts';

interface Described {
  point: HopfCurvePoint;
  l1: number;
  /** Sign of det J (ω² times the product of the other eigenvalues). */
  detSign: number;
  omega: number;
}

/**
 * A Hopf point followed in two parameters (μ, κ) = task.parameters on the extended system
 * (x, a, b, ω, μ, κ) of `HopfSystem` by pseudo-arclength continuation, with ω and l1 at every
 * point. Codimension-two points along it (Kuznetsov, Elements of Applied Bifurcation Theory,
 * 3rd ed., §8.3–8.5, §10.3): generalized Hopf where l1 changes sign, zero-Hopf where det J
 * changes sign (a real eigenvalue through zero), Bogdanov–Takens where ω reaches zero; each
 * located along the curve by regula falsi on that test function.
 */
export function runHopfCurve(model: CompiledModel, task: HopfCurveTask, ctx: TaskContext): HopfCurve {
  const n = model.n;
  const { k1, k2, p, names: [name1, name2] } = twoParameterSetup(model, task);
  const guess = vectorFrom(model.variables, task.start.state, 'task.start.state', 'variable');
  const x0 = convergeStart(model, guess, p, ctx)?.y ?? guess;
  const jac = new Float64Array(n * n);
  const stateJacobian = (y: Float64Array, out: Float64Array) => model.jacobian(y, p, out);
  const pair = hopfTest(stateJacobian, n, ctx.tolerances)(x0);
  if (!(pair.im > 0)) return { points: [], events: [], stopReason: 'start-not-converged' };
  model.jacobian(x0, p, jac);
  const v = complexNullVector(jac, n, pair.im, false);
  // Turn the eigenvector so that a·b = 0 and scale |a|² + |b|² = 1; a is the phase reference.
  let aa = 0;
  let bb = 0;
  let ab = 0;
  for (let i = 0; i < n; i++) {
    aa += v.re[i] ** 2;
    bb += v.im[i] ** 2;
    ab += v.re[i] * v.im[i];
  }
  const theta = 0.5 * Math.atan2(-2 * ab, aa - bb);
  const scale = Math.sqrt(aa + bb);
  const a = new Float64Array(n);
  const b = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    a[i] = (v.re[i] * Math.cos(theta) - v.im[i] * Math.sin(theta)) / scale;
    b[i] = (v.re[i] * Math.sin(theta) + v.im[i] * Math.cos(theta)) / scale;
  }
  const square = new HopfSystem(model, k1, p, a);
  const z0 = new Float64Array(3 * n + 2);
  z0.set(x0, 0);
  z0.set(a, n);
  z0.set(b, 2 * n);
  z0[3 * n] = pair.im;
  z0[3 * n + 1] = p[k1];
  const located = newtonSolve({ size: 3 * n + 2, evaluate: (y, out) => square.evaluate(y, out), jacobian: (y, out) => square.jacobian(y, out) }, z0, ctx.tolerances);
  if (!located.converged || !(located.y[3 * n] > 0)) return { points: [], events: [], stopReason: 'start-not-converged' };

  const system = new HopfSystem(model, k1, p, a, k2);
  const y0 = new Float64Array(3 * n + 3);
  y0.set(located.y, 0);
  y0[3 * n + 2] = p[k2];
  const bounds = [
    { index: 3 * n + 1, min: task.bounds[name1][0], max: task.bounds[name1][1] },
    { index: 3 * n + 2, min: task.bounds[name2][0], max: task.bounds[name2][1] },
  ];
  const at = (y: Float64Array) => {
    const pp = system.parametersAt(y).slice();
    const x = y.slice(0, n);
    return { pp, x, omega: y[3 * n] };
  };
  const l1At = (y: Float64Array) => {
    const { pp, x, omega } = at(y);
    return omega > 0 ? hopfCoefficients(model, x, pp, omega, ctx.tolerances.degenerate).l1 : NaN;
  };
  const logDetAt = (y: Float64Array) => {
    const { pp, x } = at(y);
    model.jacobian(x, pp, jac);
    return luLogDeterminant(luFactor(jac, n, true));
  };
  const describe = (pt: CurvePoint): Described => {
    const l1 = l1At(pt.y);
    const omega = pt.y[3 * n];
    const point: HopfCurvePoint = {
      parameters: { [name1]: pt.y[3 * n + 1], [name2]: pt.y[3 * n + 2] },
      state: named(model.variables, pt.y),
      frequency: omega,
      firstLyapunovCoefficient: l1 + 0,
      residual: pt.residual,
    };
    return { point, l1, detSign: logDetAt(pt.y).sign, omega };
  };
  const options = { step: task.step, bounds, deadline: ctx.deadline, tolerances: ctx.tolerances, describe };
  const follow = (sign: number, maxPoints: number): FollowResult => {
    const e = new Float64Array(3 * n + 3);
    e[3 * n + 2] = sign;
    const r = followCurve(system, y0, e, { ...options, maxPoints });
    if (r.points.length > 0) return r;
    e[3 * n + 2] = 0;
    e[3 * n + 1] = sign;
    return followCurve(system, y0, e, { ...options, maxPoints });
  };
  const traced = cutAtZeroFrequency(followBothWays(follow, task.direction, task.maxPoints), y0, 3 * n);
  const described = traced.points.map((pt) => pt.data as Described);
  const events: CodimensionTwoEvent[] = [];
  const l1Scale = Math.max(...described.map((d) => Math.abs(d.l1)).filter(Number.isFinite), 1e-300);
  const omegaScale = Math.max(...described.map((d) => Math.abs(d.omega)), 1e-300);
  const event = (kind: CodimensionTwoEvent['kind'], z: Float64Array, after: number): CodimensionTwoEvent => ({
    kind,
    parameters: { [name1]: z[3 * n + 1], [name2]: z[3 * n + 2] },
    state: named(model.variables, z),
    after,
  });
  for (let i = 0; i + 1 < described.length; i++) {
    if (pastDeadline(ctx)) break;
    const [da, db] = [described[i], described[i + 1]];
    const [a0, b0] = [traced.points[i], traced.points[i + 1]];
    const found: Array<[CodimensionTwoEvent['kind'], (y: Float64Array) => number, number]> = [];
    if (i === traced.cutAfterStart || i === traced.cutBeforeStart) {
      // The neighbouring point past ω = 0 was kept only to bracket the Bogdanov–Takens point.
      found.push(['bogdanov-takens', (y) => y[3 * n], omegaScale]);
    }
    else {
      if (da.l1 * db.l1 < 0) found.push(['generalized-hopf', l1At, l1Scale]);
      if (da.detSign * db.detSign < 0) {
        const ref = logDetAt(a0.y).log;
        found.push(['zero-hopf', (y) => { const d = logDetAt(y); return d.sign * Math.exp(d.log - ref); }, 1]);
      }
    }
    for (const [kind, test, testScale] of found) {
      const z = locateAlongCurve(system, a0.y, a0.tangent, b0.y, test, testScale, ctx.tolerances);
      if (z) events.push(event(kind, z, i));
    }
  }
  // Drop the bracketing points past ω = 0.
  const first = traced.cutBeforeStart >= 0 ? traced.cutBeforeStart + 1 : 0;
  const last = traced.cutAfterStart >= 0 ? traced.cutAfterStart : described.length - 1;
  const points = described.slice(first, last + 1).map((d) => d.point);
  const shifted = events.map((e) => ({ ...e, after: Math.min(Math.max(e.after - first, 0), Math.max(points.length - 1, 0)) }));
  const curve: HopfCurve = { points, events: shifted, stopReason: traced.cutAfterStart >= 0 ? 'end-point' : traced.stopReason };
  const atStart = traced.cutBeforeStart >= 0 ? 'end-point' : traced.stopReasonAtStart;
  if (atStart) curve.stopReasonAtStart = atStart;
  return curve;
}

/**
 * The extended system goes on through ω = 0 into ω < 0, the same Hopf curve with the conjugate
 * eigenvector: the curve ends at the first sign change of ω on each side of the start (a
 * Bogdanov–Takens point). Returns the points up to and including the first point past it on each
 * side (to bracket the location), with the indices of the last valid point before each cut
 * (−1: no cut on that side).
 */
function cutAtZeroFrequency<T extends { points: CurvePoint[]; stopReason: StopReason; stopReasonAtStart?: StopReason }>(traced: T, y0: Float64Array, omegaIndex: number) {
  const pts = traced.points;
  let start = pts.findIndex((pt) => pt.y.every((v, i) => v === y0[i]));
  if (start < 0) start = 0;
  let hi = pts.length - 1;
  let cutAfterStart = -1;
  for (let i = start; i + 1 < pts.length; i++)
    if (pts[i].y[omegaIndex] * pts[i + 1].y[omegaIndex] <= 0) {
      cutAfterStart = i;
      hi = i + 1;
      break;
    }
  let lo = 0;
  let cutBeforeStart = -1;
  for (let i = start; i > 0; i--)
    if (pts[i].y[omegaIndex] * pts[i - 1].y[omegaIndex] <= 0) {
      lo = i - 1;
      cutBeforeStart = i - 1;
      break;
    }
  return { ...traced, points: pts.slice(lo, hi + 1), cutAfterStart: cutAfterStart >= 0 ? cutAfterStart - lo : -1, cutBeforeStart: cutBeforeStart >= 0 ? 0 : -1 };
}
