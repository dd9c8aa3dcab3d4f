import { describe, expect, it } from 'vitest';
import { fitCef, type PeakObservation } from '@multiplet/physics/fit/fitCef';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { CancelledError, InputError } from '@multiplet/physics/errors';
import { createTask } from '@multiplet/physics/progress';

// A D3d (z ∥ 3-fold) crystal field for Er3+; values chosen for the tests (levels 0, 3.7, 12.8, 25.7, … meV at these B).
const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };

/** Noise-free peaks: the five strongest energy-loss lines at 5 K and at 60 K, with intensities. */
function syntheticPeaks(): PeakObservation[] {
  const peaks: PeakObservation[] = [];
  for (const T of [5, 60]) {
    const t = cefTransitions('Er3+', TRUTH, T);
    const lines = t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5);
    for (const v of lines) peaks.push({ energyMeV: v.energyMeV, errorMeV: 0.1, intensity: v.weight, intensityError: 0.05 * v.weight + 0.01, temperatureK: T });
  }
  return peaks;
}

describe('fitCef on peak lists', () => {
  it('recovers the parameters from a perturbed start (local fit, automatic assignment)', () => {
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, peaks: syntheticPeaks() });
    expect(report.best.chi2).toBeLessThan(1e-8);
    for (const [key, value] of Object.entries(TRUTH)) expect(report.best.parametersMeV[key]).toBeCloseTo(value, 8);
    expect(report.best.degreesOfFreedom).toBe(20 - 6 - 2);
    expect(report.best.correlation.length).toBe(6);
    expect(report.best.peakAssignments.every((a) => !a.unassigned)).toBe(true);
  });

  it('global search from 6 random starts is reproducible with a seed and reports the true minimum first', () => {
    const spec = { ion: 'Er3+', symmetry: 'D3d', start: START, peaks: syntheticPeaks() };
    const a = fitCef(spec, { starts: 6, seed: 4 });
    const b = fitCef(spec, { starts: 6, seed: 4 });
    expect(a.best.parametersMeV).toEqual(b.best.parametersMeV);
    expect(a.hamiltonianEvaluations).toBe(b.hamiltonianEvaluations);
    expect(a.startsRun).toBe(7);
    expect(a.best.chi2).toBeLessThan(1e-8);
    expect(a.distinctMinimaFound).toBeGreaterThanOrEqual(a.minima.length);
  });

  it('from random starts alone (no start values) the energies-only search reaches exact solutions and lists the alternatives', () => {
    const energiesOnly = syntheticPeaks().map(({ energyMeV, errorMeV, temperatureK }) => ({ energyMeV, errorMeV, temperatureK }));
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: {}, peaks: energiesOnly }, { starts: 16, seed: 1 });
    expect(report.best.chi2).toBeLessThan(1e-8);
    const exact = report.minima.filter((m) => m.chi2 < 1e-8);
    expect(exact.length).toBeGreaterThanOrEqual(1);
    // every exact minimum reproduces all ten peak energies: these are the alternative parameter sets the data allow
    for (const m of exact) for (const r of m.peakEnergyResiduals) expect(Math.abs(r)).toBeLessThan(1e-3);
    expect(report.minima.reduce((s, m) => s + m.hits, 0)).toBeLessThanOrEqual(17);
  });

  it('honours a pinned assignment and fixed parameters', () => {
    const peaks = syntheticPeaks();
    const t = cefTransitions('Er3+', TRUTH, 5);
    const first = peaks.findIndex((p) => p.temperatureK === 5 && Math.abs(p.energyMeV - t.levels[1].energyMeV) < 1e-9);
    expect(first).toBeGreaterThanOrEqual(0);
    const pinned = peaks.map((p, i) => (i === first ? { ...p, transition: { fromLevel: 0, toLevel: 1 } } : p));
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: { ...START, B66: TRUTH.B66 }, free: ['B20', 'B40', 'B43', 'B60', 'B63'], peaks: pinned });
    expect(report.best.parametersMeV.B66).toBe(TRUTH.B66);
    expect(report.best.peakAssignments[first]).toMatchObject({ fromLevel: 0, toLevel: 1 });
    expect(report.best.chi2).toBeLessThan(1e-8);
    expect(Object.keys(report.best.errorsMeV)).toEqual(['B20', 'B40', 'B43', 'B60', 'B63']);
  });

  it('reports peaks left without a visible transition instead of failing, and honours cancellation', () => {
    // Ce3+ (J = 5/2) has three doublets: at most two energy-loss lines from the ground level at 2 K.
    const peaks = [4, 9, 15].map((e) => ({ energyMeV: e, errorMeV: 0.2, temperatureK: 2 }));
    const report = fitCef({ ion: 'Ce3+', symmetry: 'D3d', start: { B20: -0.5, B40: 0.01, B43: 0.1 }, peaks });
    expect(report.best.peakAssignments.filter((a) => a.unassigned)).toHaveLength(1);
    expect(report.warnings.join(' ')).toMatch(/no visible computed transition/);
    expect(Number.isFinite(report.best.chi2)).toBe(true);
    const task = createTask();
    let reports = 0;
    const cancelling = { report: () => (++reports === 3 ? task.cancel() : undefined), checkpoint: () => task.checkpoint(), cancelled: false };
    expect(() => fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, peaks: syntheticPeaks() }, { starts: 8, seed: 1, task: cancelling })).toThrow(CancelledError);
  });

  it('cubic sites keep B44 = 5 B40 and B64 = −21 B60 while fitting B40 and B60 (Yb3+ in Oh: Γ6, Γ7, Γ8)', () => {
    const t = cefTransitions('Yb3+', { B40: 0.02, B60: 2e-4, B44: 0.1, B64: -4.2e-3 }, 150);
    expect(t.levels.map((l) => l.degeneracy).sort()).toEqual([2, 2, 4]);
    const maxWeight = Math.max(...t.transitions.map((x) => x.weight));
    const peaks = t.transitions
      .filter((x) => x.energyMeV > 0 && x.weight > 1e-3 * maxWeight)
      .map((x) => ({ energyMeV: x.energyMeV, errorMeV: 0.05, temperatureK: 150 }));
    expect(peaks.length).toBeGreaterThanOrEqual(2);
    const report = fitCef({ ion: 'Yb3+', symmetry: 'Oh', start: { B40: 0.018, B60: 2.3e-4 }, peaks });
    expect(report.best.freeKeys).toEqual(['B40', 'B60']);
    expect(report.best.chi2).toBeLessThan(1e-8);
    expect(report.best.parametersMeV.B44 / report.best.parametersMeV.B40).toBeCloseTo(5, 12);
    expect(report.best.parametersMeV.B64 / report.best.parametersMeV.B60).toBeCloseTo(-21, 12);
    expect(() => fitCef({ ion: 'Yb3+', symmetry: 'Oh', start: { B40: 0.015 }, free: ['B44'], peaks })).toThrow(/tied/);
  });

  it('gives clear InputErrors for bad input', () => {
    const peaks = syntheticPeaks();
    const base = { ion: 'Er3+', symmetry: 'D3d', start: START, peaks };
    expect(() => fitCef({ ...base, peaks: [{ ...peaks[0], errorMeV: 0 }] })).toThrow(/peaks\[0\]\.errorMeV/);
    expect(() => fitCef({ ...base, peaks: [{ ...peaks[0], errorMeV: -0.1 }] })).toThrow(InputError);
    expect(() => fitCef({ ...base, peaks: [{ ...peaks[0], intensityError: 0 }] })).toThrow(/intensityError/);
    expect(() => fitCef({ ...base, start: { ...START, B22: 0.01 } })).toThrow(/B22/);
    expect(() => fitCef({ ...base, free: ['B20', 'B41'] })).toThrow(/free\[1\]/);
    expect(() => fitCef({ ...base, bounds: { B20: [0, 1] } })).toThrow(/bounds\.B20/);
    expect(() => fitCef({ ...base, peaks: [] })).toThrow(/no data/);
    expect(() => fitCef({ ...base, ion: 'Ce3+', start: { B20: 0.1 }, free: ['B20', 'B60'] })).toThrow(/free\[1\]/);
  });
});
