import type { CompiledModel } from '../model/compile.ts';
import type { CurveSystem } from '../continuation/curve-system.ts';

/**
 * The standard extended system of a Hopf point with the eigenvector split into real and
 * imaginary parts (Kuznetsov, Elements of Applied Bifurcation Theory, 3rd ed., §10.2.3;
 * Seydel, Practical Bifurcation and Stability Analysis, §5.6.1):
 *   f(x, p) = 0,  J·a + ω·b = 0,  J·b − ω·a = 0   (J(a + ib) = iω(a + ib)),
 *   (a·a + b·b − 1)/2 = 0,  c·b = 0   (c fixed: the starting a; fixes the eigenvector's phase),
 * unknowns y = (x, a, b, ω, μ) (square, 3n + 2 equations) or y = (x, a, b, ω, μ, κ) with
 * κ = p[k2] free too (a curve: the Hopf curve in two parameters). Regular at a Hopf point with a
 * simple pair ±iω, ω > 0, and a transversal crossing.
 */
export class HopfSystem implements CurveSystem {
  readonly dimension: number;
  readonly equations: number;
  private readonly p: Float64Array;
  private readonly jac: Float64Array;
  private readonly ha: Float64Array;
  private readonly hb: Float64Array;
  private readonly jk: Float64Array;
  private readonly fk: Float64Array;

  constructor(
    readonly model: CompiledModel,
    readonly parameterIndex: number,
    parameters: Float64Array,
    /** Phase reference c (length n). */
    readonly phase: Float64Array,
    /** Index of the second free parameter, or −1 for the square system. */
    readonly secondIndex = -1,
  ) {
    const n = model.n;
    this.equations = 3 * n + 2;
    this.dimension = secondIndex >= 0 ? 3 * n + 3 : 3 * n + 2;
    this.p = parameters.slice();
    this.jac = new Float64Array(n * n);
    this.ha = new Float64Array(n * n);
    this.hb = new Float64Array(n * n);
    this.jk = new Float64Array(n * n);
    this.fk = new Float64Array(n);
  }

  parametersAt(y: Float64Array): Float64Array {
    const n = this.model.n;
    this.p[this.parameterIndex] = y[3 * n + 1];
    if (this.secondIndex >= 0) this.p[this.secondIndex] = y[3 * n + 2];
    return this.p;
  }

  evaluate(y: Float64Array, out: Float64Array): void {
    const n = this.model.n;
    const p = this.parametersAt(y);
    const omega = y[3 * n];
    this.model.rhs(y, p, out);
    this.model.jacobian(y, p, this.jac);
    let norm = 0;
    let phase = 0;
    for (let i = 0; i < n; i++) {
      let ja = 0;
      let jb = 0;
      for (let j = 0; j < n; j++) {
        ja += this.jac[i * n + j] * y[n + j];
        jb += this.jac[i * n + j] * y[2 * n + j];
      }
      out[n + i] = ja + omega * y[2 * n + i];
      out[2 * n + i] = jb - omega * y[n + i];
      norm += y[n + i] ** 2 + y[2 * n + i] ** 2;
      phase += this.phase[i] * y[2 * n + i];
    }
    out[3 * n] = (norm - 1) / 2;
    out[3 * n + 1] = phase;
  }

  jacobian(y: Float64Array, out: Float64Array): void {
    const { model } = this;
    const n = model.n;
    const m = this.dimension;
    const p = this.parametersAt(y);
    const a = y.subarray(n, 2 * n);
    const b = y.subarray(2 * n, 3 * n);
    const omega = y[3 * n];
    model.jacobian(y, p, this.jac);
    model.hessianTimes(y, p, a, this.ha);
    model.hessianTimes(y, p, b, this.hb);
    out.fill(0, 0, this.equations * m);
    const columns: Array<[number, number]> = [[this.parameterIndex, 3 * n + 1]];
    if (this.secondIndex >= 0) columns.push([this.secondIndex, 3 * n + 2]);
    for (const [k, col] of columns) {
      model.parameterDerivative(k)(y, p, this.fk);
      model.jacobianParameterDerivative(k)(y, p, this.jk);
      for (let i = 0; i < n; i++) {
        let jka = 0;
        let jkb = 0;
        for (let j = 0; j < n; j++) {
          jka += this.jk[i * n + j] * a[j];
          jkb += this.jk[i * n + j] * b[j];
        }
        out[i * m + col] = this.fk[i];
        out[(n + i) * m + col] = jka;
        out[(2 * n + i) * m + col] = jkb;
      }
    }
    for (let i = 0; i < n; i++) {
      const r1 = i * m;
      const r2 = (n + i) * m;
      const r3 = (2 * n + i) * m;
      for (let j = 0; j < n; j++) {
        out[r1 + j] = this.jac[i * n + j];
        out[r2 + j] = this.ha[i * n + j];
        out[r2 + n + j] = this.jac[i * n + j];
        out[r3 + j] = this.hb[i * n + j];
        out[r3 + 2 * n + j] = this.jac[i * n + j];
      }
      out[r2 + 2 * n + i] += omega;
      out[r3 + n + i] -= omega;
      out[r2 + 3 * n] = b[i];
      out[r3 + 3 * n] = -a[i];
    }
    const r4 = 3 * n * m;
    const r5 = (3 * n + 1) * m;
    for (let j = 0; j < n; j++) {
      out[r4 + n + j] = a[j];
      out[r4 + 2 * n + j] = b[j];
      out[r5 + 2 * n + j] = this.phase[j];
    }
  }
}
