/**
 * Put measured powder intensities on an absolute scale using the paramagnetic scattering: well above the
 * correlation temperature the Ising moments are uncorrelated and scatter
 *   I_para(Q) = (2/3) (γ r0/2)² μ² f(Q)²  barn/sr per ion  (powder self term; see `powderIntensity`),
 * so one weighted least-squares factor c with data ≈ c·I_para (minimising Σ w (y − c I_para)², w = 1/σ²)
 * converts data to barn/sr per ion by dividing by c. Common practice in diffuse-scattering work; the moment must
 * be the one of the Ising doublet (nuclear, phonon and background contributions removed beforehand).
 */
import { MAGNETIC_PREFACTOR_MB } from '../units';
import { InputError } from '../errors';

/** The absolute-scale factor and the data in barn/sr per ion. */
export interface ParamagnetNormalization {
  /** Multiply data by this to get barn/sr per ion. */
  scaleBarnPerSrPerIonPerUnit: number;
  scaleError: number;
  /** The paramagnetic model I_para(Q) in barn/sr per ion at the data Q. */
  paramagnetBarnPerSrPerIon: number[];
  /** χ² per degree of freedom of the one-parameter fit (1 means the shape matches). */
  reducedChiSquare: number;
}

/**
 * Scale factor from high-temperature data (Q in Å⁻¹, intensities in any unit, optional σ) for moment μ (μB).
 * @example normalizeToParamagnet(q, counts, sigma, 10, (x) => magneticFormFactor('Ho3+', x)).scaleBarnPerSrPerIonPerUnit
 * See also: powderIntensity
 */
export function normalizeToParamagnet(
  qInvAngstrom: readonly number[],
  intensity: readonly number[],
  sigma: readonly number[] | undefined,
  momentMuB: number,
  formFactor: (qInvAngstrom: number) => number = () => 1,
): ParamagnetNormalization {
  const n = qInvAngstrom.length;
  if (n < 2) throw new InputError('QInvAngstrom', qInvAngstrom, 'at least two Q values');
  if (intensity.length !== n) throw new InputError('intensity', intensity.length, `${n} values, one per Q`);
  if (sigma && sigma.length !== n) throw new InputError('sigma', sigma.length, `${n} values, one per Q`);
  if (!(momentMuB > 0)) throw new InputError('momentMuB', momentMuB, 'a positive moment in μB');
  const model = qInvAngstrom.map((q) => {
    const f = formFactor(q);
    return (2 / 3) * (MAGNETIC_PREFACTOR_MB / 1000) * momentMuB * momentMuB * f * f;
  });
  let sym = 0, smm = 0;
  for (let k = 0; k < n; k++) {
    const s = sigma ? sigma[k] : 1;
    if (!(s > 0)) throw new InputError(`sigma[${k}]`, s, 'a positive uncertainty');
    const w = 1 / (s * s);
    sym += w * intensity[k] * model[k];
    smm += w * model[k] * model[k];
  }
  const c = sym / smm;
  if (!(c > 0)) throw new InputError('intensity', intensity, 'paramagnetic data with positive intensity');
  let chi2 = 0;
  for (let k = 0; k < n; k++) {
    const s = sigma ? sigma[k] : 1;
    chi2 += ((intensity[k] - c * model[k]) / s) ** 2;
  }
  const red = chi2 / (n - 1);
  // σ_c from the curvature; without σ the scatter of the data sets the scale (reduced χ² = 1).
  const cErr = Math.sqrt((sigma ? 1 : red) / smm);
  return { scaleBarnPerSrPerIonPerUnit: 1 / c, scaleError: cErr / (c * c), paramagnetBarnPerSrPerIon: model, reducedChiSquare: red };
}
