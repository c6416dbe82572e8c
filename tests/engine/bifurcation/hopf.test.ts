import { describe, expect, it } from 'vitest';
import { analyze, type Branch, type HopfEvent, type ModelInput } from '@server/engine/index.ts';
import { continuationResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../../support/tolerances.ts';
import { coupledBrusselators } from '../models.ts';

const run = (model: ModelInput, parameter: string, start: Record<string, number>, min: number, max: number): Branch => {
  const r = analyze({ model, task: { kind: 'continuation', parameter, start, bounds: { min, max } } });
  expect(continuationResultSchema.safeParse(r).success).toBe(true);
  return r.branch;
};
const hopfs = (b: Branch) => b.events.filter((e): e is HopfEvent => e.kind === 'hopf');

/**
 * The Hopf normal form in Cartesian coordinates, ẋ = μx − ωy + l(x² + y²)x,
 * ẏ = ωx + μy + l(x² + y²)y, i.e. ż = (μ + iω)z + l z|z|² for z = x + iy, with r' = μr + lr³
 * (Kuznetsov, Elements of Applied Bifurcation Theory, 3rd ed., §3.4–3.5). With Kuznetsov's
 * normalisation q = (1, −i)/√2 (Aq = iωq, ⟨q, q⟩ = 1) the coordinate of §3.5 is z/√2, in which
 * the cubic coefficient is c1 = 2l, so l1 = Re c1/ω = 2l/ω (derived by hand from §3.5, eq. 3.18–3.20).
 */
const normalForm = (omega: number, l: number, extra = ''): ModelInput => ({
  variables: [
    { name: 'x', rhs: `mu*x - ${omega}*y + ${l}*(x^2 + y^2)*x${extra}` },
    { name: 'y', rhs: `${omega}*x + mu*y + ${l}*(x^2 + y^2)*y` },
  ],
  parameters: [{ name: 'mu', value: -1 }],
});

describe('Hopf points: the normal form', () => {
  it.each([
    { omega: 1, l: -1, criticality: 'supercritical' },
    { omega: 2, l: -1, criticality: 'supercritical' },
    { omega: 1.5, l: 0.5, criticality: 'subcritical' },
  ])('ω = $omega, l = $l: located at μ = 0 with frequency ω and l1 = 2l/ω', ({ omega, l, criticality }) => {
    const [h, ...rest] = hopfs(run(normalForm(omega, l), 'mu', {}, -1, 1));
    expect(rest).toHaveLength(0);
    expectClose(h.parameter, 0, 0, 1e-10);
    expectClose(h.frequency, omega, 1e-10);
    expectClose(h.firstLyapunovCoefficient, (2 * l) / omega, 1e-6);
    expect(h.criticality).toBe(criticality);
    expect(h.residual).toBeLessThan(1e-12);
  });

  it('keeps the sign of l1 under a non-orthogonal change of coordinates', () => {
    // u = x + 0.5y, v = y: the same flow, written in (u, v); l1's sign is invariant (Kuznetsov §3.5).
    const model: ModelInput = {
      variables: [
        { name: 'u', rhs: '(mu*(u - 0.5*v) - 1.3*v - (u_x2))*(1) + 0.5*(1.3*(u - 0.5*v) + mu*v - r2*v)'.replace('(u_x2)', 'r2*(u - 0.5*v)') },
        { name: 'v', rhs: '1.3*(u - 0.5*v) + mu*v - r2*v' },
      ],
      parameters: [{ name: 'mu', value: -1 }],
      definitions: [{ name: 'r2', expression: '(u - 0.5*v)^2 + v^2' }],
    };
    const [h] = hopfs(run(model, 'mu', {}, -1, 1));
    expectClose(h.parameter, 0, 0, 1e-10);
    expectClose(h.frequency, 1.3, 1e-10);
    expect(h.criticality).toBe('supercritical');
  });

  it('reports a degenerate Hopf point when the cubic term vanishes', () => {
    // l = 0 with a quintic term instead: l1 = 0 (Kuznetsov §8.3, generalised Hopf).
    const model: ModelInput = {
      variables: [{ name: 'x', rhs: 'mu*x - y - (x^2 + y^2)^2*x' }, { name: 'y', rhs: 'x + mu*y - (x^2 + y^2)^2*y' }],
      parameters: [{ name: 'mu', value: -1 }],
    };
    const [h] = hopfs(run(model, 'mu', {}, -1, 1));
    expect(h.criticality).toBe('degenerate');
    expect(Math.abs(h.firstLyapunovCoefficient)).toBeLessThan(1e-8);
  });
});

describe('Hopf points: the Brusselator', () => {
  // ẋ = a − (b + 1)x + x²y, ẏ = bx − x²y: equilibrium (a, b/a), trace b − 1 − a², det a², so the
  // Hopf point is at b = 1 + a² with ω = a (closed form; common practice). It is supercritical
  // (from memory).
  it.each([1, 2])('a = %s: Hopf at b = 1 + a², ω = a, supercritical', (a) => {
    const model = { variables: [{ name: 'x', rhs: 'a - (b + 1)*x + x^2*y' }, { name: 'y', rhs: 'b*x - x^2*y' }], parameters: [{ name: 'a', value: a }, { name: 'b', value: 1 }] };
    const branch = run(model, 'b', { x: a, y: 1 / a }, 0.5, 3 + a * a);
    const [h, ...rest] = hopfs(branch);
    expect(rest).toHaveLength(0);
    expectClose(h.parameter, 1 + a * a, 1e-10);
    expectClose(h.state.x, a, 1e-10);
    expectClose(h.frequency, a, 1e-9);
    expect(h.criticality).toBe('supercritical');
    expect(h.firstLyapunovCoefficient).toBeLessThan(0);
    // Stable before, unstable (a complex pair on the right) after.
    expect(branch.points[h.after].stability).toBe('stable');
    expect(branch.points[h.after + 1].unstableDimension).toBe(2);
  });
});

describe('Hopf points: not confused with a neutral saddle', () => {
  it('reports nothing where a real pair ±κ has zero sum', () => {
    // ẋ = μx + y, ẏ = x + μy: eigenvalues μ ± 1 (closed form); at μ = 0 they are ±1, where the
    // bialternate-product test function det(2J ⊙ I) = Π(λi + λj) vanishes (a "neutral saddle",
    // Kuznetsov §10.2.2) but no complex pair crosses.
    const b = run({ variables: [{ name: 'x', rhs: 'mu*x + y' }, { name: 'y', rhs: 'x + mu*y' }], parameters: [{ name: 'mu', value: -0.5 }] }, 'mu', {}, -0.5, 0.5);
    expect(b.events).toEqual([]);
    expect(b.points.every((p) => p.unstableDimension === 1)).toBe(true);
  });
});

describe('Hopf points: two coupled Brusselators (four variables)', () => {
  it('finds the in-phase and anti-phase Hopf points of the closed form', () => {
    const [a, dx, dy] = [2, 0.1, 0.2];
    const branch = run(coupledBrusselators(a, dx, dy), 'b', { x1: a, y1: 0.5, x2: a, y2: 0.5 }, 0.5, 8);
    const found = hopfs(branch);
    expect(found).toHaveLength(2);
    expectClose(found[0].parameter, 1 + a * a, 1e-10);
    expectClose(found[0].frequency, a, 1e-9);
    const b2 = 1 + a * a + 2 * (dx + dy);
    expectClose(found[1].parameter, b2, 1e-10);
    // det of the anti-phase block [[b − 1 − 2dx, a²], [−b, −a² − 2dy]] at b2.
    const det = -(b2 - 1 - 2 * dx) * (a * a + 2 * dy) + b2 * a * a;
    expectClose(found[1].frequency, Math.sqrt(det), 1e-9);
    // The in-phase Hopf point is that of one Brusselator on the synchronous subspace: supercritical (from memory).
    expect(found[0].criticality).toBe('supercritical');
    expect(branch.points.at(-1)!.unstableDimension).toBe(4);
  });
});
