import { bandedFactor, bandedSolve, type BandedLu } from '../linalg/banded-lu.ts';
import type { CompiledModel } from '../model/compile.ts';
import type { BorderedFactors, CurveSystem } from './curve-system.ts';

/**
 * Models with at least this many variables and a Jacobian band at most a quarter of n wide use
 * the banded bordered solver (below this the dense LU is as fast and simpler).
 */
export const BANDED_MIN_VARIABLES = 150;

/**
 * Equilibria of x' = f(x, p) as a curve in (x, μ), μ = p[k]: G(x, μ) = f(x, p), DG = [J | ∂f/∂μ].
 * y = (x_0 … x_{n−1}, μ). Other parameters stay at `p`.
 */
export class EquilibriumSystem implements CurveSystem {
  readonly dimension: number;
  private readonly p: Float64Array;
  private readonly jac: Float64Array;
  private readonly fp: Float64Array;
  private readonly dfdmu;
  private readonly banded: boolean;
  private lu: BandedLu | undefined;

  constructor(readonly model: CompiledModel, readonly parameterIndex: number, parameters: Float64Array) {
    const n = model.n;
    this.dimension = n + 1;
    this.p = parameters.slice();
    this.jac = new Float64Array(n * n);
    this.fp = new Float64Array(n);
    this.dfdmu = model.parameterDerivative(parameterIndex);
    const { kl, ku } = model.jacobianBand;
    this.banded = n >= BANDED_MIN_VARIABLES && kl + ku + 1 <= n / 4;
  }

  /**
   * The bordered matrix [J f_μ; rᵀ d] of a banded model by block elimination (Keller 1977;
   * Govaerts, Numerical Methods for Bifurcations of Dynamical Equilibria, §3.3): banded LU of J,
   * z = J⁻¹f_μ, Schur complement s = d − r·z; each solve is followed by one step of iterative
   * refinement with the full bordered matrix, which keeps it accurate near folds where J is
   * nearly singular. det = det J · s. Null for dense models.
   */
  factorBordered(y: Float64Array, row: Float64Array): BorderedFactors | null {
    if (!this.banded) return null;
    const n = this.model.n;
    const { kl, ku } = this.model.jacobianBand;
    const p = this.parametersAt(y);
    const jac = this.jac;
    this.model.jacobian(y, p, jac);
    const fp = new Float64Array(n);
    this.dfdmu(y, p, fp);
    const lu = (this.lu = bandedFactor(jac, n, kl, ku, this.lu));
    const r = row.subarray(0, n);
    const d = row[n];
    const z = bandedSolve(lu, fp);
    let rz = 0;
    for (let i = 0; i < n; i++) rz += r[i] * z[i];
    const schur = d - rz;
    const singular = lu.singular || !(Math.abs(schur) > 0) || !Number.isFinite(schur);
    const x1 = new Float64Array(n);
    const once = (b: ArrayLike<number>, out: Float64Array) => {
      for (let i = 0; i < n; i++) x1[i] = b[i];
      bandedSolve(lu, x1, x1);
      let rx = 0;
      for (let i = 0; i < n; i++) rx += r[i] * x1[i];
      const t = (b[n] - rx) / schur;
      for (let i = 0; i < n; i++) out[i] = x1[i] - z[i] * t;
      out[n] = t;
    };
    const residual = new Float64Array(n + 1);
    const correction = new Float64Array(n + 1);
    const solve = (b: Float64Array, out: Float64Array) => {
      const rhs = out === b ? b.slice() : b;
      once(rhs, out);
      for (let i = 0; i < n; i++) {
        let s = rhs[i] - fp[i] * out[n];
        for (let j = Math.max(0, i - kl); j <= Math.min(n - 1, i + ku); j++) s -= jac[i * n + j] * out[j];
        residual[i] = s;
      }
      let last = rhs[n] - d * out[n];
      for (let i = 0; i < n; i++) last -= r[i] * out[i];
      residual[n] = last;
      once(residual, correction);
      for (let i = 0; i <= n; i++) out[i] += correction[i];
      return out;
    };
    return { singular, solve, determinant: () => ({ sign: singular ? 0 : lu.sign * Math.sign(schur), log: lu.log + Math.log(Math.abs(schur)) }) };
  }

  /** Parameter vector with μ taken from y. */
  parametersAt(y: Float64Array): Float64Array {
    this.p[this.parameterIndex] = y[this.model.n];
    return this.p;
  }

  evaluate(y: Float64Array, out: Float64Array): void {
    this.model.rhs(y, this.parametersAt(y), out);
  }

  jacobian(y: Float64Array, out: Float64Array): void {
    const n = this.model.n;
    const p = this.parametersAt(y);
    this.model.jacobian(y, p, this.jac);
    this.dfdmu(y, p, this.fp);
    const m = n + 1;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) out[i * m + j] = this.jac[i * n + j];
      out[i * m + n] = this.fp[i];
    }
  }
}
