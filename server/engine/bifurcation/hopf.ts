import type { Eigenvalue } from '@shared/engine/contract.ts';
import type { Tolerances } from '../defaults.ts';
import type { CurveSystem } from '../continuation/curve-system.ts';
import { eigenvalues } from '../linalg/eigen.ts';
import { locateAlongCurve } from './cusp.ts';

/** Eigenvalues counted as a complex pair: |Im λ| > pairTolerance·max(1, |λ|max). */
const PAIR_TOLERANCE = 1e-7;

/** Number of eigenvalues with Im λ > 0 (one per complex pair) and Re λ > 0. */
export function unstablePairs(list: readonly Eigenvalue[], tol: Tolerances): number {
  const largest = Math.max(1, ...list.map((l) => Math.hypot(l.re, l.im)));
  return list.filter((l) => l.im > PAIR_TOLERANCE * largest && l.re > tol.neutral * largest).length;
}

/**
 * A Hopf crossing between two branch points: the number of unstable complex pairs changes while
 * the unstable dimension changes by twice as much (so a real eigenvalue through zero, a fold or
 * branch point, or two real eigenvalues of opposite sign, the "neutral saddle", never count).
 * Eigenvalue tracking, as an alternative to the bialternate-product test function (Kuznetsov,
 * Elements of Applied Bifurcation Theory, 3rd ed., §10.2.2) that also vanishes at neutral saddles.
 */
export function isHopfCrossing(a: { eigenvalues: Eigenvalue[]; unstableDimension: number }, b: { eigenvalues: Eigenvalue[]; unstableDimension: number }, tol: Tolerances): boolean {
  const dp = unstablePairs(b.eigenvalues, tol) - unstablePairs(a.eigenvalues, tol);
  return dp !== 0 && b.unstableDimension - a.unstableDimension === 2 * dp;
}

/**
 * Real part of the complex eigenvalue (Im λ > 0) of the Jacobian nearest the imaginary axis;
 * NaN when there is none. `jacobian(y, out)` fills the state Jacobian at curve point y.
 */
export function hopfTest(jacobian: (y: Float64Array, out: Float64Array) => void, n: number, tol: Tolerances): (y: Float64Array) => { re: number; im: number } {
  const jac = new Float64Array(n * n);
  return (y) => {
    jacobian(y, jac);
    const e = eigenvalues(jac, n, tol.eigenMaxIterations);
    let largest = 1;
    for (let i = 0; i < n; i++) largest = Math.max(largest, Math.hypot(e.re[i], e.im[i]));
    let best = { re: NaN, im: NaN };
    for (let i = 0; i < n; i++) {
      if (!(e.im[i] > PAIR_TOLERANCE * largest)) continue;
      if (!(Math.abs(e.re[i]) >= Math.abs(best.re))) best = { re: e.re[i], im: e.im[i] };
    }
    return best;
  };
}

/**
 * Locate a Hopf point between curve points a and b (a Hopf crossing, see isHopfCrossing) as the
 * zero of the real part of the crossing pair along the curve (Illinois regula falsi on the
 * curve's arclength, each trial point corrected onto the curve). Returns the point and ω, or
 * null when the test does not change sign.
 */
export function locateHopf(
  system: CurveSystem,
  a: { y: Float64Array; tangent: Float64Array },
  b: { y: Float64Array },
  jacobian: (y: Float64Array, out: Float64Array) => void,
  n: number,
  tol: Tolerances,
): { y: Float64Array; omega: number } | null {
  const test = hopfTest(jacobian, n, tol);
  const scale = Math.max(Math.abs(test(a.y).im), Math.abs(test(b.y).im), 1);
  const y = locateAlongCurve(system, a.y, a.tangent, b.y, (z) => test(z).re, scale, tol);
  if (!y) return null;
  const at = test(y);
  if (!(at.im > 0) || !(Math.abs(at.re) <= 1e-6 * scale)) return null;
  return { y, omega: at.im };
}
