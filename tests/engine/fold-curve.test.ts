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
