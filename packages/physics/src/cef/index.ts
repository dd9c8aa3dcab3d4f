/**
 * Crystal-electric-field engine: Stevens operators, the CEF Hamiltonian, site symmetries, parameter conventions
 * (units, rotations, Wybourne), diagonalisation with levels, eigenvectors and ground-doublet g-tensors.
 * Conventions (basis order, parameter keys, Zeeman sign): DEVELOPERS.md § Conventions.
 */
export { angularMomentumMatrices, checkJ, MAX_J, type AngularMomentumMatrices } from './angularMomentum';
export { stevensOperator } from './stevensOperator';
export { stevensOperatorFromTensor } from './stevensOperatorFromTensor';
export { cefHamiltonian, type CefParameters } from './cefHamiltonian';
export { zeemanHamiltonian } from './zeemanHamiltonian';
export { CEF_PARAMETER_KEYS, parseParameterKey, parameterKey, type StevensIndex } from './parameterKeys';
export { SITE_SYMMETRIES, CUBIC_SYMMETRIES, allowedParameters } from './siteSymmetry';
export { normalizeCefParameters, type NormalizeCefOptions } from './normalizeCefParameters';
export { solveCef, classifyDoublet, groupLevels, type CefLevel, type GroundDoublet, type CefSolution, type SolveCefOptions } from './solveCef';
export { doubletGTensor, type DoubletGTensor } from './groundDoubletGTensor';
export { describeLevels, formatAngularMomentum, type DescribedLevel, type DescribedState, type StateComponent } from './describeLevels';
export { rotateCefParameters } from './rotateCefParameters';
export { wignerD, wignerSmallD, eulerAnglesFromMatrix, rotationMatrixFromEuler, type EulerAngles } from './wignerRotation';
export { cubicToTrigonal, TRIGONAL_FRAME_OF_CUBIC } from './cubicToTrigonal';
export { stevensToWybourne, wybourneToStevens, stevensWybourneFactor } from './wybourne';
export { llwParameters, LLW_FACTORS } from './leaLeaskWolf';
export { pointChargeParameters, pointChargeCoefficients, type PointCharge, type PointChargeOptions } from './pointCharge';
export { scaleCefParameters, type ScaleOptions } from './scaleParameters';
