/**
 * Fit crystal-field parameters B_n^m (restricted to the site symmetry) to neutron peak lists and/or measured spectra,
 * optionally jointly with χ(T) and M(B) data (each dataset with its own weight and optional scale factor),
 * reporting every distinct minimum within a χ² margin with its uncertainties, correlations and per-dataset residuals.
 *
 * Local fits are Levenberg–Marquardt (levenbergMarquardt.ts) in the scaled parameter space of cef/cefFitModel.ts,
 * with the peak assignment frozen while the Jacobian is taken; the global search is multiStartSearch from the user's
 * start plus `starts` random starts brought to the energy scale of the data (cefRandomStarts). Errors are 1σ from the Jacobian covariance with the data errors
 * trusted as given (errorScaling 'data', default) or inflated by χ²_red ('residual').
 *
 * Symmetry twins (frame rotations that leave the data unchanged, fit/cef/cefTwins.ts) are merged into one minimum
 * and reported under a stated sign convention (B43 ≥ 0 in D3d unless the start has B43 < 0).
 *
 * @example
 *   const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: { B20: -0.05, B40: 1e-3 },
 *     peaks: [{ energyMeV: 7.9, errorMeV: 0.1, temperatureK: 5 }, …] }, { starts: 32, seed: 1 });
 *   report.best.parametersMeV; report.best.errorsMeV; report.minima.length
 * See also: fitCefAsync (the same fit, pausing for the host's event loop), sampleCefPosterior, multiStartSearch, cefTransitions
 */
import { InputError } from '../errors';
import type { LongTask } from '../progress';
import { runSteps, runStepsAsync, type Steps } from '../progress/steps';
import { createRandom, type Random } from '../random';
import { levelStrengths } from '../neutron/cefTransitions';
import { CefFitModel, type CefFitSpec, type PeakAssignment } from './cef/cefFitModel';
import { CefTwins } from './cef/cefTwins';
import { finiteDifferenceJacobian } from './finiteDifferenceJacobian';
import { multiStartSearchSteps } from './multiStartSearch';
import type { LevenbergMarquardtResult } from './levenbergMarquardt';
import type { LeastSquaresProblem } from './types';

export type {
  CefFitSpec,
  PeakObservation,
  SpectrumObservation,
  SusceptibilityObservation,
  MagnetizationObservation,
  PeakAssignment,
} from './cef/cefFitModel';

export interface FitCefOptions {
  /** Random starts in addition to the given start (0: a local fit only). Default 0. */
  readonly starts?: number;
  readonly seed?: number;
  /** Minima with χ² ≤ χ²_best + max(chi2Margin, 0.2 χ²_best) are reported. Default 1. */
  readonly chi2Margin?: number;
  readonly errorScaling?: 'data' | 'residual';
  readonly maxIterations?: number;
  readonly task?: LongTask;
}

