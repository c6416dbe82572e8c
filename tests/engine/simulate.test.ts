import { describe, expect, it } from 'vitest';
import { analyze } from '@server/engine/index.ts';
import { integrateDormandPrince } from '@server/engine/ode/dormand-prince.ts';
import { simulateResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../support/tolerances.ts';

const simulate = (variables: Array<{ name: string; rhs: string }>, initial: Record<string, number>, end: number, samples = 201, tolerance?: { relative: number; absolute: number }, parameters: Array<{ name: string; value: number }> = []) => {
  const r = analyze({ model: { variables, parameters }, task: { kind: 'simulate', initial, time: { end, samples }, ...(tolerance ? { tolerance } : {}) } });
  expect(simulateResultSchema.safeParse(r).success).toBe(true);
  return r;
};

describe('simulate (Dormand–Prince 5(4))', () => {
  it.each([1e-4, 1e-6, 1e-8, 1e-10])('meets relative tolerance %s on logistic growth, samples between steps included', (rtol) => {
    // ẋ = x(1 − x), x(0) = 0.1: x(t) = 1/(1 + 9e^(−t)) (closed form; Strogatz §2.3).
    const r = simulate([{ name: 'x', rhs: 'x*(1 - x)' }], { x: 0.1 }, 10, 101, { relative: rtol, absolute: rtol * 1e-2 });
    expect(r.stopReason).toBe('end');
    r.trajectory.t.forEach((t, i) => expectClose(r.trajectory.state.x[i], 1 / (1 + 9 * Math.exp(-t)), rtol));
  });

  it('follows the harmonic oscillator at the sample times (dense output)', () => {
    // ẋ = y, ẏ = −x, (1, 0): x = cos t, y = −sin t (closed form). Few samples, so most sample
    // times fall inside steps and come from the continuous extension.
    const r = simulate([{ name: 'x', rhs: 'y' }, { name: 'y', rhs: '-x' }], { x: 1 }, 20, 37, { relative: 1e-9, absolute: 1e-11 });
    r.trajectory.t.forEach((t, i) => {
      expectClose(r.trajectory.state.x[i], Math.cos(t), 0, 1e-9);
      expectClose(r.trajectory.state.y[i], -Math.sin(t), 0, 1e-9);
    });
    expect(r.trajectory.t).toHaveLength(37);
    expect(r.trajectory.t.at(-1)).toBe(20);
  });

  it('has a dense output of order 4 between the steps', () => {
    // One fixed step of ẏ = −y from y = 1 (huge tolerance so the step is accepted): the
    // interpolant's error at θ = 0.5 must shrink ~2⁵ = 32× when h halves (local order 5 of a
    // 4th-order continuous extension; Hairer, Nørsett & Wanner I, §II.6).
    const errorFor = (h: number) => {
      const r = integrateDormandPrince((_t, y, out) => void (out[0] = -y[0]), Float64Array.of(1), Float64Array.of(0, h / 2, h), { relative: 1e3, absolute: 1e3 }, Infinity);
      return Math.abs(r.values[1] - Math.exp(-h / 2));
    };
    const ratio = errorFor(0.4) / errorFor(0.2);
    expect(ratio).toBeGreaterThan(20);
    expect(ratio).toBeLessThan(50);
  });

  it('stops on blow-up with the samples it reached', () => {
    // ẋ = x², x(0) = 1 blows up at t = 1 (closed form x = 1/(1 − t)).
    const r = simulate([{ name: 'x', rhs: 'x^2' }], { x: 1 }, 2, 21);
    expect(['step-too-small', 'not-finite']).toContain(r.stopReason);
    expect(r.trajectory.t.length).toBeGreaterThan(5);
    expect(r.trajectory.t.length).toBeLessThanOrEqual(11);
    r.trajectory.t.forEach((t, i) => expectClose(r.trajectory.state.x[i], 1 / (1 - t), 1e-6));
  });

  it('uses the model’s parameter values', () => {
    const r = simulate([{ name: 'x', rhs: '-k*x' }], { x: 2 }, 1, 3, undefined, [{ name: 'k', value: 3 }]);
    expectClose(r.trajectory.state.x[2], 2 * Math.exp(-3), 1e-7);
  });
});
