import { normalisedCopy } from './scale.ts';

/**
 * Eigenvalues of a real, generally nonsymmetric n×n matrix (row-major): balancing, reduction to
 * upper Hessenberg form by stabilised elementary similarity transforms, then the Francis
 * double-shift QR iteration. Follows the Handbook algorithms `balanc`, `elmhes` and `hqr`
 * (Wilkinson & Reinsch, Handbook for Automatic Computation II, Linear Algebra, 1971; also
 * Press et al., Numerical Recipes, 3rd ed., §11.6–11.7). Cost about 10n³ flops.
 *
 * Accuracy: backward stable; a well-conditioned eigenvalue is accurate to about
 * ε·‖A‖ (ε = 2.2e-16). A failure to converge (very rare) is returned as `converged: false`
 * with the eigenvalues found so far left as NaN.
 */
export interface Eigenvalues {
  re: Float64Array;
  im: Float64Array;
  converged: boolean;
}

export function eigenvalues(matrix: Float64Array, n: number, maxIterations = 60): Eigenvalues {
  const { a, scale } = normalisedCopy(matrix, n);
  balance(a, n);
  toHessenberg(a, n);
  const e = hessenbergQr(a, n, maxIterations);
  for (let i = 0; i < n; i++) {
    e.re[i] *= scale;
    e.im[i] *= scale;
  }
  return e;
}

/** Scale rows and columns by powers of 2 so their norms are comparable (exact, similarity). */
function balance(a: Float64Array, n: number): void {
  const RADIX = 2;
  const SQRDX = RADIX * RADIX;
  let done = false;
  while (!done) {
    done = true;
    for (let i = 0; i < n; i++) {
      let r = 0;
      let c = 0;
      for (let j = 0; j < n; j++)
        if (j !== i) {
          c += Math.abs(a[j * n + i]);
          r += Math.abs(a[i * n + j]);
        }
      if (c !== 0 && r !== 0) {
        let g = r / RADIX;
        let f = 1;
        const s = c + r;
        while (c < g) {
          f *= RADIX;
          c *= SQRDX;
        }
        g = r * RADIX;
        while (c > g) {
          f /= RADIX;
          c /= SQRDX;
        }
        if ((c + r) / f < 0.95 * s) {
          done = false;
          g = 1 / f;
          for (let j = 0; j < n; j++) a[i * n + j] *= g;
          for (let j = 0; j < n; j++) a[j * n + i] *= f;
        }
      }
    }
  }
}

/** Reduce to upper Hessenberg form by Gaussian elimination with pivoting; zero the rest. */
function toHessenberg(a: Float64Array, n: number): void {
  for (let m = 1; m < n - 1; m++) {
    let x = 0;
    let i = m;
    for (let j = m; j < n; j++) {
      if (Math.abs(a[j * n + m - 1]) > Math.abs(x)) {
        x = a[j * n + m - 1];
        i = j;
      }
    }
    if (i !== m) {
      for (let j = m - 1; j < n; j++) {
        const t = a[i * n + j];
        a[i * n + j] = a[m * n + j];
        a[m * n + j] = t;
      }
      for (let j = 0; j < n; j++) {
        const t = a[j * n + i];
        a[j * n + i] = a[j * n + m];
        a[j * n + m] = t;
      }
    }
    if (x !== 0) {
      for (i = m + 1; i < n; i++) {
        let y = a[i * n + m - 1];
        if (y !== 0) {
          y /= x;
          a[i * n + m - 1] = y;
          for (let j = m; j < n; j++) a[i * n + j] -= y * a[m * n + j];
          for (let j = 0; j < n; j++) a[j * n + m] += y * a[j * n + i];
        }
      }
    }
  }
  for (let i = 2; i < n; i++) for (let j = 0; j < i - 1; j++) a[i * n + j] = 0;
}

const sign = (a: number, b: number) => (b >= 0 ? Math.abs(a) : -Math.abs(a));

