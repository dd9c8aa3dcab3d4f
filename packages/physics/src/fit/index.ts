/**
 * `@multiplet/physics/fit`: least squares (Levenberg–Marquardt with bounds), covariance, multi-start global search
 * with distinct minima, affine-invariant ensemble MCMC, optimal assignment, and the crystal-field fits built on them.
 */
export type { LeastSquaresProblem, ParameterBounds, CovarianceSummary } from './types';
export { levenbergMarquardt, levenbergMarquardtSteps } from './levenbergMarquardt';
export type { LevenbergMarquardtOptions, LevenbergMarquardtResult, LevenbergMarquardtStop } from './levenbergMarquardt';
export { covarianceFromJacobian } from './covariance';
export { finiteDifferenceJacobian } from './finiteDifferenceJacobian';
export { multiStartSearch, multiStartSearchSteps } from './multiStartSearch';
export type { MultiStartOptions, MultiStartResult, FitMinimum } from './multiStartSearch';
export { ensembleSampler, ensembleSamplerSteps, integratedAutocorrelationTime } from './ensembleSampler';
export type { EnsembleSamplerOptions, EnsembleSamplerResult, EnsembleStart } from './ensembleSampler';
export { solveAssignment } from './solveAssignment';
export { fitCef, fitCefAsync, fitCefSteps, cefLeastSquaresProblem, describeCefSolution } from './fitCef';
export type {
  FitCefOptions,
  CefFitSolution,
  CefFitReport,
  CefFitSpec,
  PeakObservation,
  SpectrumObservation,
  SusceptibilityObservation,
  MagnetizationObservation,
  PeakAssignment,
} from './fitCef';
export { sampleCefPosterior, sampleCefPosteriorAsync, sampleCefPosteriorSteps } from './sampleCefPosterior';
export type { SampleCefPosteriorOptions, CefPosterior, PosteriorSummary } from './sampleCefPosterior';
export { CefFitModel } from './cef/cefFitModel';
