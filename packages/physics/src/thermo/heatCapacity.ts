import { InputError } from '../errors';
import { addScaledInPlace, clone, hermitianEigen } from '../linalg';
import { zeemanHamiltonian } from '../cef';
import { PreparedIon, type SingleIonInput } from './internal/singleIon';
import { positiveNumber } from './internal/validate';
import { schottkyHeatCapacity, type SchottkyResult } from './schottky';

export interface CefHeatCapacityOptions {
  temperaturesK: ArrayLike<number>;
  /** Applied field in T as [Bx, By, Bz] in the ion's local (CEF) frame; default zero. */
  fieldTesla?: readonly [number, number, number];
  /** Rare-earth ions per formula unit (default 1) for the per-formula-unit values. */
  ionsPerFormulaUnit?: number;
}

export interface CefHeatCapacityResult extends SchottkyResult {
  /** The 2J+1 energies in meV relative to the ground state. */
  levelsMeV: Float64Array;
  /** C and S per mole of formula units (× ionsPerFormulaUnit), J/(mol K). */
  heatCapacityJPerMolFormulaUnitK: Float64Array;
  entropyJPerMolFormulaUnitK: Float64Array;
}

/**
 * Crystal-field (Schottky) heat capacity C(T) and entropy S(T) of a rare-earth ion, per mole of ions and per formula
 * unit, from the exact levels of H_CEF (+ optional Zeeman term −g_J μB B·J in the local frame).
 *
 * Levels from one diagonalisation; C and S from schottkyHeatCapacity (Schottky formula). `entropyJPerMolK` is
 * counted from T = 0 (S − R ln g₀, the entropy released by thermal population of excited levels, what ∫C/T dT
 * of data gives); `totalEntropyJPerMolK` is the statistical S, which tends to R ln(2J+1) at high T; a Kramers
 * ground doublet split by a small field gives the plateau R ln 2 in `entropyJPerMolK` before higher levels fill.
 *
 * @example cefHeatCapacity({ J: 7.5, gJ: 4 / 3, parametersMeV: { B20: -0.05 } }, { temperaturesK: [10, 100] })
 * @throws InputError for T ≤ 0, a bad field or ionsPerFormulaUnit.
 * See also: schottkyHeatCapacity, magneticEntropy, reduceHeatCapacity.
 */
export function cefHeatCapacity(ion: SingleIonInput, options: CefHeatCapacityOptions): CefHeatCapacityResult {
  if (options === null || typeof options !== 'object') throw new InputError('options', options, 'an object { temperaturesK }');
  const prepared = new PreparedIon(ion);
  const ions = options.ionsPerFormulaUnit === undefined ? 1 : positiveNumber(options.ionsPerFormulaUnit, 'ionsPerFormulaUnit', 'a number of ions > 0');
  const h = clone(prepared.hCef);
  if (options.fieldTesla !== undefined) addScaledInPlace(h, zeemanHamiltonian(prepared.J, prepared.gJ, options.fieldTesla));
  const { values } = hermitianEigen(h, { vectors: false });
  const levels = values.map((e) => e - values[0]);
  const r = schottkyHeatCapacity(levels, options.temperaturesK);
  return {
    ...r,
    levelsMeV: levels,
    heatCapacityJPerMolFormulaUnitK: r.heatCapacityJPerMolK.map((c) => c * ions),
    entropyJPerMolFormulaUnitK: r.entropyJPerMolK.map((s) => s * ions),
  };
}
