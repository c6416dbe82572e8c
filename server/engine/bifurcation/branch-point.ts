import type { Tolerances } from '../defaults.ts';
import type { CurveSystem } from '../continuation/curve-system.ts';
import { correct, curveTangent } from '../continuation/pseudo-arclength.ts';
import { luFactor, luLogDeterminant } from '../linalg/lu.ts';
import { nullSpaceBasis, nullVectorEstimate } from '../linalg/null-vector.ts';
import { dot, norm2, normInf } from '../linalg/vector.ts';
import { locateAlongCurve } from './cusp.ts';

/**
 * Test function for simple branch points of a curve G(y) = 0, G: R^(N+1) → R^N: the determinant
 * of the augmented matrix [DG(y); tᵀ], t the unit tangent oriented continuously along the curve.
 * Along a regular curve it keeps its sign (folds included); at a simple branch point DG loses
 * rank and it changes sign while the parameter component of t does not (Allgower & Georg,
 * Introduction to Numerical Continuation Methods, §8.1; Kuznetsov, Elements of Applied
 * Bifurcation Theory, 3rd ed., §10.2.2). Returned as sign and log|det| to stay in range.
 */
export function branchTest(system: CurveSystem, y: Float64Array, tangent: Float64Array): { sign: number; log: number } {
  const structured = system.factorBordered?.(y, tangent);
  if (structured) return structured.determinant();
  const s = system.dimension;
  const m = new Float64Array(s * s);
  system.jacobian(y, m);
  m.set(tangent, (s - 1) * s);
  return luLogDeterminant(luFactor(m, s, true));
}

export type BranchPointType = 'transcritical' | 'pitchfork' | 'simple';

export interface LocatedBranchPoint {
  y: Float64Array;
  /** Unit branch directions: the followed branch's first (oriented along travel), then the other. */
  tangents: Float64Array[];
  type: BranchPointType;
}

/**
 * Locate a simple branch point between two consecutive curve points a, b whose test values have
 * opposite signs (Illinois regula falsi along the curve), then find both branch directions from
 * the algebraic bifurcation equation: with φ1, φ2 an orthonormal basis of ker DG and ψ with
 * ψᵀDG = 0, the directions αφ1 + βφ2 solve c11α² + 2c12αβ + c22β² = 0, c_ij = ψ·D²G(φi, φj)
 * (Keller 1977; Allgower & Georg, §8.3; Seydel, Practical Bifurcation and Stability Analysis,
 * §5.5). D²G(φi, ·) is the central difference of DG along φi. Returns null when the location or
 * the directions fail (e.g. not a simple branch point).
 */
