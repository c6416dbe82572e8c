/**
 * Dormand–Prince 5(4) embedded Runge–Kutta method with FSAL, local-error step-size control and
 * 4th-order dense output (Dormand & Prince 1980, "A family of embedded Runge–Kutta formulae";
 * coefficients and dense output as in Hairer, Nørsett & Wanner, Solving Ordinary Differential
 * Equations I, 2nd ed., §II.4–II.6, Table 5.2 and the continuous extension of DOPRI5).
 *
 * Error per step: err = sqrt(mean((e_i / (atol + rtol·max(|y0_i|, |y1_i|)))²)), accept when
 * err ≤ 1; new step h·min(5, max(0.2, 0.9·err^(−1/5))). The tolerances bound the local error
 * per step; the global error is usually a small multiple of them on non-stiff problems.
 */
export type OdeRhs = (t: number, y: Float64Array, out: Float64Array) => void;

export interface IntegrateResult {
  /** Samples reached (the first `reached` sample times have values). */
  reached: number;
  /** values[s·n + i] = y_i(times[s]). */
  values: Float64Array;
  /** "stiff": stiffness was detected (only with `detectStiffness`); integrate on from `t`, `state`. */
  stopReason: 'end' | 'step-too-small' | 'not-finite' | 'time-limit' | 'stiff';
  accepted: number;
  rejected: number;
  /** Where the integration stopped, and the step it would have tried next. */
  t: number;
  state: Float64Array;
  nextStep: number;
}

/**
 * Stiffness detection of Hairer, Nørsett & Wanner, Solving ODEs I, §IV.2 / the DOPRI5 code's
 * test (from memory): h·ρ with ρ ≈ ‖k7 − k6‖/‖y1 − y6‖ (both stages at t + h) estimates h times
 * the dominant eigenvalue; the explicit method is stability-limited when h·ρ stays above a
 * threshold for this many accepted steps, not interrupted by CALM_STEPS steps in a row below it.
 * The published threshold is 3.25; with this step control the estimate settles at 3.0–3.05 once
 * the steps are stability-limited (measured on Robertson's problem), so 2.9 is used.
 */
export const STIFF_STEPS = 15;
const CALM_STEPS = 6;
const STIFF_H_RHO = 2.9;

const C2 = 1 / 5, C3 = 3 / 10, C4 = 4 / 5, C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40, A32 = 9 / 40;
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
const A71 = 35 / 384, A73 = 500 / 1113, A74 = 125 / 192, A75 = -2187 / 6784, A76 = 11 / 84;
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;
const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072;
const D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423;