/** One fitted solution. Energies and parameters in meV. */
export interface CefFitSolution {
  /** All parameters (fixed and fitted), meV. */
  readonly parametersMeV: Record<string, number>;
  /** 1σ errors of the free parameters, meV (Infinity: not determined by the data; all of them when ν < 0). */
  readonly errorsMeV: Record<string, number>;
  readonly freeKeys: readonly string[];
  /** Correlation matrix of the free parameters, rows/columns in `freeKeys` order. */
  readonly correlation: number[][];
  readonly chi2: number;
  /** χ²/ν; χ² itself when ν ≤ 0 (stated in the report's warnings). */
  readonly chi2Reduced: number;
  /** ν = data − free parameters − profiled scales and backgrounds; negative when under-determined. */
  readonly degreesOfFreedom: number;
  /** χ² split by dataset: the peak list, one entry per spectrum, per χ(T) and per M(B) dataset. */
  readonly chi2ByDataset: {
    readonly peaks: number;
    readonly spectra: readonly number[];
    readonly susceptibility: readonly number[];
    readonly magnetization: readonly number[];
  };
  /**
   * Normalised residuals √weight·(model − data)/σ per dataset, in the data's order: per peak the energy residual and
   * the intensity residual (null without an observed intensity); one array per spectrum (one value per energy
   * point, model = scale·S(E) + background), per χ(T) and per M(B) dataset.
   */
  readonly residualsByDataset: {
    readonly peaks: { readonly energy: readonly number[]; readonly intensity: readonly (number | null)[] };
    readonly spectra: readonly (readonly number[])[];
    readonly susceptibility: readonly (readonly number[])[];
    readonly magnetization: readonly (readonly number[])[];
  };
  /** Profiled (or 1) scale per χ(T) and M(B) dataset. */
  readonly bulkScales: { readonly susceptibility: readonly number[]; readonly magnetization: readonly number[] };
  /** Per peak: the transition it is assigned to and the computed energy (and intensity). */
  readonly peakAssignments: readonly PeakAssignment[];
  /** Energy residual per peak, (E_calc − E_obs)/σ. */
  readonly peakEnergyResiduals: readonly number[];
  /** Profiled intensity scale per (temperature, incident energy) group of peaks, in group order of first appearance. */
  readonly peakScales: readonly number[];
  /** Profiled [scale, flat background] per spectrum. */
  readonly spectrumScales: readonly (readonly [number, number])[];
  /** Level energies above the ground level, meV. */
  readonly levelsMeV: readonly number[];
  /** The fitted shared intrinsic FWHM of the spectra ± 1σ, meV (when fitIntrinsicWidth). */
  readonly intrinsicWidth?: { readonly valueMeV: number; readonly errorMeV: number };
  /** How many starts ended in this minimum. */
  readonly hits: number;
  readonly converged: boolean;
}

export interface CefFitReport {
  readonly best: CefFitSolution;
  /** Distinct minima within the χ² margin, best first (best included). */
  readonly minima: readonly CefFitSolution[];
  readonly startsRun: number;
  readonly distinctMinimaFound: number;
  /** Model evaluations (one H_CEF diagonalisation for the neutron data each; χ and M diagonalise again). */
  readonly hamiltonianEvaluations: number;
  /** Free keys whose sign a symmetry twin flips (empty: no twins for this symmetry and these fixed parameters). */
  readonly twinFlippedKeys: readonly string[];
  readonly warnings: readonly string[];
}

/** Least-squares view of the model: residuals, and a finite-difference Jacobian with the assignment frozen. */
export function cefLeastSquaresProblem(model: CefFitModel): LeastSquaresProblem {
  return {
    parameterCount: model.parameterCount,
    residuals: (x) => model.residuals(x),
    jacobian: (x, r) =>
      model.withFrozenAssignment(x, () =>
        // Forward differences: half the diagonalisations of central ones; their O(√ε) ≈ 1e-8 relative error is far
        // below what CEF data determine (central differences are kept for the NIST-grade generic path).
        finiteDifferenceJacobian((y) => model.residuals(y), x, r, {
          lower: model.lowerScaled,
          upper: model.upperScaled,
          typicalScale: Array.from({ length: model.parameterCount }, () => 1),
          method: 'forward',
        }),
      ),
  };
}

