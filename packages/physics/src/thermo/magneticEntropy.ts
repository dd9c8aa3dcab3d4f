import { InputError } from '../errors';
import { GAS_CONSTANT_J_PER_MOL_K } from '../units';
import { numberArray, requireIncreasing, requireSameLength, temperatureArray } from './internal/validate';

/** R ln 2 in J/(mol K): the entropy of one doublet per ion (≈ 5.763). */
export const R_LN2_J_PER_MOL_K = GAS_CONSTANT_J_PER_MOL_K * Math.LN2;
/** Pauling's residual entropy of ice, (R/2) ln(3/2) ≈ 1.686 J/(mol K) (L. Pauling, JACS 57, 2680 (1935)). */
export const PAULING_ENTROPY_J_PER_MOL_K = (GAS_CONSTANT_J_PER_MOL_K / 2) * Math.log(1.5);
/**
 * R[ln 2 − ½ ln(3/2)] ≈ 4.078 J/(mol K): the entropy a spin ice releases when its Pauling residual entropy stays
 * frozen in (Pauling's count for ice, applied to spin ice; common practice).
 */
export const SPIN_ICE_ENTROPY_J_PER_MOL_K = R_LN2_J_PER_MOL_K - PAULING_ENTROPY_J_PER_MOL_K;

/** How the entropy below the lowest measured temperature is estimated. */
export type EntropyExtrapolation = 'none' | 'power-law';

export interface MagneticEntropyOptions {
  /** Standard uncertainties of the heat-capacity points, J/(mol K) (independent errors assumed). */
  uncertaintyJPerMolK?: ArrayLike<number>;
  /** 'none' (S = 0 at the lowest temperature; default) or 'power-law' (C = a Tⁿ fitted to the lowest points). */
  extrapolation?: EntropyExtrapolation;
  /** Number of lowest points used by the power-law fit (default 5, at least 2). */
  lowPoints?: number;
}

export interface MagneticEntropyResult {
  /** S(T) in J/(mol K) at each input temperature, counted from T = 0 (extrapolation included). */
  entropyJPerMolK: Float64Array;
  /** Propagated standard uncertainty of S(T) in J/(mol K). */
  uncertaintyJPerMolK: Float64Array;
  /** The low-temperature extrapolation used: C = prefactor·Tᵉˣᵖᵒⁿᵉⁿᵗ below the first point, and the entropy it adds. */
  extrapolation: {
    kind: EntropyExtrapolation;
    prefactorJPerMolKPerKn: number;
    exponent: number;
    entropyBelowJPerMolK: number;
    uncertaintyJPerMolK: number;
  };
}

/**
 * Magnetic (or any) entropy from heat-capacity data: S(T) = S(T₁) + ∫_{T₁}^{T} C/T′ dT′, trapezoidal rule on C/T.
 *
 * Below the first point T₁ either nothing is added ('none') or a power law C = a Tⁿ fitted (least squares in
 * ln C vs ln T, weighted by σ_C/C when uncertainties are given) to the `lowPoints` lowest points adds
 * S(T₁) = a T₁ⁿ / n (common practice; n = 3 for magnons/phonons in 3D, n ≈ 1–2 in other cases).
 * Uncertainty: independent point errors propagated through the trapezoid weights, plus the extrapolation's
 * uncertainty from the fit covariance (added in quadrature, as a common offset).
 * Compare with R_LN2_J_PER_MOL_K and SPIN_ICE_ENTROPY_J_PER_MOL_K.
 *
 * Units: temperatures K (strictly increasing, > 0), C in J/(mol K) per whatever mole the data use.
 *
 * @example magneticEntropy([1, 2, 3], [0.5, 1, 1.5]).entropyJPerMolK // [0, 0.5, 1.0]
 * @throws InputError for non-increasing temperatures, mismatched lengths, or a power law that cannot be fitted
 *   (C ≤ 0 among the lowest points, or a fitted exponent ≤ 0).
 * See also: schottkyHeatCapacity, reduceHeatCapacity.
 */
