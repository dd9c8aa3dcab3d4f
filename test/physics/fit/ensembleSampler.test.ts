import { describe, expect, it } from 'vitest';
import { ensembleSampler } from '@multiplet/physics/fit/ensembleSampler';
import { invertSymmetricPositiveDefinite } from '@multiplet/physics/fit/numerics/denseLinearAlgebra';
import { createTask } from '@multiplet/physics/progress';
import { CancelledError } from '@multiplet/physics/errors';
import { createRandom } from '@multiplet/physics/random';

// Linear-Gaussian model y = θ0 + θ1 x + θ2 x² + ε, ε ~ N(0, σ²), flat prior: the posterior is exactly Gaussian with
// mean (AᵀA)⁻¹Aᵀy and covariance σ²(AᵀA)⁻¹ (e.g. Gelman et al., Bayesian Data Analysis, 3rd ed., §14.2).
// x in [1, 4] (not centred) makes θ strongly correlated, which tests the affine invariance of the stretch move.
const sigma = 0.3;
const rng = createRandom(2024);
const xs = Array.from({ length: 20 }, (_, i) => 1 + (3 * i) / 19);
const truth = [1, -2, 0.5];
const ys = xs.map((x) => truth[0] + truth[1] * x + truth[2] * x * x + sigma * rng.normal());
const design = (x: number) => [1, x, x * x];
const dim = 3;

function analyticPosterior(): { mean: number[]; covariance: Float64Array } {
  const ata = new Float64Array(dim * dim);
  const aty = new Float64Array(dim);
  xs.forEach((x, i) => {
    const row = design(x);
    for (let a = 0; a < dim; a++) {
      aty[a] += row[a] * ys[i];
      for (let b = 0; b < dim; b++) ata[a * dim + b] += row[a] * row[b];
    }
  });
  const inv = invertSymmetricPositiveDefinite(ata, dim)!;
  const mean = Array.from({ length: dim }, (_, a) => inv.slice(a * dim, a * dim + dim).reduce((s, v, b) => s + v * aty[b], 0));
  return { mean, covariance: inv.map((v) => v * sigma * sigma) };
}

const logPosterior = (theta: Float64Array): number => {
  let s = 0;
  xs.forEach((x, i) => {
    const row = design(x);
    s += ((ys[i] - (theta[0] * row[0] + theta[1] * row[1] + theta[2] * row[2])) / sigma) ** 2;
  });
  return -0.5 * s;
};

describe('ensembleSampler', () => {
  it('reproduces the analytic linear-Gaussian posterior mean and covariance within sampling error', () => {
    const exact = analyticPosterior();
    const steps = 4000;
    const run = ensembleSampler(logPosterior, { center: [0, 0, 0], spread: [0.5, 0.5, 0.5] }, { steps, burnIn: 1000, walkers: 16, seed: 5 });
    expect(run.acceptanceFraction).toBeGreaterThan(0.2);
    expect(run.acceptanceFraction).toBeLessThan(0.8);
    for (let a = 0; a < dim; a++) {
      // Effective sample size from the integrated autocorrelation time of the walker-averaged chain:
      // N_eff ≈ walkers · steps / τ. A 4σ band on the mean has a false-failure probability of 6e-5 per component.
      const tau = run.autocorrelationSteps[a];
      const nEff = (run.walkers * steps) / tau;
      const sdExact = Math.sqrt(exact.covariance[a * dim + a]);
      expect(Math.abs(run.mean[a] - exact.mean[a])).toBeLessThan((4 * sdExact) / Math.sqrt(nEff));
      // Variance estimate of a Gaussian: relative standard error √(2 / N_eff); 4σ band.
      const relVarError = Math.abs(run.covariance[a * dim + a] / exact.covariance[a * dim + a] - 1);
      expect(relVarError).toBeLessThan(4 * Math.sqrt(2 / nEff));
      for (let b = 0; b < a; b++) {
        const rhoExact = exact.covariance[a * dim + b] / Math.sqrt(exact.covariance[a * dim + a] * exact.covariance[b * dim + b]);
        const rhoRun = run.covariance[a * dim + b] / (run.standardDeviations[a] * run.standardDeviations[b]);
        // Standard error of a sample correlation ≈ (1 − ρ²)/√N_eff (Fisher).
        expect(Math.abs(rhoRun - rhoExact)).toBeLessThan((4 * (1 - rhoExact ** 2)) / Math.sqrt(nEff) + 1e-12);
      }
    }
    // The posterior here is strongly correlated: make sure the test exercises that.
    const rho01 = exact.covariance[1] / Math.sqrt(exact.covariance[0] * exact.covariance[4]);
    expect(Math.abs(rho01)).toBeGreaterThan(0.9);
  });

  it('summarises derived quantities and is reproducible with a seed', () => {
    const options = { steps: 300, walkers: 8, seed: 9, derived: (t: Float64Array) => [t[0] + t[1]] };
    const a = ensembleSampler(logPosterior, { center: [1, -2, 0.5], spread: [0.1, 0.1, 0.1] }, options);
    const b = ensembleSampler(logPosterior, { center: [1, -2, 0.5], spread: [0.1, 0.1, 0.1] }, options);
    expect(Array.from(a.samples)).toEqual(Array.from(b.samples));
    expect(a.derivedMean![0]).toBeCloseTo(a.mean[0] + a.mean[1], 10);
  });

  it('stops on cancellation', () => {
    const task = createTask();
    let calls = 0;
    const lp = (t: Float64Array) => {
      if (++calls === 500) task.cancel();
      return logPosterior(t);
    };
    expect(() => ensembleSampler(lp, { center: [1, -2, 0.5], spread: [0.1, 0.1, 0.1] }, { steps: 10_000, seed: 1, task })).toThrow(CancelledError);
  });
});
