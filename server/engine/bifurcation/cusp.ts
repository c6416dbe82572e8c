import type { Tolerances } from '../defaults.ts';
import { correct } from '../continuation/pseudo-arclength.ts';
import type { CurveSystem } from '../continuation/curve-system.ts';
import { dot } from '../linalg/vector.ts';

/**
 * Locate a zero of a scalar test function along a curve G(y) = 0 between two of its points:
 * points of the curve are parametrised by the arclength-like s, z(s) = the corrector's solution
 * of G(z) = 0, t·(z − (ya + s·t)) = 0, and the zero of test(z(s)) on (0, t·(yb − ya)) is found by
 * the Illinois variant of regula falsi (Dowell & Jarratt 1971), which keeps a bracket.
 * Used for the cusp, where the fold's quadratic coefficient b changes sign along a fold curve
 * (Kuznetsov, Elements of Applied Bifurcation Theory, 3rd ed., §8.2 and §10.2.3).
 * A trial point whose corrector fails or moves it more than a quarter of the bracket (onto
 * another branch) is replaced by the bisection point. Returns null when that fails too or the
 * test does not change sign.
 */
export function locateAlongCurve(
  system: CurveSystem,
  ya: Float64Array,
  tangent: Float64Array,
  yb: Float64Array,
  test: (y: Float64Array) => number,
  scale: number,
  tol: Tolerances,
): Float64Array | null {
  const size = ya.length;
  let sb = dot(tangent, yb) - dot(tangent, ya);
  const span = Math.abs(sb);
  const base0 = dot(tangent, ya);
  // The bracket's end points on the curve: trial points are predicted from the nearer one, so the
  // prediction error shrinks with the bracket (and stays small against a nearly singular
  // corrector close to a branch point).
  let za = ya;
  let zb = yb;
  /** The curve point at s, or null when the corrector fails or leaves for another branch. */
  const pointAt = (s: number): Float64Array | null => {
    const from = Math.abs(s - sa) <= Math.abs(s - sb) ? { z: za, s: sa } : { z: zb, s: sb };
    const z = new Float64Array(size);
    for (let i = 0; i < size; i++) z[i] = from.z[i] + (s - from.s) * tangent[i];
    const start = z.slice();
    const { converged } = correct(system, z, tangent, base0 + s, tol.newtonMaxIterations, tol);
    if (!converged) return null;
    let moved = 0;
    for (let i = 0; i < size; i++) moved += (z[i] - start[i]) ** 2;
    return Math.sqrt(moved) <= 0.25 * span ? z : null;
  };
  let sa = 0;
  let fa = test(ya);
  let fb = test(yb);
  if (!(fa * fb < 0)) return null;
  let side = 0;
  let best: Float64Array = Math.abs(fa) < Math.abs(fb) ? ya : yb;
  for (let it = 0; it < 60; it++) {
    let s = (sa * fb - sb * fa) / (fb - fa);
    let z = pointAt(s);
    // Near a branch point the corrector may leave for the other branch: fall back to bisection.
    if (!z) z = pointAt((s = (sa + sb) / 2));
    if (!z) return null;
    const fs = test(z);
    best = z;
    if (Math.abs(fs) <= tol.cusp * scale || Math.abs(sb - sa) <= 1e-14 * (1 + Math.abs(sb))) return z;
    if (fs * fb < 0) {
      sa = sb;
      fa = fb;
      za = zb;
      if (side === -1) fa /= 2;
      side = -1;
    } else {
      if (side === 1) fa /= 2;
      side = 1;
    }
    sb = s;
    fb = fs;
    zb = z;
  }
  return best;
}
