/**
 * Affine-invariant ensemble MCMC with the stretch move (Goodman & Weare 2010, Commun. Appl. Math. Comput. Sci. 5, 65),
 * in the split-ensemble form that updates half the walkers against the other half (Foreman-Mackey et al. 2013,
 * PASP 125, 306, Algorithm 3). Proposal Y = X_k + z (X_j − X_k) with z drawn from g(z) ∝ 1/√z on [1/a, a]; accepted with
 * probability min(1, z^{d−1} p(Y)/p(X_k)).
 *
 * Reproducible: all randomness from a seeded `Random`. Long: reports progress and honours cancellation via `LongTask`.
 * Derived quantities (levels, g-factors, moments) are evaluated on the kept samples by a caller-supplied function.
 *
 * @example
 *   const run = ensembleSampler((x) => -0.5 * x[0] ** 2, { center: [0], spread: [1] }, { steps: 2000, seed: 3 });
 *   run.mean; run.covariance;
 * See also: levenbergMarquardt (its covariance gives a good `spread`).
 */
import { InputError } from '../errors';
import type { LongTask } from '../progress';
import { createRandom, type Random } from '../random';
import { runSteps, type Steps } from '../progress/steps';

export interface EnsembleStart {
  /** Centre of the initial ball (e.g. the least-squares solution). */
  readonly center: ArrayLike<number>;
  /** Per-parameter width of the initial Gaussian ball (e.g. a fraction of the LM standard errors). */
  readonly spread: ArrayLike<number>;
}

export interface EnsembleSamplerOptions {
  /** Steps per walker after burn-in. */
  readonly steps: number;
  /** Steps discarded first. Default steps / 4. */
  readonly burnIn?: number;
  /** Number of walkers (even, ≥ 2·dim). Default max(2·dim + 2, 16) rounded up to even. */
  readonly walkers?: number;
  /** Keep every `thin`-th step. Default 1. */
  readonly thin?: number;
  /** Stretch scale a > 1. Default 2 (Goodman & Weare's choice). */
  readonly stretch?: number;
  readonly seed?: number;
  readonly random?: Random;
  /** Functions of the parameters summarised over the kept samples. */
  readonly derived?: (parameters: Float64Array) => ArrayLike<number>;
  readonly task?: LongTask;
}

export interface EnsembleSamplerResult {
  /** Kept samples, row-major (sampleCount × dim). */
  readonly samples: Float64Array;
  readonly sampleCount: number;
  readonly dimension: number;
  readonly walkers: number;
  /** Log-probability of each kept sample. */
  readonly logProbabilities: Float64Array;
  /** Fraction of accepted proposals over all steps (0.2–0.5 is healthy). */
  readonly acceptanceFraction: number;
  readonly mean: Float64Array;
  /** dim×dim sample covariance, row-major. */
  readonly covariance: Float64Array;
  readonly standardDeviations: Float64Array;
  /** Integrated autocorrelation time per parameter, in steps, from the walker-averaged chain (Sokal's window). */
  readonly autocorrelationSteps: Float64Array;
  /** Derived quantities: mean and standard deviation of each component, if `derived` was given. */
  readonly derivedMean?: Float64Array;
  readonly derivedStandardDeviation?: Float64Array;
}

/** Sample from exp(logProbability) with an ensemble of walkers started in a Gaussian ball. */
export function ensembleSampler(
  logProbability: (parameters: Float64Array) => number,
  start: EnsembleStart,
  options: EnsembleSamplerOptions,
): EnsembleSamplerResult {
  return runSteps(ensembleSamplerSteps(logProbability, start, options));
}

