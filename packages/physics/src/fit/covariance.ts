/**
 * Parameter covariance from the Jacobian at a least-squares solution: C = s² (JᵀJ)⁻¹, computed through a
 * column-scaled QR of J so that badly scaled problems keep their digits (Björck, Numerical Methods for Least Squares
 * Problems, 1996, §2.7). With weighted residuals and trusted σ, s² = 1; NIST StRD quotes s² = χ²/(n − p).
 *
 * @example const { standardErrors } = covarianceFromJacobian(jac, m, p, { residualVariance: chi2 / (m - p) });
 * See also: levenbergMarquardt.
 */
import { householderQr, invertUpperTriangular } from './numerics/denseLinearAlgebra';
import type { CovarianceSummary } from './types';

export interface CovarianceOptions {
  /** Multiplies (JᵀJ)⁻¹. Default 1 (σ of the data trusted as given). */
  readonly residualVariance?: number;
  /** Relative threshold below which a scaled R diagonal counts as zero. Default 1e-12. */
  readonly singularTolerance?: number;
}

/** Covariance, standard errors and correlation of the p parameters from the row-major m×p Jacobian. */
export function covarianceFromJacobian(
  jacobian: Float64Array,
  m: number,
  p: number,
  options: CovarianceOptions = {},
): CovarianceSummary {
  const variance = options.residualVariance ?? 1;
  const tolerance = options.singularTolerance ?? 1e-12;
  const columnNorm = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let i = 0; i < m; i++) s = Math.hypot(s, jacobian[i * p + j]);
    columnNorm[j] = s;
  }
  const undetermined: number[] = [];
  const keep: number[] = [];
  for (let j = 0; j < p; j++) (columnNorm[j] > 0 ? keep : undetermined).push(j);
  // Scaled Jacobian on the determined columns; drop columns whose R pivot collapses, one at a time.
  let active = keep.slice();
  let rInverse: Float64Array | undefined;
  for (;;) {
    const q = active.length;
    if (q === 0) break;
    const scaled = new Float64Array(m * q);
    for (let i = 0; i < m; i++) for (let k = 0; k < q; k++) scaled[i * q + k] = jacobian[i * p + active[k]] / columnNorm[active[k]];
    const qr = householderQr(scaled, m, q);
    let worst = -1;
    let worstValue = Infinity;
    for (let k = 0; k < q; k++) {
      const d = Math.abs(qr.r[k * q + k]);
      if (d < worstValue) {
        worstValue = d;
        worst = k;
      }
    }
    if (worstValue > tolerance) {
      rInverse = invertUpperTriangular(qr.r, q);
      break;
    }
    undetermined.push(active[worst]);
    active = active.filter((_, k) => k !== worst);
  }
  const covariance = new Float64Array(p * p);
  for (const j of undetermined) covariance[j * p + j] = Infinity;
  if (rInverse) {
    const q = active.length;
    for (let a = 0; a < q; a++)
      for (let b = 0; b < q; b++) {
        let s = 0;
        for (let k = Math.max(a, b); k < q; k++) s += rInverse[a * q + k] * rInverse[b * q + k];
        covariance[active[a] * p + active[b]] = (variance * s) / (columnNorm[active[a]] * columnNorm[active[b]]);
      }
  }
  const standardErrors = new Float64Array(p);
  for (let j = 0; j < p; j++) standardErrors[j] = Math.sqrt(covariance[j * p + j]);
  const correlation = new Float64Array(p * p);
  for (let a = 0; a < p; a++)
    for (let b = 0; b < p; b++) {
      if (a === b) correlation[a * p + b] = 1;
      else if (Number.isFinite(standardErrors[a]) && Number.isFinite(standardErrors[b]) && standardErrors[a] > 0 && standardErrors[b] > 0)
        correlation[a * p + b] = covariance[a * p + b] / (standardErrors[a] * standardErrors[b]);
    }
  undetermined.sort((x, y) => x - y);
  return { covariance, standardErrors, correlation, undetermined };
}

/** The summary of p parameters none of which the data determine: Infinity variances, identity correlation. */
export function undeterminedCovariance(p: number): CovarianceSummary {
  const covariance = new Float64Array(p * p);
  const correlation = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    covariance[j * p + j] = Infinity;
    correlation[j * p + j] = 1;
  }
  return { covariance, standardErrors: new Float64Array(p).fill(Infinity), correlation, undetermined: Array.from({ length: p }, (_, j) => j) };
}
