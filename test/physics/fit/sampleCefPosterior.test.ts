import { describe, expect, it } from 'vitest';
import { fitCef, type PeakObservation } from '@multiplet/physics/fit/fitCef';
import { sampleCefPosterior } from '@multiplet/physics/fit/sampleCefPosterior';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { solveCef } from '@multiplet/physics/cef';
import { getIon } from '@multiplet/physics/ions';
import { createTask } from '@multiplet/physics/progress';
import { CancelledError } from '@multiplet/physics/errors';

const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };

function peaks(): PeakObservation[] {
  const out: PeakObservation[] = [];
  for (const T of [5, 60]) {
    const t = cefTransitions('Er3+', TRUTH, T);
    for (const v of t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5))
      out.push({ energyMeV: v.energyMeV, errorMeV: 0.05, intensity: v.weight, intensityError: 0.05 * v.weight + 0.01, temperatureK: T });
  }
  return out;
}

describe('sampleCefPosterior', () => {
  const spec = { ion: 'Er3+', symmetry: 'D3d', start: TRUTH, peaks: peaks() };
  const fit = fitCef(spec);

  it('near a well-determined minimum the posterior widths match the Jacobian errors, and derived quantities are summarised', () => {
    const posterior = sampleCefPosterior(spec, fit.best, { steps: 300, burnIn: 100, walkers: 14, thin: 5, seed: 3 });
    // Measured τ ≤ 40 steps here, so N_eff ≈ 14·300/τ ≳ 100 per parameter.
    expect(posterior.acceptanceFraction).toBeGreaterThan(0.15);
    for (const key of Object.keys(TRUTH)) {
      // With N_eff ≳ 100 the relative error of a standard deviation is ≲ 1/√(2·100) ≈ 7 %;
      // [0.7, 1.4] also allows for mild non-linearity of the model over ±2σ.
      const ratio = posterior.parameters[key].standardDeviation / fit.best.errorsMeV[key];
      expect(ratio, key).toBeGreaterThan(0.7);
      expect(ratio, key).toBeLessThan(1.4);
      expect(Math.abs(posterior.parameters[key].mean - fit.best.parametersMeV[key]) / fit.best.errorsMeV[key], key).toBeLessThan(0.6);
    }
    const ground = solveCef(getIon('Er3+'), TRUTH).groundDoublet!;
    expect(posterior.derived.gParallel.mean).toBeCloseTo(ground.gParallel, 1);
    expect(posterior.derived.gPerpendicular.mean).toBeCloseTo(ground.gPerpendicular, 1);
    expect(posterior.derived.level1MeV.mean).toBeCloseTo(fit.best.levelsMeV[1], 1);
    expect(posterior.derived.gParallel.standardDeviation).toBeGreaterThan(0);
    expect(posterior.samplesMeV.length).toBe(posterior.sampleCount * 6);
  });

  it('is reproducible with a seed and can be cancelled', () => {
    const a = sampleCefPosterior(spec, fit.best, { steps: 20, walkers: 12, seed: 8 });
    const b = sampleCefPosterior(spec, fit.best, { steps: 20, walkers: 12, seed: 8 });
    expect(a.parameters).toEqual(b.parameters);
    const task = createTask();
    let reports = 0;
    const cancelling = { ...task, report: () => (++reports === 2 ? task.cancel() : undefined), checkpoint: () => task.checkpoint(), cancelled: false };
    expect(() => sampleCefPosterior(spec, fit.best, { steps: 1000, walkers: 12, seed: 8, task: cancelling })).toThrow(CancelledError);
  });
});
