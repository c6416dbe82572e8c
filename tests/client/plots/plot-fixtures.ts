import type { BranchPoint, ContinuationResult, FoldCurveResult, FoldEvent } from '@shared/engine/contract.ts';

/**
 * Synthetic engine results built from closed forms, so plot specs can be checked against
 * known geometry.
 *
 * Saddle-node normal form x' = μ − x² (S. H. Strogatz, "Nonlinear Dynamics and Chaos", 2nd ed.,
 * §3.1): equilibria x = ±√μ for μ > 0; f'(x) = −2x, so x = +√μ is stable and x = −√μ unstable;
 * fold at μ* = 0, x* = 0 with v = w = 1, a = w·f_μ = 1, b = w·f_xx = −2, and the pair exists
 * where −a(μ−μ*)/b > 0, i.e. μ > 0 ("above").
 */
export function saddleNodeBranch(n = 81, muMax = 1): ContinuationResult {
  const points: BranchPoint[] = [];
  for (let i = 0; i < n; i++) {
    // Walk from the lower (unstable) half through the fold to the upper (stable) half.
    const s = -1 + (2 * i) / (n - 1);
    const x = s * Math.sqrt(muMax);
    const mu = x * x;
    const stability = x > 0 ? 'stable' : x < 0 ? 'unstable' : 'neutral';
    points.push({
      parameter: mu,
      state: { x },
      stability,
      eigenvalues: [{ re: -2 * x, im: 0 }],
      unstableDimension: x < 0 ? 1 : 0,
      residual: 0,
    });
  }
  const fold: FoldEvent = {
    kind: 'fold',
    parameter: 0,
    state: { x: 0 },
    after: (n - 1) / 2 - 1,
    eigenvalues: [{ re: 0, im: 0 }],
    normalForm: {
      a: 1,
      b: -2,
      nullVector: { x: 1 },
      adjointNullVector: { x: 1 },
      equilibriaSide: 'above',
      nondegenerate: true,
    },
    residual: 0,
  };
  return {
    branch: { points, events: [fold], stopReason: 'bounds', stopReasonAtStart: 'bounds' },
    engine: { version: 'test', elapsedMs: 1 },
  };
}

/** The same fold mirrored: x' = −μ − x², pair exists for μ < 0 ("below"); a = −1, b = −2. */
export function mirroredSaddleNodeBranch(): ContinuationResult {
  const r = saddleNodeBranch();
  r.branch.points = r.branch.points.map((p) => ({ ...p, parameter: -p.parameter }));
  r.branch.events = r.branch.events.map((e) =>
    e.kind === 'fold'
      ? { ...e, normalForm: { ...e.normalForm, a: -1, equilibriaSide: 'below' as const } }
      : e,
  );
  return r;
}

/**
 * Fold curve of the cusp normal form x' = h + r·x − x³ (Strogatz §3.6, imperfect bifurcation):
 * f = 0 and f_x = 0 give r = 3x², h = −2x³, so the curve is h = ±2(r/3)^{3/2} with a cusp at
 * r = h = 0; three equilibria (two stable) for |h| < 2(r/3)^{3/2}. With v = w = 1 the normal
 * form along the curve is a = f_r = x (first parameter r), b = f_xx = −6x, so −a/b = 1/6 > 0:
 * the extra pair lies towards larger r.
 */
export function cuspFoldCurve(n = 201, xMax = 1): FoldCurveResult {
  const points = [];
  for (let i = 0; i < n; i++) {
    const x = -xMax + (2 * xMax * i) / (n - 1);
    points.push({
      parameters: { r: 3 * x * x, h: -2 * x ** 3 },
      state: { x },
      normalForm: { a: x, b: -6 * x },
      residual: 0,
    });
  }
  return {
    curve: {
      points,
      events: [{ kind: 'cusp', parameters: { r: 0, h: 0 }, state: { x: 0 }, after: (n - 1) / 2 - 1 }],
      stopReason: 'bounds',
      stopReasonAtStart: 'bounds',
    },
    engine: { version: 'test', elapsedMs: 1 },
  };
}

/** The first event of a fixture branch, which is a fold. */
export function firstFold(r: ContinuationResult): FoldEvent {
  const e = r.branch.events[0];
  if (e.kind !== 'fold') throw new Error('the fixture starts with a fold');
  return e;
}
