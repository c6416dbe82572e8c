import { luFactor, luSolve } from './lu.ts';
import { norm2, normInf } from './vector.ts';

/**
 * Approximate null vector of a (nearly) singular square matrix by inverse iteration with a tiny
 * shift (Golub & Van Loan, Matrix Computations, 4th ed., §7.6.1). When the null space has more
 * than one dimension the result is some unit vector in it. |v|₂ = 1.
 */
export function nullVectorEstimate(matrix: Float64Array, n: number, iterations = 4): Float64Array {
  const shifted = matrix.slice(0, n * n);
  const size = Math.max(normInf(matrix), 1e-300);
  for (let i = 0; i < n; i++) shifted[i * n + i] += 1e-10 * size;
  const lu = luFactor(shifted, n, true);
  let v = Float64Array.from({ length: n }, (_, i) => 1 + i / (n + 1));
  for (let it = 0; it < iterations; it++) {
    const z = luSolve(lu, v);
    const len = norm2(z);
    if (!(len > 0) || !Number.isFinite(len)) break;
    v = z.map((c) => c / len);
  }
  return v;
}

/**
 * Orthonormal basis of the (approximate) null space of a real m×c matrix M (row-major) of
 * dimension `dim`, by subspace inverse iteration on MᵀM + εI with Gram–Schmidt
 * (Golub & Van Loan, §8.2.4, orthogonal iteration applied to the inverse). Accurate when the
 * `dim` smallest singular values are far below the others; squaring MᵀM limits the accuracy to
 * about sqrt(machine precision) × condition in the worst case, enough for branch directions.
 */
export function nullSpaceBasis(matrix: Float64Array, rows: number, cols: number, dim: number, iterations = 6): Float64Array[] {
  const g = new Float64Array(cols * cols);
  for (let i = 0; i < cols; i++)
    for (let j = i; j < cols; j++) {
      let s = 0;
      for (let r = 0; r < rows; r++) s += matrix[r * cols + i] * matrix[r * cols + j];
      g[i * cols + j] = s;
      g[j * cols + i] = s;
    }
  let basis: Float64Array[] = orthonormalize(Array.from({ length: dim }, (_, k) => Float64Array.from({ length: cols }, (_, i) => Math.sin(1 + (k + 1) * (i + 1) * 0.7))));
  const size = normInf(g);
  // A zero matrix: every vector is a null vector.
  if (!(size > 0)) return basis;
  for (let i = 0; i < cols; i++) g[i * cols + i] += 1e-13 * size;
  const lu = luFactor(g, cols, true);
  for (let it = 0; it < iterations; it++) basis = orthonormalize(basis.map((v) => luSolve(lu, v)));
  return basis;
}

/** Modified Gram–Schmidt, in order. */
export function orthonormalize(vectors: Float64Array[]): Float64Array[] {
  const out: Float64Array[] = [];
  for (const v0 of vectors) {
    const v = v0.slice();
    for (const u of out) {
      let d = 0;
      for (let i = 0; i < v.length; i++) d += u[i] * v[i];
      for (let i = 0; i < v.length; i++) v[i] -= d * u[i];
    }
    const len = norm2(v);
    for (let i = 0; i < v.length; i++) v[i] /= len;
    out.push(v);
  }
  return out;
}