/** ensembleSampler as pause points (progress/steps.ts): before every step and every derived-quantity evaluation. */
export function* ensembleSamplerSteps(
  logProbability: (parameters: Float64Array) => number,
  start: EnsembleStart,
  options: EnsembleSamplerOptions,
): Steps<EnsembleSamplerResult> {
  const dim = start.center.length;
  if (dim === 0) throw new InputError('start.center', [], 'at least one parameter');
  if (start.spread.length !== dim) throw new InputError('start.spread', Array.from(start.spread), `${dim} widths`);
  const steps = options.steps;
  if (!Number.isInteger(steps) || steps < 1) throw new InputError('steps', steps, 'a positive integer');
  const burnIn = options.burnIn ?? Math.floor(steps / 4);
  if (!Number.isInteger(burnIn) || burnIn < 0) throw new InputError('burnIn', burnIn, 'a non-negative integer');
  const thin = options.thin ?? 1;
  if (!Number.isInteger(thin) || thin < 1) throw new InputError('thin', thin, 'a positive integer');
  let walkers = options.walkers ?? Math.max(2 * dim + 2, 16);
  if (walkers % 2 === 1) walkers++;
  if (walkers < 2 * dim) throw new InputError('walkers', walkers, `an even number ≥ 2·dim = ${2 * dim}`);
  const a = options.stretch ?? 2;
  if (!(a > 1)) throw new InputError('stretch', a, 'a number > 1');
  const random = options.random ?? createRandom(options.seed ?? 0);
  const task = options.task;

  // Initial ball; redraw walkers that land where the density is zero (up to a limit).
  const positions: Float64Array[] = [];
  const logP = new Float64Array(walkers);
  for (let k = 0; k < walkers; k++) {
    let x = new Float64Array(dim);
    let lp = -Infinity;
    for (let attempt = 0; attempt < 1000 && !Number.isFinite(lp); attempt++) {
      x = Float64Array.from({ length: dim }, (_, j) => start.center[j] + start.spread[j] * random.normal());
      lp = logProbability(x);
    }
    if (!Number.isFinite(lp)) throw new InputError('start', Array.from(start.center), 'a region where the probability is positive');
    positions.push(x);
    logP[k] = lp;
  }

  const totalSteps = burnIn + steps;
  const keptPerWalker = Math.floor(steps / thin);
  const sampleCount = keptPerWalker * walkers;
  const samples = new Float64Array(sampleCount * dim);
  const logProbabilities = new Float64Array(sampleCount);
  const walkerMeanTrace = Array.from({ length: dim }, () => new Float64Array(steps));
  let accepted = 0;
  let proposed = 0;
  let kept = 0;
  const half = walkers / 2;

  for (let step = 0; step < totalSteps; step++) {
    yield;
    task?.checkpoint();
    for (let part = 0; part < 2; part++) {
      const first = part * half;
      const other = (1 - part) * half;
      for (let k = first; k < first + half; k++) {
        const partner = positions[other + random.nextInt(half)];
        // z with density ∝ 1/√z on [1/a, a]: z = ((a − 1) u + 1)² / a.
        const z = ((a - 1) * random.nextDouble() + 1) ** 2 / a;
        const proposal = new Float64Array(dim);
        const x = positions[k];
        for (let j = 0; j < dim; j++) proposal[j] = partner[j] + z * (x[j] - partner[j]);
        const lp = logProbability(proposal);
        const logAccept = (dim - 1) * Math.log(z) + lp - logP[k];
        proposed++;
        if (Number.isFinite(lp) && Math.log(random.nextDouble()) < logAccept) {
          positions[k] = proposal;
          logP[k] = lp;
          accepted++;
        }
      }
    }
    if (step >= burnIn) {
      const s = step - burnIn;
      for (let j = 0; j < dim; j++) {
        let sum = 0;
        for (let k = 0; k < walkers; k++) sum += positions[k][j];
        walkerMeanTrace[j][s] = sum / walkers;
      }
      if (s % thin === 0 && kept < sampleCount) {
        for (let k = 0; k < walkers; k++) {
          samples.set(positions[k], kept * dim);
          logProbabilities[kept] = logP[k];
          kept++;
        }
      }
    }
    if (step % 50 === 0) task?.report(step, totalSteps, 'ensemble MCMC');
  }
  task?.report(totalSteps, totalSteps, 'ensemble MCMC');

  const mean = new Float64Array(dim);
  for (let s = 0; s < sampleCount; s++) for (let j = 0; j < dim; j++) mean[j] += samples[s * dim + j];
  for (let j = 0; j < dim; j++) mean[j] /= sampleCount;
  const covariance = new Float64Array(dim * dim);
  for (let s = 0; s < sampleCount; s++)
    for (let i = 0; i < dim; i++)
      for (let j = 0; j < dim; j++) covariance[i * dim + j] += (samples[s * dim + i] - mean[i]) * (samples[s * dim + j] - mean[j]);
  for (let k = 0; k < dim * dim; k++) covariance[k] /= Math.max(1, sampleCount - 1);
  const standardDeviations = Float64Array.from({ length: dim }, (_, j) => Math.sqrt(covariance[j * dim + j]));
  const autocorrelationSteps = Float64Array.from(walkerMeanTrace, (trace) => integratedAutocorrelationTime(trace));

  let derivedMean: Float64Array | undefined;
  let derivedStandardDeviation: Float64Array | undefined;
  if (options.derived) {
    let sum: Float64Array | undefined;
    let sumSq: Float64Array | undefined;
    for (let s = 0; s < sampleCount; s++) {
      yield;
      task?.checkpoint();
      const value = options.derived(samples.subarray(s * dim, (s + 1) * dim));
      if (!sum || !sumSq) {
        sum = new Float64Array(value.length);
        sumSq = new Float64Array(value.length);
      }
      for (let q = 0; q < value.length; q++) {
        sum[q] += value[q];
        sumSq[q] += value[q] * value[q];
      }
    }
    if (sum && sumSq) {
      derivedMean = sum.map((v) => v / sampleCount);
      const m = derivedMean;
      derivedStandardDeviation = sumSq.map((v, q) => Math.sqrt(Math.max(0, v / sampleCount - m[q] * m[q]) * (sampleCount / Math.max(1, sampleCount - 1))));
    }
  }

  return {
    samples,
    sampleCount,
    dimension: dim,
    walkers,
    logProbabilities,
    acceptanceFraction: proposed > 0 ? accepted / proposed : 0,
    mean,
    covariance,
    standardDeviations,
    autocorrelationSteps,
    derivedMean,
    derivedStandardDeviation,
  };
}

/**
 * Integrated autocorrelation time τ = 1 + 2 Σ_{t≥1} ρ(t), summed up to the first window M ≥ 5τ(M)
 * (Sokal 1997, "Monte Carlo methods in statistical mechanics", §3; the windowing used by Goodman & Weare).
 */
export function integratedAutocorrelationTime(trace: Float64Array): number {
  const n = trace.length;
  if (n < 4) return 1;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += trace[i];
  mean /= n;
  let c0 = 0;
  for (let i = 0; i < n; i++) c0 += (trace[i] - mean) ** 2;
  c0 /= n;
  if (c0 === 0) return 1;
  let tau = 1;
  for (let t = 1; t < n / 2; t++) {
    let c = 0;
    for (let i = 0; i + t < n; i++) c += (trace[i] - mean) * (trace[i + t] - mean);
    c /= n;
    tau += (2 * c) / c0;
    if (t >= 5 * tau) break;
  }
  return Math.max(1, tau);
}
