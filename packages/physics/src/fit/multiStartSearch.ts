/**
 * Global search by multi-start Levenberg–Marquardt: local fits from Latin-hypercube starts inside a finite box
 * (McKay, Beckman & Conover 1979), then the converged points are merged into distinct minima and every minimum within
 * a χ² margin of the best is reported — users need to see the alternative solutions, not one answer.
 *
 * Two local results are the same minimum when every parameter differs by less than `sameMinimumSigma` × its 1σ error
 * (or a 1e-6 fraction of the box where the error is undetermined) and their χ² agree within the margin.
 *
 * Seeded through `physics/random`; progress and cancellation through `LongTask`.
 *
 * @example
 *   const search = multiStartSearch(problem, { lower, upper, starts: 32, seed: 1 });
 *   search.minima[0].parameters; search.minima.length;
 * See also: levenbergMarquardt, ensembleSampler.
 */
import { InputError } from '../errors';
import type { LongTask } from '../progress';
import { createRandom, type Random } from '../random';
import { levenbergMarquardtSteps, type LevenbergMarquardtOptions, type LevenbergMarquardtResult } from './levenbergMarquardt';
import { runSteps, type Steps } from '../progress/steps';
import type { LeastSquaresProblem } from './types';

export interface MultiStartOptions extends Omit<LevenbergMarquardtOptions, 'lower' | 'upper' | 'task'> {
  /** Finite box for the random starts (and the bounds of every local fit). */
  readonly lower: ArrayLike<number>;
  readonly upper: ArrayLike<number>;
  /** Number of random starts. Default 32. */
  readonly starts?: number;
  /**
   * Screening: draw this many Latin-hypercube candidates per start, evaluate χ² once at each and start the local
   * fits from the best `starts` of them (a cheap first stage of the kind used in multi-level single-linkage methods,
   * Rinnooy Kan & Timmer, Math. Program. 39, 27 (1987)). Default 1 (no screening).
   */
  readonly candidatesPerStart?: number;
  /** Extra starts tried first (e.g. the user's own start). */
  readonly initialPoints?: ReadonlyArray<ArrayLike<number>>;
  /** Seed or generator. Default seed 0. */
  readonly seed?: number;
  readonly random?: Random;
  /** Minima with χ² ≤ χ²_best + max(chi2Margin, relativeMargin · χ²_best) are reported. Default 1. */
  readonly chi2Margin?: number;
  /** See chi2Margin. Default 0.2. */
  readonly relativeMargin?: number;
  /** Parameters within this many σ are the same minimum. Default 0.5. */
  readonly sameMinimumSigma?: number;
  /**
   * Maps every local result to a representative of its class of equivalent solutions before the merge (e.g. one of
   * the symmetry twins of a crystal field, fit/cef/cefTwins.ts), so that equivalent minima count as one.
   */
  readonly canonicalize?: (fit: LevenbergMarquardtResult) => LevenbergMarquardtResult;
  readonly task?: LongTask;
}

/** One distinct minimum. */
export interface FitMinimum {
  readonly fit: LevenbergMarquardtResult;
  /** How many starts ended here. */
  readonly hits: number;
}

export interface MultiStartResult {
  /** Distinct minima within the χ² margin, best first. */
  readonly minima: readonly FitMinimum[];
  /** The best minimum (minima[0]). */
  readonly best: LevenbergMarquardtResult;
  readonly startsRun: number;
  /** Distinct minima found before the χ² margin cut. */
  readonly distinctMinimaFound: number;
  /** Residual evaluations over the screening and all local fits. */
  readonly evaluations: number;
}

/** Run local fits from random starts and return the distinct minima within the χ² margin, best first. */
export function multiStartSearch(problem: LeastSquaresProblem, options: MultiStartOptions): MultiStartResult {
  return runSteps(multiStartSearchSteps(problem, options));
}

