/**
 * The part of a run that crosses a thread boundary (structured-clone friendly: no pair matrix), and the helper
 * that strips a raw run down to it.
 */
import type { SpinIceRawResult, SpinIceSeries } from './spinIceSimulation';
import type { SpinIceModel } from './spinIceCouplings';

/** Series, snapshots and the few coupling numbers needed afterwards (reweighting, scattering). */
export interface SpinIceRunData {
  model: SpinIceModel;
  temperaturesK: number[];
  numberOfSites: number;
  measuredSweeps: number;
  /** Constant energy part (K) and D (K) of the couplings used. */
  constantK: number;
  dipolarDK: number;
  series: SpinIceSeries;
  snapshots: Int8Array[][];
  acceptance: { singleFlip: number[]; loop: number[]; swap: number[] };
}

/**
 * Drop the couplings (the N×N matrix) from a raw run, keeping what reweighting and scattering need.
 * @example const data = spinIceRunData(runSpinIceMonteCarlo(options).raw)
 * See also: runSpinIceMonteCarloAsync
 */
export function spinIceRunData(raw: SpinIceRawResult): SpinIceRunData {
  return {
    model: raw.couplings.model,
    temperaturesK: raw.temperaturesK,
    numberOfSites: raw.couplings.numberOfSites,
    measuredSweeps: raw.measuredSweeps,
    constantK: raw.couplings.constantK,
    dipolarDK: raw.couplings.dipolarDK,
    series: raw.series,
    snapshots: raw.snapshots,
    acceptance: raw.acceptance,
  };
}