/** Describe one LM result as a CefFitSolution. */
export function describeCefSolution(
  model: CefFitModel,
  fit: LevenbergMarquardtResult,
  hits: number,
  errorScaling: 'data' | 'residual' = 'data',
): CefFitSolution {
  const evaluation = model.evaluate(fit.parameters);
  const p = model.freeKeys.length;
  const all = model.parameterCount;
  const dof = model.degreesOfFreedom;
  // ν < 0 (fewer data than free parameters and profiled scales): the data fix at most a combination of the
  // parameters, so no parameter has an error. ν = 0: s² = χ²/ν is undefined, so 'residual' errors do not exist.
  // The least-squares side cannot see this when the profiled scales are what tips the count.
  const undetermined = dof < 0 || (dof === 0 && errorScaling === 'residual');
  const standardError = (k: number) => (undetermined ? Infinity : fit.standardErrors[k]);
  const errorsMeV: Record<string, number> = {};
  model.freeKeys.forEach((key, k) => (errorsMeV[key] = standardError(k) / model.norms[k]));
  const correlation = Array.from({ length: p }, (_, a) =>
    Array.from({ length: p }, (_, b) => (a === b ? 1 : undetermined ? 0 : fit.correlation[a * all + b])),
  );
  const width = model.widthIndex >= 0 ? { valueMeV: fit.parameters[model.widthIndex], errorMeV: standardError(model.widthIndex) } : undefined;
  // Split the residual vector in the order the model writes it: peaks (energy, then intensity), spectra, χ(T), M(B).
  const r = evaluation.residuals;
  let offset = 0;
  const take = (n: number) => Array.from(r.subarray(offset, (offset += n)));
  const peakEnergy: number[] = [];
  const peakIntensity: (number | null)[] = [];
  for (const peak of model.peaks) {
    peakEnergy.push(r[offset++]);
    peakIntensity.push(peak.intensity === undefined ? null : r[offset++]);
  }
  const residualsByDataset = {
    peaks: { energy: peakEnergy, intensity: peakIntensity },
    spectra: model.spectra.map((sp) => take(sp.energiesMeV.length)),
    susceptibility: model.susceptibility.map((d) => take(d.temperaturesK.length)),
    magnetization: model.magnetization.map((d) => take(d.fieldsT.length)),
  };
  return {
    parametersMeV: model.parametersMeV(fit.parameters),
    errorsMeV,
    freeKeys: model.freeKeys,
    correlation,
    chi2: fit.chi2,
    chi2Reduced: dof > 0 ? fit.chi2 / dof : fit.chi2,
    degreesOfFreedom: dof,
    chi2ByDataset: {
      peaks: evaluation.peakChi2,
      spectra: evaluation.spectrumChi2,
      susceptibility: evaluation.bulkChi2.susceptibility,
      magnetization: evaluation.bulkChi2.magnetization,
    },
    residualsByDataset,
    bulkScales: evaluation.bulkScales,
    peakAssignments: evaluation.assignments,
    peakEnergyResiduals: model.peaks.map((peak) => (evaluation.assignments[peak.index].computedMeV - peak.energyMeV) / peak.errorMeV),
    peakScales: evaluation.peakScales,
    spectrumScales: evaluation.spectrumScales,
    levelsMeV: Array.from(evaluation.levels.levelEnergiesMeV),
    intrinsicWidth: width,
    hits,
    converged: fit.converged,
  };
}

/**
 * Random starts on the right energy scale. H_CEF is linear in the B's, so the level energies of λB are λ times
 * those of B: each random direction in the scaled box is stretched so that its highest level lies at 1–1.3 times the
 * largest observed energy (when there are peaks or spectra), then clipped to the box. Without this, most uniform
 * starts in the box put levels hundreds of meV away from the data and end in far local minima.
 */
export function cefRandomStarts(model: CefFitModel, count: number, random: Random, task?: LongTask): number[][] {
  return runSteps(cefRandomStartsSteps(model, count, random, task));
}

/** cefRandomStarts as pause points (progress/steps.ts): one pause per 64 starts. */
function* cefRandomStartsSteps(model: CefFitModel, count: number, random: Random, task?: LongTask): Steps<number[][]> {
  const targets = [
    ...model.peaks.map((p) => Math.abs(p.energyMeV)),
    ...model.spectra.map((sp) => 0.8 * Math.max(...sp.energiesMeV.map(Math.abs))),
  ];
  const largest = targets.length ? Math.max(...targets) : 0;
  const p = model.parameterCount;
  const nB = model.freeKeys.length;
  const starts: number[][] = [];
  for (let k = 0; k < count; k++) {
    // One diagonalisation per start: thousands of starts take seconds, so an interrupt is checked here too.
    if (k % 64 === 0) {
      yield;
      task?.checkpoint();
    }
    const x = Array.from({ length: p }, (_, j) => model.lowerScaled[j] + random.nextDouble() * (model.upperScaled[j] - model.lowerScaled[j]));
    if (largest > 0) {
      const levels = levelStrengths(model.ion, model.parametersMeV(x)).levelEnergiesMeV;
      const top = levels[levels.length - 1];
      if (top > 0) {
        const lambda = (largest * (1 + 0.3 * random.nextDouble())) / top;
        for (let j = 0; j < nB; j++) x[j] = Math.min(model.upperScaled[j], Math.max(model.lowerScaled[j], lambda * x[j]));
      }
    }
    starts.push(x);
  }
  return starts;
}

