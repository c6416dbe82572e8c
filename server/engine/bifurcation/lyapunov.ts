import { EngineUsageError } from '../errors.ts';
import { luFactor, luSolve } from '../linalg/lu.ts';
import { nullVectorEstimate } from '../linalg/null-vector.ts';
import type { CompiledModel } from '../model/compile.ts';

/** A complex vector as two real arrays. */
export interface ComplexVector {
  re: Float64Array;
  im: Float64Array;
}

export interface HopfCoefficients {
  /** First Lyapunov coefficient l1. */
  l1: number;
  /** q with Aq = iωq, ⟨q, q⟩ = 1. */
  q: ComplexVector;
  /** p with Aᵀp = −iωp, ⟨p, q⟩ = 1. */
  p: ComplexVector;
  /** |l1| is below `degenerate` × the size of its terms. */
  degenerate: boolean;
}

/** ⟨u, v⟩ = Σ conj(u_i)·v_i. */
export function innerProduct(u: ComplexVector, v: ComplexVector): { re: number; im: number } {
  let re = 0;
  let im = 0;
  for (let i = 0; i < u.re.length; i++) {
    re += u.re[i] * v.re[i] + u.im[i] * v.im[i];
    im += u.re[i] * v.im[i] - u.im[i] * v.re[i];
  }
  return { re, im };
}

const conj = (v: ComplexVector): ComplexVector => ({ re: v.re, im: v.im.map((x) => -x) });

/**
 * A real symmetric multilinear form extended to complex arguments by multilinearity: each
 * argument split into real and imaginary parts, 2^m real evaluations weighted by i^(number of
 * imaginary parts taken).
 */
function complexForm(real: (args: Float64Array[]) => Float64Array, args: ComplexVector[]): ComplexVector {
  const n = args[0].re.length;
  const out: ComplexVector = { re: new Float64Array(n), im: new Float64Array(n) };
  const m = args.length;
  for (let mask = 0; mask < 1 << m; mask++) {
    let count = 0;
    const parts = args.map((a, j) => ((mask >> j) & 1 ? (count++, a.im) : a.re));
    const value = real(parts);
    // i^count: 1, i, −1, −i.
    const turn = count % 4;
    for (let i = 0; i < n; i++) {
      const v = value[i];
      if (turn === 0) out.re[i] += v;
      else if (turn === 1) out.im[i] += v;
      else if (turn === 2) out.re[i] -= v;
      else out.im[i] -= v;
    }
  }
  return out;
}

/**
 * First Lyapunov coefficient of a Hopf point (x, p) with eigenvalues ±iω of A = J(x, p), by the
 * invariant formula of Kuznetsov, Elements of Applied Bifurcation Theory, 3rd ed., §3.5
 * (eq. 3.20) and §10.2 (for n dimensions):
 *   l1 = (1/(2ω)) Re[ ⟨p, C(q,q,q̄)⟩ − 2⟨p, B(q, A⁻¹B(q,q̄))⟩ + ⟨p, B(q̄, (2iωI − A)⁻¹B(q,q))⟩ ],
 * with B, C the second and third derivatives of f, and the normalisation Aq = iωq, Aᵀp = −iωp,
 * ⟨q, q⟩ = 1, ⟨p, q⟩ = 1, ⟨u, v⟩ = Σ ū_i v_i. The value depends on this normalisation (its sign
 * does not): l1 < 0 means a supercritical Hopf bifurcation. B is exact (symbolic second
 * derivatives); C is the central difference of B along its third argument with Richardson
 * extrapolation, accurate to about 1e-9 relative. `degenerate` when |l1| ≤ degenerate ×
 * max(size of the three terms, ω) (the ω floor assumes state values of order one).
 */
