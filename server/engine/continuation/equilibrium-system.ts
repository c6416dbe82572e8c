import type { CompiledModel } from '../model/compile.ts';
import type { CurveSystem } from './curve-system.ts';

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

  constructor(readonly model: CompiledModel, readonly parameterIndex: number, parameters: Float64Array) {
    const n = model.n;
    this.dimension = n + 1;
    this.p = parameters.slice();
    this.jac = new Float64Array(n * n);
    this.fp = new Float64Array(n);
    this.dfdmu = model.parameterDerivative(parameterIndex);
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
