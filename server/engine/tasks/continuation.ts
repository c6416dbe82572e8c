import {
  ENGINE_ERROR_CODES,
  type Branch,
  type BranchEvent,
  type BranchPoint,
  type BranchPointEvent,
  type ContinuationTask,
  type FoldEvent,
  type HopfEvent,
  type StopReason,
} from '@shared/engine/contract.ts';
import { EngineRequestError } from '../errors.ts';
import { branchTest, locateBranchPoint, type LocatedBranchPoint } from '../bifurcation/branch-point.ts';
import { isHopfCrossing, locateHopf } from '../bifurcation/hopf.ts';
import { hopfCoefficients } from '../bifurcation/lyapunov.ts';
import { foldSensitivities } from '../bifurcation/sensitivity.ts';
import { tippingMargins } from '../bifurcation/tipping-margin.ts';
import { dot } from '../linalg/vector.ts';
import { LARGE_FOLD_MIN, locateFold, locateFoldAlongCurve } from '../bifurcation/fold.ts';
import { foldNormalForm } from '../bifurcation/normal-form.ts';
import { stabilityOf } from '../bifurcation/stability.ts';
import { EquilibriumSystem } from '../continuation/equilibrium-system.ts';
import { correct, followCurve, type CurvePoint, type FollowResult } from '../continuation/pseudo-arclength.ts';
import type { CompiledModel } from '../model/compile.ts';
import { newtonSolve } from '../newton.ts';
import { pastDeadline, type TaskContext } from './context.ts';
import { equilibriumPoint, named, parameterIndex, vectorFrom } from './present.ts';

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

/** A point of a traced branch: the curve point and its description. */
interface TracedPoint extends CurvePoint {
  data: { point: BranchPoint };
}

interface Located {
  events: BranchEvent[];
  /** Internal data of each "branch-point" event, by event index (for switching branches). */
  branchPoints: Map<number, LocatedBranchPoint>;
}

/**
 * Branch of equilibria in one parameter: Newton at the model's parameter values, then
 * pseudo-arclength continuation through folds; stability at every point; folds (sign change of
 * the tangent's parameter component), simple branch points (sign change of the augmented
 * determinant) and Hopf points (a complex pair crossing) located, with normal forms, fold
 * sensitivities and each point's tipping margin. With `switchAt`, the other branch through the
 * chosen branch point is followed instead.
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
  if (task.switchAt !== undefined && typeof task.switchAt === 'object') vectorFrom(model.variables, task.switchAt.state, 'task.switchAt.state', 'variable');
  const start = convergeStart(model, guess, p, ctx);
  if (!start) return { points: [], events: [], stopReason: 'start-not-converged' };

  const system = new EquilibriumSystem(model, k, p);
  const y0 = new Float64Array(n + 1);
  y0.set(start.y);
  y0[n] = mu0;
  const jac = new Float64Array(n * n);
  const describe = (pt: CurvePoint): TracedPoint['data'] => {
    model.jacobian(pt.y, system.parametersAt(pt.y), jac);
    const point: BranchPoint = { state: named(model.variables, pt.y), parameter: pt.y[n], ...stabilityOf(jac, n, ctx.tolerances, model.jacobianBand), residual: pt.residual };
    return { point };
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
  let traced = followBothWays(follow, task.direction, task.maxPoints);
  let located = locateEvents(model, k, p, system, traced.points as TracedPoint[], ctx);
  if (task.switchAt !== undefined) {
    const index = chooseBranchPoint(task.switchAt, located, traced.points as TracedPoint[], model);
    const bp = located.branchPoints.get(index)!;
    traced = followOtherBranch(system, bp, task.step.initial, task.direction, task.maxPoints, { ...options, maxPoints: task.maxPoints });
    located = locateEvents(model, k, p, system, traced.points as TracedPoint[], ctx);
  }
  const points = (traced.points as TracedPoint[]).map((pt) => pt.data.point);
  const folds = located.events.filter((e): e is FoldEvent => e.kind === 'fold');
  tippingMargins(points.map((pt) => pt.parameter), folds).forEach((margin, i) => (points[i].tippingMargin = margin));
  const branch: Branch = { points, events: located.events, stopReason: traced.stopReason };
  if (traced.stopReasonAtStart) branch.stopReasonAtStart = traced.stopReasonAtStart;
  return branch;
}

/** Folds, branch points and Hopf points between consecutive points, in branch order. */
function locateEvents(model: CompiledModel, k: number, p: Float64Array, system: EquilibriumSystem, traced: TracedPoint[], ctx: TaskContext): Located {
  const n = model.n;
  const events: BranchEvent[] = [];
  const branchPoints = new Map<number, LocatedBranchPoint>();
  const stateJacobian = (y: Float64Array, out: Float64Array) => model.jacobian(y, system.parametersAt(y), out);
  // The test's sign depends on the tangent's orientation: taken once the branch is in its final order.
  const signs = traced.map((pt) => branchTest(system, pt.y, pt.tangent).sign);
  for (let i = 0; i + 1 < traced.length; i++) {
    if (pastDeadline(ctx)) break;
    const [a, b] = [traced[i], traced[i + 1]];
    const ta = a.tangent[n];
    const tb = b.tangent[n];
    if (ta * tb < 0) {
      const fold = foldEvent(model, system, k, p, a, b, i, ctx);
      if (fold) events.push(fold);
    } else if (signs[i] * signs[i + 1] < 0) {
      const bp = locateBranchPoint(system, a, b, n, ctx.tolerances);
      if (bp) {
        branchPoints.set(events.length, bp);
        events.push(branchPointEvent(model, system, bp, i, ctx));
      }
    }
    if (isHopfCrossing(a.data.point, b.data.point, ctx.tolerances)) {
      const hopf = locateHopf(system, a, b, stateJacobian, n, ctx.tolerances);
      if (hopf) events.push(hopfEvent(model, system, hopf.y, hopf.omega, i, ctx));
    }
  }
  return { events, branchPoints };
}