export function magneticEntropy(
  temperaturesK: ArrayLike<number>,
  heatCapacityJPerMolK: ArrayLike<number>,
  options: MagneticEntropyOptions = {},
): MagneticEntropyResult {
  const t = requireIncreasing(temperatureArray(temperaturesK), 'temperaturesK');
  const c = numberArray(heatCapacityJPerMolK, 'heatCapacityJPerMolK', 'heat capacities in J/(mol K)');
  requireSameLength(t, c, 'temperaturesK', 'heatCapacityJPerMolK');
  let sigma: Float64Array | undefined;
  if (options.uncertaintyJPerMolK !== undefined) {
    sigma = numberArray(options.uncertaintyJPerMolK, 'uncertaintyJPerMolK', 'standard uncertainties in J/(mol K)');
    requireSameLength(t, sigma, 'temperaturesK', 'uncertaintyJPerMolK');
    sigma.forEach((s, i) => {
      if (s < 0) throw new InputError(`uncertaintyJPerMolK[${i}]`, s, 'an uncertainty ≥ 0');
    });
  }
  const kind = options.extrapolation ?? 'none';
  if (kind !== 'none' && kind !== 'power-law') throw new InputError('extrapolation', kind, '"none" or "power-law"');

  const extrapolation = { kind, prefactorJPerMolKPerKn: 0, exponent: 0, entropyBelowJPerMolK: 0, uncertaintyJPerMolK: 0 };
  if (kind === 'power-law') Object.assign(extrapolation, fitPowerLaw(t, c, sigma, options.lowPoints ?? 5));

  const n = t.length;
  const entropy = new Float64Array(n);
  const uncertainty = new Float64Array(n);
  entropy[0] = extrapolation.entropyBelowJPerMolK;
  // Var S_k = Σ_i (w_ik σ_i / T_i)², w_ik the trapezoid weight of point i in ∫_{T_1}^{T_k}.
  let variance = 0;
  uncertainty[0] = extrapolation.uncertaintyJPerMolK;
  for (let k = 1; k < n; k++) {
    const h = t[k] - t[k - 1];
    entropy[k] = entropy[k - 1] + 0.5 * h * (c[k] / t[k] + c[k - 1] / t[k - 1]);
    if (sigma) {
      // `variance` holds the points below k−1 with their final weights; point k−1 now gets its final weight
      // (h_prev + h)/2 and point k, the upper end, the provisional weight h/2.
      const hPrev = k >= 2 ? t[k - 1] - t[k - 2] : 0;
      variance += ((0.5 * (hPrev + h) * sigma[k - 1]) / t[k - 1]) ** 2;
      const tail = ((0.5 * h * sigma[k]) / t[k]) ** 2;
      uncertainty[k] = Math.sqrt(variance + tail + extrapolation.uncertaintyJPerMolK ** 2);
    } else {
      uncertainty[k] = extrapolation.uncertaintyJPerMolK;
    }
  }
  return { entropyJPerMolK: entropy, uncertaintyJPerMolK: uncertainty, extrapolation };
}

function fitPowerLaw(t: Float64Array, c: Float64Array, sigma: Float64Array | undefined, lowPoints: number) {
  if (!Number.isInteger(lowPoints) || lowPoints < 2) throw new InputError('lowPoints', lowPoints, 'an integer ≥ 2');
  if (lowPoints > t.length) throw new InputError('lowPoints', lowPoints, `at most ${t.length} (the number of data points)`);
  const x: number[] = [], y: number[] = [], w: number[] = [];
  for (let i = 0; i < lowPoints; i++) {
    if (!(c[i] > 0)) throw new InputError(`heatCapacityJPerMolK[${i}]`, c[i], 'a heat capacity > 0 (the power-law extrapolation fits ln C)');
    x.push(Math.log(t[i]));
    y.push(Math.log(c[i]));
    const relative = sigma && sigma[i] > 0 ? sigma[i] / c[i] : 1;
    w.push(1 / relative ** 2);
  }
  // Weighted straight line y = α + n x (Press et al., Numerical Recipes §15.2).
  const s = w.reduce((a, b) => a + b, 0);
  const sx = w.reduce((a, wi, i) => a + wi * x[i], 0), sy = w.reduce((a, wi, i) => a + wi * y[i], 0);
  const sxx = w.reduce((a, wi, i) => a + wi * x[i] * x[i], 0), sxy = w.reduce((a, wi, i) => a + wi * x[i] * y[i], 0);
  const delta = s * sxx - sx * sx;
  if (!(delta > 0)) throw new InputError('temperaturesK', Array.from(t.slice(0, lowPoints)), 'distinct temperatures for the power-law fit');
  const alpha = (sxx * sy - sx * sxy) / delta;
  const exponent = (s * sxy - sx * sy) / delta;
  if (!(exponent > 0))
    throw new InputError('extrapolation', 'power-law', 'data whose lowest points rise with temperature', `fitted exponent ${exponent.toPrecision(3)} ≤ 0`);
  // Parameter covariance: from the given uncertainties, or scaled by the residual variance when none are given.
  let scale = 1;
  if (!sigma) {
    const chi2 = x.reduce((a, xi, i) => a + w[i] * (y[i] - alpha - exponent * xi) ** 2, 0);
    scale = lowPoints > 2 ? chi2 / (lowPoints - 2) : 0;
  }
  const varAlpha = (scale * sxx) / delta, varN = (scale * s) / delta, covAN = (-scale * sx) / delta;
  const prefactor = Math.exp(alpha);
  const t1 = t[0];
  const below = (prefactor * t1 ** exponent) / exponent;
  // S_below = exp(α) T₁ⁿ / n: ∂S/∂α = S, ∂S/∂n = S (ln T₁ − 1/n).
  const dA = below, dN = below * (Math.log(t1) - 1 / exponent);
  const variance = dA * dA * varAlpha + dN * dN * varN + 2 * dA * dN * covAN;
  return { prefactorJPerMolKPerKn: prefactor, exponent, entropyBelowJPerMolK: below, uncertaintyJPerMolK: Math.sqrt(Math.max(0, variance)) };
}
