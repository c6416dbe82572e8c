import { normalisedCopy } from './scale.ts';

/**
 * Eigenvalues of a real symmetric n×n matrix (row-major; only the lower triangle is read):
 * Householder reduction to tridiagonal form, then the implicit QL iteration with Wilkinson-like
 * shifts (Handbook algorithms `tred1`/`tql1`: Wilkinson & Reinsch, Handbook for Automatic
 * Computation II, 1971; Press et al., Numerical Recipes, 3rd ed., §11.3–11.4). Rows that are
 * already tridiagonal are not transformed, so tridiagonal input (e.g. discretised 1-D
 * diffusion) costs O(n²). About 4n³/3 flops otherwise, several times less than the
 * nonsymmetric QR. Eigenvalues are real and accurate to about ε·‖A‖.
 */
export function symmetricEigenvalues(matrix: Float64Array, n: number, maxIterations = 60): { values: Float64Array; converged: boolean } {
  const { a, scale } = normalisedCopy(matrix, n);
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  for (let i = n - 1; i >= 1; i--) {
    const l = i - 1;
    let full = false;
    for (let k = 0; k < l; k++) if (a[i * n + k] !== 0) full = true;
    if (!full) {
      e[i] = a[i * n + l];
      continue;
    }
    let scale = 0;
    let h = 0;
    for (let k = 0; k <= l; k++) scale += Math.abs(a[i * n + k]);
    for (let k = 0; k <= l; k++) {
      a[i * n + k] /= scale;
      h += a[i * n + k] * a[i * n + k];
    }
    let f = a[i * n + l];
    let g = f >= 0 ? -Math.sqrt(h) : Math.sqrt(h);
    e[i] = scale * g;
    h -= f * g;
    a[i * n + l] = f - g;
    f = 0;
    for (let j = 0; j <= l; j++) {
      g = 0;
      for (let k = 0; k <= j; k++) g += a[j * n + k] * a[i * n + k];
      for (let k = j + 1; k <= l; k++) g += a[k * n + j] * a[i * n + k];
      e[j] = g / h;
      f += e[j] * a[i * n + j];
    }
    const hh = f / (h + h);
    for (let j = 0; j <= l; j++) {
      f = a[i * n + j];
      e[j] = g = e[j] - hh * f;
      for (let k = 0; k <= j; k++) a[j * n + k] -= f * e[k] + g * a[i * n + k];
    }
  }
  for (let i = 0; i < n; i++) d[i] = a[i * n + i];
  const converged = tridiagonalQl(d, e, n, maxIterations);
  for (let i = 0; i < n; i++) d[i] *= scale;
  return { values: d, converged };
}

const sign = (a: number, b: number) => (b >= 0 ? Math.abs(a) : -Math.abs(a));

/** Implicit QL on the tridiagonal (d, e), e[i] coupling i−1 and i; eigenvalues left in d. */
function tridiagonalQl(d: Float64Array, e: Float64Array, n: number, maxIterations: number): boolean {
  for (let i = 1; i < n; i++) e[i - 1] = e[i];
  if (n > 0) e[n - 1] = 0;
  for (let l = 0; l < n; l++) {
    let iter = 0;
    let m: number;
    do {
      for (m = l; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) + dd === dd) break;
      }
      if (m !== l) {
        if (iter++ === maxIterations) return false;
        let g = (d[l + 1] - d[l]) / (2 * e[l]);
        let r = Math.hypot(g, 1);
        g = d[m] - d[l] + e[l] / (g + sign(r, g));
        let s = 1;
        let c = 1;
        let p = 0;
        let i: number;
        for (i = m - 1; i >= l; i--) {
          const f = s * e[i];
          const b = c * e[i];
          e[i + 1] = r = Math.hypot(f, g);
          if (r === 0) {
            d[i + 1] -= p;
            e[m] = 0;
            break;
          }
          s = f / r;
          c = g / r;
          g = d[i + 1] - p;
          r = (d[i] - g) * s + 2 * c * b;
          p = s * r;
          d[i + 1] = g + p;
          g = c * r - b;
        }
        if (r === 0 && i >= l) continue;
        d[l] -= p;
        e[l] = g;
        e[m] = 0;
      }
    } while (m !== l);
  }
  return true;
}

/** True when A equals Aᵀ up to 1e-14 relative in every entry. */
export function isSymmetric(a: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++)
    for (let j = 0; j < i; j++) {
      const x = a[i * n + j];
      const y = a[j * n + i];
      if (Math.abs(x - y) > 1e-14 * Math.max(Math.abs(x), Math.abs(y))) return false;
    }
  return true;
}
