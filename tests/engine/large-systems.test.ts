import { describe, expect, it } from 'vitest';
import { analyze, EngineRequestError, validateModel, type FoldEvent, type ModelInput } from '@server/engine/index.ts';
import { continuationResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../support/tolerances.ts';
import { bratuModel } from './models.ts';

/** The 1-D Bratu problem u'' + λe^u = 0, u(0) = u(1) = 0, on N interior points, as one indexed variable. */
const indexedBratu = (N: number): ModelInput => ({
  variables: [{ name: 'u', size: N, rhs: `(u[i-1] - 2*u[i] + u[i+1])*${(N + 1) ** 2} + lambda*exp(u[i])` }],
  parameters: [{ name: 'lambda', value: 0 }],
});

const foldOf = (model: ModelInput, maxPoints = 120) => {
  const r = analyze({ model, task: { kind: 'continuation', parameter: 'lambda', bounds: { min: -1, max: 4 }, direction: 'increasing', maxPoints, step: { initial: 0.05, min: 1e-6, max: 0.5 } } });
  expect(continuationResultSchema.safeParse(r).success).toBe(true);
  const folds = r.branch.events.filter((e): e is FoldEvent => e.kind === 'fold');
  expect(folds).toHaveLength(1);
  return { fold: folds[0], branch: r.branch };
};

describe('indexed variables', () => {
  it('write out to the same model as the hand-expanded one', () => {
    const a = foldOf(indexedBratu(10)).fold;
    const b = foldOf(bratuModel(10)).fold;
    expectClose(a.parameter, b.parameter, 1e-12);
    expect(Object.keys(a.state)).toEqual(Array.from({ length: 10 }, (_, k) => `u[${k + 1}]`));
    expectClose(a.state['u[5]'], b.state.u5, 1e-10);
  });

  it('use the boundary values at u[0] and u[N+1]', () => {
    // u' = (u[i-1] − 2u[i] + u[i+1]) with u[0] = a, u[N+1] = b relaxes to the straight line
    // u_i = a + (b − a)·i/(N+1) (closed form of the discrete Laplace equation).
    const model: ModelInput = { variables: [{ name: 'u', size: 9, rhs: 'u[i-1] - 2*u[i] + u[i+1]', boundary: { left: 'a', right: '2*a + 1' } }], parameters: [{ name: 'a', value: 1 }] };
    const r = analyze({ model, task: { kind: 'equilibria', starts: 4 } });
    expect(r.equilibria).toHaveLength(1);
    for (let i = 1; i <= 9; i++) expectClose(r.equilibria[0].state[`u[${i}]`], 1 + (3 - 1) * (i / 10), 1e-10);
  });

  it.each([
    { rhs: 'u[i+2] - u[i]', path: 'model.variables[0].rhs', message: /u\[7\] is outside 0 … 6 \(at i = 5\)/ },
    { rhs: 'u[i/2]', path: 'model.variables[0].rhs', message: /whole number \(got 0\.5 at i = 1\)/ },
    { rhs: 'u - 1', path: 'model.variables[0].rhs', message: /u is an indexed variable: write an entry/ },
    { rhs: 'q[1]', path: 'model.variables[0].rhs', message: /Indexing is only for indexed variables/ },
    { rhs: 'u[i] + zz', path: 'model.variables[0].rhs', message: /Unknown name "zz"/ },
  ])('reports $rhs with the field and the reason', ({ rhs, path, message }) => {
    const model: ModelInput = { variables: [{ name: 'u', size: 5, rhs }], parameters: [{ name: 'mu', value: 0 }] };
    const errors = validateModel(model);
    expect(errors[0].path).toBe(path);
    expect(errors[0].message).toMatch(message);
    expect(() => analyze({ model, task: { kind: 'equilibria' } })).toThrow(EngineRequestError);
  });
});

describe('limits of large models', () => {
  it('refuses a fold curve of a 300-entry model with a clear message', () => {
    expect(() => analyze({ model: { ...indexedBratu(300), parameters: [{ name: 'lambda', value: 1 }, { name: 'k', value: 0 }] }, task: { kind: 'fold-curve', parameters: ['lambda', 'k'], start: { parameters: {} }, bounds: { lambda: [0, 4], k: [-1, 1] } } })).toThrow(/at most 200 state entries; this one has 300/);
  });

  it('refuses more entries than the limit, naming the field', () => {
    const errors = validateModel({ variables: [{ name: 'u', size: 5000, rhs: 'u[i]' }] });
    expect(errors[0].path).toBe('model.variables[0].size');
  });
});

describe('large discretised systems (banded Jacobian)', () => {
  // Continuum fold of the Bratu problem: λ_c = 8t²/cosh²t with t·tanh t = 1, λ_c ≈ 3.513830719
  // (closed form from the exact solution; Bratu 1914, as quoted e.g. by Boyd, "An analytical and
  // numerical study of a two-dimensional Bratu equation", J. Sci. Comput. 1986) (from memory).
  let t = 1.2;
  for (let i = 0; i < 50; i++) t -= (t * Math.tanh(t) - 1) / (Math.tanh(t) + t / Math.cosh(t) ** 2);
  const lambdaC = (8 * t * t) / Math.cosh(t) ** 2;

  // Measured on this machine (engine 1.1.0):
  //   N      h          fold λ*              λ_c − λ*     error ratio (expected ((N'+1)/(N+1))²)
  //   125    1/126      3.5137155685390775   1.1515e-4    —
  //   250    1/251      3.5138017020593835   2.9017e-5    3.9684 (3.9684)
  //   500    1/501      3.5138234358973692   7.2832e-6    3.9841 (3.9841)
  //   1000   1/1001     3.5138288946801435   1.8244e-6    3.9920 (3.9920)
  it('follows the 1,000-point Bratu problem through its fold and converges at second order', () => {
    const rows = [125, 250, 500, 1000].map((N) => {
      const { fold, branch } = foldOf(indexedBratu(N));
      expect(fold.residual).toBeLessThan(1e-6);
      // Stable lower branch, one unstable direction past the fold (from the inertia).
      expect(branch.points[1].stability).toBe('stable');
      expect(branch.points.at(-1)!.unstableDimension).toBe(1);
      return { N, h: 1 / (N + 1), fold: fold.parameter, error: lambdaC - fold.parameter };
    });
    for (const r of rows) expect(r.error).toBeGreaterThan(0);
    // Central differences: error ∝ h², so halving h divides it by ≈ 4 ((N+1) ratios 251/126, 501/251, 1001/501).
    for (let i = 1; i < rows.length; i++) {
      const expected = (rows[i - 1].h / rows[i].h) ** 2;
      expectClose(rows[i - 1].error / rows[i].error, expected, 0.02);
    }
    expectClose(rows.at(-1)!.fold, lambdaC, 2e-6);
  }, 120_000);
});
