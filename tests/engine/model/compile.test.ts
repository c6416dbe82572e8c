import { describe, expect, it } from 'vitest';
import { modelSchema, type ModelInput } from '@shared/engine/contract.ts';
import { compileModel, differencedHessianTimes } from '@server/engine/model/compile.ts';
import { expectClose } from '../../support/tolerances.ts';

const compile = (m: ModelInput) => compileModel(modelSchema.parse(m));

/** Central difference of a vector function (to check exact derivatives), h = 1e-6. */
function centralDifference(f: (y: Float64Array, out: Float64Array) => void, y: Float64Array, j: number, size: number): Float64Array {
  const h = 1e-6 * (1 + Math.abs(y[j]));
  const a = y.slice();
  const b = y.slice();
  a[j] += h;
  b[j] -= h;
  const fa = new Float64Array(size);
  const fb = new Float64Array(size);
  f(a, fa);
  f(b, fb);
  return fa.map((v, i) => (v - fb[i]) / (2 * h));
}

describe('compileModel', () => {
  const model = compile({
    variables: [
      { name: 'x', rhs: 'mu - x^2 + y*g' },
      { name: 'y', rhs: 'x - y + sin(x*y) + tan(x)/k' },
      { name: 'z', rhs: 'atan(z*x) + sqrt(1 + y^2) - pow(k, 2)*cosh(z) + asin(x/3) + abs(y)' },
    ],
    parameters: [{ name: 'mu', value: 0.1 }, { name: 'k', value: 2 }],
    definitions: [{ name: 'g', expression: 'exp(-x)*mu' }, { name: 'g2', expression: 'g*log(2 + x^2)' }],
  });
  const x = Float64Array.of(0.3, 0.7, -0.4);
  const p = model.parameterValues();

  it('evaluates the right-hand side through definitions', () => {
    const out = new Float64Array(3);
    model.rhs(x, p, out);
    // Closed form at (0.3, 0.7, −0.4), μ = 0.1, k = 2.
    expectClose(out[0], 0.1 - 0.09 + 0.7 * Math.exp(-0.3) * 0.1, 1e-15);
    expectClose(out[1], 0.3 - 0.7 + Math.sin(0.21) + Math.tan(0.3) / 2, 1e-15);
    expectClose(out[2], Math.atan(-0.12) + Math.sqrt(1.49) - 4 * Math.cosh(-0.4) + Math.asin(0.1) + 0.7, 1e-15);
  });

  it('has an exact Jacobian (closed-form entries; central differences agree to 1e-8)', () => {
    const jac = new Float64Array(9);
    model.jacobian(x, p, jac);
    // d/dx tan x = sec² x (common practice), d/dx asin(x/3) = 1/(3 sqrt(1 − x²/9)).
    expectClose(jac[0], -0.6 - 0.7 * Math.exp(-0.3) * 0.1, 1e-14);
    expectClose(jac[3], 1 + 0.7 * Math.cos(0.21) + 1 / (2 * Math.cos(0.3) ** 2), 1e-14);
    expectClose(jac[6], -0.4 / (1 + 0.0144) + 1 / (3 * Math.sqrt(1 - 0.01)), 1e-14);
    for (let j = 0; j < 3; j++) {
      const col = centralDifference((y, out) => model.rhs(y, p, out), x, j, 3);
      for (let i = 0; i < 3; i++) expectClose(jac[i * 3 + j], col[i], 1e-7, 1e-8);
    }
  });

  it('has exact parameter derivatives and mixed second derivatives', () => {
    const fmu = new Float64Array(3);
    model.parameterDerivative(0)(x, p, fmu);
    expectClose(fmu[0], 1 + 0.7 * Math.exp(-0.3), 1e-15);
    expect(fmu[1]).toBe(0);
    const fk = new Float64Array(3);
    model.parameterDerivative(1)(x, p, fk);
    expectClose(fk[1], -Math.tan(0.3) / 4, 1e-14);
    expectClose(fk[2], -2 * 2 * Math.cosh(-0.4), 1e-14);
    const jk = new Float64Array(9);
    model.jacobianParameterDerivative(1)(x, p, jk);
    expectClose(jk[3], -1 / (4 * Math.cos(0.3) ** 2), 1e-14);
  });

  it('forms D²f(v, ·) exactly (checked against differences of the exact Jacobian)', () => {
    const v = Float64Array.of(0.2, -0.5, 0.9);
    const hv = new Float64Array(9);
    model.hessianTimes(x, p, v, hv);
    // Column k of D²f(v,·) is ∂(J v)/∂x_k.
    const jv = (y: Float64Array, out: Float64Array) => {
      const jac = new Float64Array(9);
      model.jacobian(y, p, jac);
      for (let i = 0; i < 3; i++) out[i] = jac[i * 3] * v[0] + jac[i * 3 + 1] * v[1] + jac[i * 3 + 2] * v[2];
    };
    for (let k = 0; k < 3; k++) {
      const col = centralDifference(jv, x, k, 3);
      for (let i = 0; i < 3; i++) expectClose(hv[i * 3 + k], col[i], 1e-7, 1e-8);
    }
  });

  it('falls back to a differenced D²f(v, ·) for huge models that agrees with the exact one to 1e-9', () => {
    const v = Float64Array.of(0.2, -0.5, 0.9);
    const exact = new Float64Array(9);
    const approx = new Float64Array(9);
    model.hessianTimes(x, p, v, exact);
    differencedHessianTimes(3, model.jacobian)(x, p, v, approx);
    for (let i = 0; i < 9; i++) expectClose(approx[i], exact[i], 1e-9, 1e-9);
  });

  it('reuses a compiled model but takes each request’s parameter values', () => {
    const a = compile({ variables: [{ name: 'x', rhs: 'mu*x' }], parameters: [{ name: 'mu', value: 1 }] });
    const b = compile({ variables: [{ name: 'x', rhs: 'mu*x' }], parameters: [{ name: 'mu', value: 3 }] });
    expect(a.rhs).toBe(b.rhs);
    expect(Array.from(a.parameterValues())).toEqual([1]);
    expect(Array.from(b.parameterValues())).toEqual([3]);
  });
});
