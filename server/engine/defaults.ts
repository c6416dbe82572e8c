/**
 * Numerical tolerances and iteration limits of the engine: one typed object, passed explicitly
 * to each algorithm (callers may override single fields). Request-level defaults (steps, points,
 * time budget) live in `shared/engine/limits.ts`.
 */
export interface Tolerances {
  /** Newton: stop when ‖Δ‖∞ ≤ step·(1 + ‖x‖∞) and ‖F‖∞ ≤ residual·(1 + scale of F). */
  newtonStep: number;
  newtonResidual: number;
  /** Newton iterations when converging a start or locating a fold/cusp. */
  newtonMaxIterations: number;
  /** Corrector (continuation, curve location): stop when ‖Δ‖∞ ≤ correctorStep·(1 + ‖y‖∞). */
  correctorStep: number;
  /** Newton iterations of a continuation corrector before the step is cut. */
  correctorMaxIterations: number;
  /** Grow the continuation step after a corrector that needed at most this many iterations. */
  correctorFastIterations: number;
  /** Step growth and cut factors of the continuation. */
  stepGrow: number;
  stepCut: number;
  /** Largest angle (cosine bound) between consecutive tangents before the step is cut. */
  tangentCosMin: number;
  /** Eigenvalues with |Re λ| ≤ neutral·max(1, max|λ|) count as on the imaginary axis. */
  neutral: number;
  /** Two equilibria are the same when ‖x − y‖∞ ≤ duplicate·(1 + ‖x‖∞). */
  duplicate: number;
  /** Normal-form coefficient a or b counts as zero when |a| ≤ degenerate·(size of the terms). */
  degenerate: number;
  /** Cusp location: stop when |b| ≤ cusp·(size of the terms) or the bracket is this small (relative). */
  cusp: number;
  /** QR iterations allowed per eigenvalue. */
  eigenMaxIterations: number;
}

export const TOLERANCES: Readonly<Tolerances> = Object.freeze({
  newtonStep: 1e-12,
  newtonResidual: 1e-11,
  newtonMaxIterations: 40,
  correctorStep: 1e-10,
  correctorMaxIterations: 8,
  correctorFastIterations: 3,
  stepGrow: 1.5,
  stepCut: 0.5,
  tangentCosMin: 0.9,
  neutral: 1e-9,
  duplicate: 1e-6,
  degenerate: 1e-8,
  cusp: 1e-12,
  eigenMaxIterations: 60,
});

export function withTolerances(overrides?: Partial<Tolerances>): Tolerances {
  return { ...TOLERANCES, ...overrides };
}
