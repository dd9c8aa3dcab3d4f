import { GAS_CONSTANT_J_PER_MOL_K } from '../units';
import { integrate } from './internal/gaussLegendre';
import { positiveNumber, temperatureArray } from './internal/validate';

/**
 * Debye-model lattice heat capacity C(T) in J/(mol K) per mole of formula units with `atomsPerFormulaUnit` atoms.
 *
 * C = 9 n R (T/θ_D)³ ∫_0^{θ_D/T} x⁴ eˣ/(eˣ − 1)² dx (P. Debye, Ann. Phys. 39, 789 (1912); Kittel, "Introduction to
 * Solid State Physics", ch. 5). Limits: 3nR at T ≫ θ_D (Dulong–Petit) and (12π⁴/5) n R (T/θ_D)³ at T ≪ θ_D.
 * The integral uses composite 16-point Gauss–Legendre panels of width ≤ 2 up to x = min(θ_D/T, 60); beyond 60 the
 * integrand is below 10⁻¹⁸ of its peak and the constant 4π⁴/15 (the full integral) is used instead.
 *
 * @example debyeHeatCapacity([300], 300, 1)[0] / (3 * 8.314462618) // ≈ 0.952
 * @throws InputError for temperatures ≤ 0, θ_D ≤ 0 or a non-positive atom count.
 * See also: einsteinHeatCapacity, fitPhononModel, latticeFromAnalogue.
 */
export function debyeHeatCapacity(temperaturesK: ArrayLike<number>, debyeTemperatureK: number, atomsPerFormulaUnit = 1): Float64Array {
  const temperatures = temperatureArray(temperaturesK);
  const theta = positiveNumber(debyeTemperatureK, 'debyeTemperatureK', 'a Debye temperature > 0 K');
  const atoms = positiveNumber(atomsPerFormulaUnit, 'atomsPerFormulaUnit', 'a number of atoms > 0');
  const integrand = (x: number) => {
    if (x < 1e-6) return x * x; // x⁴eˣ/(eˣ−1)² → x² as x → 0
    const em1 = Math.expm1(x);
    return (x ** 4 * (em1 + 1)) / (em1 * em1);
  };
  const fullIntegral = (4 * Math.PI ** 4) / 15; // ∫_0^∞ x⁴eˣ/(eˣ−1)² dx = 4π⁴/15 (Gradshteyn & Ryzhik 3.411)
  return temperatures.map((t) => {
    const xD = theta / t;
    const value = xD > 60 ? fullIntegral : integrate(integrand, 0, xD, Math.max(1, Math.ceil(xD / 2)));
    return 9 * atoms * GAS_CONSTANT_J_PER_MOL_K * (t / theta) ** 3 * value;
  });
}
