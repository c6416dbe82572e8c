import { describe, expect, it } from 'vitest';
import { analyze, type BranchEvent, type ContinuationResult, type FoldEvent, type ModelInput } from '@server/engine/index.ts';
import { continuationResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../support/tolerances.ts';
import { bratuModel } from './models.ts';

/** The event as a fold (fails the test otherwise). */
const asFold = (e: BranchEvent | undefined): FoldEvent => {
  expect(e?.kind).toBe('fold');
  return e as FoldEvent;
};

const follow = (model: ModelInput, parameter: string, start: Record<string, number>, min: number, max: number, extra: Record<string, unknown> = {}): ContinuationResult['branch'] => {
  const r = analyze({ model, task: { kind: 'continuation', parameter, start, bounds: { min, max }, ...extra } });
  expect(continuationResultSchema.safeParse(r).success).toBe(true);
  return r.branch;
};

describe('continuation: folds of one-variable models', () => {
  it.each([
    {
      source: 'Strogatz, Nonlinear Dynamics and Chaos, §3.1, eq. 3.1.1: ẋ = r + x², fold at r = 0, x = 0',
      model: { variables: [{ name: 'x', rhs: 'r + x^2' }], parameters: [{ name: 'r', value: -1 }] },
      parameter: 'r', start: { x: -1 }, bounds: [-1, 0.5] as const,
      fold: { parameter: 0, x: 0, a: 1, b: 2, side: 'below' },
    },
    {
      source: 'Strogatz, §3.1, Example 3.1.2: ẋ = r − x − e^(−x), fold at r = 1, x = 0',
      model: { variables: [{ name: 'x', rhs: 'r - x - exp(-x)' }], parameters: [{ name: 'r', value: 2 }] },
      parameter: 'r', start: { x: 1 }, bounds: [0, 3] as const,
      fold: { parameter: 1, x: 0, a: 1, b: -1, side: 'above' },
    },
    {
      source: 'Strogatz, Exercise 3.7.3 (fishery, dimensionless): ẋ = x(1 − x) − h, fold at h = 1/4, x = 1/2',
      model: { variables: [{ name: 'x', rhs: 'x*(1 - x) - h' }], parameters: [{ name: 'h', value: 0 }] },
      parameter: 'h', start: { x: 1 }, bounds: [-0.5, 0.5] as const,
      fold: { parameter: 0.25, x: 0.5, a: -1, b: -2, side: 'below' },
    },
  ])('locates the fold: $source', ({ model, parameter, start, bounds, fold }) => {
    const branch = follow(model, parameter, start, bounds[0], bounds[1]);
    expect(branch.events).toHaveLength(1);
    const e = asFold(branch.events[0]);
    expectClose(e.parameter, fold.parameter, 1e-8, 1e-12);
    expectClose(e.state.x, fold.x, 0, 1e-7);
    expect(e.residual).toBeLessThan(1e-10);
    // Scalar model: a = ∂f/∂μ, b = ∂²f/∂x² (Kuznetsov, Elements of Applied Bifurcation Theory, §3.3).
    expectClose(e.normalForm.a, fold.a, 1e-7);
    expectClose(e.normalForm.b, fold.b, 1e-7);
    expect(e.normalForm.equilibriaSide).toBe(fold.side);
    expect(e.normalForm.nondegenerate).toBe(true);
    expect(e.normalForm.nullVector).toEqual({ x: 1 });
    expect(Math.abs(e.eigenvalues[0].re)).toBeLessThan(1e-8);
    // The fold sits between branch points `after` and `after + 1` (its state does; its parameter
    // is an extremum along the branch, beyond both).
    const [x0, x1] = [branch.points[e.after].state.x, branch.points[e.after + 1].state.x];
    expect(Math.min(x0, x1)).toBeLessThanOrEqual(e.state.x);
    expect(Math.max(x0, x1)).toBeGreaterThanOrEqual(e.state.x);
    const [p0, p1] = [branch.points[e.after].parameter, branch.points[e.after + 1].parameter];
    expect(Math.abs(e.parameter - fold.parameter)).toBeLessThanOrEqual(Math.max(Math.abs(p0 - fold.parameter), Math.abs(p1 - fold.parameter)) + 1e-12);
  });
});

describe('continuation: hysteresis with two folds', () => {
  // Strogatz §3.6 (imperfect bifurcation) ẋ = h + r x − x³ with r = 1: folds at
  // h = ∓2/(3√3), x = ±1/√3, i.e. h_c = (2r/3)·sqrt(r/3).
  const model = { variables: [{ name: 'x', rhs: 'h + x - x^3' }], parameters: [{ name: 'h', value: -1 }] };
  const branch = follow(model, 'h', { x: -1.3 }, -1, 1, { direction: 'increasing' });
  const hc = 2 / (3 * Math.sqrt(3));

  it('follows the S-shaped branch through both folds to the far bound', () => {
    expect(branch.stopReason).toBe('bounds');
    expect(branch.points[0].parameter).toBe(-1);
    expect(branch.points.at(-1)!.parameter).toBe(1);
    expect(branch.events.map((e) => e.kind)).toEqual(['fold', 'fold']);
    expectClose(branch.events[0].parameter, hc, 1e-8);
    expectClose(branch.events[1].parameter, -hc, 1e-8);
    expectClose(branch.events[0].state.x, -1 / Math.sqrt(3), 1e-8);
    for (const p of branch.points) expect(p.residual).toBeLessThan(1e-10);
  });

  it('classifies the outer branches stable and the middle one unstable', () => {
    const [f1, f2] = branch.events;
    branch.points.forEach((p, i) => {
      const middle = i > f1.after && i <= f2.after;
      // f'(x) = 1 − 3x² < 0 on the outer branches (|x| > 1/√3).
      if (Math.abs(Math.abs(p.state.x) - 1 / Math.sqrt(3)) < 1e-3) return;
      expect(p.stability).toBe(middle ? 'unstable' : 'stable');
      expect(p.unstableDimension).toBe(middle ? 1 : 0);
      expectClose(p.eigenvalues[0].re, 1 - 3 * p.state.x ** 2, 1e-10, 1e-12);
    });
  });

  it('puts the equilibria on the correct side of each fold', () => {
    // Near h = +h_c (x = −1/√3) equilibria exist for h < h_c; near −h_c for h > −h_c.
    expect(branch.events.map((e) => asFold(e).normalForm.equilibriaSide)).toEqual(['below', 'above']);
  });
});

describe('continuation: a three-variable fold needing the full projection (w ≠ v)', () => {
  // ẋ = μ − x² + z, ẏ = x − y, ż = y − 2z. Closed form (derived by hand; the projection
  // formulas are Kuznetsov, §3.3, with ⟨p, q⟩ = 1): equilibria y = x, z = x/2, μ = x² − x/2, so
  // the fold is at x* = 1/4, μ* = −1/16; J* = [[−1/2, 0, 1], [1, −1, 0], [0, 1, −2]];
  // v = (2, 2, 1)/3, w = (6, 3, 3)/7, a = w·f_μ = 6/7, b = w·D²f(v, v) = (6/7)(−2)(4/9) = −16/21;
  // the other eigenvalues solve λ² + 3.5λ + 3.5 = 0: −1.75 ± i·sqrt(1.75)/2.
  const model = {
    variables: [{ name: 'x', rhs: 'mu - x^2 + z' }, { name: 'y', rhs: 'x - y' }, { name: 'z', rhs: 'y - 2*z' }],
    parameters: [{ name: 'mu', value: 0 }],
  };
  const branch = follow(model, 'mu', { x: 1, y: 1, z: 0.5 }, -1, 1);

  it('locates the fold and its normal form', () => {
    expect(branch.events).toHaveLength(1);
    const e = asFold(branch.events[0]);
    expectClose(e.parameter, -1 / 16, 1e-8);
    expectClose(e.state.x, 0.25, 1e-8);
    expectClose(e.state.z, 0.125, 1e-8);
    expect(e.residual).toBeLessThan(1e-10);
    const { nullVector: v, adjointNullVector: w, a, b } = e.normalForm;
    expectClose(v.x, 2 / 3, 1e-8);
    expectClose(v.y, 2 / 3, 1e-8);
    expectClose(v.z, 1 / 3, 1e-8);
    expectClose(w.x, 6 / 7, 1e-8);
    expectClose(w.y, 3 / 7, 1e-8);
    expectClose(w.z, 3 / 7, 1e-8);
    expectClose(a, 6 / 7, 1e-8);
    expectClose(b, -16 / 21, 1e-8);
    expect(e.normalForm.equilibriaSide).toBe('above');
  });

  it('reports the fold eigenvalues to 1e-8', () => {
    const [l0, l1, l2] = branch.events[0].eigenvalues;
    expect(Math.abs(l0.re)).toBeLessThan(1e-8);
    expectClose(l1.re, -1.75, 1e-8);
    expectClose(l1.im, Math.sqrt(1.75) / 2, 1e-8);
    expectClose(l2.im, -Math.sqrt(1.75) / 2, 1e-8);
  });

  it('matches the local parabola x ≈ x* ± v·sqrt(−2a(μ−μ*)/b) near the fold', () => {
    const { a, b, nullVector } = asFold(branch.events[0]).normalForm;
    const near = branch.points.filter((p) => Math.abs(p.parameter + 1 / 16) < 2e-3 && p.parameter > -1 / 16);
    expect(near.length).toBeGreaterThan(0);
    for (const p of near) {
      const r = nullVector.x * Math.sqrt((-2 * a * (p.parameter + 1 / 16)) / b);
      const offset = Math.abs(p.state.x - 0.25);
      // Exact here: μ − μ* = (x − 1/4)² (closed form above).
      expectClose(offset, r, 1e-6, 1e-9);
    }
  });
});

describe('continuation: the discretised Bratu problem', () => {
  // u'' + λe^u = 0, u(0) = u(1) = 0. Continuum fold λ_c = 8t²/cosh²(t) where t·tanh(t) = 1
  // (from the exact solution u = −2 ln[cosh((x − 1/2)θ/2)/cosh(θ/4)], θ = sqrt(2λ)·cosh(θ/4)
  // (from memory)); λ_c ≈ 3.51383 (from memory). Central differences converge as O(h²).
  let t = 1.2;
  for (let i = 0; i < 50; i++) t -= (t * Math.tanh(t) - 1) / (Math.tanh(t) + t / Math.cosh(t) ** 2);
  const lambdaC = (8 * t * t) / Math.cosh(t) ** 2;

  it('has the continuum fold value from the closed form', () => {
    expectClose(lambdaC, 3.51383, 0, 5e-6);
  });

  const foldFor = (n: number) => {
    const branch = follow(bratuModel(n), 'lambda', {}, -1, 4, { direction: 'increasing', maxPoints: 400, step: { initial: 0.05, min: 1e-6, max: 0.5 } });
    expect(branch.events).toHaveLength(1);
    expect(branch.events[0].residual).toBeLessThan(1e-10);
    return branch.events[0].parameter;
  };

  it('converges to it at second order as the grid is refined', () => {
    const errors = [10, 20, 40].map((n) => lambdaC - foldFor(n));
    for (const e of errors) expect(e).toBeGreaterThan(0);
    // Error ratios for h halving (h = 1/11, 1/21, 1/41): ≈ ((n+1)/(2n+1))⁻² ≈ 3.6–3.9.
    expect(errors[0] / errors[1]).toBeGreaterThan(3.3);
    expect(errors[1] / errors[2]).toBeGreaterThan(3.6);
    expect(errors[2]).toBeLessThan(2e-3);
  });

  it('finds the stable lower branch turning unstable at the fold', () => {
    const branch = follow(bratuModel(10), 'lambda', {}, -1, 4, { direction: 'increasing', maxPoints: 60 });
    const fold = branch.events[0];
    branch.points.forEach((p, i) => {
      if (i <= fold.after - 1) expect(p.stability).toBe('stable');
      if (i >= fold.after + 2) expect(p.unstableDimension).toBe(1);
    });
  });
});

describe('continuation: stop reasons', () => {
  it('stops with "closed" on an isola', () => {
    // ẋ = (x² + μ² − 1) has the closed branch x² + μ² = 1 (a circle; common practice).
    const branch = follow({ variables: [{ name: 'x', rhs: 'x^2 + mu^2 - 1' }], parameters: [{ name: 'mu', value: 0 }] }, 'mu', { x: 1 }, -2, 2, { step: { initial: 0.05, min: 1e-6, max: 0.05 } });
    expect(branch.stopReason).toBe('closed');
    expect(branch.events).toHaveLength(2);
    expect(branch.events.map((e) => Math.abs(e.parameter))).toEqual([expect.closeTo(1, 10), expect.closeTo(1, 10)]);
  });

  it('stops with "max-points"', () => {
    const branch = follow({ variables: [{ name: 'x', rhs: 'mu - x' }], parameters: [{ name: 'mu', value: 0 }] }, 'mu', {}, -100, 100, { maxPoints: 7, direction: 'increasing' });
    expect(branch.stopReason).toBe('max-points');
    expect(branch.points).toHaveLength(7);
  });

  it('reports a start where Newton does not converge as a value', () => {
    const branch = follow({ variables: [{ name: 'x', rhs: 'x^2 + 1 + mu' }], parameters: [{ name: 'mu', value: 0 }] }, 'mu', { x: 0.5 }, -1, 1);
    expect(branch).toEqual({ points: [], events: [], stopReason: 'start-not-converged' });
  });

  it('stops with "time-limit" and keeps what it computed', () => {
    const r = analyze({ model: bratuModel(40), task: { kind: 'continuation', parameter: 'lambda', bounds: { min: -1, max: 4 }, maxPoints: 20000, step: { initial: 1e-4, min: 1e-6, max: 1e-4 } }, timeLimitMs: 1000 });
    expect(r.branch.stopReason).toBe('time-limit');
    expect(r.branch.points.length).toBeGreaterThan(1);
  });
});

describe('continuation: starting exactly at a fold', () => {
  it('sets off along the state direction and finds the fold at its start', () => {
    // ẋ = μ − x², start (x, μ) = (0, 0) is the fold itself (Strogatz §3.1).
    const branch = follow({ variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 0 }] }, 'mu', { x: 0 }, -1, 1);
    expect(branch.points.length).toBeGreaterThan(10);
    for (const p of branch.points) expectClose(p.parameter, p.state.x ** 2, 1e-9, 1e-12);
    expect(branch.points.every((p) => p.parameter >= 0)).toBe(true);
  });
});
