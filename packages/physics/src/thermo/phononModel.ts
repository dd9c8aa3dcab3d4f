import { InputError } from '../errors';
import { debyeHeatCapacity } from './debye';
import { einsteinHeatCapacity } from './einstein';
import { temperatureArray } from './internal/validate';

/** One Debye or Einstein term: its characteristic temperature (K) and its number of atoms per formula unit. */
export interface PhononTerm {
  atoms: number;
  temperatureK: number;
}

/** A lattice model: an optional Debye term plus any number of Einstein terms (common practice for oxides). */
export interface PhononModel {
  debye?: PhononTerm;
  einstein?: readonly PhononTerm[];
}

/**
 * Lattice heat capacity C(T) in J/(mol K) per formula unit of a Debye term plus Einstein terms:
 * C = C_D(T; θ_D, n_D) + Σ_i C_E(T; θ_E,i, n_E,i) (Debye 1912; Einstein 1907; the sum is common practice with
 * n_D + Σ n_E,i equal to the atoms per formula unit).
 *
 * @example phononHeatCapacity([10, 100], { debye: { atoms: 3, temperatureK: 300 }, einstein: [{ atoms: 8, temperatureK: 500 }] })
 * @throws InputError for an empty model, temperatures ≤ 0 or bad terms.
 * See also: debyeHeatCapacity, einsteinHeatCapacity, fitPhononModel.
 */
export function phononHeatCapacity(temperaturesK: ArrayLike<number>, model: PhononModel): Float64Array {
  const t = temperatureArray(temperaturesK);
  if (model === null || typeof model !== 'object' || (!model.debye && !(model.einstein && model.einstein.length)))
    throw new InputError('phonon', model, 'a model with a debye term and/or einstein terms');
  const total = new Float64Array(t.length);
  if (model.debye) debyeHeatCapacity(t, model.debye.temperatureK, model.debye.atoms).forEach((c, i) => (total[i] += c));
  if (model.einstein && !Array.isArray(model.einstein)) throw new InputError('phonon.einstein', model.einstein, 'an array of { atoms, temperatureK }');
  (model.einstein ?? []).forEach((term) => einsteinHeatCapacity(t, term.temperatureK, term.atoms).forEach((c, i) => (total[i] += c)));
  return total;
}
