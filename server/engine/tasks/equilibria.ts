import { ENGINE_ERROR_CODES, type EquilibriaResult, type EquilibriaTask, type Point } from '@shared/engine/contract.ts';
import { EngineRequestError } from '../errors.ts';
import type { CompiledModel } from '../model/compile.ts';
import { newtonSolve } from '../newton.ts';
import { normInf } from '../linalg/vector.ts';
import { pastDeadline, type TaskContext } from './context.ts';
import { equilibriumPoint } from './present.ts';

/** Search interval of a variable left out of the box. */
export const DEFAULT_INTERVAL: readonly [number, number] = [-10, 10];

/** Deterministic pseudo-random numbers in [0, 1) (mulberry32), so a search is reproducible. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Equilibria f(x, p) = 0 in a box: damped Newton from the box centre and from pseudo-random
 * starts (fixed seed), keeping converged solutions inside the box, deduplicated
 * (‖x − y‖∞ ≤ duplicate·(1 + ‖x‖∞)), each with its stability. Solutions are sorted by their
 * first variable, then the next. An equilibrium whose basin no start falls into is missed:
 * more starts find more.
 */
export function runEquilibria(model: CompiledModel, task: EquilibriaTask, ctx: TaskContext): Omit<EquilibriaResult, 'engine'> {
  const n = model.n;
  for (const key of Object.keys(task.box))
    if (!model.variables.includes(key))
      throw new EngineRequestError({ code: ENGINE_ERROR_CODES.unknownReference, message: `"${key}" is not a variable of the model`, path: `task.box.${key}` });
  const lo = model.variables.map((v) => (task.box[v] ?? DEFAULT_INTERVAL)[0]);
  const hi = model.variables.map((v) => (task.box[v] ?? DEFAULT_INTERVAL)[1]);
  const p = model.parameterValues();
  const system = { size: n, evaluate: (x: Float64Array, out: Float64Array) => model.rhs(x, p, out), jacobian: (x: Float64Array, out: Float64Array) => model.jacobian(x, p, out) };
  const next = random(0x5eed);
  const found: Float64Array[] = [];
  const residuals: number[] = [];
  let tried = 0;
  let converged = 0;
  let stopReason: EquilibriaResult['stopReason'] = 'completed';
  const slack = (i: number) => 1e-9 * (hi[i] - lo[i]);
  for (let s = 0; s < task.starts; s++) {
    if (pastDeadline(ctx)) {
      stopReason = 'time-limit';
      break;
    }
    const x0 = lo.map((l, i) => (s === 0 ? (l + hi[i]) / 2 : l + next() * (hi[i] - l)));
    tried++;
    const r = newtonSolve(system, x0, ctx.tolerances, true, 60);
    if (!r.converged) continue;
    converged++;
    if (r.y.some((v, i) => v < lo[i] - slack(i) || v > hi[i] + slack(i))) continue;
    const duplicate = found.some((y) => {
      let d = 0;
      for (let i = 0; i < n; i++) d = Math.max(d, Math.abs(y[i] - r.y[i]));
      return d <= ctx.tolerances.duplicate * (1 + normInf(r.y));
    });
    if (!duplicate) {
      found.push(r.y);
      residuals.push(r.residual);
    }
  }
  const order = found.map((_, i) => i).sort((a, b) => {
    for (let i = 0; i < n; i++) if (found[a][i] !== found[b][i]) return found[a][i] - found[b][i];
    return 0;
  });
  const equilibria: Point[] = order.map((i) => equilibriumPoint(model, found[i], p, ctx.tolerances, residuals[i]));
  return { equilibria, starts: { tried, converged }, stopReason };
}
