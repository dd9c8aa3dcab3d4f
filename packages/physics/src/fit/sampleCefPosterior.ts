/**
 * Posterior sampling of crystal-field parameters around a fitted solution with the affine-invariant ensemble sampler
 * (ensembleSampler.ts; Goodman & Weare 2010). Likelihood exp(−χ²/2) with the data errors as given, flat priors inside
 * the fit's bounds (the default search box when none were given). Derived quantities are summarised over the samples:
 * the level energies and the lowest doublet's g∥, g⊥ and moment g∥/2 (μB), from the two lowest states
 * (Abragam & Bleaney, Electron Paramagnetic Resonance of Transition Ions (1970), §15.4 for the effective g).
 *
 * Seeded and reproducible; progress and cancellation through `LongTask`.
 *
 * @example
 *   const report = fitCef(spec);
 *   const posterior = sampleCefPosterior(spec, report.best, { steps: 2000, seed: 1 });
 *   posterior.parameters.B20.mean; posterior.derived.gParallel.standardDeviation
 * See also: fitCef, ensembleSampler
 */
import { InputError } from '../errors';
import type { LongTask } from '../progress';
import { runSteps, runStepsAsync, type Steps } from '../progress/steps';
import { angularMomentumMatrices } from '../cef/angularMomentum';
import { doubletGTensor } from '../cef/groundDoubletGTensor';
import { CefFitModel, type CefFitSpec } from './cef/cefFitModel';
import { ensembleSamplerSteps } from './ensembleSampler';
import type { CefFitSolution } from './fitCef';

export interface SampleCefPosteriorOptions {
  /** Steps per walker after burn-in. Default 1000. */
  readonly steps?: number;
  readonly burnIn?: number;
  readonly walkers?: number;
  readonly thin?: number;
  readonly seed?: number;
  readonly task?: LongTask;
}

/** Mean and standard deviation of one quantity over the posterior samples. */
export interface PosteriorSummary {
  readonly mean: number;
  readonly standardDeviation: number;
}

export interface CefPosterior {
  /** Per free parameter (and 'intrinsicFwhmMeV' when the width is fitted), meV. */
  readonly parameters: Record<string, PosteriorSummary>;
  /** Correlation matrix of the free parameters over the samples (freeKeys order). */
  readonly correlation: number[][];
  readonly freeKeys: readonly string[];
  /** 'level1MeV', 'level2MeV', … and 'gParallel', 'gPerpendicular', 'momentParallelMuB'. */
  readonly derived: Record<string, PosteriorSummary>;
  readonly acceptanceFraction: number;
  /** Integrated autocorrelation time per parameter, in steps; steps / τ ≫ 1 is needed for trustworthy summaries. */
  readonly autocorrelationSteps: Record<string, number>;
  readonly sampleCount: number;
  /** Samples of the free parameters (then the width, if fitted) in meV, row-major (sampleCount × count), for plots. */
  readonly samplesMeV: Float64Array;
}

/** Sample the posterior of the free B_n^m of `spec` starting from a fitted `solution`. */
export function sampleCefPosterior(spec: CefFitSpec, solution: CefFitSolution, options: SampleCefPosteriorOptions = {}): CefPosterior {
  return runSteps(sampleCefPosteriorSteps(spec, solution, options));
}

/**
 * sampleCefPosterior that awaits `yieldNow()` before every MCMC step and every derived-quantity evaluation (see
 * fitCefAsync); bit-identical to the synchronous call.
 */
export function sampleCefPosteriorAsync(
  spec: CefFitSpec,
  solution: CefFitSolution,
  options: SampleCefPosteriorOptions & { readonly yieldNow: () => Promise<void> },
): Promise<CefPosterior> {
  return runStepsAsync(sampleCefPosteriorSteps(spec, solution, options), options.yieldNow);
}

