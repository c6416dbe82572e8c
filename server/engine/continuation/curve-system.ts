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
  /**
   * A structured factorisation of the bordered matrix [DG(y); rowᵀ] (e.g. banded), or null to
   * use the dense one. Large discretised models provide it.
   */
  factorBordered?(y: Float64Array, row: Float64Array): BorderedFactors | null;
}

/** A factorised bordered matrix [DG(y); rowᵀ]. */
export interface BorderedFactors {
  singular: boolean;
  solve(b: Float64Array, out: Float64Array): Float64Array;
  /** Sign and log|det| of the bordered matrix. */
  determinant(): { sign: number; log: number };
}

/** A coordinate of y kept inside [min, max]; leaving it ends the curve with stop reason "bounds". */
export interface CoordinateBound {
  index: number;
  min: number;
  max: number;
}