/** Fit B_n^m to the data in `spec`; see the module comment. Throws InputError on bad input. */
export function fitCef(spec: CefFitSpec, options: FitCefOptions = {}): CefFitReport {
  return runSteps(fitCefSteps(spec, options));
}

/**
 * fitCef that awaits `yieldNow()` before every start and every Levenberg–Marquardt iteration, so that a host sharing
 * the thread (the kernel) can show `task.report` progress and serve messages while it runs. The same code as fitCef
 * in the same order: the report is bit-identical. A rejection of `yieldNow` (an interrupt) stops the fit.
 */
export function fitCefAsync(spec: CefFitSpec, options: FitCefOptions & { readonly yieldNow: () => Promise<void> }): Promise<CefFitReport> {
  return runStepsAsync(fitCefSteps(spec, options), options.yieldNow);
}

/** fitCef as pause points (progress/steps.ts). */
export function* fitCefSteps(spec: CefFitSpec, options: FitCefOptions = {}): Steps<CefFitReport> {
  const model = new CefFitModel(spec);
  const problem = cefLeastSquaresProblem(model);
  const starts = options.starts ?? 0;
  if (!Number.isInteger(starts) || starts < 0) throw new InputError('starts', starts, 'a non-negative integer');
  const random = createRandom(options.seed ?? 0);
  const randomStarts = yield* cefRandomStartsSteps(model, starts, random, options.task);
  const twins = new CefTwins(model);
  const local = {
    seed: options.seed ?? 0,
    errorScaling: options.errorScaling ?? 'data',
    maxIterations: options.maxIterations ?? 200,
    // The assignment makes χ² piecewise smooth: stop at 1e-8 relative steps rather than machine precision.
    xTolerance: 1e-8,
    chi2Tolerance: 1e-12,
    task: options.task,
  } as const;
  const search = yield* multiStartSearchSteps(problem, {
    ...local,
    lower: model.lowerScaled,
    upper: model.upperScaled,
    starts: 0,
    initialPoints: [model.startScaled, ...randomStarts],
    chi2Margin: options.chi2Margin,
    canonicalize: (fit) => twins.canonicalFit(fit),
  });
  const minima = search.minima.map((m) => describeCefSolution(model, m.fit, m.hits, local.errorScaling));
  const warnings: string[] = [];
  const dof = model.degreesOfFreedom;
  const counted = `${model.residualCount} data for ${model.parameterCount} free parameters` + (model.profiledCount ? ` and ${model.profiledCount} profiled scales/backgrounds` : '');
  if (dof < 0)
    warnings.push(`under-determined: ${counted} (ν = ${dof}); the best parameters are one point of a family that fits equally well, their errors are undetermined (null) and χ²_red is χ². Add data (peaks with intensities, more temperatures, bulk data) or fix parameters`);
  else if (dof === 0)
    warnings.push(`no degrees of freedom: ${counted} (ν = 0); χ²_red is χ²` + (local.errorScaling === 'residual' ? ", and errors scaled by the residuals are undetermined (null)" : ''));
  if (minima[0].peakAssignments.some((a) => a.unassigned)) warnings.push('some peaks have no visible computed transition left to match');
  if (!minima[0].converged) warnings.push('the best local fit stopped before its convergence criteria were met');
  return {
    best: minima[0],
    minima,
    startsRun: search.startsRun,
    distinctMinimaFound: search.distinctMinimaFound,
    hamiltonianEvaluations: model.hamiltonianEvaluations,
    twinFlippedKeys: [...new Set(twins.maps.flatMap((m) => m.flippedKeys))],
    warnings,
  };
}
