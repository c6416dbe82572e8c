import { dot } from '../linalg/vector.ts';
import type { CompiledModel } from '../model/compile.ts';

/**
 * Sensitivity of a fold's parameter value μ* to every other parameter p_j:
 * dμ* / dp_j = −(w·∂f/∂p_j)/(w·∂f/∂μ), with w the adjoint null vector at the fold (wᵀJ = 0).
 * From differentiating f(x*(p), μ*(p), p) = 0 along the fold and projecting with w (implicit
 * function theorem on the extended system; Kuznetsov, Elements of Applied Bifurcation Theory,
 * 3rd ed., §3.3 and §10.2). Independent of w's scaling. Returns { index: value } for j ≠ k;
 * a degenerate fold (w·∂f/∂μ = 0) gives non-finite values, which are left out.
 */
export function foldSensitivities(model: CompiledModel, x: Float64Array, p: Float64Array, k: number, w: Float64Array): Map<number, number> {
  const n = model.n;
  const f = new Float64Array(n);
  model.parameterDerivative(k)(x, p, f);
  const a = dot(w, f);
  const out = new Map<number, number>();
  for (let j = 0; j < model.parameters.length; j++) {
    if (j === k) continue;
    model.parameterDerivative(j)(x, p, f);
    const s = -dot(w, f) / a;
    if (Number.isFinite(s)) out.set(j, s + 0);
  }
  return out;
}