/** multiStartSearch as pause points (progress/steps.ts): before every start and every LM iteration. */
export function* multiStartSearchSteps(problem: LeastSquaresProblem, options: MultiStartOptions): Steps<MultiStartResult> {
  const p = problem.parameterCount;
  const lower = Array.from({ length: p }, (_, j) => options.lower[j]);
  const upper = Array.from({ length: p }, (_, j) => options.upper[j]);
  for (let j = 0; j < p; j++) {
    if (!Number.isFinite(lower[j]) || !Number.isFinite(upper[j]) || !(lower[j] < upper[j]))
      throw new InputError(`bounds[${j}]`, [lower[j], upper[j]], 'finite lower < upper for a global search');
  }
  const starts = options.starts ?? 32;
  if (!Number.isInteger(starts) || starts < 0) throw new InputError('starts', starts, 'a non-negative integer');
  const random = options.random ?? createRandom(options.seed ?? 0);
  const task = options.task;
  const initial = (options.initialPoints ?? []).map((point) => Array.from({ length: p }, (_, j) => point[j]));
  const perStart = options.candidatesPerStart ?? 1;
  if (!Number.isInteger(perStart) || perStart < 1) throw new InputError('candidatesPerStart', perStart, 'an integer ≥ 1');
  let randomPoints = latinHypercube(starts * perStart, lower, upper, random);
  let screeningEvaluations = 0;
  if (perStart > 1) {
    const scored = randomPoints.map((point, k) => {
      if (k % 64 === 0) task?.checkpoint();
      screeningEvaluations++;
      const r = problem.residuals(Float64Array.from(point));
      let chi2 = 0;
      for (let i = 0; i < r.length; i++) chi2 += r[i] * r[i];
      return { point, chi2: Number.isFinite(chi2) ? chi2 : Infinity };
    });
    scored.sort((a, b) => a.chi2 - b.chi2);
    randomPoints = scored.slice(0, starts).map((s) => s.point);
  }
  const points = [...initial, ...randomPoints];
  if (points.length === 0) throw new InputError('starts', starts, 'at least one start');

  const results: LevenbergMarquardtResult[] = [];
  let evaluations = screeningEvaluations;
  for (let k = 0; k < points.length; k++) {
    yield;
    task?.checkpoint();
    task?.report(k, points.length, 'multi-start');
    const fit = yield* levenbergMarquardtSteps(problem, points[k], { ...options, lower, upper, task });
    evaluations += fit.evaluations;
    results.push(options.canonicalize ? options.canonicalize(fit) : fit);
  }
  task?.report(points.length, points.length, 'multi-start');

  results.sort((a, b) => a.chi2 - b.chi2);
  const sigmaFactor = options.sameMinimumSigma ?? 0.5;
  const merged: { fit: LevenbergMarquardtResult; hits: number }[] = [];
  for (const fit of results) {
    const home = merged.find((m) => sameMinimum(m.fit, fit, lower, upper, sigmaFactor));
    if (home) home.hits++;
    else merged.push({ fit, hits: 1 });
  }
  const bestChi2 = merged[0].fit.chi2;
  const margin = Math.max(options.chi2Margin ?? 1, (options.relativeMargin ?? 0.2) * bestChi2);
  const minima = merged.filter((m) => m.fit.chi2 <= bestChi2 + margin);
  return { minima, best: minima[0].fit, startsRun: points.length, distinctMinimaFound: merged.length, evaluations };
}

function sameMinimum(
  a: LevenbergMarquardtResult,
  b: LevenbergMarquardtResult,
  lower: number[],
  upper: number[],
  sigmaFactor: number,
): boolean {
  for (let j = 0; j < lower.length; j++) {
    const floor = 1e-6 * (upper[j] - lower[j]);
    const sa = a.standardErrors[j];
    const sb = b.standardErrors[j];
    const sigma = Math.max(Number.isFinite(sa) ? sa : 0, Number.isFinite(sb) ? sb : 0);
    if (Math.abs(a.parameters[j] - b.parameters[j]) > Math.max(floor, sigmaFactor * sigma)) return false;
  }
  return true;
}

/** n points of a Latin hypercube in the box: each coordinate's n strata are each used once. */
function latinHypercube(n: number, lower: number[], upper: number[], random: Random): number[][] {
  const p = lower.length;
  const points = Array.from({ length: n }, () => new Array<number>(p).fill(0));
  for (let j = 0; j < p; j++) {
    const order = Array.from({ length: n }, (_, k) => k);
    for (let k = n - 1; k > 0; k--) {
      const swap = random.nextInt(k + 1);
      [order[k], order[swap]] = [order[swap], order[k]];
    }
    for (let k = 0; k < n; k++) {
      const u = (order[k] + random.nextDouble()) / n;
      points[k][j] = lower[j] + u * (upper[j] - lower[j]);
    }
  }
  return points;
}
