import { InputError } from '../errors';
import { BOLTZMANN_MEV_PER_K, GAS_CONSTANT_J_PER_MOL_K, AVOGADRO_PER_MOL, MEV_IN_J } from '../units';
import { numberArray, temperatureArray } from './internal/validate';

/** Heat capacity, entropy and energy of a set of discrete levels, per mole of systems (ions, nuclei). */
export interface SchottkyResult {
  /** C(T) in J/(mol K). */
  heatCapacityJPerMolK: Float64Array;
  /** S(T) − S(0) = ∫_0^T C/T′ dT′ in J/(mol K): the entropy released by the levels above the ground level. */
  entropyJPerMolK: Float64Array;
  /** Statistical entropy S(T) = R (ln Z + ⟨E⟩/k_BT) in J/(mol K); tends to R ln(number of states) at high T. */
  totalEntropyJPerMolK: Float64Array;
  /** S(T → 0) = R ln g₀ in J/(mol K), g₀ the ground-level degeneracy (R ln 2 for a Kramers doublet). */
  groundStateEntropyJPerMolK: number;
  /** U(T) − U(0) = N_A ⟨E − E₀⟩ in J/mol. */
  internalEnergyJPerMol: Float64Array;
}

/**
 * Schottky heat capacity and entropy of discrete energy levels (crystal-field levels, nuclear hyperfine levels).
 *
 * With β = 1/(k_B T), energies measured from the ground level and Z = Σ g_i e^{−βE_i} (statistical mechanics; e.g.
 * Gopal, "Specific Heats at Low Temperatures" (1966), ch. 4; Kittel & Kroemer, "Thermal Physics", ch. 3):
 *   C = R β² (⟨E²⟩ − ⟨E⟩²),  S = R (ln Z + β⟨E⟩),  U = N_A ⟨E⟩.
 * Levels closer than `degeneracyToleranceMeV` (default 1e-8 meV) to the lowest one count as the ground level when
 * S(0) = R ln g₀ is subtracted for `entropyJPerMolK`.
 *
 * Units: levels in meV, temperatures in K, results per mole of systems (multiply by ions per formula unit for a
 * per-formula-unit value).
 *
 * @example schottkyHeatCapacity([0, 1], [0.4168 / 0.0861733]).heatCapacityJPerMolK[0] / 8.314 // ≈ 0.4392
 * @throws InputError for an empty or non-finite level list, temperatures ≤ 0, or bad degeneracies.
 * See also: cefHeatCapacity (thermo/heatCapacity.ts), nuclearSchottkyHeatCapacity, magneticEntropy.
 */
export function schottkyHeatCapacity(
  levelsMeV: ArrayLike<number>,
  temperaturesK: ArrayLike<number>,
  options: { degeneracies?: ArrayLike<number>; degeneracyToleranceMeV?: number } = {},
): SchottkyResult {
  const levels = numberArray(levelsMeV, 'levelsMeV', 'energies in meV');
  const temperatures = temperatureArray(temperaturesK);
  const g = new Float64Array(levels.length).fill(1);
  if (options.degeneracies !== undefined) {
    const d = numberArray(options.degeneracies, 'degeneracies', 'positive integers');
    if (d.length !== levels.length) throw new InputError('degeneracies', `${d.length} values`, `${levels.length} values (one per level)`);
    d.forEach((x, i) => {
      if (!Number.isInteger(x) || x < 1) throw new InputError(`degeneracies[${i}]`, x, 'a positive integer');
      g[i] = x;
    });
  }
  const tolerance = options.degeneracyToleranceMeV ?? 1e-8;
  const e0 = Math.min(...levels);
  const shifted = levels.map((e) => e - e0);
  let g0 = 0;
  shifted.forEach((e, i) => {
    if (e <= tolerance) g0 += g[i];
  });
  const R = GAS_CONSTANT_J_PER_MOL_K;
  const n = temperatures.length;
  const out: SchottkyResult = {
    heatCapacityJPerMolK: new Float64Array(n),
    entropyJPerMolK: new Float64Array(n),
    totalEntropyJPerMolK: new Float64Array(n),
    groundStateEntropyJPerMolK: R * Math.log(g0),
    internalEnergyJPerMol: new Float64Array(n),
  };
  for (let t = 0; t < n; t++) {
    const kT = BOLTZMANN_MEV_PER_K * temperatures[t];
    let z = 0, e1 = 0, e2 = 0;
    for (let i = 0; i < shifted.length; i++) {
      const x = shifted[i] / kT;
      const w = g[i] * Math.exp(-x);
      z += w;
      e1 += w * x;
      e2 += w * x * x;
    }
    e1 /= z;
    e2 /= z;
    out.heatCapacityJPerMolK[t] = R * Math.max(0, e2 - e1 * e1);
    out.totalEntropyJPerMolK[t] = R * (Math.log(z) + e1);
    // S − R ln g₀ computed as R[ln(Z/g₀) + β⟨E⟩] keeps precision when only the ground level is populated.
    out.entropyJPerMolK[t] = Math.max(0, R * (Math.log1p((z - g0) / g0) + e1));
    out.internalEnergyJPerMol[t] = AVOGADRO_PER_MOL * e1 * kT * MEV_IN_J;
  }
  return out;
}
