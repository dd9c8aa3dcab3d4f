/** Peak assignment per (temperature, incident energy) group: one transition listed at two incident energies. */
import { describe, expect, it } from 'vitest';
import { fitCef, type PeakObservation } from '@multiplet/physics/fit/fitCef';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { InputError } from '@multiplet/physics/errors';

// The D3d Er3+ field of fitCef.test.ts (levels 0, 3.7, 12.8, 25.7, … meV).
const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };

/** 5 K: the five strongest lines with E_i = 80 meV, and again those below 15 meV with E_i = 20 meV (k_f/k_i applied). */
function twoIncidentEnergies(): PeakObservation[] {
  const t = cefTransitions('Er3+', TRUTH, 5);
  const lines = t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5);
  const peaks: PeakObservation[] = [];
  for (const ei of [80, 20])
    for (const v of lines) {
      if (v.energyMeV >= ei - 5) continue;
      const intensity = v.weight * Math.sqrt(1 - v.energyMeV / ei);
      peaks.push({ energyMeV: v.energyMeV, errorMeV: 0.1, intensity, intensityError: 0.05 * intensity + 0.01, temperatureK: 5, incidentEnergyMeV: ei });
    }
  return peaks;
}

describe('fitCef peak assignment per (temperature, incident energy) group', () => {
  it('the same transitions measured at two incident energies (one temperature) fit back exactly, each group matched on its own', () => {
    const peaks = twoIncidentEnergies();
    const low = peaks.filter((p) => p.incidentEnergyMeV === 20);
    expect(low.length).toBeGreaterThanOrEqual(2); // the duplicated lines exist
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, peaks });
    expect(report.best.chi2).toBeLessThan(1e-8);
    expect(report.best.peakAssignments.every((a) => !a.unassigned)).toBe(true);
    for (const [key, value] of Object.entries(TRUTH)) expect(report.best.parametersMeV[key]).toBeCloseTo(value, 8);
    // a line listed at both E_i is matched to the same transition in both groups
    peaks.forEach((p, i) => {
      if (p.incidentEnergyMeV !== 20) return;
      const j = peaks.findIndex((q) => q.incidentEnergyMeV === 80 && q.energyMeV === p.energyMeV);
      const a = report.best.peakAssignments[i];
      const b = report.best.peakAssignments[j];
      expect([a.fromLevel, a.toLevel]).toEqual([b.fromLevel, b.toLevel]);
    });
    expect(report.best.peakScales).toHaveLength(2);
    for (const s of report.best.peakScales) expect(s).toBeCloseTo(1, 6);
  });

  it('within one group a transition is still used once: a duplicated peak in the same group is not matched twice', () => {
    const peaks = twoIncidentEnergies().filter((p) => p.incidentEnergyMeV === 80);
    const doubled = [...peaks, { ...peaks[0] }];
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: TRUTH, peaks: doubled, free: ['B20'] });
    const a = report.best.peakAssignments;
    const keys = a.map((x) => `${x.fromLevel}|${x.toLevel}`);
    expect(new Set(keys).size).toBe(keys.length);
    expect(report.best.chi2).toBeGreaterThan(1);
  });

  it('the same pin in two incident-energy groups is allowed; twice in one group it is refused', () => {
    const peaks = twoIncidentEnergies();
    const first = cefTransitions('Er3+', TRUTH, 5).levels[1].energyMeV;
    const pinned = peaks.map((p) => (Math.abs(p.energyMeV - first) < 1e-9 ? { ...p, transition: { fromLevel: 0, toLevel: 1 } } : p));
    expect(pinned.filter((p) => p.transition).length).toBe(2);
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, peaks: pinned });
    expect(report.best.chi2).toBeLessThan(1e-8);
    const sameGroup = [...pinned, { ...pinned.find((p) => p.transition)! }];
    expect(() => fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, peaks: sameGroup })).toThrow(InputError);
  });
});
