import { InputError } from '../errors';
import { fitPhononModel, type PhononTermSpec } from './fitPhononModel';
import { interpolateLinear } from './internal/interpolate';
import { finiteNumber, numberArray, positiveNumber, requireIncreasing, requireSameLength, temperatureArray } from './internal/validate';
import { latticeFromAnalogue, type AnalogueData, type SampleMass } from './latticeFromAnalogue';
import { magneticEntropy, R_LN2_J_PER_MOL_K, SPIN_ICE_ENTROPY_J_PER_MOL_K, type EntropyExtrapolation, type MagneticEntropyResult } from './magneticEntropy';
import { nuclearSchottkyHeatCapacity, type HyperfineParameters } from './nuclearSchottky';
import { phononHeatCapacity, type PhononModel } from './phononModel';
import { schottkyHeatCapacity } from './schottky';

/** What to subtract from a measured heat capacity, and how to integrate what is left. */
export interface HeatCapacityReductionInput {
  /** Measurement temperatures in K, strictly increasing. */
  temperaturesK: ArrayLike<number>;
  /** Measured C in J/(mol K) per formula unit. */
  heatCapacityJPerMolK: ArrayLike<number>;
  /** Standard uncertainties of the measured C, J/(mol K) per formula unit. */
  uncertaintyJPerMolK?: ArrayLike<number>;
  /** Rare-earth ions per formula unit (default 1): converts to per mole of ions. */
  ionsPerFormulaUnit?: number;
  /** Lattice: a Debye/Einstein model (terms without temperatureK are fitted to the data in fitRangeK). */
  phonon?: { debye?: PhononTermSpec; einstein?: readonly PhononTermSpec[]; fitRangeK?: readonly [number, number] };
  /** Lattice: the measured C of a nonmagnetic analogue, rescaled with the Debye-temperature ratio. */
  analogue?: AnalogueData & { sample: SampleMass };
  /** Nuclear Schottky terms (per rare-earth ion), one per isotope. */
  nuclear?: readonly HyperfineParameters[];
  /** Secondary phase: molar fraction f, with its C as a dataset or as Schottky levels (J/(mol K) per mole of phase). */
  impurity?: {
    fraction: number;
    dataset?: { temperaturesK: ArrayLike<number>; heatCapacityJPerMolK: ArrayLike<number> };
    levelsMeV?: ArrayLike<number>;
  };
  /** Low-temperature extrapolation of the entropy (default 'none') and number of points fitted (default 5). */
  extrapolation?: EntropyExtrapolation;
  lowPoints?: number;
}

export interface HeatCapacityReductionResult {
  /** Each subtracted part at the data temperatures, J/(mol K) per formula unit (zeros when not used). */
  latticeJPerMolK: Float64Array;
  nuclearJPerMolK: Float64Array;
  impurityJPerMolK: Float64Array;
  /** The phonon model used (given or fitted), if any. */
  phononModel?: PhononModel;
  /** Magnetic C per formula unit and per mole of rare-earth ions, J/(mol K). */
  magneticJPerMolFuK: Float64Array;
  magneticJPerMolIonK: Float64Array;
  /** Magnetic entropy per mole of rare-earth ions, J/(mol K), with its propagated uncertainty and extrapolation. */
  entropy: MagneticEntropyResult;
  /** Comparison lines per mole of ions: R ln 2 and R[ln 2 − ½ ln(3/2)] (spin ice with Pauling's residual entropy). */
  comparisonLinesJPerMolK: { rLn2: number; spinIce: number };
}

/**
 * Reduce a measured heat capacity to the magnetic part and its entropy:
 *   C_mag = [C_meas − f C_impurity] / (1 − f) − C_lattice − n_ion C_nuclear,   S_mag(T) = ∫ C_mag/T dT per ion.
 * The lattice comes from a Debye/Einstein model (given, or fitted in `phonon.fitRangeK` to the raw data, taken as
 * lattice-only there) or from a nonmagnetic analogue (`latticeFromAnalogue`, Bouvier et al. 1991 scaling); not both.
 * The impurity fraction f is a molar fraction of secondary phase (common practice). Uncertainties of the measured
 * points are propagated to S_mag (the subtracted models are taken as exact).
 *
 * Units: T in K; C in J/(mol K) per formula unit in, per formula unit and per mole of rare-earth ions out.
 *
 * @example reduceHeatCapacity({ temperaturesK, heatCapacityJPerMolK, ionsPerFormulaUnit: 2, phonon: { debye: { atoms: 11, temperatureK: 400 } } })
 * @throws InputError for non-increasing temperatures, mismatched lengths, both lattice sources, f outside [0, 1).
 * See also: magneticEntropy, fitPhononModel, latticeFromAnalogue, nuclearSchottkyHeatCapacity.
 */
