/**
 * The one type for quadrature grids on the unit sphere: directions (unit vectors) and weights adding up to 1, so
 * that Σ_k w_k f(n_k) approximates the spherical mean (1/4π)∮ f dΩ.
 *
 * See also: lebedevGrid, fibonacciGrid, inversionHalf.
 */
export interface SphereGrid {
  /** Human-readable name, e.g. "Lebedev–Laikov degree 17 (110 points)". */
  readonly name: string;
  /** Algebraic degree of exactness (all spherical harmonics of order ≤ degree integrate exactly); 0 if none. */
  readonly degree: number;
  /** Number of directions. */
  readonly count: number;
  /** Unit vectors, packed [x0, y0, z0, x1, y1, z1, ...]. */
  readonly directions: Float64Array;
  /** Weights, summing to 1. */
  readonly weights: Float64Array;
}
