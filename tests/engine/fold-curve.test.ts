import { describe, expect, it } from 'vitest';
import { analyze } from '@server/engine/index.ts';
import { foldCurveResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../support/tolerances.ts';

describe('fold-curve: the cusp', () => {
  // ẋ = h + r x − x³ (Strogatz, Nonlinear Dynamics and Chaos, §3.6, Fig. 3.6.3; Kuznetsov,
  // Elements of Applied Bifurcation Theory, §8.2, normal form ẋ = β₁ + β₂x − x³). Fold curve:
  // r = 3x², h = −2x³, i.e. 27h² = 4r³; along it b = f_xx = −6x changes sign at the cusp
  // (h, r) = (0, 0), x = 0; a = f_h = 1.
  const request = {
    model: { variables: [{ name: 'x', rhs: 'h + r*x - x^3' }], parameters: [{ name: 'h', value: -2 / (3 * Math.sqrt(3)) }, { name: 'r', value: 1 }] },
    task: { kind: 'fold-curve' as const, parameters: ['h', 'r'] as [string, string], start: { parameters: {}, state: { x: 0.6 } }, bounds: { h: [-1, 1] as [number, number], r: [-1, 2] as [number, number] } },
  };
  const r = analyze(request);
  const { curve } = r;

  it('returns a result in the shared contract', () => {
    expect(foldCurveResultSchema.safeParse(r).success).toBe(true);
  });

  it('follows the fold curve through the cusp to the bounds', () => {
    expect(curve.stopReason).toBe('bounds');
    expect(curve.stopReasonAtStart).toBe('bounds');
    expect(curve.points.length).toBeGreaterThan(20);
    for (const p of curve.points) {
      const { h, r: rr } = p.parameters;
      const x = p.state.x;
      expectClose(rr, 3 * x * x, 1e-9, 1e-12);
      expectClose(h, -2 * x ** 3, 1e-9, 1e-12);
      expectClose(27 * h * h, 4 * rr ** 3, 1e-8, 1e-12);
      expect(p.residual).toBeLessThan(1e-10);
      expectClose(p.normalForm.a, 1, 1e-9);
      expectClose(p.normalForm.b, -6 * x, 1e-8, 1e-10);
    }
  });

  it('locates the cusp at the origin', () => {
    expect(curve.events).toHaveLength(1);
    const cusp = curve.events[0];
    expect(cusp.kind).toBe('cusp');
    expect(Math.abs(cusp.parameters.h)).toBeLessThan(1e-10);
    expect(Math.abs(cusp.parameters.r)).toBeLessThan(1e-8);
    expect(Math.abs(cusp.state.x)).toBeLessThan(1e-8);
    const [before, after] = [curve.points[cusp.after].state.x, curve.points[cusp.after + 1].state.x];
    expect(before * after).toBeLessThan(0);
  });
});

describe('fold-curve: a two-variable fold in two parameters', () => {
  // ẋ = μ − x² + κ·y, ẏ = x − y: equilibria y = x, μ = x² − κx; folds at x = κ/2, μ = −κ²/4
  // (closed form, derived by hand). No cusp: b = w·D²f(v,v) keeps its sign.
  it('follows μ* = −κ²/4', () => {
    const r = analyze({
      model: { variables: [{ name: 'x', rhs: 'mu - x^2 + k*y' }, { name: 'y', rhs: 'x - y' }], parameters: [{ name: 'mu', value: -0.25 }, { name: 'k', value: 1 }] },
      task: { kind: 'fold-curve', parameters: ['mu', 'k'], start: { parameters: { mu: -0.2 }, state: { x: 0.4, y: 0.4 } }, bounds: { mu: [-2, 1], k: [0.5, 2] } },
    });
    expect(r.curve.points.length).toBeGreaterThan(5);
    expect(r.curve.events).toEqual([]);
    for (const p of r.curve.points) {
      expectClose(p.parameters.mu, -(p.parameters.k ** 2) / 4, 1e-9, 1e-12);
      expectClose(p.state.x, p.parameters.k / 2, 1e-9, 1e-12);
    }
    const ks = r.curve.points.map((p) => p.parameters.k);
    expectClose(Math.min(...ks), 0.5, 1e-12);
    expectClose(Math.max(...ks), 2, 1e-12);
  });

  it('reports a start far from any fold as a value', () => {
    const r = analyze({
      model: { variables: [{ name: 'x', rhs: '-x + mu + k' }], parameters: [{ name: 'mu', value: 0 }, { name: 'k', value: 0 }] },
      task: { kind: 'fold-curve', parameters: ['mu', 'k'], start: { parameters: {}, state: {} }, bounds: { mu: [-1, 1], k: [-1, 1] } },
    });
    expect(r.curve.stopReason).toBe('start-not-converged');
  });
});

describe('fold-curve: Bogdanov–Takens and zero-Hopf points', () => {
  it('locates the Bogdanov–Takens point of its normal form', () => {
    // Kuznetsov, Elements of Applied Bifurcation Theory, 3rd ed., §8.4: η1' = η2,
    // η2' = β1 + β2η1 + η1² − η1η2. Equilibria η1² + β2η1 + β1 = 0, so the fold curve is
    // β1 = β2²/4 at η1 = −β2/2 (closed form); J = [[0, 1], [0, −η1]] there, whose second
    // eigenvalue −η1 = β2/2 vanishes at the Bogdanov–Takens point β = 0.
    const model = { variables: [{ name: 'u', rhs: 'v' }, { name: 'v', rhs: 'b1 + b2*u + u^2 - u*v' }], parameters: [{ name: 'b1', value: 0.25 }, { name: 'b2', value: -1 }] };
    const r = analyze({ model, task: { kind: 'fold-curve', parameters: ['b1', 'b2'], start: { parameters: {}, state: { u: 0.5, v: 0 } }, bounds: { b1: [-1, 1], b2: [-1.5, 1] } } });
    expect(foldCurveResultSchema.safeParse(r).success).toBe(true);
    for (const p of r.curve.points) expectClose(p.parameters.b1, p.parameters.b2 ** 2 / 4, 1e-9, 1e-12);
    expect(r.curve.events.map((e) => e.kind)).toEqual(['bogdanov-takens']);
    expectClose(r.curve.events[0].parameters.b2, 0, 0, 1e-8);
    expectClose(r.curve.events[0].parameters.b1, 0, 0, 1e-12);
  });

  it('locates a zero-Hopf point where a complex pair crosses on the fold curve', () => {
    // A fold in z (ż = κ − z², fold curve κ = 0 at z = 0; Strogatz §3.1) and a Hopf pair μ ± i in
    // (x, y): on the fold curve the pair crosses the imaginary axis at μ = 0 (closed form).
    const model = {
      variables: [{ name: 'x', rhs: 'mu*x - y + x*z' }, { name: 'y', rhs: 'x + mu*y' }, { name: 'z', rhs: 'kappa - z^2 + x^2' }],
      parameters: [{ name: 'kappa', value: 0 }, { name: 'mu', value: -0.5 }],
    };
    const r = analyze({ model, task: { kind: 'fold-curve', parameters: ['kappa', 'mu'], start: { parameters: {}, state: { z: 0.01 } }, bounds: { kappa: [-1, 1], mu: [-1, 1] } } });
    for (const p of r.curve.points) expectClose(p.parameters.kappa, 0, 0, 1e-10);
    expect(r.curve.events.map((e) => e.kind)).toEqual(['zero-hopf']);
    expectClose(r.curve.events[0].parameters.mu, 0, 0, 1e-9);
  });
});
