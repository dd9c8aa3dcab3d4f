/**
 * Heat capacity and energy at any temperature from multiple-histogram reweighting of a run (Ferrenberg & Swendsen
 * 1989): C = β²(⟨E²⟩ − ⟨E⟩²) with the averages reweighted, optionally with other coupling constants.
 */
import type { MultiHistogram } from './multiHistogramReweighting';
import { GAS_CONSTANT_J_PER_MOL_K } from '../units';

/** Reweighted thermodynamics at the requested temperatures. */
export interface ReweightedThermodynamics {
  temperaturesK: number[];
  energyKPerSpin: number[];
  heatCapacityJPerMolK: number[];
}

/**
 * Reweight to `temperaturesK` (K) for N spins; `energiesK` (pooled, K) replaces the sampled energies when the
 * couplings are changed.
 * @example reweightedHeatCapacity(mh, [0.8, 0.9, 1.0], 1024).heatCapacityJPerMolK
 * See also: multiHistogramReweighting
 */
export function reweightedHeatCapacity(mh: MultiHistogram, temperaturesK: readonly number[], numberOfSpins: number, energiesK?: Float64Array): ReweightedThermodynamics {
  const E = energiesK ?? mh.energiesK;
  let ref = 0;
  for (let n = 0; n < E.length; n++) ref += E[n] / E.length;
  const e1 = new Float64Array(E.length);
  const e2 = new Float64Array(E.length);
  for (let n = 0; n < E.length; n++) {
    e1[n] = E[n] - ref;
    e2[n] = e1[n] * e1[n];
  }
  const energy: number[] = [];
  const heat: number[] = [];
  for (const T of temperaturesK) {
    const [a1, a2] = mh.average(T, [e1, e2], E);
    energy.push((a1 + ref) / numberOfSpins);
    heat.push(((a2 - a1 * a1) / (T * T * numberOfSpins)) * GAS_CONSTANT_J_PER_MOL_K);
  }
  return { temperaturesK: [...temperaturesK], energyKPerSpin: energy, heatCapacityJPerMolK: heat };
}
