import { describe, expect, it } from 'vitest';
import { analyze } from '@server/engine/index.ts';
import { equilibriaResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../support/tolerances.ts';

describe('equilibria', () => {
  it('finds the three equilibria of the bistable cubic, each once, with stability', () => {
    // ẋ = x − x³: equilibria −1, 0, 1; f'(x) = 1 − 3x², so ±1 stable (−2) and 0 unstable (+1)
    // (Strogatz, Nonlinear Dynamics and Chaos, §2.4 and Example 2.2.1 style; closed form).
    const r = analyze({ model: { variables: [{ name: 'x', rhs: 'x - x^3' }] }, task: { kind: 'equilibria', box: { x: [-2, 2] }, starts: 64 } });
    expect(equilibriaResultSchema.safeParse(r).success).toBe(true);
    expect(r.equilibria.map((e) => e.state.x)).toEqual([expect.closeTo(-1, 12), expect.closeTo(0, 12), expect.closeTo(1, 12)]);
    expect(r.equilibria.map((e) => e.stability)).toEqual(['stable', 'unstable', 'stable']);
    expect(r.equilibria.map((e) => e.eigenvalues[0].re)).toEqual([expect.closeTo(-2, 10), expect.closeTo(1, 10), expect.closeTo(-2, 10)]);
    for (const e of r.equilibria) expect(e.residual).toBeLessThan(1e-12);
  });

  it('classifies a saddle, a stable spiral and a centre-like neutral point', () => {
    // Damped pendulum θ' = ω, ω' = −sin θ − γω with γ = 0.5: (0, 0) has λ = −1/4 ± i·sqrt(15)/4
    // (stable spiral), (π, 0) has λ = (−1/2 ± sqrt(1/4 + 4))/2 (saddle) (Strogatz §6.7).
    const r = analyze({
      model: { variables: [{ name: 'theta', rhs: 'omega' }, { name: 'omega', rhs: '-sin(theta) - g*omega' }], parameters: [{ name: 'g', value: 0.5 }] },
      task: { kind: 'equilibria', box: { theta: [-1, 4], omega: [-1, 1] }, starts: 64 },
    });
    expect(r.equilibria).toHaveLength(2);
    const [origin, saddle] = r.equilibria;
    expect(origin.stability).toBe('stable');
    expectClose(origin.eigenvalues[0].re, -0.25, 1e-12);
    expectClose(origin.eigenvalues[0].im, Math.sqrt(15) / 4, 1e-12);
    expectClose(saddle.state.theta, Math.PI, 1e-12);
    expect(saddle.stability).toBe('unstable');
    expect(saddle.unstableDimension).toBe(1);
    expectClose(saddle.eigenvalues[0].re, (-0.5 + Math.sqrt(4.25)) / 2, 1e-12);
    // Without damping the origin is a linear centre: neutral.
    const undamped = analyze({
      model: { variables: [{ name: 'theta', rhs: 'omega' }, { name: 'omega', rhs: '-sin(theta)' }] },
      task: { kind: 'equilibria', box: { theta: [-1, 1], omega: [-1, 1] }, starts: 16 },
    });
    expect(undamped.equilibria.map((e) => e.stability)).toEqual(['neutral']);
  });

  it('returns no equilibria where there are none', () => {
    const r = analyze({ model: { variables: [{ name: 'x', rhs: 'x^2 + 1' }] }, task: { kind: 'equilibria', starts: 20 } });
    expect(r.equilibria).toEqual([]);
    expect(r.starts).toEqual({ tried: 20, converged: 0 });
  });
});