function branchPointEvent(model: CompiledModel, system: EquilibriumSystem, bp: LocatedBranchPoint, after: number, ctx: TaskContext): BranchPointEvent {
  const n = model.n;
  const point = equilibriumPoint(model, bp.y, system.parametersAt(bp.y), ctx.tolerances);
  return {
    kind: 'branch-point',
    parameter: bp.y[n],
    state: point.state,
    after,
    tangents: bp.tangents.map((t) => ({ state: named(model.variables, t), parameter: t[n] + 0 })),
    type: bp.type,
    eigenvalues: point.eigenvalues,
    residual: point.residual,
  };
}

function hopfEvent(model: CompiledModel, system: EquilibriumSystem, y: Float64Array, omega: number, after: number, ctx: TaskContext): HopfEvent {
  const n = model.n;
  const p = system.parametersAt(y).slice();
  const point = equilibriumPoint(model, y, p, ctx.tolerances);
  const c = hopfCoefficients(model, y.slice(0, n), p, omega, ctx.tolerances.degenerate);
  return {
    kind: 'hopf',
    parameter: y[n],
    state: point.state,
    after,
    frequency: omega,
    firstLyapunovCoefficient: c.l1 + 0,
    criticality: c.degenerate ? 'degenerate' : c.l1 < 0 ? 'supercritical' : 'subcritical',
    eigenvalues: point.eigenvalues,
    residual: point.residual,
  };
}

