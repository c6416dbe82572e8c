import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { eigenvalues } from '@server/engine/linalg/eigen.ts';
import { isSymmetric, symmetricEigenvalues } from '@server/engine/linalg/eigen-symmetric.ts';
import { expectClose } from '../../support/tolerances.ts';

const sorted = (re: ArrayLike<number>, im: ArrayLike<number>) =>
  Array.from(re, (r, i) => [r, im[i]] as const).sort((a, b) => a[0] - b[0] || a[1] - b[1]);

describe('eigenvalues', () => {
  it('agrees with ml-matrix EigenvalueDecomposition on random dense nonsymmetric matrices', () => {
    // Reference library: ml-matrix 6.12.1 (a port of JAMA's EigenvalueDecomposition). Dense
    // random matrices are generically non-defective, so both must agree to ~1e-8·‖A‖.
    let seed = 12345;
    const next = () => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return (seed / 2147483648) * 20 - 10;
    };
    for (let trial = 0; trial < 300; trial++) {
      const n = 1 + (trial % 16);
      const entries = Array.from({ length: n * n }, next);
      const mine = eigenvalues(Float64Array.from(entries), n);
      expect(mine.converged).toBe(true);
      const ref = new EigenvalueDecomposition(new Matrix(Array.from({ length: n }, (_, i) => entries.slice(i * n, i * n + n))));
      const ours = sorted(mine.re, mine.im);
      const scale = 1 + Math.max(...entries.map(Math.abs)) * n;
      for (const [r, i] of sorted(ref.realEigenvalues, ref.imaginaryEigenvalues)) {
        const d = Math.min(...ours.map(([a, b]) => Math.hypot(a - r, b - i)));
        expect(d).toBeLessThanOrEqual(1e-8 * scale);
      }
    }
  });

  it('keeps trace and conjugate symmetry for any matrix, sparse and defective ones included (property)', () => {
    // Invariants (common practice): Σλ = trace A, and complex eigenvalues come in conjugate pairs.
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10 }).chain((n) => fc.tuple(fc.constant(n), fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n * n, maxLength: n * n }))), ([n, entries]) => {
        const e = eigenvalues(Float64Array.from(entries), n);
        expect(e.converged).toBe(true);
        const norm = 1 + Math.max(...entries.map(Math.abs)) * n;
        let trace = 0;
        for (let i = 0; i < n; i++) trace += entries[i * n + i];
        // The sum of the eigenvalues is the trace (closed form), their imaginary parts cancel.
        expect(Math.abs(e.re.reduce((s, v) => s + v, 0) - trace)).toBeLessThanOrEqual(1e-9 * norm * n);
        expect(Math.abs(e.im.reduce((s, v) => s + v, 0))).toBeLessThanOrEqual(1e-9 * norm * n);
      }),
      { numRuns: 300 },
    );
  });

  it('finds the closed-form spectrum of a nonsymmetric tridiagonal Toeplitz matrix', () => {
    // λ_k = a + 2·sqrt(b·c)·cos(kπ/(n+1)), k = 1…n (G. D. Smith, Numerical Solution of PDEs, §2.11;
    // common practice). a = −2, sub-diagonal b = 1, super-diagonal c = 0.5, n = 20.
    const n = 20;
    const m = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      m[i * n + i] = -2;
      if (i > 0) m[i * n + i - 1] = 1;
      if (i < n - 1) m[i * n + i + 1] = 0.5;
    }
    const e = eigenvalues(m, n);
    const exact = Array.from({ length: n }, (_, k) => -2 + 2 * Math.sqrt(0.5) * Math.cos(((k + 1) * Math.PI) / (n + 1))).sort((a, b) => a - b);
    const ours = sorted(e.re, e.im);
    ours.forEach(([re, im], k) => {
      expectClose(re, exact[k], 1e-10, 1e-10);
      expect(Math.abs(im)).toBeLessThanOrEqual(1e-10);
    });
  });

  it('finds complex pairs and roots of a companion matrix', () => {
    // Rotation generator [[0, −1], [1, 0]] has ±i; the companion matrix of
    // (λ−1)(λ−2)(λ−3) = λ³ − 6λ² + 11λ − 6 has 1, 2, 3 (closed forms).
    const rot = eigenvalues(Float64Array.of(0, -1, 1, 0), 2);
    expect(sorted(rot.re, rot.im).map(([r, i]) => [r + 0, i])).toEqual([[0, -1], [0, 1]]);
    const comp = eigenvalues(Float64Array.of(6, -11, 6, 1, 0, 0, 0, 1, 0), 3);
    sorted(comp.re, comp.im).forEach(([r, i], k) => {
      expectClose(r, k + 1, 1e-12);
      expect(i).toBe(0);
    });
  });
});

describe('symmetricEigenvalues', () => {
  it('finds the closed-form spectrum of the discrete Laplacian', () => {
    // tridiag(1, −2, 1) of order n: λ_k = −2 + 2cos(kπ/(n+1)) (closed form; common practice).
    const n = 50;
    const m = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      m[i * n + i] = -2;
      if (i > 0) m[i * n + i - 1] = m[(i - 1) * n + i] = 1;
    }
    expect(isSymmetric(m, n)).toBe(true);
    const { values, converged } = symmetricEigenvalues(m, n);
    expect(converged).toBe(true);
    const exact = Array.from({ length: n }, (_, k) => -2 + 2 * Math.cos(((k + 1) * Math.PI) / (n + 1))).sort((a, b) => a - b);
    Array.from(values).sort((a, b) => a - b).forEach((v, k) => expectClose(v, exact[k], 0, 1e-13));
  });

  it('agrees with ml-matrix on random dense symmetric matrices (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 20 }).chain((n) => fc.tuple(fc.constant(n), fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n * n, maxLength: n * n }))), ([n, entries]) => {
        // Subnormal entries are flushed: the reference library returns NaN on some of them.
        const a = Float64Array.from(entries, (v) => (Math.abs(v) < 1e-100 ? 0 : v));
        for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) a[j * n + i] = a[i * n + j];
        const ref = new EigenvalueDecomposition(new Matrix(Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)))), { assumeSymmetric: true });
        const ours = Array.from(symmetricEigenvalues(a, n).values).sort((x, y) => x - y);
        const theirs = [...ref.realEigenvalues].sort((x, y) => x - y);
        const scale = 1 + 10 * n;
        ours.forEach((v, k) => expect(Math.abs(v - theirs[k])).toBeLessThanOrEqual(1e-11 * scale));
      }),
      { numRuns: 300 },
    );
  });
});