export function integrateDormandPrince(
  f: OdeRhs,
  y0: Float64Array,
  times: Float64Array,
  tol: { relative: number; absolute: number },
  deadline: number,
  detectStiffness = false,
): IntegrateResult {
  const n = y0.length;
  const samples = times.length;
  const values = new Float64Array(samples * n);
  const t0 = times[0];
  const tEnd = times[samples - 1];
  const y = y0.slice();
  const y1 = new Float64Array(n);
  const yt = new Float64Array(n);
  const k1 = new Float64Array(n), k2 = new Float64Array(n), k3 = new Float64Array(n), k4 = new Float64Array(n);
  const k5 = new Float64Array(n), k6 = new Float64Array(n), k7 = new Float64Array(n);
  const r1 = new Float64Array(n), r2 = new Float64Array(n), r3 = new Float64Array(n), r4 = new Float64Array(n), r5 = new Float64Array(n);
  values.set(y, 0);
  let reached = 1;
  let accepted = 0;
  let rejected = 0;
  f(t0, y, k1);
  const span = tEnd - t0;
  let h = initialStep(f, t0, y, k1, tol, span);
  let t = t0;
  let steps = 0;
  let stiffSteps = 0;
  let calmSteps = 0;
  const done = (stopReason: IntegrateResult['stopReason']): IntegrateResult => ({ reached, values, stopReason, accepted, rejected, t, state: y, nextStep: h });
  while (reached < samples) {
    if ((++steps & 63) === 0 && Date.now() > deadline) return done('time-limit');
    if (t + h > tEnd) h = tEnd - t;
    if (h <= 1e-14 * Math.max(1, Math.abs(t))) return done('step-too-small');
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * A21 * k1[i];
    f(t + C2 * h, yt, k2);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
    f(t + C3 * h, yt, k3);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
    f(t + C4 * h, yt, k4);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
    f(t + C5 * h, yt, k5);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
    f(t + h, yt, k6);
    for (let i = 0; i < n; i++) y1[i] = y[i] + h * (A71 * k1[i] + A73 * k3[i] + A74 * k4[i] + A75 * k5[i] + A76 * k6[i]);
    f(t + h, y1, k7);
    let err = 0;
    for (let i = 0; i < n; i++) {
      const e = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
      const sc = tol.absolute + tol.relative * Math.max(Math.abs(y[i]), Math.abs(y1[i]));
      err += (e / sc) ** 2;
    }
    err = Math.sqrt(err / n);
    if (!Number.isFinite(err)) {
      if (h < 1e-10 * Math.max(1, Math.abs(span))) return done('not-finite');
      h *= 0.1;
      rejected++;
      continue;
    }
    const factor = Math.min(5, Math.max(0.2, 0.9 * Math.pow(Math.max(err, 1e-10), -0.2)));
    if (err > 1) {
      h *= Math.min(1, factor);
      rejected++;
      continue;
    }
    accepted++;
    if (detectStiffness) {
      // yt holds the sixth stage (at t + h), k6 its slope; y1 and k7 the new solution and slope.
      let num = 0;
      let den = 0;
      for (let i = 0; i < n; i++) {
        num += (k7[i] - k6[i]) ** 2;
        den += (y1[i] - yt[i]) ** 2;
      }
      if (den > 0 && h * Math.sqrt(num / den) > STIFF_H_RHO) {
        stiffSteps++;
        calmSteps = 0;
      } else if (++calmSteps >= CALM_STEPS) stiffSteps = 0;
    }
    const tNew = t + h;
    // Dense output on [t, tNew] for the sample times it covers.
    if (reached < samples && times[reached] <= tNew) {
      for (let i = 0; i < n; i++) {
        const dy = y1[i] - y[i];
        const bspl = h * k1[i] - dy;
        r1[i] = y[i];
        r2[i] = dy;
        r3[i] = bspl;
        r4[i] = dy - h * k7[i] - bspl;
        r5[i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i]);
      }
      while (reached < samples && times[reached] <= tNew) {
        const theta = (times[reached] - t) / h;
        const theta1 = 1 - theta;
        const off = reached * n;
        for (let i = 0; i < n; i++) values[off + i] = r1[i] + theta * (r2[i] + theta1 * (r3[i] + theta * (r4[i] + theta1 * r5[i])));
        reached++;
      }
    }
    y.set(y1);
    k1.set(k7);
    t = tNew;
    if (!y.every(Number.isFinite)) return done('not-finite');
    h *= factor;
    if (stiffSteps >= STIFF_STEPS && reached < samples) return done('stiff');
  }
  return done('end');
}

/** Starting step (Hairer, Nørsett & Wanner I, §II.4, "Starting step size"). */
function initialStep(f: OdeRhs, t0: number, y0: Float64Array, f0: Float64Array, tol: { relative: number; absolute: number }, span: number): number {
  const n = y0.length;
  let d0 = 0;
  let d1 = 0;
  for (let i = 0; i < n; i++) {
    const sc = tol.absolute + tol.relative * Math.abs(y0[i]);
    d0 += (y0[i] / sc) ** 2;
    d1 += (f0[i] / sc) ** 2;
  }
  d0 = Math.sqrt(d0 / n);
  d1 = Math.sqrt(d1 / n);
  let h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * (d0 / d1);
  h0 = Math.min(h0, span);
  const y1 = new Float64Array(n);
  const f1 = new Float64Array(n);
  for (let i = 0; i < n; i++) y1[i] = y0[i] + h0 * f0[i];
  f(t0 + h0, y1, f1);
  let d2 = 0;
  for (let i = 0; i < n; i++) {
    const sc = tol.absolute + tol.relative * Math.abs(y0[i]);
    d2 += ((f1[i] - f0[i]) / sc) ** 2;
  }
  d2 = Math.sqrt(d2 / n) / h0;
  const h1 = Math.max(d1, d2) <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : Math.pow(0.01 / Math.max(d1, d2), 1 / 5);
  const h = Math.min(100 * h0, h1, span);
  return Number.isFinite(h) && h > 0 ? h : Math.min(1e-6, span);
}