/** Francis double-shift QR on an upper Hessenberg matrix (destroyed). */
function hessenbergQr(a: Float64Array, n: number, maxIterations: number): Eigenvalues {
  const wr = new Float64Array(n).fill(NaN);
  const wi = new Float64Array(n).fill(NaN);
  let anorm = 0;
  for (let i = 0; i < n; i++) for (let j = Math.max(i - 1, 0); j < n; j++) anorm += Math.abs(a[i * n + j]);
  let nn = n - 1;
  let t = 0;
  let p = 0;
  let q = 0;
  let r = 0;
  let s = 0;
  let w = 0;
  let x = 0;
  let y = 0;
  let z = 0;
  while (nn >= 0) {
    let its = 0;
    let l: number;
    do {
      for (l = nn; l >= 1; l--) {
        s = Math.abs(a[(l - 1) * n + l - 1]) + Math.abs(a[l * n + l]);
        if (s === 0) s = anorm;
        if (Math.abs(a[l * n + l - 1]) + s === s) {
          a[l * n + l - 1] = 0;
          break;
        }
      }
      x = a[nn * n + nn];
      if (l === nn) {
        wr[nn] = x + t;
        wi[nn] = 0;
        nn--;
      } else {
        y = a[(nn - 1) * n + nn - 1];
        w = a[nn * n + nn - 1] * a[(nn - 1) * n + nn];
        if (l === nn - 1) {
          p = 0.5 * (y - x);
          q = p * p + w;
          z = Math.sqrt(Math.abs(q));
          x += t;
          if (q >= 0) {
            z = p + sign(z, p);
            wr[nn - 1] = wr[nn] = x + z;
            if (z !== 0) wr[nn] = x - w / z;
            wi[nn - 1] = wi[nn] = 0;
          } else {
            wr[nn - 1] = wr[nn] = x + p;
            wi[nn - 1] = -z;
            wi[nn] = z;
          }
          nn -= 2;
        } else {
          if (its === maxIterations) return { re: wr, im: wi, converged: false };
          if (its === 10 || its === 20) {
            t += x;
            for (let i = 0; i <= nn; i++) a[i * n + i] -= x;
            s = Math.abs(a[nn * n + nn - 1]) + Math.abs(a[(nn - 1) * n + nn - 2]);
            y = x = 0.75 * s;
            w = -0.4375 * s * s;
          }
          ++its;
          let m: number;
          for (m = nn - 2; m >= l; m--) {
            z = a[m * n + m];
            r = x - z;
            s = y - z;
            p = (r * s - w) / a[(m + 1) * n + m] + a[m * n + m + 1];
            q = a[(m + 1) * n + m + 1] - z - r - s;
            r = a[(m + 2) * n + m + 1];
            s = Math.abs(p) + Math.abs(q) + Math.abs(r);
            p /= s;
            q /= s;
            r /= s;
            if (m === l) break;
            const u = Math.abs(a[m * n + m - 1]) * (Math.abs(q) + Math.abs(r));
            const v = Math.abs(p) * (Math.abs(a[(m - 1) * n + m - 1]) + Math.abs(z) + Math.abs(a[(m + 1) * n + m + 1]));
            if (u + v === v) break;
          }
          for (let i = m + 2; i <= nn; i++) {
            a[i * n + i - 2] = 0;
            if (i !== m + 2) a[i * n + i - 3] = 0;
          }
          for (let k = m; k <= nn - 1; k++) {
            if (k !== m) {
              p = a[k * n + k - 1];
              q = a[(k + 1) * n + k - 1];
              r = 0;
              if (k !== nn - 1) r = a[(k + 2) * n + k - 1];
              x = Math.abs(p) + Math.abs(q) + Math.abs(r);
              if (x !== 0) {
                p /= x;
                q /= x;
                r /= x;
              }
            }
            s = sign(Math.sqrt(p * p + q * q + r * r), p);
            if (s !== 0) {
              if (k === m) {
                if (l !== m) a[k * n + k - 1] = -a[k * n + k - 1];
              } else a[k * n + k - 1] = -s * x;
              p += s;
              x = p / s;
              y = q / s;
              z = r / s;
              q /= p;
              r /= p;
              for (let j = k; j <= nn; j++) {
                p = a[k * n + j] + q * a[(k + 1) * n + j];
                if (k !== nn - 1) {
                  p += r * a[(k + 2) * n + j];
                  a[(k + 2) * n + j] -= p * z;
                }
                a[(k + 1) * n + j] -= p * y;
                a[k * n + j] -= p * x;
              }
              const mmin = nn < k + 3 ? nn : k + 3;
              for (let i = l; i <= mmin; i++) {
                p = x * a[i * n + k] + y * a[i * n + k + 1];
                if (k !== nn - 1) {
                  p += z * a[i * n + k + 2];
                  a[i * n + k + 2] -= p * r;
                }
                a[i * n + k + 1] -= p * q;
                a[i * n + k] -= p;
              }
            }
          }
        }
      }
    } while (l < nn - 1);
  }
  return { re: wr, im: wi, converged: true };
}
