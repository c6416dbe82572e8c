import { luFactor, luSolve, type LuFactors } from '../linalg/lu.ts';
import type { OdeRhs } from './dormand-prince.ts';

export type OdeJacobian = (t: number, y: Float64Array, out: Float64Array) => void;

export interface RosenbrockResult {
  /** Samples reached (times[0 … reached−1] have values). */
  reached: number;
  stopReason: 'end' | 'step-too-small' | 'not-finite' | 'time-limit';
  accepted: number;
  rejected: number;
}

const D = 1 / (2 + Math.SQRT2);
const E32 = 6 + Math.SQRT2;

/**
 * Linearly implicit Rosenbrock (W-) method of order 2 with an embedded order-3 error estimate,
 * L-stable, for stiff autonomous systems y' = f(y) (Shampine & Reichelt 1997, SIAM J. Sci.
 * Comput. 18(1), §3, with the exact Jacobian J; Hairer & Wanner, Solving ODEs II, §IV.7 for
 * Rosenbrock methods in general). Per step: W = I − h·d·J, d = 1/(2 + √2), factored once;
 *   k1 = W⁻¹f(y), F1 = f(y + h/2·k1), k2 = W⁻¹(F1 − k1) + k1, y_new = y + h·k2,
 *   k3 = W⁻¹(f(y_new) − e32(k2 − F1) − 2(k1 − f(y))), e32 = 6 + √2,
 *   error = h/6·(k1 − 2k2 + k3), measured as in the explicit method;
 * new step h·min(5, max(0.2, 0.8·err^(−1/3))). Dense output (same source):
 *   y(t + sh) = y + h·[s(1 − s)/(1 − 2d)·k1 + s(s − 2d)/(1 − 2d)·k2].
 * Integrates from (t0, y0) and fills `values` for sample indices from `firstSample` on.
 */
export function integrateRosenbrock(
  f: OdeRhs,
  jacobian: OdeJacobian,
  t0: number,
  y0: Float64Array,
  times: Float64Array,
  firstSample: number,
  values: Float64Array,
  tol: { relative: number; absolute: number },
  deadline: number,
  initialStep?: number,
): RosenbrockResult {
  const n = y0.length;
  const samples = times.length;
  const tEnd = times[samples - 1];
  const y = y0.slice();
  const ynew = new Float64Array(n);
  const yt = new Float64Array(n);
  const f0 = new Float64Array(n);
  const f1 = new Float64Array(n);
  const f2 = new Float64Array(n);
  const k1 = new Float64Array(n);
  const k2 = new Float64Array(n);
  const k3 = new Float64Array(n);
  const rhs = new Float64Array(n);
  const jac = new Float64Array(n * n);
  const w = new Float64Array(n * n);
  const lu: LuFactors = { n, lu: new Float64Array(n * n), pivot: new Int32Array(n), singular: false, pivotRatio: 1 };
  let reached = firstSample;
  let accepted = 0;
  let rejected = 0;
  let t = t0;
  f(t, y, f0);
  let h = initialStep && initialStep > 0 ? initialStep : Math.min(1e-6 * Math.max(1, Math.abs(tEnd - t0)), tEnd - t0);
  let jacobianFresh = false;
  while (reached < samples) {
    if (Date.now() > deadline) return { reached, stopReason: 'time-limit', accepted, rejected };
    if (t + h > tEnd) h = tEnd - t;
    if (h <= 1e-14 * Math.max(1, Math.abs(t))) return { reached, stopReason: 'step-too-small', accepted, rejected };
    if (!jacobianFresh) {
      jacobian(t, y, jac);
      jacobianFresh = true;
    }
    for (let i = 0; i < n * n; i++) w[i] = -h * D * jac[i];
    for (let i = 0; i < n; i++) w[i * n + i] += 1;
    luFactor(w, n, false, lu);
    if (lu.singular) {
      h /= 2;
      rejected++;
      continue;
    }
    luSolve(lu, f0, k1);
    for (let i = 0; i < n; i++) yt[i] = y[i] + 0.5 * h * k1[i];
    f(t + 0.5 * h, yt, f1);
    for (let i = 0; i < n; i++) rhs[i] = f1[i] - k1[i];
    luSolve(lu, rhs, k2);
    for (let i = 0; i < n; i++) {
      k2[i] += k1[i];
      ynew[i] = y[i] + h * k2[i];
    }
    f(t + h, ynew, f2);
    for (let i = 0; i < n; i++) rhs[i] = f2[i] - E32 * (k2[i] - f1[i]) - 2 * (k1[i] - f0[i]);
    luSolve(lu, rhs, k3);
    let err = 0;
    for (let i = 0; i < n; i++) {
      const e = (h / 6) * (k1[i] - 2 * k2[i] + k3[i]);
      const sc = tol.absolute + tol.relative * Math.max(Math.abs(y[i]), Math.abs(ynew[i]));
      err += (e / sc) ** 2;
    }
    err = Math.sqrt(err / n);
    if (!Number.isFinite(err)) {
      if (h < 1e-10 * Math.max(1, Math.abs(tEnd - t0))) return { reached, stopReason: 'not-finite', accepted, rejected };
      h *= 0.1;
      rejected++;
      continue;
    }
    const factor = Math.min(5, Math.max(0.2, 0.8 * Math.pow(Math.max(err, 1e-10), -1 / 3)));
    if (err > 1) {
      h *= Math.min(1, factor);
      rejected++;
      continue;
    }
    accepted++;
    const tNew = t + h;
    while (reached < samples && times[reached] <= tNew) {
      const s = (times[reached] - t) / h;
      const c1 = (s * (1 - s)) / (1 - 2 * D);
      const c2 = (s * (s - 2 * D)) / (1 - 2 * D);
      const off = reached * n;
      for (let i = 0; i < n; i++) values[off + i] = s === 1 ? ynew[i] : y[i] + h * (c1 * k1[i] + c2 * k2[i]);
      reached++;
    }
    y.set(ynew);
    f0.set(f2);
    t = tNew;
    jacobianFresh = false;
    if (!y.every(Number.isFinite)) return { reached, stopReason: 'not-finite', accepted, rejected };
    h *= factor;
  }
  return { reached, stopReason: 'end', accepted, rejected };
}
