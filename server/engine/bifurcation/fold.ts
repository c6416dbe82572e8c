import type { Tolerances } from '../defaults.ts';
import type { CompiledModel } from '../model/compile.ts';
import { newtonSolve } from '../newton.ts';
import { norm2 } from '../linalg/vector.ts';
import { FoldSystem } from './fold-system.ts';
import { curveTangent } from '../continuation/pseudo-arclength.ts';
import type { CurveSystem } from '../continuation/curve-system.ts';
import { locateAlongCurve } from './cusp.ts';

/**
 * Above this many variables a fold is located along the branch (below) rather than by Newton
 * on the dense 2n+1 extended system, whose factorisation would cost O(8n³) per iteration.
 */
export const LARGE_FOLD_MIN = 200;

export interface LocatedFold {
  converged: boolean;
  x: Float64Array;
  /** Null vector from the extended system (|v| = 1, orientation as converged). */
  v: Float64Array;
  parameter: number;
  /** ‖(f, Jv, (v·v − 1)/2)‖₂ at the solution. */
  residual: number;
}

/**
 * Locate a fold (saddle-node) of equilibria precisely by Newton's method on the standard
 * extended system f(x, μ) = 0, J(x, μ)v = 0, (v·v − 1)/2 = 0 (Kuznetsov, Elements of Applied
 * Bifurcation Theory, 3rd ed., §10.2.2; Moore & Spence 1980). Start from an estimate (x0, μ0) and
 * a null-vector estimate v0 (e.g. the branch tangent's state part, which is the null vector at
 * the fold). Converges quadratically at a nondegenerate fold; otherwise `converged: false`.
 */
export function locateFold(model: CompiledModel, parameterIndex: number, parameters: Float64Array, x0: ArrayLike<number>, v0: ArrayLike<number>, mu0: number, tol: Tolerances): LocatedFold {
  const n = model.n;
  const system = new FoldSystem(model, parameterIndex, parameters);
  const y0 = new Float64Array(2 * n + 1);
  const vl = norm2(v0);
  for (let i = 0; i < n; i++) {
    y0[i] = x0[i];
    y0[n + i] = v0[i] / vl;
  }
  y0[2 * n] = mu0;
  const r = newtonSolve({ size: 2 * n + 1, evaluate: (y, out) => system.evaluate(y, out), jacobian: (y, out) => system.jacobian(y, out) }, y0, tol);
  return { converged: r.converged, x: r.y.slice(0, n), v: r.y.slice(n, 2 * n), parameter: r.y[2 * n], residual: r.residual };
}

/**
 * Locate a fold of a branch of equilibria y = (x, μ) between two of its points as the zero of
 * the tangent's parameter component along the curve (Illinois regula falsi on arclength, each
 * trial point corrected onto the branch; Allgower & Georg, Introduction to Numerical Continuation
 * Methods, §9.2). Uses only the branch's own bordered solves, so it suits large structured
 * models. At the fold the tangent is (v, 0): v is returned as the null vector; the residual is
 * that of the extended system (f, Jv, |v| − 1).
 */
export function locateFoldAlongCurve(system: CurveSystem & { model: CompiledModel; parametersAt(y: Float64Array): Float64Array }, a: { y: Float64Array; tangent: Float64Array }, b: { y: Float64Array; tangent: Float64Array }, tol: Tolerances): LocatedFold {
  const n = system.model.n;
  const test = (y: Float64Array) => (curveTangent(system, y, a.tangent) ?? a.tangent)[n];
  const y = locateAlongCurve(system, a.y, a.tangent, b.y, test, Math.max(Math.abs(a.tangent[n]), Math.abs(b.tangent[n])), tol);
  if (!y) return { converged: false, x: a.y.slice(0, n), v: a.tangent.slice(0, n), parameter: a.y[n], residual: Infinity };
  const t = curveTangent(system, y, a.tangent) ?? a.tangent;
  const v = t.slice(0, n);
  const len = norm2(v);
  for (let i = 0; i < n; i++) v[i] /= len;
  const x = y.slice(0, n);
  const p = system.parametersAt(y);
  const f = new Float64Array(n);
  system.model.rhs(x, p, f);
  const jac = new Float64Array(n * n);
  system.model.jacobian(x, p, jac);
  let r = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += jac[i * n + j] * v[j];
    r += f[i] * f[i] + s * s;
  }
  return { converged: true, x, v, parameter: y[n], residual: Math.sqrt(r) };
}
