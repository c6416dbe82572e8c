import type { CompiledModel } from '../model/compile.ts';
import type { CurveSystem } from '../continuation/curve-system.ts';

/**
 * The standard extended system of a fold (saddle-node) of equilibria (Kuznetsov, Elements of
 * Applied Bifurcation Theory, 3rd ed., §10.2.2; Seydel, Practical Bifurcation and Stability
 * Analysis, §5.4):
 *   f(x, p) = 0,  J(x, p)·v = 0,  (v·v − 1)/2 = 0,
 * unknowns y = (x, v, μ) with μ = p[k1] (a square system, 2n+1 equations), or
 * y = (x, v, μ, κ) with κ = p[k2] free too (a curve: the fold curve in two parameters).
 * Its Jacobian is regular at a nondegenerate fold (a ≠ 0, b ≠ 0 in the normal form).
 */
export class FoldSystem implements CurveSystem {
  readonly dimension: number;
  readonly equations: number;
  private readonly p: Float64Array;
  private readonly jac: Float64Array;
  private readonly hv: Float64Array;
  private readonly jmu: Float64Array;
  private readonly jkappa: Float64Array;
  private readonly fmu: Float64Array;
  private readonly fkappa: Float64Array;

  constructor(
    readonly model: CompiledModel,
    readonly parameterIndex: number,
    parameters: Float64Array,
    /** Index of the second free parameter, or −1 for the square system. */
    readonly secondIndex = -1,
  ) {
    const n = model.n;
    this.equations = 2 * n + 1;
    this.dimension = secondIndex >= 0 ? 2 * n + 2 : 2 * n + 1;
    this.p = parameters.slice();
    this.jac = new Float64Array(n * n);
    this.hv = new Float64Array(n * n);
    this.jmu = new Float64Array(n * n);
    this.jkappa = new Float64Array(n * n);
    this.fmu = new Float64Array(n);
    this.fkappa = new Float64Array(n);
  }

  parametersAt(y: Float64Array): Float64Array {
    const n = this.model.n;
    this.p[this.parameterIndex] = y[2 * n];
    if (this.secondIndex >= 0) this.p[this.secondIndex] = y[2 * n + 1];
    return this.p;
  }

  evaluate(y: Float64Array, out: Float64Array): void {
    const n = this.model.n;
    const p = this.parametersAt(y);
    this.model.rhs(y, p, out);
    this.model.jacobian(y, p, this.jac);
    let vv = 0;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < n; j++) s += this.jac[i * n + j] * y[n + j];
      out[n + i] = s;
      vv += y[n + i] * y[n + i];
    }
    out[2 * n] = (vv - 1) / 2;
  }

  jacobian(y: Float64Array, out: Float64Array): void {
    const { model } = this;
    const n = model.n;
    const m = this.dimension;
    const p = this.parametersAt(y);
    const v = y.subarray(n, 2 * n);
    model.jacobian(y, p, this.jac);
    model.hessianTimes(y, p, v, this.hv);
    model.parameterDerivative(this.parameterIndex)(y, p, this.fmu);
    model.jacobianParameterDerivative(this.parameterIndex)(y, p, this.jmu);
    if (this.secondIndex >= 0) {
      model.parameterDerivative(this.secondIndex)(y, p, this.fkappa);
      model.jacobianParameterDerivative(this.secondIndex)(y, p, this.jkappa);
    }
    out.fill(0, 0, this.equations * m);
    for (let i = 0; i < n; i++) {
      const r1 = i * m;
      const r2 = (n + i) * m;
      let jmuv = 0;
      let jkv = 0;
      for (let j = 0; j < n; j++) {
        out[r1 + j] = this.jac[i * n + j];
        out[r2 + j] = this.hv[i * n + j];
        out[r2 + n + j] = this.jac[i * n + j];
        jmuv += this.jmu[i * n + j] * v[j];
        jkv += this.jkappa[i * n + j] * v[j];
      }
      out[r1 + 2 * n] = this.fmu[i];
      out[r2 + 2 * n] = jmuv;
      if (this.secondIndex >= 0) {
        out[r1 + 2 * n + 1] = this.fkappa[i];
        out[r2 + 2 * n + 1] = jkv;
      }
    }
    const r3 = 2 * n * m;
    for (let j = 0; j < n; j++) out[r3 + n + j] = v[j];
  }
}
