import { GAS_CONSTANT_J_PER_MOL_K } from '../units';
import { positiveNumber, temperatureArray } from './internal/validate';

/**
 * Einstein-model heat capacity C(T) in J/(mol K) for `atomsPerFormulaUnit` atoms (3 modes each) per formula unit,
 * all vibrating at k_B θ_E.
 *
 * C = 3 n R x² eˣ/(eˣ − 1)², x = θ_E/T (A. Einstein, Ann. Phys. 22, 180 (1907); Kittel, "Introduction to Solid State
 * Physics", ch. 5). Tends to 3nR at T ≫ θ_E and vanishes as x² e⁻ˣ at low T.
 *
 * @example einsteinHeatCapacity([100], 100, 1)[0] // 3R·e/(e−1)² ≈ 22.99 J/(mol K)
 * @throws InputError for temperatures ≤ 0, θ_E ≤ 0 or a non-positive atom count.
 * See also: debyeHeatCapacity, fitPhononModel.
 */
export function einsteinHeatCapacity(temperaturesK: ArrayLike<number>, einsteinTemperatureK: number, atomsPerFormulaUnit = 1): Float64Array {
  const temperatures = temperatureArray(temperaturesK);
  const theta = positiveNumber(einsteinTemperatureK, 'einsteinTemperatureK', 'an Einstein temperature > 0 K');
  const atoms = positiveNumber(atomsPerFormulaUnit, 'atomsPerFormulaUnit', 'a number of atoms > 0');
  return temperatures.map((t) => {
    const x = theta / t;
    if (x > 700) return 0; // e^{−700} underflows the ratio; the term is below 10⁻³⁰⁰ anyway
    const em1 = Math.expm1(x);
    return 3 * atoms * GAS_CONSTANT_J_PER_MOL_K * (x * x * (em1 + 1)) / (em1 * em1);
  });
}
