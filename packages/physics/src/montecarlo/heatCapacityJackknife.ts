/**
 * Heat capacity from energy fluctuations, C = (⟨E²⟩ − ⟨E⟩²)/(k_B T²), with the error from binning the time series
 * into blocks and a jackknife over the blocks (Flyvbjerg & Petersen, J. Chem. Phys. 91, 461 (1989); Newman &
 * Barkema, Monte Carlo Methods in Statistical Physics (1999), §3.4). Blocks longer than the autocorrelation time
 * make the blocks independent; the jackknife removes the bias of the non-linear estimator.
 */
import { InputError } from '../errors';

/** A value with its one-standard-deviation error. */
export interface ValueWithError {
  value: number;
  error: number;
}

/**
 * C per spin in units of k_B from a series of total energies (K) at temperature T (K), for N spins.
 * @example heatCapacityJackknife(energiesK, 0.5, 1024, 20) // { value: 0.31, error: 0.01 }
 * See also: meanWithBinningError
 */
export function heatCapacityJackknife(energiesK: Float64Array, temperatureK: number, numberOfSpins: number, bins = 20): ValueWithError {
  const n = energiesK.length;
  if (n < 2 * bins || bins < 2) throw new InputError('sweeps', n, `at least ${2 * bins} measured sweeps for ${bins} bins`);
  const size = Math.floor(n / bins);
  const used = size * bins;
  // Shift by the mean for numerical stability of the variance.
  let mean = 0;
  for (let k = 0; k < used; k++) mean += energiesK[k];
  mean /= used;
  const s1 = new Float64Array(bins);
  const s2 = new Float64Array(bins);
  for (let b = 0; b < bins; b++)
    for (let k = b * size; k < (b + 1) * size; k++) {
      const e = energiesK[k] - mean;
      s1[b] += e;
      s2[b] += e * e;
    }
  let t1 = 0, t2 = 0;
  for (let b = 0; b < bins; b++) {
    t1 += s1[b];
    t2 += s2[b];
  }
  const scale = 1 / (temperatureK * temperatureK * numberOfSpins);
  const full = (t2 / used - (t1 / used) ** 2) * scale;
  const jk = new Float64Array(bins);
  let jm = 0;
  for (let b = 0; b < bins; b++) {
    const m = used - size;
    const a1 = (t1 - s1[b]) / m;
    const a2 = (t2 - s2[b]) / m;
    jk[b] = (a2 - a1 * a1) * scale;
    jm += jk[b] / bins;
  }
  let v = 0;
  for (let b = 0; b < bins; b++) v += (jk[b] - jm) ** 2;
  const error = Math.sqrt(((bins - 1) / bins) * v);
  // Bias-corrected jackknife estimate.
  return { value: bins * full - (bins - 1) * jm, error };
}

/**
 * Mean of a series with the error from `bins` blocks (standard error of the block means).
 * @example meanWithBinningError(series, 20)
 */
export function meanWithBinningError(series: Float64Array, bins = 20): ValueWithError {
  const size = Math.floor(series.length / bins);
  if (size < 1) throw new InputError('sweeps', series.length, `at least ${bins} measured sweeps`);
  const means = new Float64Array(bins);
  for (let b = 0; b < bins; b++) {
    let s = 0;
    for (let k = b * size; k < (b + 1) * size; k++) s += series[k];
    means[b] = s / size;
  }
  let m = 0;
  for (let b = 0; b < bins; b++) m += means[b] / bins;
  let v = 0;
  for (let b = 0; b < bins; b++) v += (means[b] - m) ** 2;
  return { value: m, error: Math.sqrt(v / (bins * (bins - 1))) };
}
