import { describe, expect, it } from 'vitest';
import { Matrix, EigenvalueDecomposition, determinant, solve } from 'ml-matrix';
import { bandedFactor, bandedSolve, bandwidth, symmetricBandedInertia } from '@server/engine/linalg/banded-lu.ts';
import { expectClose } from '../../support/tolerances.ts';

/** A pseudo-random banded matrix (deterministic), optionally symmetric. */
function banded(n: number, kl: number, ku: number, seed: number, symmetric = false): Float64Array {
  const a = new Float64Array(n * n);
  let s = seed;
  const rand = () => ((s = (s * 16807) % 2147483647) / 2147483647) * 2 - 1;
  for (let i = 0; i < n; i++)
    for (let j = Math.max(0, i - kl); j <= Math.min(n - 1, i + ku); j++) a[i * n + j] = rand();
  if (symmetric) for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) a[i * n + j] = a[j * n + i];
  return a;
}
const toMatrix = (a: Float64Array, n: number) => new Matrix(Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n))));

describe('banded LU with partial pivoting', () => {
  it.each([
    { n: 30, kl: 1, ku: 1 },
    { n: 40, kl: 2, ku: 3 },
    { n: 25, kl: 4, ku: 0 },
  ])('solves like the reference library ml-matrix (n = $n, kl = $kl, ku = $ku)', ({ n, kl, ku }) => {
    const a = banded(n, kl, ku, 7 + n);
    expect(bandwidth(a, n)).toEqual({ kl, ku });
    const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i));
    const x = bandedSolve(bandedFactor(a, n, kl, ku), b);
    const ref = solve(toMatrix(a, n), Matrix.columnVector(Array.from(b))).to1DArray();
    x.forEach((v, i) => expectClose(v, ref[i], 1e-9, 1e-11));
  });

  it('gives the determinant of the reference library', () => {
    const n = 12;
    const a = banded(n, 2, 1, 99);
    const f = bandedFactor(a, n, 2, 1);
    const det = determinant(toMatrix(a, n));
    expect(f.sign).toBe(Math.sign(det));
    expectClose(f.log, Math.log(Math.abs(det)), 1e-10);
  });

  it('counts eigenvalue signs of a symmetric banded matrix like ml-matrix’s eigenvalues', () => {
    const n = 30;
    const a = banded(n, 2, 2, 5, true);
    const values = new EigenvalueDecomposition(toMatrix(a, n), { assumeSymmetric: true }).realEigenvalues;
    const inertia = symmetricBandedInertia(a, n, 2);
    expect(inertia.positive).toBe(values.filter((v) => v > 0).length);
    expect(inertia.negative).toBe(values.filter((v) => v < 0).length);
  });
});
