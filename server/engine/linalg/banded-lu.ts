import { EngineUsageError } from '../errors.ts';

/**
 * Banded LU factorisation with partial (row) pivoting of an n×n matrix with kl sub- and ku
 * super-diagonals (Golub & Van Loan, Matrix Computations, 4th ed., §4.3, Algorithm 4.3.1 with
 * pivoting as in §4.3.5: the upper bandwidth of U grows to ku + kl). Storage: row i holds columns
 * i − kl … i + ku + kl at ab[i·w + (j − i + kl)], w = 2kl + ku + 1. Cost O(n·kl·(kl + ku)).
 */
export interface BandedLu {
  n: number;
  kl: number;
  ku: number;
  width: number;
  ab: Float64Array;
  pivot: Int32Array;
  /** A pivot was exactly zero. */
  singular: boolean;
  /** Sign of det(A) and log|det(A)| from the factors. */
  sign: number;
  log: number;
}

/** Band structure of a dense row-major n×n matrix (entries that are not exactly zero). */
export function bandwidth(a: Float64Array, n: number): { kl: number; ku: number } {
  let kl = 0;
  let ku = 0;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++)
      if (a[i * n + j] !== 0) {
        if (i - j > kl) kl = i - j;
        if (j - i > ku) ku = j - i;
      }
  return { kl, ku };
}

/** Factor the band of a dense row-major n×n matrix `a` (entries outside the band are ignored). */
export function bandedFactor(a: Float64Array, n: number, kl: number, ku: number, into?: BandedLu): BandedLu {
  if (a.length < n * n) throw new EngineUsageError('bandedFactor: matrix smaller than n×n', { n });
  const width = 2 * kl + ku + 1;
  const f: BandedLu = into && into.n === n && into.kl === kl && into.ku === ku ? into : { n, kl, ku, width, ab: new Float64Array(n * width), pivot: new Int32Array(n), singular: false, sign: 1, log: 0 };
  const { ab, pivot } = f;
  ab.fill(0);
  for (let i = 0; i < n; i++) {
    const lo = Math.max(0, i - kl);
    const hi = Math.min(n - 1, i + ku);
    for (let j = lo; j <= hi; j++) ab[i * width + (j - i + kl)] = a[i * n + j];
  }
  const at = (i: number, j: number) => i * width + (j - i + kl);
  let sign = 1;
  let log = 0;
  let singular = false;
  for (let k = 0; k < n; k++) {
    const last = Math.min(n - 1, k + kl);
    let p = k;
    let best = Math.abs(ab[at(k, k)]);
    for (let i = k + 1; i <= last; i++) {
      const v = Math.abs(ab[at(i, k)]);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    pivot[k] = p;
    const right = Math.min(n - 1, k + ku + kl);
    if (p !== k) {
      sign = -sign;
      for (let j = k; j <= right; j++) {
        const t = ab[at(k, j)];
        ab[at(k, j)] = ab[at(p, j)];
        ab[at(p, j)] = t;
      }
    }
    const d = ab[at(k, k)];
    if (d === 0) {
      singular = true;
      sign = 0;
      log = -Infinity;
      continue;
    }
    if (d < 0) sign = -sign;
    log += Math.log(Math.abs(d));
    for (let i = k + 1; i <= last; i++) {
      const m = ab[at(i, k)] / d;
      ab[at(i, k)] = m;
      if (m === 0) continue;
      for (let j = k + 1; j <= right; j++) ab[at(i, j)] -= m * ab[at(k, j)];
    }
  }
  f.singular = singular;
  f.sign = singular ? 0 : sign;
  f.log = log;
  return f;
}

/** Solve A·x = b with the banded factors; `out` may alias `b`. */
export function bandedSolve(f: BandedLu, b: ArrayLike<number>, out: Float64Array = new Float64Array(f.n)): Float64Array {
  const { n, kl, ku, width, ab, pivot } = f;
  if (out !== b) for (let i = 0; i < n; i++) out[i] = b[i];
  for (let k = 0; k < n; k++) {
    const p = pivot[k];
    if (p !== k) {
      const t = out[k];
      out[k] = out[p];
      out[p] = t;
    }
    const last = Math.min(n - 1, k + kl);
    for (let i = k + 1; i <= last; i++) out[i] -= ab[i * width + (k - i + kl)] * out[k];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = out[i];
    const right = Math.min(n - 1, i + ku + kl);
    for (let j = i + 1; j <= right; j++) s -= ab[i * width + (j - i + kl)] * out[j];
    out[i] = s / ab[i * width + kl];
  }
  return out;
}

/**
 * Inertia of a symmetric banded matrix from the pivots of its LDLᵀ factorisation without
 * pivoting (Sylvester's law of inertia; Golub & Van Loan §8.1.1 and §4.3): the numbers of
 * positive, negative and zero eigenvalues. Reliable when no pivot comes near zero, as for the
 * diagonally dominant or definite Jacobians of discretised diffusion away from folds; `zero`
 * counts pivots below 1e-12 of the matrix scale.
 */
export function symmetricBandedInertia(a: Float64Array, n: number, k: number): { positive: number; negative: number; zero: number } {
  // Upper band of A: row i, columns i … i + k, as d[i·(k+1) + (j − i)].
  const w = k + 1;
  const u = new Float64Array(n * w);
  let scale = 0;
  for (let i = 0; i < n; i++)
    for (let j = i; j <= Math.min(n - 1, i + k); j++) {
      u[i * w + (j - i)] = a[i * n + j];
      scale = Math.max(scale, Math.abs(a[i * n + j]));
    }
  let positive = 0;
  let negative = 0;
  let zero = 0;
  for (let r = 0; r < n; r++) {
    let d = u[r * w];
    if (Math.abs(d) <= 1e-12 * scale) {
      zero++;
      d = d < 0 ? -1e-12 * scale : 1e-12 * scale;
      u[r * w] = d;
    } else if (d > 0) positive++;
    else negative++;
    for (let i = r + 1; i <= Math.min(n - 1, r + k); i++) {
      const m = u[r * w + (i - r)] / d;
      for (let j = i; j <= Math.min(n - 1, r + k); j++) u[i * w + (j - i)] -= m * u[r * w + (j - r)];
    }
  }
  return { positive, negative, zero };
}
