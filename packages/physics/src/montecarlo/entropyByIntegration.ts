/**
 * Entropy by thermodynamic integration down from infinite temperature, where an Ising system has S(∞) = N k_B ln 2.
 *
 * With ε(β) the energy per spin measured from its infinite-temperature value,
 *   s(β)/k_B = ln 2 + β ε(β) − ∫_0^β ε(β') dβ'
 * (from ln Z(β) = ln Z(0) − ∫_0^β E dβ' and S/k_B = ln Z + βE; e.g. Newman & Barkema (1999) §3.5). The interval from
 * β = 0 to the highest simulated temperature uses the exact high-temperature slope dε/dβ|₀ = −Var₀(E)/N and a
 * quadratic through the first point; the rest is the trapezoidal rule in β, with the Euler–Maclaurin end correction
 * h²/12 (ε'_a − ε'_b) when the heat capacity is given (dε/dβ = −T² c, c per spin in k_B; cubic Hermite accuracy).
 */
import { InputError } from '../errors';

/**
 * Entropy per spin (units of k_B) at each temperature.
 * @param temperaturesK any order, distinct, positive
 * @param energyPerSpinK ε(T) per spin in K, measured from the β = 0 value
 * @param varianceAtInfinityPerSpinK2 Var₀(E)/N in K² (Σ_{i<j} J_ij² + Σ b_i², per spin)
 * @param heatCapacityPerSpin optional c(T) per spin in units of k_B, for the end-corrected trapezoid
 * @example entropyByIntegration([10, 1, 0.1], eps, v) // [0.69, 0.5, 0.21]
 * See also: runSpinIceMonteCarlo
 */
export function entropyByIntegration(
  temperaturesK: readonly number[],
  energyPerSpinK: readonly number[],
  varianceAtInfinityPerSpinK2: number,
  heatCapacityPerSpin?: readonly number[],
): number[] {
  const n = temperaturesK.length;
  if (n !== energyPerSpinK.length) throw new InputError('energyPerSpinK', energyPerSpinK.length, `${n} values, one per temperature`);
  const order = temperaturesK.map((_, k) => k).sort((p, q) => temperaturesK[q] - temperaturesK[p]);
  const out = new Array<number>(n);
  let integral = 0;
  let prevBeta = 0;
  let prevE = 0;
  let prevSlope = 0;
  if (heatCapacityPerSpin && heatCapacityPerSpin.length !== n) throw new InputError('heatCapacityPerSpin', heatCapacityPerSpin.length, `${n} values`);
  for (let r = 0; r < n; r++) {
    const k = order[r];
    const beta = 1 / temperaturesK[k];
    const e = energyPerSpinK[k];
    if (r === 0) {
      const v = varianceAtInfinityPerSpinK2;
      const c = (e + v * beta) / (beta * beta);
      integral = (-v * beta * beta) / 2 + (c * beta * beta * beta) / 3;
    } else {
      const h = beta - prevBeta;
      integral += 0.5 * h * (e + prevE);
      if (heatCapacityPerSpin) {
        const slope = -heatCapacityPerSpin[k] / (beta * beta);
        integral += ((h * h) / 12) * (prevSlope - slope);
      }
    }
    out[k] = Math.log(2) + beta * e - integral;
    prevBeta = beta;
    prevE = e;
    if (heatCapacityPerSpin) prevSlope = -heatCapacityPerSpin[k] / (beta * beta);
  }
  return out;
}
