/**
 * Thermodynamics: single-ion magnetization, Van Vleck susceptibility and CEF heat capacity from the crystal field;
 * heat-capacity data reduction (Debye, Einstein, analogue lattice, nuclear Schottky, impurity), entropy integration,
 * Curie–Weiss fits. Units: DEVELOPERS.md § Conventions; every name carries its unit.
 */
export { magnetization, POWDER_DEGREE_SEQUENCE, type MagnetizationOptions, type MagnetizationResult, type PowderOptions, type SingleIonInput } from './magnetization';
export { vanVleckSusceptibility, type SusceptibilityOptions, type SusceptibilityResult } from './susceptibility';
export { cefHeatCapacity, type CefHeatCapacityOptions, type CefHeatCapacityResult } from './heatCapacity';
export { schottkyHeatCapacity, type SchottkyResult } from './schottky';
export { siteFrames, toLocal, type Rotation3, type SiteFrameName } from './siteFrames';
export { debyeHeatCapacity } from './debye';
export { einsteinHeatCapacity } from './einstein';
export { phononHeatCapacity, type PhononModel, type PhononTerm } from './phononModel';
export { fitPhononModel, type PhononFitResult, type PhononTermSpec } from './fitPhononModel';
export { latticeFromAnalogue, type AnalogueData, type AnalogueLatticeResult, type SampleMass } from './latticeFromAnalogue';
export { nuclearSchottkyHeatCapacity, type HyperfineParameters } from './nuclearSchottky';
export {
  magneticEntropy,
  R_LN2_J_PER_MOL_K,
  PAULING_ENTROPY_J_PER_MOL_K,
  SPIN_ICE_ENTROPY_J_PER_MOL_K,
  type EntropyExtrapolation,
  type MagneticEntropyOptions,
  type MagneticEntropyResult,
} from './magneticEntropy';
export { curieWeissFit, type CurieWeissOptions, type CurieWeissResult } from './curieWeiss';
export { reduceHeatCapacity, type HeatCapacityReductionInput, type HeatCapacityReductionResult } from './reduceHeatCapacity';
export type { Demagnetization } from './internal/meanField';
