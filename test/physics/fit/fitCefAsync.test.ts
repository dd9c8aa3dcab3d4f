/**
 * fitCefAsync and sampleCefPosteriorAsync run the synchronous fit's code with pauses for the host's event loop:
 * bit-identical reports, the pauses really happen (a timer fires during the fit), and a rejecting yieldNow stops them.
 */
import { describe, it, expect } from 'vitest';
import { fitCef, fitCefAsync, sampleCefPosterior, sampleCefPosteriorAsync, type CefFitSpec } from '@multiplet/physics/fit';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { CancelledError } from '@multiplet/physics/errors';
import { createTask } from '@multiplet/physics/progress';

const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };

function peaks() {
  const out = [];
  for (const T of [5, 60]) {
    const t = cefTransitions('Er3+', TRUTH, T);
    for (const v of t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5))
      out.push({ energyMeV: v.energyMeV + 0.03 * Math.sin(7 * v.energyMeV), errorMeV: 0.1, intensity: v.weight, intensityError: 0.05 * v.weight + 0.01, temperatureK: T });
  }
  return out;
}
const SPEC: CefFitSpec = { ion: 'Er3+', symmetry: 'D3d', start: START, peaks: peaks() };
const turn = () => new Promise<void>((resolve) => setImmediate(resolve));

describe('cooperative cef fit', () => {
  it('fitCefAsync gives a bit-identical report (random starts, minima, errors) and pauses for the event loop', async () => {
    const options = { starts: 6, seed: 3, errorScaling: 'residual' as const };
    const sync = fitCef(SPEC, options);
    let pauses = 0;
    let ticks = 0;
    const timer = setInterval(() => ticks++, 1);
    const asyncReport = await fitCefAsync(SPEC, {
      ...options,
      yieldNow: async () => {
        pauses++;
        if (pauses % 25 === 0) await new Promise((resolve) => setTimeout(resolve, 2));
      },
    });
    clearInterval(timer);
    expect(asyncReport).toStrictEqual(sync);
    expect(asyncReport.startsRun).toBe(7);
    // one pause before every start and every LM iteration
    expect(pauses).toBeGreaterThan(7);
    expect(ticks).toBeGreaterThan(0);
  });

  it('sampleCefPosteriorAsync is bit-identical to sampleCefPosterior', async () => {
    const best = fitCef(SPEC, { seed: 1 }).best;
    const options = { steps: 20, walkers: 14, seed: 4 };
    const sync = sampleCefPosterior(SPEC, best, options);
    let pauses = 0;
    const asyncPosterior = await sampleCefPosteriorAsync(SPEC, best, { ...options, yieldNow: () => ((pauses++), turn()) });
    expect(asyncPosterior).toStrictEqual(sync);
    expect(Array.from(asyncPosterior.samplesMeV)).toEqual(Array.from(sync.samplesMeV));
    // burn-in 5 + 20 steps, and one derived evaluation per kept sample
    expect(pauses).toBe(25 + 20 * 14);
  });

  it('an interrupt seen at a pause (yieldNow rejects, or the task is cancelled) stops the fit and the sampler', async () => {
    let calls = 0;
    await expect(
      fitCefAsync(SPEC, { starts: 50, seed: 2, yieldNow: async () => { if (++calls === 30) throw new CancelledError(); } }),
    ).rejects.toBeInstanceOf(CancelledError);
    expect(calls).toBe(30);
    const task = createTask();
    let pauses = 0;
    const best = fitCef(SPEC, { seed: 1 }).best;
    await expect(
      sampleCefPosteriorAsync(SPEC, best, { steps: 1000, seed: 1, task, yieldNow: async () => { if (++pauses === 10) task.cancel(); await turn(); } }),
    ).rejects.toBeInstanceOf(CancelledError);
    expect(pauses).toBe(10);
  });
});
