/**
 * An under-determined smooth system G: R^(N+1) → R^N whose zero set is a curve (a branch of
 * equilibria in (x, μ), a fold curve in (x, v, μ, κ), ...). Jacobians are dense row-major
 * N×(N+1).
 */
export interface CurveSystem {
  /** N + 1, the number of unknowns. */
  readonly dimension: number;
  evaluate(y: Float64Array, out: Float64Array): void;
  jacobian(y: Float64Array, out: Float64Array): void;
}

/** A coordinate of y kept inside [min, max]; leaving it ends the curve with stop reason "bounds". */
export interface CoordinateBound {
  index: number;
  min: number;
  max: number;
}
