import type { Tolerances } from '../defaults.ts';
import { luFactor, luSolve } from '../linalg/lu.ts';
import { dot, norm2 } from '../linalg/vector.ts';
import type { CompiledModel } from '../model/compile.ts';

export interface FoldCoefficients {
  /** a = w·∂f/∂μ. */
  a: number;
  /** b = w·D²f(v, v). */
  b: number;
  /** Right null vector as given (|v|₂ = 1). */
  v: Float64Array;
  /** Left null vector, wᵀJ = 0, w·v = 1. */
  w: Float64Array;
  nondegenerate: boolean;
}

/**
 * Normal-form coefficients of a fold (saddle-node) at an equilibrium (x, p) whose Jacobian J has
 * the simple zero eigenvalue with right null vector v (given, |v| = 1). The left null vector is
 * the solution of the bordered system [Jᵀ v; vᵀ 0]·(w, s) = (0, 1), so wᵀJ = 0 and w·v = 1;
 * then a = w·∂f/∂μ and b = w·D²f(v, v), and near the fold the equilibria are
 * x ≈ x* ± v·sqrt(−2a(μ−μ*)/b) (Kuznetsov, Elements of Applied Bifurcation Theory, 3rd ed.,
 * §3.3 and §5.4, with his normalisation ⟨p, q⟩ = 1). For a scalar model a = f_μ and b = f_xx.
 * The signs of a and b depend on the orientation of v (both flip with v); their ratio does not.
 * `nondegenerate` is false when |a| or |b| is below degenerate × the size of its terms.
 */
export function foldCoefficients(model: CompiledModel, x: Float64Array, p: Float64Array, parameterIndex: number, v: Float64Array, tol: Tolerances): FoldCoefficients {
  const n = model.n;
  const jac = new Float64Array(n * n);
  model.jacobian(x, p, jac);
  const m = n + 1;
  const border = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) border[i * m + j] = jac[j * n + i];
    border[i * m + n] = v[i];
    border[n * m + i] = v[i];
  }
  const rhs = new Float64Array(m);
  rhs[n] = 1;
  const sol = luSolve(luFactor(border, m, true), rhs);
  const w = sol.slice(0, n);
  const fmu = new Float64Array(n);
  model.parameterDerivative(parameterIndex)(x, p, fmu);
  const hv = new Float64Array(n * n);
  model.hessianTimes(x, p, v, hv);
  const bvv = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let k = 0; k < n; k++) s += hv[i * n + k] * v[k];
    bvv[i] = s;
  }
  const a = dot(w, fmu);
  const b = dot(w, bvv);
  const wn = norm2(w);
  const nondegenerate =
    Number.isFinite(a) && Number.isFinite(b) && Math.abs(a) > tol.degenerate * wn * norm2(fmu) && Math.abs(b) > tol.degenerate * wn * norm2(bvv);
  return { a, b, v, w, nondegenerate };
}

/**
 * The same coefficients with the product's sign convention: v turned so that its
 * largest-magnitude component is positive (ties: the first), w following it.
 */
export function foldNormalForm(model: CompiledModel, x: Float64Array, p: Float64Array, parameterIndex: number, v: Float64Array, tol: Tolerances): FoldCoefficients & { equilibriaSide: 'above' | 'below' } {
  const length = norm2(v);
  let largest = 0;
  for (let i = 1; i < v.length; i++) if (Math.abs(v[i]) > Math.abs(v[largest]) * (1 + 1e-12)) largest = i;
  const sign = v[largest] < 0 ? -1 : 1;
  const unit = v.map((c) => (sign * c) / length);
  const c = foldCoefficients(model, x, p, parameterIndex, unit, tol);
  // Equilibria exist where −a(μ − μ*)/b > 0.
  return { ...c, equilibriaSide: -c.a / c.b > 0 ? 'above' : 'below' };
}
