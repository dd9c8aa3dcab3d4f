/**
 * `@multiplet/physics/neutron`: CEF transition strengths (powder and single crystal), Boltzmann populations and
 * detailed balance, the dipole magnetic form factor, line shapes with a polynomial resolution, and spectra in
 * absolute units (mb sr⁻¹ meV⁻¹ per ion).
 */
export { magneticFormFactor, radialFormFactors } from './magneticFormFactor';
export { FORM_FACTOR_TABLE, type FormFactorCoefficients, type FormFactorEntry } from './formFactorTable';
export { transitionStrengths, type TransitionStrengths } from './transitionStrengths';
export {
  cefTransitions,
  levelStrengths,
  levelStrengthsAlong,
  levelPopulations,
  thermalTransitions,
  type LevelStrengths,
  type PopulatedLevel, type CefTransition, type CefTransitionsResult, type CefTransitionsOptions } from './cefTransitions';
export { lineShape, LINE_SHAPES, type LineShapeKind } from './lineShape';
export {
  neutronSpectrum,
  spectrumFromTransitions,
  resolutionFwhmMeV,
  checkSpectrumOptions,
  type NeutronSpectrumOptions,
  type NeutronSpectrumResult,
} from './neutronSpectrum';
