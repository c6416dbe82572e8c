import { describe, expect, it } from 'vitest';
import { analyze, EngineRequestError, type Branch, type BranchPointEvent, type ModelInput } from '@server/engine/index.ts';
import { continuationResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../../support/tolerances.ts';

const run = (model: ModelInput, start: Record<string, number>, extra: Record<string, unknown> = {}): Branch => {
  const r = analyze({ model, task: { kind: 'continuation', parameter: 'mu', start, bounds: { min: -1, max: 1 }, step: { initial: 0.01, min: 1e-6, max: 0.05 }, ...extra } });
  expect(continuationResultSchema.safeParse(r).success).toBe(true);
  return r.branch;
};
const branchPoints = (b: Branch) => b.events.filter((e): e is BranchPointEvent => e.kind === 'branch-point');

describe('branch points: transcritical ẋ = μx − x² (Strogatz, Nonlinear Dynamics and Chaos, §3.2)', () => {
  const model = { variables: [{ name: 'x', rhs: 'mu*x - x^2' }], parameters: [{ name: 'mu', value: -1 }] };
  const trivial = run(model, { x: 0 });

  it('locates the branch point at μ = 0, x = 0 with both branch directions', () => {
    expect(trivial.events.map((e) => e.kind)).toEqual(['branch-point']);
    const [bp] = branchPoints(trivial);
    expect(bp.type).toBe('transcritical');
    expectClose(bp.parameter, 0, 0, 1e-9);
    expectClose(bp.state.x, 0, 0, 1e-9);
    // Branches x = 0 (direction (0, 1)) and x = μ (direction (1, 1)/√2) (Strogatz §3.2).
    expectClose(bp.tangents[0].state.x, 0, 0, 1e-6);
    expectClose(bp.tangents[0].parameter, 1, 1e-6);
    expectClose(bp.tangents[1].state.x, Math.SQRT1_2, 1e-6);
    expectClose(bp.tangents[1].parameter, Math.SQRT1_2, 1e-6);
    expect(Math.abs(bp.eigenvalues[0].re)).toBeLessThan(1e-8);
    // The branch is traced straight through, with the stability exchange of §3.2.
    expect(trivial.points.at(0)!.stability).toBe('stable');
    expect(trivial.points.at(-1)!.stability).toBe('unstable');
  });

  it('switches to the other branch x = μ, stable for μ > 0 (switchAt: event index)', () => {
    const other = run(model, { x: 0 }, { switchAt: 0 });
    expect(other.points.length).toBeGreaterThan(20);
    for (const p of other.points) expectClose(p.state.x, p.parameter, 0, 1e-9);
    expect(Math.min(...other.points.map((p) => p.parameter))).toBe(-1);
    expect(Math.max(...other.points.map((p) => p.parameter))).toBe(1);
    for (const p of other.points) if (Math.abs(p.parameter) > 1e-3) expect(p.stability).toBe(p.parameter > 0 ? 'stable' : 'unstable');
    // The same branch point is met again on the other branch.
    expect(branchPoints(other).map((e) => e.type)).toEqual(['transcritical']);
    expectClose(branchPoints(other)[0].parameter, 0, 0, 1e-9);
  });

  it('switches by a point near the branch point (switchAt: { parameter, state })', () => {
    const other = run(model, { x: 0 }, { switchAt: { parameter: 0.01, state: { x: 0 } } });
    for (const p of other.points) expectClose(p.state.x, p.parameter, 0, 1e-9);
  });

  it.each([
    { switchAt: 3, message: /there is no event 3/ },
    { switchAt: { parameter: 0, state: { y: 1 } }, message: /"y" is not a variable/ },
  ])('rejects switchAt $switchAt with a clear message', ({ switchAt, message }) => {
    expect(() => analyze({ model, task: { kind: 'continuation', parameter: 'mu', start: { x: 0 }, bounds: { min: -1, max: 1 }, switchAt } })).toThrow(message);
  });

  it('names the field and the kind when switchAt points at a fold', () => {
    const fold = { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }] };
    try {
      analyze({ model: fold, task: { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 2 }, switchAt: 0 } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineRequestError);
      expect((e as EngineRequestError).path).toBe('task.switchAt');
      expect((e as EngineRequestError).message).toMatch(/event 0 is a fold, not a branch point; no branch point was found/);
    }
  });
});

describe('branch points: pitchfork ẋ = μx − x³ (Strogatz §3.4, supercritical)', () => {
  const model = { variables: [{ name: 'x', rhs: 'mu*x - x^3' }], parameters: [{ name: 'mu', value: -1 }] };

  it('classifies the branch point as a pitchfork and traces both halves x = ±√μ', () => {
    const trivial = run(model, { x: 0 });
    const [bp] = branchPoints(trivial);
    expect(bp.type).toBe('pitchfork');
    expectClose(bp.parameter, 0, 0, 1e-9);
    // The bifurcating branch leaves vertically: direction (±1, 0).
    expectClose(Math.abs(bp.tangents[1].state.x), 1, 1e-6);
    expectClose(bp.tangents[1].parameter, 0, 0, 1e-6);
    const other = run(model, { x: 0 }, { switchAt: 0 });
    const xs = other.points.map((p) => p.state.x);
    expect(Math.min(...xs)).toBeLessThan(-0.9);
    expect(Math.max(...xs)).toBeGreaterThan(0.9);
    for (const p of other.points) {
      expectClose(p.parameter, p.state.x ** 2, 0, 1e-9);
      // x = ±√μ is stable: f'(x) = μ − 3x² = −2μ < 0 (Strogatz §3.4).
      if (p.parameter > 1e-3) expect(p.stability).toBe('stable');
    }
  });
});

describe('branch points in two variables', () => {
  it('finds a transcritical point whose branches mix both variables', () => {
    // ẋ = μx − x² − xy, ẏ = x − y: equilibria x = y = 0 and x = y = μ/2 (closed form, derived by
    // hand): a transcritical crossing at μ = 0 with the other direction (1, 1, 2)/√6.
    const model = { variables: [{ name: 'x', rhs: 'mu*x - x^2 - x*y' }, { name: 'y', rhs: 'x - y' }], parameters: [{ name: 'mu', value: -1 }] };
    const [bp] = branchPoints(run(model, { x: 0, y: 0 }));
    expect(bp.type).toBe('transcritical');
    expectClose(bp.parameter, 0, 0, 1e-9);
    const t = bp.tangents[1];
    expectClose(t.state.x, 1 / Math.sqrt(6), 1e-6);
    expectClose(t.state.y, 1 / Math.sqrt(6), 1e-6);
    expectClose(t.parameter, 2 / Math.sqrt(6), 1e-6);
    const other = run(model, { x: 0, y: 0 }, { switchAt: 0 });
    for (const p of other.points) {
      expectClose(p.state.x, p.parameter / 2, 0, 1e-9);
      expectClose(p.state.y, p.parameter / 2, 0, 1e-9);
    }
  });

  it('reports no branch point on a regular branch with folds', () => {
    const model = { variables: [{ name: 'x', rhs: 'mu + x - x^3' }, { name: 'y', rhs: 'x - y' }], parameters: [{ name: 'mu', value: -1 }] };
    const b = run(model, { x: -1.3, y: -1.3 });
    expect(b.events.map((e) => e.kind)).toEqual(['fold', 'fold']);
  });
});
