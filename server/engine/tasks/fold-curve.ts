import { type CodimensionTwoEvent, type Eigenvalue, type FoldCurve, type FoldCurvePoint, type FoldCurveTask } from '@shared/engine/contract.ts';
import { locateAlongCurve } from '../bifurcation/cusp.ts';
import { locateFold } from '../bifurcation/fold.ts';
import { FoldSystem } from '../bifurcation/fold-system.ts';
import { foldCoefficients, foldNormalForm } from '../bifurcation/normal-form.ts';
import { followCurve, type CurvePoint, type FollowResult } from '../continuation/pseudo-arclength.ts';
import { nullVectorEstimate } from '../linalg/null-vector.ts';
import { eigenvalues } from '../linalg/eigen.ts';
import { hopfTest, unstablePairs } from '../bifurcation/hopf.ts';
import type { CompiledModel } from '../model/compile.ts';
import { convergeStart, followBothWays } from './continuation.ts';
import { pastDeadline, type TaskContext } from './context.ts';
import { named, vectorFrom } from './present.ts';
import { twoParameterSetup } from './two-parameter.ts';

/**
 * A fold followed in two parameters (μ, κ) = task.parameters on the standard extended system
 * (x, v, μ, κ) by pseudo-arclength continuation. Each point carries its normal-form a, b
 * (product convention); cusps are where b, computed with the null vector carried continuously
 * along the curve, changes sign; Bogdanov–Takens points where a second eigenvalue reaches zero;
 * zero-Hopf points where a complex pair of the other eigenvalues crosses the imaginary axis;
 * each located along the curve.
 */