export function hopfCoefficients(model: CompiledModel, x: Float64Array, parameters: Float64Array, omega: number, degenerate: number): HopfCoefficients {
  const n = model.n;
  if (!(omega > 0)) throw new EngineUsageError('hopfCoefficients: ω must be positive', { omega });
  const a = new Float64Array(n * n);
  model.jacobian(x, parameters, a);
  const q = complexNullVector(a, n, omega, false);
  let qq = innerProduct(q, q).re;
  qq = Math.sqrt(qq);
  for (let i = 0; i < n; i++) {
    q.re[i] /= qq;
    q.im[i] /= qq;
  }
  const p0 = complexNullVector(a, n, omega, true);
  // p ← p / conj(⟨p0, q⟩) so that ⟨p, q⟩ = 1.
  const c = innerProduct(p0, q);
  const cc = c.re * c.re + c.im * c.im;
  // 1/conj(c) = c/|c|².
  const p: ComplexVector = { re: new Float64Array(n), im: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    p.re[i] = (p0.re[i] * c.re - p0.im[i] * c.im) / cc;
    p.im[i] = (p0.re[i] * c.im + p0.im[i] * c.re) / cc;
  }
  const hv = new Float64Array(n * n);
  const b2 = (at: Float64Array, [u, v]: Float64Array[]) => {
    model.hessianTimes(at, parameters, u, hv);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += hv[i * n + k] * v[k];
      out[i] = s;
    }
    return out;
  };
  let xs = 0;
  for (let i = 0; i < n; i++) xs = Math.max(xs, Math.abs(x[i]));
  const c3 = ([u, v, w]: Float64Array[]) => {
    let ws = 0;
    for (let i = 0; i < n; i++) ws = Math.max(ws, Math.abs(w[i]));
    if (ws === 0) return new Float64Array(n);
    // Central differences at h and h/2 combined by Richardson extrapolation (error O(h⁴)).
    const central = (h: number) => {
      const plus = b2(x.map((xi, i) => xi + h * w[i]), [u, v]);
      const minus = b2(x.map((xi, i) => xi - h * w[i]), [u, v]);
      return plus.map((pv, i) => (pv - minus[i]) / (2 * h));
    };
    const h = (1e-3 * (1 + xs)) / ws;
    const coarse = central(h);
    const fine = central(h / 2);
    return fine.map((f, i) => (4 * f - coarse[i]) / 3);
  };
  const B = (u: ComplexVector, v: ComplexVector) => complexForm((args) => b2(x, args), [u, v]);
  const C = (u: ComplexVector, v: ComplexVector, w: ComplexVector) => complexForm(c3, [u, v, w]);
  const qb = conj(q);
  const term1 = innerProduct(p, C(q, q, qb));
  // A⁻¹ B(q, q̄): a real right-hand side in theory; both parts solved.
  const luA = luFactor(a, n);
  const bqqb = B(q, qb);
  const s1: ComplexVector = { re: luSolve(luA, bqqb.re), im: luSolve(luA, bqqb.im) };
  const term2 = innerProduct(p, B(q, s1));
  // (2iωI − A)·(u + iv) = (−Au − 2ωv) + i(2ωu − Av): a real 2n system.
  const m = 2 * n;
  const big = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      big[i * m + j] = -a[i * n + j];
      big[(n + i) * m + n + j] = -a[i * n + j];
    }
    big[i * m + n + i] = -2 * omega;
    big[(n + i) * m + i] = 2 * omega;
  }
  const bqq = B(q, q);
  const rhs = new Float64Array(m);
  rhs.set(bqq.re, 0);
  rhs.set(bqq.im, n);
  const sol = luSolve(luFactor(big, m, true), rhs);
  const s2: ComplexVector = { re: sol.slice(0, n), im: sol.slice(n) };
  const term3 = innerProduct(p, B(qb, s2));
  const l1 = (term1.re - 2 * term2.re + term3.re) / (2 * omega);
  const size = (Math.abs(term1.re) + 2 * Math.abs(term2.re) + Math.abs(term3.re)) / (2 * omega);
  // Degenerate: |l1| small against its own terms and against ω (the latter for state scales of order 1).
  return { l1, q, p, degenerate: !(Math.abs(l1) > degenerate * Math.max(size, omega)) };
}

/**
 * A vector of ker(A − iωI) (or, with `adjoint`, of ker(Aᵀ + iωI)) from the real 2n×2n form
 * [[A, ωI], [−ωI, A]] (resp. [[Aᵀ, −ωI], [ωI, Aᵀ]]) acting on (re, im), by inverse iteration.
 */
export function complexNullVector(a: Float64Array, n: number, omega: number, adjoint: boolean): ComplexVector {
  const m = 2 * n;
  const r = new Float64Array(m * m);
  const w = adjoint ? -omega : omega;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const aij = adjoint ? a[j * n + i] : a[i * n + j];
      r[i * m + j] = aij;
      r[(n + i) * m + n + j] = aij;
    }
    r[i * m + n + i] = w;
    r[(n + i) * m + i] = -w;
  }
  const v = nullVectorEstimate(r, m, 6);
  return { re: v.slice(0, n), im: v.slice(n) };
}
