import type { Tolerances } from '../defaults.ts';
import type { CompiledModel } from '../model/compile.ts';
import { newtonSolve } from '../newton.ts';
import { norm2 } from '../linalg/vector.ts';
import { FoldSystem } from './fold-system.ts';

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
