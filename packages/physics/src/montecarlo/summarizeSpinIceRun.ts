/**
 * Turn the time series of a run into thermodynamic results with error bars, in the units users compare with data:
 * energy per spin in K, heat capacity and entropy in J/(mol K) per mole of magnetic ions (R = N_A k_B per spin;
 * multiply by 2 for R2M2O7 pyrochlores per formula unit), magnetization in μB per spin along the chosen direction.
 */
import type { SpinIceRawResult } from './spinIceSimulation';
import { heatCapacityJackknife, meanWithBinningError } from './heatCapacityJackknife';
import { entropyByIntegration } from './entropyByIntegration';
import { GAS_CONSTANT_J_PER_MOL_K } from '../units';

/** Thermodynamics of a run, one entry per temperature (caller's order). */
export interface SpinIceRunResult {
  temperaturesK: number[];
  numberOfSites: number;
  measuredSweeps: number;
  energyKPerSpin: number[];
  energyErrorKPerSpin: number[];
  heatCapacityJPerMolK: number[];
  heatCapacityErrorJPerMolK: number[];
  /** S(T) by integration from S(∞) = R ln 2 (needs the highest temperature well above the couplings). */
  entropyJPerMolK: number[];
  magnetizationMuBPerSpin: number[];
  magnetizationErrorMuBPerSpin: number[];
  /** ⟨ψ⟩ of the q = (001) ordered state (0..1). */
  orderParameter001: number[];
  acceptance: { singleFlip: number[]; loop: number[]; swap: number[] };
}

/**
 * Summarize a run with `bins` blocks for the error bars.
 * @example summarizeSpinIceRun(runSpinIceMonteCarlo(options).raw)
 * See also: runSpinIceMonteCarlo, multiHistogramReweighting
 */
export function summarizeSpinIceRun(raw: SpinIceRawResult, bins = 20): SpinIceRunResult {
  const c = raw.couplings;
  const N = c.numberOfSites;
  const R = GAS_CONSTANT_J_PER_MOL_K;
  const mu = c.model.momentMuB;
  const energy = raw.series.energyK.map((e) => meanWithBinningError(e, bins));
  const cap = raw.series.energyK.map((e, k) => heatCapacityJackknife(e, raw.temperaturesK[k], N, bins));
  const mag = raw.series.projection.map((p) => meanWithBinningError(p, bins));
  const psi = raw.series.orderParameter.map((p) => p.reduce((a, b) => a + b, 0) / Math.max(1, p.length));
  const entropy = entropyByIntegration(
    raw.temperaturesK,
    energy.map((e) => (e.value - c.constantK) / N),
    highTemperatureVariancePerSpinK2(raw),
    cap.map((x) => x.value),
  );
  return {
    temperaturesK: raw.temperaturesK,
    numberOfSites: N,
    measuredSweeps: raw.measuredSweeps,
    energyKPerSpin: energy.map((e) => e.value / N),
    energyErrorKPerSpin: energy.map((e) => e.error / N),
    heatCapacityJPerMolK: cap.map((x) => x.value * R),
    heatCapacityErrorJPerMolK: cap.map((x) => x.error * R),
    entropyJPerMolK: entropy.map((s) => s * R),
    magnetizationMuBPerSpin: mag.map((m) => (m.value * mu) / N),
    magnetizationErrorMuBPerSpin: mag.map((m) => (m.error * mu) / N),
    orderParameter001: psi,
    acceptance: raw.acceptance,
  };
}

/** Var₀(E)/N = (Σ_{i<j} J_ij² + Σ_i b_i²)/N in K²: the energy variance of independent random spins. */
export function highTemperatureVariancePerSpinK2(raw: SpinIceRawResult): number {
  const c = raw.couplings;
  const N = c.numberOfSites;
  let v = 0;
  if (c.dense) for (let p = 0; p < N * N; p++) v += 0.5 * c.dense[p] * c.dense[p];
  else for (let p = 0; p < c.values.length; p++) v += 0.5 * c.values[p] * c.values[p];
  for (let i = 0; i < N; i++) v += c.zeemanK[i] * c.zeemanK[i];
  return v / N;
}