export function locateBranchPoint(system: CurveSystem, a: { y: Float64Array; tangent: Float64Array }, b: { y: Float64Array; tangent: Float64Array }, parameterIndex: number, tol: Tolerances): LocatedBranchPoint | null {
  const size = system.dimension;
  const ref = branchTest(system, a.y, a.tangent).log;
  const test = (y: Float64Array) => {
    const t = curveTangent(system, y, a.tangent) ?? a.tangent;
    const d = branchTest(system, y, t);
    return d.sign * Math.exp(d.log - ref);
  };
  const y = locateAlongCurve(system, a.y, a.tangent, b.y, test, 1, tol);
  if (!y) return null;
  const rows = size - 1;
  const dg = new Float64Array(rows * size);
  system.jacobian(y, dg);
  const [phi1, phi2] = nullSpaceBasis(dg, rows, size, 2);
  const ddt = new Float64Array(rows * rows);
  for (let i = 0; i < rows; i++)
    for (let j = 0; j < rows; j++) ddt[i * rows + j] = dot(dg.subarray(i * size, (i + 1) * size), dg.subarray(j * size, (j + 1) * size));
  const psi = nullVectorEstimate(ddt, rows);
  const c = bilinearCoefficients(system, y, psi, [phi1, phi2]);
  const disc = c[0][1] ** 2 - c[0][0] * c[1][1];
  const scale = Math.max(Math.abs(c[0][0]), Math.abs(c[0][1]), Math.abs(c[1][1]));
  if (!(scale > 0) || !(disc > tol.degenerate * scale * scale)) return null;
  const root = Math.sqrt(disc);
  const pairs: Array<[number, number]> =
    Math.abs(c[0][0]) >= Math.abs(c[1][1])
      ? [[-c[0][1] + root, c[0][0]], [-c[0][1] - root, c[0][0]]]
      : [[c[1][1], -c[0][1] + root], [c[1][1], -c[0][1] - root]];
  let directions = pairs.map(([al, be]) => {
    const v = new Float64Array(size);
    for (let i = 0; i < size; i++) v[i] = al * phi1[i] + be * phi2[i];
    const len = norm2(v);
    return v.map((x) => x / len);
  });
  // The followed branch first, oriented along travel; the other with a non-negative parameter component.
  if (Math.abs(dot(directions[1], a.tangent)) > Math.abs(dot(directions[0], a.tangent))) directions = [directions[1], directions[0]];
  if (dot(directions[0], a.tangent) < 0) directions[0] = directions[0].map((x) => -x);
  const other = directions[1];
  let largest = 0;
  for (let i = 1; i < size; i++) if (Math.abs(other[i]) > Math.abs(other[largest]) * (1 + 1e-9)) largest = i;
  const flip = Math.abs(other[parameterIndex]) > 1e-8 ? other[parameterIndex] < 0 : other[largest] < 0;
  if (flip) directions[1] = other.map((x) => -x);
  return { y, tangents: directions, type: classify(system, y, directions, parameterIndex, tol) };
}

/** c_ij = ψ·D²G(φ_i, φ_j), D²G(φ_i, ·) = (DG(y + hφ_i) − DG(y − hφ_i))/(2h). */
function bilinearCoefficients(system: CurveSystem, y: Float64Array, psi: Float64Array, phis: Float64Array[]): number[][] {
  const size = system.dimension;
  const rows = size - 1;
  const h = 1e-5 * (1 + normInf(y));
  const plus = new Float64Array(rows * size);
  const minus = new Float64Array(rows * size);
  const c = phis.map(() => phis.map(() => 0));
  phis.forEach((pi, i) => {
    system.jacobian(y.map((v, k) => v + h * pi[k]), plus);
    system.jacobian(y.map((v, k) => v - h * pi[k]), minus);
    phis.forEach((pj, j) => {
      let s = 0;
      for (let r = 0; r < rows; r++) {
        let row = 0;
        for (let k = 0; k < size; k++) row += (plus[r * size + k] - minus[r * size + k]) * pj[k];
        s += psi[r] * (row / (2 * h));
      }
      c[i][j] = s;
    });
  });
  const sym = (c[0][1] + c[1][0]) / 2;
  return [[c[0][0], sym], [sym, c[1][1]]];
}

/**
 * Probe each branch a short way on both sides of the branch point: the parameter moving to
 * opposite sides on both branches is the transcritical picture; moving to the same side on both
 * ends of one branch (a parabola opening one way) is the pitchfork picture (Strogatz, Nonlinear
 * Dynamics and Chaos, §3.2, §3.4). Anything else, or a probe that fails, is "simple".
 */
function classify(system: CurveSystem, y: Float64Array, directions: Float64Array[], k: number, tol: Tolerances): BranchPointType {
  const h = 1e-3 * (1 + normInf(y));
  const mu = y[k];
  const even: boolean[] = [];
  for (const t of directions) {
    const offsets: number[] = [];
    for (const sign of [1, -1]) {
      const z = y.map((v, i) => v + sign * h * t[i]);
      const { converged } = correct(system, z, t, dot(t, z), tol.newtonMaxIterations, tol);
      if (!converged) return 'simple';
      offsets.push(z[k] - mu);
    }
    if (Math.max(Math.abs(offsets[0]), Math.abs(offsets[1])) <= 1e-12 * (1 + Math.abs(mu))) return 'simple';
    even.push(offsets[0] * offsets[1] > 0);
  }
  if (!even[0] && !even[1]) return 'transcritical';
  if (even[0] !== even[1]) return 'pitchfork';
  return 'simple';
}
