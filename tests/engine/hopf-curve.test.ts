import { describe, expect, it } from 'vitest';
import { analyze, type ModelInput } from '@server/engine/index.ts';
import { hopfCurveResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../support/tolerances.ts';

const hopfCurve = (model: ModelInput, parameters: [string, string], state: Record<string, number>, bounds: Record<string, [number, number]>, startParameters: Record<string, number> = {}) => {
  const r = analyze({ model, task: { kind: 'hopf-curve', parameters, start: { parameters: startParameters, state }, bounds } });
  expect(hopfCurveResultSchema.safeParse(r).success).toBe(true);
  return r.curve;
};

describe('hopf-curve: generalized Hopf (Bautin) point', () => {
  // Kuznetsov, Elements of Applied Bifurcation Theory, 3rd ed., §8.3, normal form
  // ż = (β1 + i)z + β2 z|z|² − z|z|⁴: Hopf curve β1 = 0 for all β2, ω = 1, and (Cartesian, with the
  // normalisation of the "hopf" events) l1 = 2β2 (see tests/engine/bifurcation/hopf.test.ts), so
  // the generalized Hopf point is (β1, β2) = (0, 0).
  const model = {
    variables: [
      { name: 'x', rhs: 'b1*x - y + b2*r2*x - r2^2*x' },
      { name: 'y', rhs: 'x + b1*y + b2*r2*y - r2^2*y' },
    ],
    parameters: [{ name: 'b1', value: 0.01 }, { name: 'b2', value: -1 }],
    definitions: [{ name: 'r2', expression: 'x^2 + y^2' }],
  };
  const curve = hopfCurve(model, ['b1', 'b2'], {}, { b1: [-1, 1], b2: [-1.5, 1] });

  it('follows the Hopf curve β1 = 0 with ω = 1 and l1 = 2β2', () => {
    expect(curve.points.length).toBeGreaterThan(10);
    expect(curve.stopReason).toBe('bounds');
    for (const p of curve.points) {
      expectClose(p.parameters.b1, 0, 0, 1e-10);
      expectClose(p.frequency, 1, 1e-10);
      expectClose(p.firstLyapunovCoefficient, 2 * p.parameters.b2, 1e-6, 1e-9);
      expect(p.residual).toBeLessThan(1e-10);
    }
  });

  it('locates the generalized Hopf point at the origin', () => {
    expect(curve.events.map((e) => e.kind)).toEqual(['generalized-hopf']);
    expectClose(curve.events[0].parameters.b2, 0, 0, 1e-8);
    expectClose(curve.events[0].parameters.b1, 0, 0, 1e-10);
  });
});

describe('hopf-curve: Bogdanov–Takens end point', () => {
  // Kuznetsov §8.4, normal form η1' = η2, η2' = β1 + β2η1 + η1² − η1η2 (s = −1): Hopf curve
  // β1 = 0, β2 < 0 at η = 0 with ω = sqrt(−β2) (closed form: J = [[0, 1], [β2, 0]] there), ending
  // at the Bogdanov–Takens point β = 0; supercritical for s = −1 (from memory).
  const model = {
    variables: [{ name: 'u', rhs: 'v' }, { name: 'v', rhs: 'b1 + b2*u + u^2 - u*v' }],
    parameters: [{ name: 'b1', value: 0 }, { name: 'b2', value: -1 }],
  };
  const curve = hopfCurve(model, ['b1', 'b2'], { u: 0, v: 0 }, { b1: [-1, 1], b2: [-2, 0.5] });

  it('follows β1 = 0 with ω = sqrt(−β2), supercritical', () => {
    expect(curve.points.length).toBeGreaterThan(5);
    for (const p of curve.points) {
      expectClose(p.parameters.b1, 0, 0, 1e-9);
      expectClose(p.frequency, Math.sqrt(-p.parameters.b2), 1e-8, 1e-8);
      expect(p.firstLyapunovCoefficient).toBeLessThan(0);
    }
  });

  it('reports the Bogdanov–Takens point at the origin where ω reaches zero', () => {
    const bt = curve.events.filter((e) => e.kind === 'bogdanov-takens');
    expect(bt).toHaveLength(1);
    expectClose(bt[0].parameters.b2, 0, 0, 1e-6);
  });
});

describe('hopf-curve: zero-Hopf point', () => {
  // A Hopf pair in (x, y) and a real eigenvalue κ in z: ẋ = μx − y − (x² + y²)x + xz,
  // ẏ = x + μy − (x² + y²)y, ż = κz + x² + y². At the origin J = [[μ, −1, 0], [1, μ, 0], [0, 0, κ]]
  // (closed form): the Hopf curve is μ = 0 for all κ, and det J = κ(μ² + 1) changes sign at κ = 0,
  // the zero-Hopf point (Kuznetsov §8.5).
  const model = {
    variables: [
      { name: 'x', rhs: 'mu*x - y - (x^2 + y^2)*x + x*z' },
      { name: 'y', rhs: 'x + mu*y - (x^2 + y^2)*y' },
      { name: 'z', rhs: 'kappa*z + x^2 + y^2' },
    ],
    parameters: [{ name: 'mu', value: 0 }, { name: 'kappa', value: -1 }],
  };
  const curve = hopfCurve(model, ['mu', 'kappa'], {}, { mu: [-1, 1], kappa: [-1.5, 1] });

  it('locates the zero-Hopf point at κ = 0 on the Hopf curve μ = 0', () => {
    for (const p of curve.points) expectClose(p.parameters.mu, 0, 0, 1e-10);
    const zh = curve.events.filter((e) => e.kind === 'zero-hopf');
    expect(zh).toHaveLength(1);
    expectClose(zh[0].parameters.kappa, 0, 0, 1e-9);
  });
});
