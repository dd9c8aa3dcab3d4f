import { InputError } from '../errors';
import { finiteNumber, temperatureArray } from './internal/validate';
import { schottkyHeatCapacity, type SchottkyResult } from './schottky';

/** Hyperfine parameters of one nuclear species. */
export interface HyperfineParameters {
  /** Effective hyperfine splitting A in meV: levels E_m = A·m for m = −I … I (A = A_hf⟨J_z⟩ for an ordered or frozen moment). */
  hyperfineMeV: number;
  /** Nuclear spin I (integer or half-integer ≥ 1/2). */
  nuclearSpin: number;
  /** Fraction of the ions carrying this isotope, 0 … 1 (natural abundance; default 1). */
  abundance?: number;
  /** Optional quadrupole term P in meV: adds P[m² − I(I+1)/3] to each level (default 0). */
  quadrupoleMeV?: number;
}

/**
 * Nuclear Schottky heat capacity C(T) and entropy, in J/(mol K) per mole of rare-earth ions, from a hyperfine constant
 * and a nuclear spin: 2I+1 levels E_m = A·m + P[m² − I(I+1)/3], weighted by the isotope's abundance.
 *
 * Hamiltonian: the static hyperfine field of a frozen 4f moment, H = A I_z + P[I_z² − I(I+1)/3] (A. Abragam &
 * B. Bleaney, "Electron Paramagnetic Resonance of Transition Ions" (1970), ch. 17; common practice for rare-earth
 * heat-capacity analysis). Its high-temperature tail is C ≈ R·abundance·A² I(I+1)/(3 (k_B T)²) (for P = 0).
 * Several isotopes: sum the results (e.g. ¹⁶¹Dy and ¹⁶³Dy).
 *
 * @example nuclearSchottkyHeatCapacity([0.1], { hyperfineMeV: 0.01, nuclearSpin: 3.5 }).heatCapacityJPerMolK
 * @throws InputError for I not a positive multiple of 1/2, abundance outside [0, 1], or temperatures ≤ 0.
 * See also: schottkyHeatCapacity, reduceHeatCapacity.
 */
export function nuclearSchottkyHeatCapacity(temperaturesK: ArrayLike<number>, parameters: HyperfineParameters): SchottkyResult {
  const temperatures = temperatureArray(temperaturesK);
  if (parameters === null || typeof parameters !== 'object') throw new InputError('nuclear', parameters, 'an object { hyperfineMeV, nuclearSpin, abundance? }');
  const a = finiteNumber(parameters.hyperfineMeV, 'nuclear.hyperfineMeV', 'a hyperfine constant in meV');
  const spin = finiteNumber(parameters.nuclearSpin, 'nuclear.nuclearSpin', 'a nuclear spin I ≥ 1/2, a multiple of 1/2');
  if (spin < 0.5 || !Number.isInteger(2 * spin)) throw new InputError('nuclear.nuclearSpin', spin, 'a nuclear spin I ≥ 1/2, a multiple of 1/2');
  const abundance = parameters.abundance === undefined ? 1 : finiteNumber(parameters.abundance, 'nuclear.abundance', 'a fraction from 0 to 1');
  if (abundance < 0 || abundance > 1) throw new InputError('nuclear.abundance', abundance, 'a fraction from 0 to 1');
  const p = parameters.quadrupoleMeV === undefined ? 0 : finiteNumber(parameters.quadrupoleMeV, 'nuclear.quadrupoleMeV', 'a quadrupole constant in meV');
  const levels: number[] = [];
  for (let k = 0; k <= 2 * spin; k++) {
    const m = spin - k;
    levels.push(a * m + p * (m * m - (spin * (spin + 1)) / 3));
  }
  const r = schottkyHeatCapacity(levels, temperatures);
  const scale = (x: Float64Array) => x.map((v) => v * abundance);
  return {
    heatCapacityJPerMolK: scale(r.heatCapacityJPerMolK),
    entropyJPerMolK: scale(r.entropyJPerMolK),
    totalEntropyJPerMolK: scale(r.totalEntropyJPerMolK),
    groundStateEntropyJPerMolK: r.groundStateEntropyJPerMolK * abundance,
    internalEnergyJPerMol: scale(r.internalEnergyJPerMol),
  };
}