export function runFoldCurve(model: CompiledModel, task: FoldCurveTask, ctx: TaskContext): FoldCurve {
  const n = model.n;
  const { k1, k2, p, names: [name1, name2] } = twoParameterSetup(model, task);
  const guess = vectorFrom(model.variables, task.start.state, 'task.start.state', 'variable');
  const x0 = convergeStart(model, guess, p, ctx)?.y ?? guess;
  const jac = new Float64Array(n * n);
  model.jacobian(x0, p, jac);
  const fold = locateFold(model, k1, p, x0, nullVectorEstimate(jac, n), p[k1], ctx.tolerances);
  if (!fold.converged) return { points: [], events: [], stopReason: 'start-not-converged' };

  const system = new FoldSystem(model, k1, p, k2);
  const y0 = new Float64Array(2 * n + 2);
  y0.set(fold.x, 0);
  y0.set(fold.v, n);
  y0[2 * n] = fold.parameter;
  y0[2 * n + 1] = p[k2];
  const bounds = [
    { index: 2 * n, min: task.bounds[name1][0], max: task.bounds[name1][1] },
    { index: 2 * n + 1, min: task.bounds[name2][0], max: task.bounds[name2][1] },
  ];
  const curveJac = new Float64Array(n * n);
  const stateJacobian = (y: Float64Array, out: Float64Array) => model.jacobian(y, system.parametersAt(y), out);
  /** The eigenvalues other than the fold's zero one, and their product (the Bogdanov–Takens test). */
  const otherEigenvalues = (y: Float64Array) => {
    stateJacobian(y, curveJac);
    const e = eigenvalues(curveJac, n, ctx.tolerances.eigenMaxIterations);
    let zero = 0;
    for (let i = 1; i < n; i++) if (Math.hypot(e.re[i], e.im[i]) < Math.hypot(e.re[zero], e.im[zero])) zero = i;
    const list: Eigenvalue[] = [];
    let product = 1;
    for (let i = 0; i < n; i++) {
      if (i === zero) continue;
      list.push({ re: e.re[i], im: e.im[i] });
      // A complex pair contributes |λ|² once; real eigenvalues themselves.
      if (e.im[i] === 0) product *= e.re[i];
      else if (e.im[i] > 0) product *= e.re[i] ** 2 + e.im[i] ** 2;
    }
    const unstable = list.filter((l) => l.re > ctx.tolerances.neutral * Math.max(1, ...list.map((m) => Math.hypot(m.re, m.im)))).length;
    return { list, product, unstable };
  };
  const describe = (pt: CurvePoint) => {
    const pp = system.parametersAt(pt.y).slice();
    const x = pt.y.slice(0, n);
    const v = pt.y.slice(n, 2 * n);
    const nf = foldNormalForm(model, x, pp, k1, v, ctx.tolerances);
    const raw = foldCoefficients(model, x, pp, k1, v, ctx.tolerances);
    const point: FoldCurvePoint = { parameters: { [name1]: pt.y[2 * n], [name2]: pt.y[2 * n + 1] }, state: named(model.variables, x), normalForm: { a: nf.a, b: nf.b }, residual: pt.residual };
    return { point, continuousB: raw.b, others: otherEigenvalues(pt.y) };
  };
  const follow = (sign: number, maxPoints: number): FollowResult => {
    const e = new Float64Array(2 * n + 2);
    e[2 * n + 1] = sign;
    const r = followCurve(system, y0, e, { step: task.step, maxPoints, bounds, deadline: ctx.deadline, tolerances: ctx.tolerances, describe });
    if (r.points.length > 0) return r;
    e[2 * n + 1] = 0;
    e[2 * n] = sign;
    return followCurve(system, y0, e, { step: task.step, maxPoints, bounds, deadline: ctx.deadline, tolerances: ctx.tolerances, describe });
  };
  const traced = followBothWays(follow, task.direction, task.maxPoints);
  const described = traced.points.map((pt) => pt.data as ReturnType<typeof describe>);
  const points = described.map((d) => d.point);
  const continuousB = described.map((d) => d.continuousB);
  const bScale = Math.max(...continuousB.map(Math.abs), 1e-300);
  const events: CodimensionTwoEvent[] = [];
  for (let i = 0; i + 1 < points.length; i++) {
    if (!(continuousB[i] * continuousB[i + 1] < 0) || pastDeadline(ctx)) continue;
    const a = traced.points[i];
    const testB = (y: Float64Array) => {
      const pp = system.parametersAt(y).slice();
      return foldCoefficients(model, y.slice(0, n), pp, k1, y.slice(n, 2 * n), ctx.tolerances).b;
    };
    const z = locateAlongCurve(system, a.y, a.tangent, traced.points[i + 1].y, testB, bScale, ctx.tolerances);
    // b also changes sign through a pole where w·v = 1 cannot hold (a Bogdanov–Takens point): not a cusp.
    if (!z || !(Math.abs(testB(z)) <= 1e-6 * bScale)) continue;
    events.push({ kind: 'cusp', parameters: { [name1]: z[2 * n], [name2]: z[2 * n + 1] }, state: named(model.variables, z), after: i });
  }
  // Bogdanov–Takens: a second eigenvalue through zero (the product of the others changes sign);
  // zero-Hopf: a complex pair of the others crosses the imaginary axis (Kuznetsov, §8.4–8.5, §10.3.1).
  const productScale = Math.max(...described.map((d) => Math.abs(d.others.product)), 1e-300);
  const hopf = hopfTest(stateJacobian, n, ctx.tolerances);
  for (let i = 0; i + 1 < points.length; i++) {
    if (pastDeadline(ctx)) break;
    const [da, db] = [described[i].others, described[i + 1].others];
    const [a, b] = [traced.points[i], traced.points[i + 1]];
    const at = (kind: CodimensionTwoEvent['kind'], z: Float64Array | null) => {
      if (z) events.push({ kind, parameters: { [name1]: z[2 * n], [name2]: z[2 * n + 1] }, state: named(model.variables, z), after: i });
    };
    if (da.product * db.product < 0) at('bogdanov-takens', locateAlongCurve(system, a.y, a.tangent, b.y, (y) => otherEigenvalues(y).product, productScale, ctx.tolerances));
    if (unstablePairs(da.list, ctx.tolerances) !== unstablePairs(db.list, ctx.tolerances) && da.unstable !== db.unstable)
      at('zero-hopf', locateAlongCurve(system, a.y, a.tangent, b.y, (y) => hopf(y).re, 1, ctx.tolerances));
  }
  events.sort((e1, e2) => e1.after - e2.after);
  const curve: FoldCurve = { points, events, stopReason: traced.stopReason };
  if (traced.stopReasonAtStart) curve.stopReasonAtStart = traced.stopReasonAtStart;
  return curve;
}
