import { InputError } from '../errors';
import { interpolateLinear } from './internal/interpolate';
import { numberArray, positiveNumber, requireIncreasing, requireSameLength, temperatureArray } from './internal/validate';

/** Measured heat capacity of a nonmagnetic analogue and its molar mass (and, optionally, molar volume). */
export interface AnalogueData {
  temperaturesK: ArrayLike<number>;
  heatCapacityJPerMolK: ArrayLike<number>;
  molarMassGPerMol: number;
  molarVolumeCm3PerMol?: number;
}

/** The sample's molar mass (and, optionally, molar volume), per formula unit as for the analogue. */
export interface SampleMass {
  molarMassGPerMol: number;
  molarVolumeCm3PerMol?: number;
}

export interface AnalogueLatticeResult {
  /** Lattice heat capacity of the sample at the requested temperatures, J/(mol K) per formula unit. */
  heatCapacityJPerMolK: Float64Array;
  /** θ_D(sample)/θ_D(analogue) used to rescale the temperature axis. */
  debyeTemperatureRatio: number;
  /** 'mass' (θ ∝ M^(−1/2)) or 'mass-volume' (θ ∝ M^(−1/2) V^(−1/3)), whichever the inputs allow. */
  scaling: 'mass' | 'mass-volume';
}

/**
 * Lattice heat capacity of a magnetic sample from the measured heat capacity of a nonmagnetic analogue with the
 * same structure and the same number of atoms per formula unit, rescaling the temperature axis by the ratio of
 * Debye temperatures: C_sample(T) = C_analogue(T / r), r = θ_D,sample / θ_D,analogue.
 *
 * Ratio: with both molar volumes given, the Lindemann-type form of Bouvier, Lethuillier & Schmitt,
 * Phys. Rev. B 43, 13137 (1991) (from memory), θ_D ∝ M^(−1/2) V^(−1/3), so r = (M_a/M_s)^(1/2) (V_a/V_s)^(1/3);
 * otherwise the mass-only form θ_D ∝ M^(−1/2) (same force constants; common practice). The analogue data are
 * interpolated linearly in T; rescaled temperatures outside the analogue's measured range are an error rather than
 * an extrapolation.
 *
 * @example latticeFromAnalogue([5, 10], { temperaturesK, heatCapacityJPerMolK, molarMassGPerMol: 533.9 }, { molarMassGPerMol: 740.6 })
 * @throws InputError for non-increasing analogue temperatures, mismatched lengths, T/r outside the analogue's range.
 * See also: debyeHeatCapacity, reduceHeatCapacity.
 */
export function latticeFromAnalogue(temperaturesK: ArrayLike<number>, analogue: AnalogueData, sample: SampleMass): AnalogueLatticeResult {
  const t = temperatureArray(temperaturesK);
  if (analogue === null || typeof analogue !== 'object') throw new InputError('analogue', analogue, 'an object { temperaturesK, heatCapacityJPerMolK, molarMassGPerMol }');
  if (sample === null || typeof sample !== 'object') throw new InputError('sample', sample, 'an object { molarMassGPerMol }');
  const ta = requireIncreasing(temperatureArray(analogue.temperaturesK, 'analogue.temperaturesK'), 'analogue.temperaturesK');
  const ca = numberArray(analogue.heatCapacityJPerMolK, 'analogue.heatCapacityJPerMolK', 'heat capacities in J/(mol K)');
  requireSameLength(ta, ca, 'analogue.temperaturesK', 'analogue.heatCapacityJPerMolK');
  const ma = positiveNumber(analogue.molarMassGPerMol, 'analogue.molarMassGPerMol', 'a molar mass > 0 g/mol');
  const ms = positiveNumber(sample.molarMassGPerMol, 'sample.molarMassGPerMol', 'a molar mass > 0 g/mol');
  let ratio = Math.sqrt(ma / ms);
  let scaling: 'mass' | 'mass-volume' = 'mass';
  if (analogue.molarVolumeCm3PerMol !== undefined || sample.molarVolumeCm3PerMol !== undefined) {
    const va = positiveNumber(analogue.molarVolumeCm3PerMol, 'analogue.molarVolumeCm3PerMol', 'a molar volume > 0 cm³/mol (give both or neither)');
    const vs = positiveNumber(sample.molarVolumeCm3PerMol, 'sample.molarVolumeCm3PerMol', 'a molar volume > 0 cm³/mol (give both or neither)');
    ratio *= Math.cbrt(va / vs);
    scaling = 'mass-volume';
  }
  const heat = t.map((ti, i) =>
    interpolateLinear(ta, ca, ti / ratio, `temperaturesK[${i}]`, ti, `a temperature whose rescaled value T/r (r = ${ratio.toFixed(5)}) lies in the analogue's range`),
  );
  return { heatCapacityJPerMolK: heat, debyeTemperatureRatio: ratio, scaling };
}
