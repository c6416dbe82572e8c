import type { Tolerances } from './defaults.ts';
import { luFactor, luSolve } from './linalg/lu.ts';
import { allFinite, norm2, normInf } from './linalg/vector.ts';

/** A square system F: R^m → R^m with a dense row-major Jacobian. */
export interface SquareSystem {
  readonly size: number;
  evaluate(y: Float64Array, out: Float64Array): void;
  jacobian(y: Float64Array, out: Float64Array): void;
}

export interface NewtonResult {
  y: Float64Array;
  converged: boolean;
  iterations: number;
  /** ‖F(y)‖₂ at the returned y. */
  residual: number;
}

/**
 * Newton's method for F(y) = 0 from y0 (Deuflhard, Newton Methods for Nonlinear Problems,
 * ch. 2). With `damped`, each step is shortened by halving until ‖F‖₂ decreases (Armijo
 * backtracking), which widens the basin for arbitrary starts. Converged when
 * ‖Δy‖∞ ≤ newtonStep·(1 + ‖y‖∞) and ‖F‖∞ ≤ newtonResidual·(1 + ‖DF‖∞·(1 + ‖y‖∞)).
 * Quadratic near a regular root; linear or failing near a singular one (e.g. an equilibrium at
 * a fold, for which use the extended system). Failure is `converged: false`, not an exception.
 */
export function newtonSolve(system: SquareSystem, y0: ArrayLike<number>, tol: Tolerances, damped = false, maxIterations = tol.newtonMaxIterations): NewtonResult {
  const m = system.size;
  const y = Float64Array.from(y0);
  const f = new Float64Array(m);
  const trial = new Float64Array(m);
  const ftrial = new Float64Array(m);
  const jac = new Float64Array(m * m);
  const d = new Float64Array(m);
  system.evaluate(y, f);
  let fnorm = norm2(f);
  for (let it = 1; it <= maxIterations; it++) {
    if (!allFinite(f)) return { y, converged: false, iterations: it, residual: fnorm };
    system.jacobian(y, jac);
    let jnorm = 0;
    for (let i = 0; i < m; i++) {
      let s = 0;
      for (let j = 0; j < m; j++) s += Math.abs(jac[i * m + j]);
      jnorm = Math.max(jnorm, s);
    }
    const lu = luFactor(jac, m, true);
    // A singular Jacobian at a point that already solves F = 0 (e.g. a start exactly at a fold).
    if (lu.singular) return { y, converged: normInf(f) <= tol.newtonResidual * (1 + normInf(y)) * 1e-3, iterations: it, residual: fnorm };
    luSolve(lu, f, d);
    let lambda = 1;
    for (;;) {
      for (let i = 0; i < m; i++) trial[i] = y[i] - lambda * d[i];
      system.evaluate(trial, ftrial);
      const tn = norm2(ftrial);
      if (!damped || (Number.isFinite(tn) && tn <= (1 - lambda / 4) * fnorm) || lambda < 1 / 1024) {
        fnorm = tn;
        break;
      }
      lambda /= 2;
    }
    y.set(trial);
    f.set(ftrial);
    const small = lambda * normInf(d) <= tol.newtonStep * (1 + normInf(y));
    if (small && normInf(f) <= tol.newtonResidual * (1 + jnorm * (1 + normInf(y)))) return { y, converged: true, iterations: it, residual: fnorm };
    if (small && lambda === 1 && it > 2 && normInf(f) > 1e-6 * (1 + jnorm * (1 + normInf(y)))) break;
  }
  return { y, converged: false, iterations: maxIterations, residual: fnorm };
}
