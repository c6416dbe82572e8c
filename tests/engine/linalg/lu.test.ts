import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { luFactor, luSolve, luSolveTransposed } from '@server/engine/linalg/lu.ts';
import { matTVec, matVec, normInf } from '@server/engine/linalg/vector.ts';

describe('luFactor / luSolve', () => {
  it('solves A x = b and Aᵀ x = b with a small backward error (property)', () => {
    // Partial pivoting is backward stable in practice: ‖Ax − b‖ ≲ n·ε·‖A‖·‖x‖ (Higham,
    // Accuracy and Stability of Numerical Algorithms, §9.3); checked with a generous factor.
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }).chain((n) => fc.tuple(fc.constant(n), fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n + n, maxLength: n * n + n }))), ([n, entries]) => {
        const a = Float64Array.from(entries.slice(0, n * n));
        for (let i = 0; i < n; i++) a[i * n + i] += 2 * n; // keep it well conditioned
        const b = Float64Array.from(entries.slice(n * n));
        const f = luFactor(a, n);
        expect(f.singular).toBe(false);
        const x = luSolve(f, b);
        const r = matVec(a, x, n, n).map((v, i) => v - b[i]);
        expect(normInf(r)).toBeLessThanOrEqual(1e-13 * n * (1 + normInf(b)));
        const xt = luSolveTransposed(f, b);
        const rt = matTVec(a, xt, n, n).map((v, i) => v - b[i]);
        expect(normInf(rt)).toBeLessThanOrEqual(1e-13 * n * (1 + normInf(b)));
      }),
      { numRuns: 200 },
    );
  });

  it('reports a singular matrix as a value', () => {
    expect(luFactor(Float64Array.of(1, 2, 2, 4), 2).singular).toBe(true);
  });
});
