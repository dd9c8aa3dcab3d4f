/**
 * Shared types of the fit module: a least-squares problem is a function from a parameter vector to weighted
 * residuals r_i = (model_i − data_i) / σ_i, so that χ² = Σ r_i².
 */

/** A (weighted) least-squares problem. */
export interface LeastSquaresProblem {
  /** Number of parameters. */
  readonly parameterCount: number;
  /** Weighted residuals at `parameters` (length fixed for a given problem). */
  residuals(parameters: Float64Array): Float64Array;
  /**
   * Optional Jacobian ∂r_i/∂p_j, row-major (residualCount × parameterCount). `residualsAtPoint` are the residuals
   * already computed at `parameters`. Without it, central finite differences are used.
   */
  jacobian?(parameters: Float64Array, residualsAtPoint: Float64Array): Float64Array;
}

/** Parameter box; ±Infinity for an open side. */
export interface ParameterBounds {
  readonly lower?: ArrayLike<number>;
  readonly upper?: ArrayLike<number>;
}

/** Uncertainty summary of a least-squares solution. */
export interface CovarianceSummary {
  /** p×p covariance, row-major. Infinity on the diagonal of a parameter the data do not determine. */
  readonly covariance: Float64Array;
  /** 1σ standard errors (√ of the covariance diagonal). */
  readonly standardErrors: Float64Array;
  /** p×p correlation matrix, row-major (0 off-diagonal for undetermined parameters). */
  readonly correlation: Float64Array;
  /** Indices of parameters the data do not determine (numerically singular Jacobian columns). */
  readonly undetermined: readonly number[];
}
