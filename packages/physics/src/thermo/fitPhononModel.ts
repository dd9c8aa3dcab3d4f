import { InputError } from '../errors';
import { nelderMead } from './internal/minimize';
import { finiteNumber, numberArray, positiveNumber, requireSameLength, temperatureArray } from './internal/validate';
import { phononHeatCapacity, type PhononModel } from './phononModel';

/** A term to fit: atoms fixed, temperature either given (kept) or missing (fitted from `startK`, default 300 K). */
export interface PhononTermSpec {
  atoms: number;
  temperatureK?: number;
  startK?: number;
}

export interface PhononFitResult {
  model: PhononModel;
  /** Relative root-mean-square deviation of the fit, (1/N Σ ((C − model)/C)²)^{1/2}. */
  relativeRms: number;
  pointsUsed: number;
}

/**
 * Fit the missing Debye and Einstein temperatures of a lattice model to heat-capacity data in a temperature range
 * where the data are taken to be lattice only (common practice: above the magnetic and CEF contributions, or on a
 * nonmagnetic analogue). Minimises the sum of squared relative deviations with a Nelder–Mead simplex in ln θ.
 *
 * Units: T in K, C in J/(mol K) per formula unit.
 *
 * @example fitPhononModel(T, C, { debye: { atoms: 11 } }, [20, 200]).model.debye.temperatureK
 * @throws InputError for no free temperature, fewer points in range than free parameters + 1, or C ≤ 0 in range.
 * See also: phononHeatCapacity, reduceHeatCapacity.
 */
export function fitPhononModel(
  temperaturesK: ArrayLike<number>,
  heatCapacityJPerMolK: ArrayLike<number>,
  spec: { debye?: PhononTermSpec; einstein?: readonly PhononTermSpec[] },
  rangeK?: readonly [number, number],
): PhononFitResult {
  const tAll = temperatureArray(temperaturesK);
  const cAll = numberArray(heatCapacityJPerMolK, 'heatCapacityJPerMolK', 'heat capacities in J/(mol K)');
  requireSameLength(tAll, cAll, 'temperaturesK', 'heatCapacityJPerMolK');
  const [low, high] = rangeK ?? [-Infinity, Infinity];
  if (rangeK !== undefined) {
    finiteNumber(rangeK[0], 'fitRangeK[0]', 'a temperature in K');
    finiteNumber(rangeK[1], 'fitRangeK[1]', 'a temperature in K');
    if (!(rangeK[1] > rangeK[0])) throw new InputError('fitRangeK', rangeK, 'T_min < T_max');
  }
  const t: number[] = [], c: number[] = [];
  tAll.forEach((ti, i) => {
    if (ti < low || ti > high) return;
    if (!(cAll[i] > 0)) throw new InputError(`heatCapacityJPerMolK[${i}]`, cAll[i], 'a heat capacity > 0 in the fit range');
    t.push(ti);
    c.push(cAll[i]);
  });
  const terms: Array<{ key: 'debye' | number; atoms: number; fixed?: number; start: number }> = [];
  const addTerm = (key: 'debye' | number, term: PhononTermSpec, field: string) => {
    const atoms = positiveNumber(term?.atoms, `${field}.atoms`, 'a number of atoms > 0');
    const fixed = term.temperatureK === undefined ? undefined : positiveNumber(term.temperatureK, `${field}.temperatureK`, 'a temperature > 0 K');
    const start = term.startK === undefined ? 300 : positiveNumber(term.startK, `${field}.startK`, 'a temperature > 0 K');
    terms.push({ key, atoms, fixed, start });
  };
  if (spec.debye) addTerm('debye', spec.debye, 'phonon.debye');
  (spec.einstein ?? []).forEach((term, i) => addTerm(i, term, `phonon.einstein[${i}]`));
  const free = terms.filter((term) => term.fixed === undefined);
  if (free.length === 0) throw new InputError('phonon', spec, 'at least one term without temperatureK (to be fitted)');
  if (t.length < free.length + 1) throw new InputError('fitRangeK', rangeK ?? 'all', `a range holding at least ${free.length + 1} points`, `${t.length} in range`);

  const build = (logTheta: number[]): PhononModel => {
    let k = 0;
    const model: { debye?: { atoms: number; temperatureK: number }; einstein: Array<{ atoms: number; temperatureK: number }> } = { einstein: [] };
    for (const term of terms) {
      const theta = term.fixed ?? Math.exp(logTheta[k++]);
      if (term.key === 'debye') model.debye = { atoms: term.atoms, temperatureK: theta };
      else model.einstein.push({ atoms: term.atoms, temperatureK: theta });
    }
    return model;
  };
  const cost = (logTheta: number[]) => {
    if (logTheta.some((x) => !(x > -5 && x < 12))) return Infinity; // θ between 0.007 K and 160 000 K
    const model = phononHeatCapacity(t, build(logTheta));
    let s = 0;
    for (let i = 0; i < t.length; i++) s += ((c[i] - model[i]) / c[i]) ** 2;
    return s;
  };
  const best = nelderMead(cost, free.map((term) => Math.log(term.start)), free.map(() => 0.3));
  return { model: build(best.x), relativeRms: Math.sqrt(best.value / t.length), pointsUsed: t.length };
}
