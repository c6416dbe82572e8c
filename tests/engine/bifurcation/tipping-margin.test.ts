import { describe, expect, it } from 'vitest';
import { analyze, type BranchEvent, type FoldEvent } from '@server/engine/index.ts';
import { continuationResultSchema } from '@shared/engine/contract.ts';
import { expectClose } from '../../support/tolerances.ts';

const folds = (events: BranchEvent[]) => events.filter((e): e is FoldEvent => e.kind === 'fold');

describe('fold sensitivities dμ*/dp = −(w·f_p)/(w·f_μ)', () => {
  it('matches the imperfect bifurcation closed form h_c(r) = ±(2r/3)·sqrt(r/3)', () => {
    // Strogatz, Nonlinear Dynamics and Chaos, §3.6 (imperfect bifurcation): ẋ = h + r x − x³ has
    // folds at h = ±(2r/3)·sqrt(r/3); differentiating, dh_c/dr = ±sqrt(r/3) (derived by hand).
    const model = { variables: [{ name: 'x', rhs: 'h + r*x - x^3' }], parameters: [{ name: 'h', value: -1 }, { name: 'r', value: 2 }] };
    const r = analyze({ model, task: { kind: 'continuation', parameter: 'h', start: { x: -2 }, bounds: { min: -1.5, max: 1.5 }, direction: 'increasing' } });
    expect(continuationResultSchema.safeParse(r).success).toBe(true);
    const [f1, f2] = folds(r.branch.events);
    const hc = (2 * 2) / 3 * Math.sqrt(2 / 3);
    expectClose(f1.parameter, hc, 1e-8);
    expectClose(f1.sensitivities!.r, Math.sqrt(2 / 3), 1e-7);
    expectClose(f2.parameter, -hc, 1e-8);
    expectClose(f2.sensitivities!.r, -Math.sqrt(2 / 3), 1e-7);
    expect(Object.keys(f1.sensitivities!)).toEqual(['r']);
  });

  it('matches the harvested logistic model h* = r/4 in three variables and a finite difference', () => {
    // Strogatz, Exercise 3.7.3 (fishery) with growth rate r: ẋ = r x(1 − x) − h, fold at h* = r/4,
    // so dh*/dr = 1/4 (closed form). Two fast linear variables y, z follow x and leave it unchanged.
    const model = {
      variables: [{ name: 'x', rhs: 'r*x*(1 - x) - h' }, { name: 'y', rhs: 'x - y' }, { name: 'z', rhs: 'y - 2*z + 0*c' }],
      parameters: [{ name: 'h', value: 0 }, { name: 'r', value: 1.5 }, { name: 'c', value: 0 }],
    };
    const fold = (rv: number) => {
      const res = analyze({ model: { ...model, parameters: [{ name: 'h', value: 0 }, { name: 'r', value: rv }, { name: 'c', value: 0 }] }, task: { kind: 'continuation', parameter: 'h', start: { x: 1, y: 1, z: 0.5 }, bounds: { min: -1, max: 1 } } });
      return folds(res.branch.events)[0];
    };
    const f = fold(1.5);
    expectClose(f.parameter, 1.5 / 4, 1e-8);
    expectClose(f.sensitivities!.r, 0.25, 1e-8);
    expectClose(f.sensitivities!.c, 0, 0, 1e-12);
    // Central difference of the located fold values (common practice).
    const d = (fold(1.5 + 1e-4).parameter - fold(1.5 - 1e-4).parameter) / 2e-4;
    expectClose(f.sensitivities!.r, d, 1e-6);
  });
});

describe('tipping margins along a branch', () => {
  // Strogatz §3.6 with r = 1: the S-shaped branch has folds at h = ±h_c, h_c = 2/(3√3).
  const model = { variables: [{ name: 'x', rhs: 'h + x - x^3' }], parameters: [{ name: 'h', value: -1 }] };
  const r = analyze({ model, task: { kind: 'continuation', parameter: 'h', start: { x: -1.3 }, bounds: { min: -1, max: 1 }, direction: 'increasing' } });
  const hc = 2 / (3 * Math.sqrt(3));
  const [f1, f2] = folds(r.branch.events);

  it('gives the distance to the fold ahead on each stretch, and null where none lies that way', () => {
    r.branch.points.forEach((p, i) => {
      const m = p.tippingMargin!;
      if (i <= f1.after) {
        // Lower stretch: it ends at the fold h = +h_c; decreasing h never tips.
        expectClose(m.increasing!, hc - p.parameter, 1e-8, 1e-9);
        expect(m.decreasing).toBeNull();
      } else if (i <= f2.after) {
        expectClose(m.increasing!, hc - p.parameter, 1e-8, 1e-9);
        expectClose(m.decreasing!, p.parameter + hc, 1e-8, 1e-9);
      } else {
        expect(m.increasing).toBeNull();
        expectClose(m.decreasing!, p.parameter + hc, 1e-8, 1e-9);
      }
    });
  });

  it('has no margins on a branch without folds', () => {
    const line = analyze({ model: { variables: [{ name: 'x', rhs: 'mu - x' }], parameters: [{ name: 'mu', value: 0 }] }, task: { kind: 'continuation', parameter: 'mu', bounds: { min: -1, max: 1 } } });
    for (const p of line.branch.points) expect(p.tippingMargin).toEqual({ increasing: null, decreasing: null });
  });
});
