/**
 * Copy of a square matrix scaled to largest entry 1, with entries below 1e-30 (relative) set to
 * zero, and the scale to multiply eigenvalues by. Keeps the eigenvalue iterations away from
 * underflow and subnormal numbers (a perturbation of 1e-30·‖A‖ moves an eigenvalue of a
 * non-defective matrix by about as much, and of a defective one by at most its square root).
 */
export function normalisedCopy(matrix: Float64Array, n: number): { a: Float64Array; scale: number } {
  const a = matrix.slice(0, n * n);
  let scale = 0;
  for (let i = 0; i < a.length; i++) scale = Math.max(scale, Math.abs(a[i]));
  if (scale === 0 || !Number.isFinite(scale)) return { a, scale: scale === 0 ? 1 : scale };
  for (let i = 0; i < a.length; i++) {
    const v = a[i] / scale;
    a[i] = Math.abs(v) < 1e-30 ? 0 : v;
  }
  return { a, scale };
}