/** The event index `switchAt` names: an index that must be a branch point, or the branch point nearest a given point. */
function chooseBranchPoint(switchAt: NonNullable<ContinuationTask['switchAt']>, located: Located, traced: TracedPoint[], model: CompiledModel): number {
  const available = [...located.branchPoints.keys()];
  const list = available.length ? `branch points on this branch are events ${available.join(', ')}` : 'no branch point was found on this branch';
  if (typeof switchAt === 'number') {
    if (located.branchPoints.has(switchAt)) return switchAt;
    const what = switchAt < located.events.length ? `event ${switchAt} is a ${located.events[switchAt].kind}, not a branch point` : `there is no event ${switchAt} (the branch has ${located.events.length})`;
    throw new EngineRequestError({ code: ENGINE_ERROR_CODES.invalidRequest, message: `switchAt: ${what}; ${list}`, path: 'task.switchAt' });
  }
  if (!available.length) throw new EngineRequestError({ code: ENGINE_ERROR_CODES.invalidRequest, message: `switchAt: ${list}`, path: 'task.switchAt' });
  const n = model.n;
  const target = vectorFrom(model.variables, switchAt.state, 'task.switchAt.state', 'variable', traced[0]?.y);
  let best = available[0];
  let bestDistance = Infinity;
  for (const index of available) {
    const y = located.branchPoints.get(index)!.y;
    let d = (y[n] - switchAt.parameter) ** 2;
    for (let i = 0; i < n; i++) d += (y[i] - target[i]) ** 2;
    if (d < bestDistance) [best, bestDistance] = [index, d];
  }
  return best;
}

/**
 * Follow the other branch through a located branch point: a first point a distance h along its
 * direction on each side (corrected onto that branch), then pseudo-arclength continuation away
 * from the branch point; joined in the order of the branch direction.
 */
function followOtherBranch(
  system: EquilibriumSystem,
  bp: LocatedBranchPoint,
  h: number,
  direction: 'both' | 'increasing' | 'decreasing',
  maxPoints: number,
  options: Parameters<typeof followCurve>[3],
): { points: CurvePoint[]; stopReason: StopReason; stopReasonAtStart?: StopReason } {
  const t = bp.tangents[1];
  const away = (sign: number, count: number): FollowResult => {
    const dir = t.map((c) => sign * c);
    const z = bp.y.map((v, i) => v + h * dir[i]);
    const { converged } = correct(system, z, dir, dot(dir, z), options.tolerances.newtonMaxIterations, options.tolerances);
    if (!converged) return { points: [], stopReason: 'step-too-small' };
    return followCurve(system, z, dir, { ...options, maxPoints: count });
  };
  const n = system.model.n;
  // "increasing"/"decreasing" pick the side by the parameter (the state when the direction has no parameter component).
  const lead = Math.abs(t[n]) > 1e-8 ? t[n] : t.reduce((best, c) => (Math.abs(c) > Math.abs(best) ? c : best), 0);
  if (direction !== 'both') return away((direction === 'increasing') === lead > 0 ? 1 : -1, maxPoints);
  const back = away(-1, Math.max(2, Math.ceil(maxPoints / 2)));
  const forward = away(1, Math.max(2, maxPoints - back.points.length));
  const reversed = back.points.reverse().map((pt) => ({ ...pt, tangent: pt.tangent.map((c) => -c) }));
  return { points: [...reversed, ...forward.points], stopReason: forward.stopReason, stopReasonAtStart: back.stopReason };
}

/** Locate the fold between two branch points whose tangents' parameter components differ in sign. */
function foldEvent(model: CompiledModel, system: EquilibriumSystem, k: number, parameters: Float64Array, a: CurvePoint, b: CurvePoint, after: number, ctx: TaskContext): FoldEvent | null {
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
  const located = n > LARGE_FOLD_MIN ? locateFoldAlongCurve(system, a, b, ctx.tolerances) : locateFold(model, k, parameters, x0, v0, mu0, ctx.tolerances);
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
    eigenvalues: stabilityOf(jac, n, ctx.tolerances, model.jacobianBand).eigenvalues,
    normalForm: {
      a: nf.a,
      b: nf.b,
      nullVector: named(model.variables, nf.v),
      adjointNullVector: named(model.variables, nf.w),
      equilibriaSide: nf.equilibriaSide,
      nondegenerate: nf.nondegenerate,
    },
    residual: located.residual,
    sensitivities: Object.fromEntries([...foldSensitivities(model, located.x, p, k, nf.w)].map(([j, value]) => [model.parameters[j], value])),
  };
}
