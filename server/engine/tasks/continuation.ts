import { ENGINE_ERROR_CODES, type Branch, type BranchPoint, type ContinuationTask, type FoldEvent, type StopReason } from '@shared/engine/contract.ts';
import { EngineRequestError } from '../errors.ts';
import { locateFold } from '../bifurcation/fold.ts';
import { foldNormalForm } from '../bifurcation/normal-form.ts';
import { stabilityOf } from '../bifurcation/stability.ts';
import { EquilibriumSystem } from '../continuation/equilibrium-system.ts';
import { followCurve, type CurvePoint, type FollowResult } from '../continuation/pseudo-arclength.ts';
import type { CompiledModel } from '../model/compile.ts';
import { newtonSolve } from '../newton.ts';
import { pastDeadline, type TaskContext } from './context.ts';
import { named, parameterIndex, vectorFrom } from './present.ts';

/** A converged equilibrium at the model's parameter values, or null. */
export function convergeStart(model: CompiledModel, guess: Float64Array, p: Float64Array, ctx: TaskContext) {
  const r = newtonSolve(
    { size: model.n, evaluate: (x, out) => model.rhs(x, p, out), jacobian: (x, out) => model.jacobian(x, p, out) },
    guess,
    ctx.tolerances,
    true,
  );
  return r.converged ? r : null;
}

/**
 * Follow two curve directions from one start and join them in curve order: the reversed
 * "backward" part (tangents turned to the order of travel), then the "forward" part.
 */
export function followBothWays(
  follow: (direction: number, maxPoints: number) => FollowResult,
  direction: 'both' | 'increasing' | 'decreasing',
  maxPoints: number,
): { points: CurvePoint[]; stopReason: StopReason; stopReasonAtStart?: StopReason } {
  if (direction !== 'both') return follow(direction === 'increasing' ? 1 : -1, maxPoints);
  const back = follow(-1, Math.max(2, Math.ceil(maxPoints / 2)));
  if (back.stopReason === 'closed' || back.points.length === 0) return back;
  const forward = follow(1, maxPoints - back.points.length + 1);
  const reversed = back.points.reverse().map((pt) => ({ ...pt, tangent: pt.tangent.map((c) => -c) }));
  return { points: [...reversed, ...forward.points.slice(1)], stopReason: forward.stopReason, stopReasonAtStart: back.stopReason };
}

/**
 * Branch of equilibria in one parameter: Newton at the model's parameter values, then
 * pseudo-arclength continuation through folds; stability at every point; folds detected by a
 * sign change of the tangent's parameter component and located on the extended system, with
 * their normal forms.
 */
export function runContinuation(model: CompiledModel, task: ContinuationTask, ctx: TaskContext): Branch {
  const n = model.n;
  const k = parameterIndex(model, task.parameter, 'task.parameter');
  const p = model.parameterValues();
  const mu0 = p[k];
  if (mu0 < task.bounds.min || mu0 > task.bounds.max)
    throw new EngineRequestError({
      code: ENGINE_ERROR_CODES.invalidRequest,
      message: `The model's value of ${task.parameter} (${mu0}) lies outside bounds [${task.bounds.min}, ${task.bounds.max}]`,
      path: 'task.bounds',
    });
  const guess = vectorFrom(model.variables, task.start, 'task.start', 'variable');
  const start = convergeStart(model, guess, p, ctx);
  if (!start) return { points: [], events: [], stopReason: 'start-not-converged' };

  const system = new EquilibriumSystem(model, k, p);
  const y0 = new Float64Array(n + 1);
  y0.set(start.y);
  y0[n] = mu0;
  const jac = new Float64Array(n * n);
  const describe = (pt: CurvePoint): BranchPoint => {
    model.jacobian(pt.y, system.parametersAt(pt.y), jac);
    return { state: named(model.variables, pt.y), parameter: pt.y[n], ...stabilityOf(jac, n, ctx.tolerances), residual: pt.residual };
  };
  const options = { step: task.step, bounds: [{ index: n, min: task.bounds.min, max: task.bounds.max }], deadline: ctx.deadline, tolerances: ctx.tolerances, describe };
  const follow = (sign: number, maxPoints: number): FollowResult => {
    const e = new Float64Array(n + 1);
    e[n] = sign;
    const r = followCurve(system, y0, e, { ...options, maxPoints });
    if (r.points.length > 0) return r;
    // The start sits on a fold: no tangent has a parameter component; set off along a state direction.
    e.fill(sign / Math.sqrt(n));
    e[n] = 0;
    return followCurve(system, y0, e, { ...options, maxPoints });
  };
  const traced = followBothWays(follow, task.direction, task.maxPoints);
  const points = traced.points.map((pt) => pt.data as BranchPoint);
  const events: FoldEvent[] = [];
  for (let i = 0; i + 1 < points.length; i++) {
    const ta = traced.points[i].tangent[n];
    const tb = traced.points[i + 1].tangent[n];
    if (!(ta * tb < 0) || pastDeadline(ctx)) continue;
    const fold = foldEvent(model, k, p, traced.points[i], traced.points[i + 1], i, ctx);
    if (fold) events.push(fold);
  }
  const branch: Branch = { points, events, stopReason: traced.stopReason };
  if (traced.stopReasonAtStart) branch.stopReasonAtStart = traced.stopReasonAtStart;
  return branch;
}

/** Locate the fold between two branch points whose tangents' parameter components differ in sign. */
function foldEvent(model: CompiledModel, k: number, parameters: Float64Array, a: CurvePoint, b: CurvePoint, after: number, ctx: TaskContext): FoldEvent | null {
  const n = model.n;
  const ta = a.tangent[n];
  const tb = b.tangent[n];
  const s = ta / (ta - tb);
  const x0 = new Float64Array(n);
  const v0 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x0[i] = a.y[i] + s * (b.y[i] - a.y[i]);
    v0[i] = a.tangent[i] + s * (b.tangent[i] - a.tangent[i]);
  }
  const mu0 = a.y[n] + s * (b.y[n] - a.y[n]);
  const located = locateFold(model, k, parameters, x0, v0, mu0, ctx.tolerances);
  if (!located.converged) return null;
  // The located fold must lie between the two points (not a different fold further away).
  let gap = 0;
  let span = 0;
  for (let i = 0; i <= n; i++) {
    const c = i < n ? located.x[i] : located.parameter;
    gap = Math.max(gap, Math.abs(c - (a.y[i] + b.y[i]) / 2));
    span = Math.max(span, Math.abs(b.y[i] - a.y[i]));
  }
  if (gap > span + 1e-9) return null;
  const p = parameters.slice();
  p[k] = located.parameter;
  const jac = new Float64Array(n * n);
  model.jacobian(located.x, p, jac);
  const nf = foldNormalForm(model, located.x, p, k, located.v, ctx.tolerances);
  return {
    kind: 'fold',
    parameter: located.parameter,
    state: named(model.variables, located.x),
    after,
    eigenvalues: stabilityOf(jac, n, ctx.tolerances).eigenvalues,
    normalForm: {
      a: nf.a,
      b: nf.b,
      nullVector: named(model.variables, nf.v),
      adjointNullVector: named(model.variables, nf.w),
      equilibriaSide: nf.equilibriaSide,
      nondegenerate: nf.nondegenerate,
    },
    residual: located.residual,
  };
}
