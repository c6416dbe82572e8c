import { describe, expect, it } from 'vitest';
import { analyze, type SimulateResult } from '@server/engine/index.ts';
import { simulateResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../support/tolerances.ts';

/**
 * Robertson's chemical kinetics (Robertson 1966; Hairer & Wanner, Solving ODEs II, §IV.1 and
 * §IV.10): y1' = −0.04y1 + 1e4·y2y3, y2' = 0.04y1 − 1e4·y2y3 − 3e7·y2², y3' = 3e7·y2²,
 * y(0) = (1, 0, 0). Reference values at t = 40 (from memory, as tabulated in the stiff test
 * literature): y1 = 0.7158270687, y2 = 9.185534765e-6, y3 = 0.2841637457.
 */
const robertson = {
  variables: [
    { name: 'y1', rhs: '-k1*y1 + k3*y2*y3' },
    { name: 'y2', rhs: 'k1*y1 - k3*y2*y3 - k2*y2^2' },
    { name: 'y3', rhs: 'k2*y2^2' },
  ],
  parameters: [{ name: 'k1', value: 0.04 }, { name: 'k2', value: 3e7 }, { name: 'k3', value: 1e4 }],
};
const REFERENCE = { y1: 0.7158270687, y2: 9.185534765e-6, y3: 0.2841637457 };

const solve = (method: 'explicit' | 'implicit' | 'auto', relative: number, absolute: number): SimulateResult => {
  const r = analyze({ model: robertson, task: { kind: 'simulate', initial: { y1: 1 }, time: { end: 40, samples: 41 }, tolerance: { relative, absolute }, method }, timeLimitMs: 60_000 });
  expect(simulateResultSchema.safeParse(r).success).toBe(true);
  expect(r.stopReason).toBe('end');
  return r;
};
const at40 = (r: SimulateResult) => ({ y1: r.trajectory.state.y1.at(-1)!, y2: r.trajectory.state.y2.at(-1)!, y3: r.trajectory.state.y3.at(-1)! });

describe('simulate: stiff models (Rosenbrock method)', () => {
  const implicit = solve('implicit', 1e-6, 1e-12);
  const explicit = solve('explicit', 1e-10, 1e-16);
  const auto = solve('auto', 1e-6, 1e-12);

  it('meets the reference values of Robertson’s problem at t = 40 with the implicit method', () => {
    const y = at40(implicit);
    expectClose(y.y1, REFERENCE.y1, 1e-6);
    expectClose(y.y2, REFERENCE.y2, 1e-5);
    expectClose(y.y3, REFERENCE.y3, 1e-5);
    // Mass conservation y1 + y2 + y3 = 1 holds for any linear-invariant-preserving method (common practice).
    implicit.trajectory.t.forEach((_, i) => expectClose(implicit.trajectory.state.y1[i] + implicit.trajectory.state.y2[i] + implicit.trajectory.state.y3[i], 1, 1e-12));
  });

  // Step counts measured (engine 1.1.0): implicit (rtol 1e-6) 1,010 accepted / 2 rejected;
  // explicit (rtol 1e-10) 61,929 / 4; auto (rtol 1e-6) 884, of which 816 implicit after the switch
  // at t ≈ 0.042.
  it('agrees with the explicit method run at a tight tolerance, in far fewer steps', () => {
    const a = at40(explicit);
    expectClose(a.y1, REFERENCE.y1, 1e-8);
    expectClose(a.y2, REFERENCE.y2, 1e-7);
    implicit.trajectory.t.forEach((_, i) => {
      expectClose(implicit.trajectory.state.y1[i], explicit.trajectory.state.y1[i], 1e-6);
      expectClose(implicit.trajectory.state.y2[i], explicit.trajectory.state.y2[i], 1e-5, 1e-12);
    });
    expect(implicit.steps.accepted * 20).toBeLessThan(explicit.steps.accepted);
    expect(implicit.method).toEqual({ used: 'implicit' });
  });

  it('"auto" detects the stiffness, switches, and matches the reference', () => {
    expect(auto.method?.used).toBe('auto');
    expect(auto.method?.switchedAt).toBeGreaterThan(0);
    expect(auto.method!.switchedAt!).toBeLessThan(1);
    expect(auto.steps.implicit).toBeGreaterThan(0);
    const y = at40(auto);
    expectClose(y.y1, REFERENCE.y1, 1e-6);
    expectClose(y.y3, REFERENCE.y3, 1e-5);
  });

  it('"auto" stays explicit on a non-stiff model (results identical to "explicit")', () => {
    const model = { variables: [{ name: 'x', rhs: 'y' }, { name: 'y', rhs: '-x' }] };
    const run = (method: 'explicit' | 'auto') => analyze({ model, task: { kind: 'simulate', initial: { x: 1 }, time: { end: 20 }, method } });
    const [e, a] = [run('explicit'), run('auto')];
    expect(a.method).toEqual({ used: 'auto' });
    expect(a.trajectory).toEqual(e.trajectory);
  });

  it('the implicit method meets its tolerance on a closed-form linear stiff problem', () => {
    // y' = −1000(y − cos t) − sin t, y(0) = 1: y = cos t (closed form; Hairer & Wanner II, §IV.1 style test).
    const r = analyze({ model: { variables: [{ name: 'y', rhs: '-1000*(y - cos(t)) - sin(t)' }, { name: 't', rhs: '1' }] }, task: { kind: 'simulate', initial: { y: 1 }, time: { end: 10, samples: 51 }, tolerance: { relative: 1e-4, absolute: 1e-7 }, method: 'implicit' } });
    r.trajectory.t.forEach((t, i) => expectClose(r.trajectory.state.y[i], Math.cos(t), 0, 1e-4));
    const e = analyze({ model: { variables: [{ name: 'y', rhs: '-1000*(y - cos(t)) - sin(t)' }, { name: 't', rhs: '1' }] }, task: { kind: 'simulate', initial: { y: 1 }, time: { end: 10, samples: 51 }, tolerance: { relative: 1e-4, absolute: 1e-7 } } });
    expect(r.steps.accepted * 3).toBeLessThan(e.steps.accepted);
  });
});
