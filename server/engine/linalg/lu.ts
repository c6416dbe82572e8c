import { EngineUsageError } from '../errors.ts';

/**
 * Dense LU factorisation with partial (row) pivoting, P·A = L·U, in place on a row-major n×n
 * Float64Array (Golub & Van Loan, Matrix Computations, 4th ed., Algorithm 3.4.1).
 * A zero or tiny pivot is reported as a value (`singular: true`), not thrown: near folds the
 * Jacobian is singular by nature and callers decide what to do.
 */
export interface LuFactors {
  n: number;
  /** L (unit lower, below the diagonal) and U (on and above), row-major. */
  lu: Float64Array;
  /** Row i of P·A is row pivot[i] of A. */
  pivot: Int32Array;
  singular: boolean;
  /** Smallest |pivot| / largest |pivot|, a cheap conditioning hint. */
  pivotRatio: number;
}

/** Factor a (copied unless `inPlace`). */
export function luFactor(a: Float64Array, n: number, inPlace = false, into?: LuFactors): LuFactors {
  if (a.length < n * n) throw new EngineUsageError('luFactor: matrix smaller than n×n', { n, length: a.length });
  const lu = inPlace ? a : into && into.lu.length >= n * n ? (into.lu.set(a.subarray(0, n * n)), into.lu) : a.slice(0, n * n);
  const pivot = into && into.pivot.length >= n ? into.pivot : new Int32Array(n);
  for (let i = 0; i < n; i++) pivot[i] = i;
  let minPivot = Infinity;
  let maxPivot = 0;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(lu[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (p !== k) {
      const rk = k * n;
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const t = lu[rk + j];
        lu[rk + j] = lu[rp + j];
        lu[rp + j] = t;
      }
      const t = pivot[k];
      pivot[k] = pivot[p];
      pivot[p] = t;
    }
    minPivot = Math.min(minPivot, best);
    maxPivot = Math.max(maxPivot, best);
    if (best === 0) continue;
    const rk = k * n;
    const inv = 1 / lu[rk + k];
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const m = lu[ri + k] * inv;
      if (m === 0) continue;
      lu[ri + k] = m;
      for (let j = k + 1; j < n; j++) lu[ri + j] -= m * lu[rk + j];
    }
  }
  const pivotRatio = maxPivot === 0 ? 0 : minPivot / maxPivot;
  const result = into ?? ({} as LuFactors);
  result.n = n;
  result.lu = lu;
  result.pivot = pivot;
  result.pivotRatio = pivotRatio;
  result.singular = !(pivotRatio > 1e-15);
  return result;
}

/** Solve A·x = b with the factors; `out` may alias `b`. Results are non-finite if A is singular. */
export function luSolve(f: LuFactors, b: Float64Array, out: Float64Array = new Float64Array(f.n)): Float64Array {
  const { n, lu, pivot } = f;
  const y = out === b ? b.slice(0, n) : b;
  for (let i = 0; i < n; i++) out[i] = y[pivot[i]];
  for (let i = 1; i < n; i++) {
    let s = out[i];
    const ri = i * n;
    for (let j = 0; j < i; j++) s -= lu[ri + j] * out[j];
    out[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = out[i];
    const ri = i * n;
    for (let j = i + 1; j < n; j++) s -= lu[ri + j] * out[j];
    out[i] = s / lu[ri + i];
  }
  return out;
}

/** Solve Aᵀ·x = b with the factors of A. */
export function luSolveTransposed(f: LuFactors, b: Float64Array, out: Float64Array = new Float64Array(f.n)): Float64Array {
  const { n, lu, pivot } = f;
  const z = new Float64Array(n);
  // Aᵀ = Uᵀ Lᵀ P: solve Uᵀ z = b, then Lᵀ y = z, then x = Pᵀ y.
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let j = 0; j < i; j++) s -= lu[j * n + i] * z[j];
    z[i] = s / lu[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = z[i];
    for (let j = i + 1; j < n; j++) s -= lu[j * n + i] * z[j];
    z[i] = s;
  }
  for (let i = 0; i < n; i++) out[pivot[i]] = z[i];
  return out;
}

/**
 * log|det A| and the sign of det A from the factors (product of U's diagonal times the sign of
 * the row permutation). The logarithm keeps large systems free of overflow and underflow; a zero
 * pivot gives sign 0 and log −∞.
 */
export function luLogDeterminant(f: LuFactors): { sign: number; log: number } {
  const { n, lu, pivot } = f;
  let sign = 1;
  let log = 0;
  for (let i = 0; i < n; i++) {
    const d = lu[i * n + i];
    if (d === 0) return { sign: 0, log: -Infinity };
    if (d < 0) sign = -sign;
    log += Math.log(Math.abs(d));
  }
  // Parity of the permutation from its cycles.
  const seen = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (seen[i]) continue;
    let length = 0;
    for (let j = i; !seen[j]; j = pivot[j]) {
      seen[j] = 1;
      length++;
    }
    if (length % 2 === 0) sign = -sign;
  }
  return { sign, log };
}
