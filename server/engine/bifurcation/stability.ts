import type { Eigenvalue, Stability } from '@shared/engine/contract.ts';
import type { Tolerances } from '../defaults.ts';
import { eigenvalues } from '../linalg/eigen.ts';
import { isSymmetric, symmetricEigenvalues } from '../linalg/eigen-symmetric.ts';
import { symmetricBandedInertia } from '../linalg/banded-lu.ts';

/**
 * Above this many variables, a symmetric banded Jacobian (discretised diffusion) is judged by its
 * inertia (the signs of its LDLᵀ pivots, Sylvester's law) in O(n·k²) instead of all eigenvalues
 * in O(n³); such points report `eigenvalues: []` and the unstable dimension from the inertia.
 */
export const LARGE_EIGEN_MIN = 200;

export interface StabilityInfo {
  stability: Stability;
  eigenvalues: Eigenvalue[];
  unstableDimension: number;
}

/**
 * Linear stability of an equilibrium from the eigenvalues of its Jacobian (Lyapunov's indirect
 * method; Kuznetsov, Elements of Applied Bifurcation Theory, §1.5; Strogatz, Nonlinear Dynamics
 * and Chaos, §6.3): "stable" when every Re λ < −tol, "unstable" when some Re λ > tol, otherwise
 * "neutral" (linearisation inconclusive), tol = neutral·max(1, max|λ|). Eigenvalues are sorted by
 * decreasing real part, then decreasing imaginary part; unstableDimension counts Re λ > tol.
 * A symmetric Jacobian (gradient-like systems, discretised diffusion) takes the faster
 * symmetric solver; any other the nonsymmetric QR.
 */
export function stabilityOf(jacobian: Float64Array, n: number, tol: Tolerances, band?: { kl: number; ku: number }): StabilityInfo {
  if (band && n > LARGE_EIGEN_MIN && band.kl === band.ku && band.kl + band.ku + 1 <= n / 4 && bandSymmetric(jacobian, n, band.kl)) {
    const inertia = symmetricBandedInertia(jacobian, n, band.kl);
    const stability: Stability = inertia.positive > 0 ? 'unstable' : inertia.zero > 0 ? 'neutral' : 'stable';
    return { stability, eigenvalues: [], unstableDimension: inertia.positive };
  }
  const e = isSymmetric(jacobian, n) ? symmetric(jacobian, n, tol) : eigenvalues(jacobian, n, tol.eigenMaxIterations);
  const list: Eigenvalue[] = [];
  let largest = 0;
  let missing = false;
  for (let i = 0; i < n; i++) {
    // A QR iteration that did not converge leaves NaN for the eigenvalues it did not reach, and a
    // Jacobian with an infinite entry (e.g. sqrt at 0) gives infinite ones: both left out.
    if (!Number.isFinite(e.re[i]) || !Number.isFinite(e.im[i])) {
      missing = true;
      continue;
    }
    // Exact zeros print as 0, not -0.
    list.push({ re: e.re[i] + 0, im: e.im[i] + 0 });
    largest = Math.max(largest, Math.hypot(e.re[i], e.im[i]));
  }
  list.sort((a, b) => b.re - a.re || b.im - a.im);
  const threshold = tol.neutral * Math.max(1, largest);
  let unstable = 0;
  let neutral = 0;
  for (const l of list) {
    if (l.re > threshold) unstable++;
    else if (!(l.re < -threshold)) neutral++;
  }
  const stability: Stability = unstable > 0 ? 'unstable' : neutral > 0 || !e.converged || missing ? 'neutral' : 'stable';
  return { stability, eigenvalues: list, unstableDimension: unstable };
}

function symmetric(jacobian: Float64Array, n: number, tol: Tolerances) {
  const { values, converged } = symmetricEigenvalues(jacobian, n, tol.eigenMaxIterations);
  return { re: values, im: new Float64Array(n), converged };
}

/** J = Jᵀ within a band of half-width k (entries outside it are structurally zero). O(n·k). */
function bandSymmetric(a: Float64Array, n: number, k: number): boolean {
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j <= Math.min(n - 1, i + k); j++) {
      const x = a[i * n + j];
      const y = a[j * n + i];
      if (Math.abs(x - y) > 1e-13 * Math.max(Math.abs(x), Math.abs(y))) return false;
    }
  return true;
}