export function reduceHeatCapacity(input: HeatCapacityReductionInput): HeatCapacityReductionResult {
  const t = requireIncreasing(temperatureArray(input.temperaturesK), 'temperaturesK');
  const measured = numberArray(input.heatCapacityJPerMolK, 'heatCapacityJPerMolK', 'heat capacities in J/(mol K)');
  requireSameLength(t, measured, 'temperaturesK', 'heatCapacityJPerMolK');
  let sigma: Float64Array | undefined;
  if (input.uncertaintyJPerMolK !== undefined) {
    sigma = numberArray(input.uncertaintyJPerMolK, 'uncertaintyJPerMolK', 'uncertainties in J/(mol K)');
    requireSameLength(t, sigma, 'temperaturesK', 'uncertaintyJPerMolK');
  }
  const ions = input.ionsPerFormulaUnit === undefined ? 1 : positiveNumber(input.ionsPerFormulaUnit, 'ionsPerFormulaUnit', 'a number > 0');
  const n = t.length;

  // Impurity: C_meas = (1 − f) C_sample + f C_imp  ⇒  C_sample = (C_meas − f C_imp)/(1 − f).
  const impurity = new Float64Array(n);
  let fraction = 0;
  if (input.impurity !== undefined) {
    fraction = finiteNumber(input.impurity.fraction, 'impurity.fraction', 'a molar fraction from 0 to < 1');
    if (fraction < 0 || fraction >= 1) throw new InputError('impurity.fraction', fraction, 'a molar fraction from 0 to < 1');
    const { dataset, levelsMeV } = input.impurity;
    if ((dataset === undefined) === (levelsMeV === undefined)) throw new InputError('impurity', input.impurity, 'exactly one of dataset or levelsMeV');
    let perPhase: Float64Array;
    if (dataset) {
      const ti = requireIncreasing(temperatureArray(dataset.temperaturesK, 'impurity.dataset.temperaturesK'), 'impurity.dataset.temperaturesK');
      const ci = numberArray(dataset.heatCapacityJPerMolK, 'impurity.dataset.heatCapacityJPerMolK', 'heat capacities in J/(mol K)');
      requireSameLength(ti, ci, 'impurity.dataset.temperaturesK', 'impurity.dataset.heatCapacityJPerMolK');
      perPhase = t.map((x, i) => interpolateLinear(ti, ci, x, `temperaturesK[${i}]`, x, "a temperature inside the impurity dataset's range"));
    } else {
      perPhase = schottkyHeatCapacity(levelsMeV!, t).heatCapacityJPerMolK;
    }
    perPhase.forEach((c, i) => (impurity[i] = fraction * c));
  }

  if (input.phonon && input.analogue) throw new InputError('analogue', 'both phonon and analogue', 'one lattice source: phonon or analogue');
  const lattice = new Float64Array(n);
  let phononModel: PhononModel | undefined;
  if (input.phonon) {
    const { debye, einstein, fitRangeK } = input.phonon;
    const needsFit = (debye && debye.temperatureK === undefined) || (einstein ?? []).some((e) => e.temperatureK === undefined);
    if (needsFit) phononModel = fitPhononModel(t, measured, { debye, einstein }, fitRangeK).model;
    else
      phononModel = {
        debye: debye ? { atoms: debye.atoms, temperatureK: debye.temperatureK! } : undefined,
        einstein: (einstein ?? []).map((e) => ({ atoms: e.atoms, temperatureK: e.temperatureK! })),
      };
    phononHeatCapacity(t, phononModel).forEach((c, i) => (lattice[i] = c));
  } else if (input.analogue) {
    latticeFromAnalogue(t, input.analogue, input.analogue.sample).heatCapacityJPerMolK.forEach((c, i) => (lattice[i] = c));
  }

  const nuclear = new Float64Array(n);
  if (input.nuclear !== undefined) {
    if (!Array.isArray(input.nuclear)) throw new InputError('nuclear', input.nuclear, 'an array of { hyperfineMeV, nuclearSpin, abundance? }');
    for (const species of input.nuclear) nuclearSchottkyHeatCapacity(t, species).heatCapacityJPerMolK.forEach((c, i) => (nuclear[i] += ions * c));
  }

  const magneticFu = t.map((_, i) => (measured[i] - impurity[i]) / (1 - fraction) - lattice[i] - nuclear[i]);
  const magneticIon = magneticFu.map((c) => c / ions);
  const sigmaIon = sigma ? sigma.map((s) => s / ((1 - fraction) * ions)) : undefined;
  const entropy = magneticEntropy(t, magneticIon, {
    uncertaintyJPerMolK: sigmaIon,
    extrapolation: input.extrapolation,
    lowPoints: input.lowPoints,
  });
  return {
    latticeJPerMolK: lattice,
    nuclearJPerMolK: nuclear,
    impurityJPerMolK: impurity,
    phononModel,
    magneticJPerMolFuK: magneticFu,
    magneticJPerMolIonK: magneticIon,
    entropy,
    comparisonLinesJPerMolK: { rLn2: R_LN2_J_PER_MOL_K, spinIce: SPIN_ICE_ENTROPY_J_PER_MOL_K },
  };
}