/** sampleCefPosterior as pause points (progress/steps.ts). */
export function* sampleCefPosteriorSteps(spec: CefFitSpec, solution: CefFitSolution, options: SampleCefPosteriorOptions = {}): Steps<CefPosterior> {
  const model = new CefFitModel(spec);
  const p = model.parameterCount;
  const nB = model.freeKeys.length;
  if (solution.freeKeys.join(',') !== model.freeKeys.join(','))
    throw new InputError('solution.freeKeys', solution.freeKeys, `the free parameters of the specification (${model.freeKeys.join(', ')})`);
  const center = Float64Array.from({ length: p }, (_, k) =>
    k < nB ? solution.parametersMeV[model.freeKeys[k]] * model.norms[k] : (solution.intrinsicWidth?.valueMeV ?? model.startScaled[k]),
  );
  const spread = Float64Array.from({ length: p }, (_, k) => {
    const error = k < nB ? solution.errorsMeV[model.freeKeys[k]] * model.norms[k] : (solution.intrinsicWidth?.errorMeV ?? Infinity);
    // A fraction of the LM error; an undetermined parameter starts from a small fraction of its box.
    return Number.isFinite(error) && error > 0 ? 0.1 * error : 1e-3 * (model.upperScaled[k] - model.lowerScaled[k]);
  });
  const logProbability = (x: Float64Array): number => {
    for (let k = 0; k < p; k++) if (x[k] < model.lowerScaled[k] || x[k] > model.upperScaled[k]) return -Infinity;
    const r = model.residuals(x);
    let chi2 = 0;
    for (let i = 0; i < r.length; i++) chi2 += r[i] * r[i];
    return -0.5 * chi2;
  };
  const jm = angularMomentumMatrices(model.ion.J);
  const levelCount = solution.levelsMeV.length;
  const derivedNames = [...Array.from({ length: Math.max(0, levelCount - 1) }, (_, k) => `level${k + 1}MeV`), 'gParallel', 'gPerpendicular', 'momentParallelMuB'];
  const derived = (x: Float64Array): number[] => {
    const levels = model.evaluate(x).levels;
    const energies = Array.from({ length: levelCount - 1 }, (_, k) => (k + 1 < levels.levelEnergiesMeV.length ? levels.levelEnergiesMeV[k + 1] : levels.levelEnergiesMeV[levels.levelEnergiesMeV.length - 1]));
    const g = doubletGTensor(levels.eigenvectors, 0, 1, jm, model.ion.gJ);
    return [...energies, g.gParallel, g.gPerpendicular, g.gParallel / 2];
  };
  const run = yield* ensembleSamplerSteps(logProbability, { center, spread }, {
    steps: options.steps ?? 1000,
    burnIn: options.burnIn,
    walkers: options.walkers,
    thin: options.thin,
    seed: options.seed ?? 0,
    derived,
    task: options.task,
  });
  const parameters: Record<string, PosteriorSummary> = {};
  const autocorrelationSteps: Record<string, number> = {};
  model.freeKeys.forEach((key, k) => {
    parameters[key] = { mean: run.mean[k] / model.norms[k], standardDeviation: run.standardDeviations[k] / model.norms[k] };
    autocorrelationSteps[key] = run.autocorrelationSteps[k];
  });
  if (model.widthIndex >= 0) {
    parameters.intrinsicFwhmMeV = { mean: run.mean[model.widthIndex], standardDeviation: run.standardDeviations[model.widthIndex] };
    autocorrelationSteps.intrinsicFwhmMeV = run.autocorrelationSteps[model.widthIndex];
  }
  const correlation = Array.from({ length: nB }, (_, a) =>
    Array.from({ length: nB }, (_, b) => (a === b ? 1 : run.covariance[a * p + b] / (run.standardDeviations[a] * run.standardDeviations[b] || 1))),
  );
  const derivedSummary: Record<string, PosteriorSummary> = {};
  derivedNames.forEach((name, q) => (derivedSummary[name] = { mean: run.derivedMean![q], standardDeviation: run.derivedStandardDeviation![q] }));
  const samplesMeV = new Float64Array(run.sampleCount * p);
  for (let s = 0; s < run.sampleCount; s++) for (let k = 0; k < p; k++) samplesMeV[s * p + k] = run.samples[s * p + k] / (k < nB ? model.norms[k] : 1);
  return {
    parameters,
    correlation,
    freeKeys: model.freeKeys,
    derived: derivedSummary,
    acceptanceFraction: run.acceptanceFraction,
    autocorrelationSteps,
    sampleCount: run.sampleCount,
    samplesMeV,
  };
}
