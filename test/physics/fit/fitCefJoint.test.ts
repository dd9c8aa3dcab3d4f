import { describe, expect, it } from 'vitest';
import { fitCef, type PeakObservation } from '@multiplet/physics/fit/fitCef';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { vanVleckSusceptibility, magnetization } from '@multiplet/physics/thermo';
import { getIon } from '@multiplet/physics/ions';
import { InputError } from '@multiplet/physics/errors';

// Joint fit: a few peak energies at 5 K alone leave the D3d parameters poorly determined; adding powder χ(T) and
// M(B) along z from the same crystal field (thermo module) pins them. Noise-free synthetic data.
const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START = { B20: -0.035, B40: 1.1e-3, B43: -0.0095, B60: 9e-6, B63: -6e-5, B66: 1e-4 };
const ion = getIon('Er3+');
const single = { J: ion.J, gJ: ion.gJ, parametersMeV: TRUTH };

function peaks(): PeakObservation[] {
  const t = cefTransitions('Er3+', TRUTH, 5);
  return t.transitions.filter((x) => x.fromLevel === 0 && x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 4)
    .map((v) => ({ energyMeV: v.energyMeV, errorMeV: 0.1, temperatureK: 5 }));
}

const temperatures = Array.from({ length: 12 }, (_, k) => 5 * 1.4 ** k);
const chi = Array.from(vanVleckSusceptibility(single, { temperaturesK: temperatures, direction: 'powder' }).chiEmuPerMol);
const fields = [0.5, 1, 2, 4, 7];
const m = Array.from(magnetization(single, { temperaturesK: [2], fieldsT: fields, direction: [0, 0, 1] }).magnetizationMuB[0]);

describe('fitCef joint fits with χ(T) and M(B)', () => {
  it('recovers the parameters and reports χ² per dataset; a fitted scale absorbs a mass error', () => {
    const report = fitCef({
      ion: 'Er3+', symmetry: 'D3d', start: START, peaks: peaks(),
      susceptibility: [{ temperaturesK: temperatures, chiEmuPerMol: chi.map((x) => 1.1 * x), errorEmuPerMol: chi.map((x) => 0.01 * x), fitScale: true }],
      magnetization: [{ temperatureK: 2, fieldsT: fields, momentMuB: m, errorMuB: m.map(() => 0.01), direction: [0, 0, 1] }],
    });
    expect(report.best.chi2).toBeLessThan(1e-6);
    for (const [key, value] of Object.entries(TRUTH)) expect(report.best.parametersMeV[key]).toBeCloseTo(value, 7);
    expect(report.best.bulkScales.susceptibility[0]).toBeCloseTo(1.1, 6);
    expect(report.best.bulkScales.magnetization[0]).toBe(1);
    expect(report.best.chi2ByDataset.susceptibility).toHaveLength(1);
    expect(report.best.degreesOfFreedom).toBe(4 + 12 + 5 - 6 - 1);
  });

  it('rejects mismatched lengths and non-positive errors', () => {
    expect(() => fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, susceptibility: [{ temperaturesK: [1, 2], chiEmuPerMol: [1], errorEmuPerMol: [1, 1] }] })).toThrow(/chiEmuPerMol/);
    expect(() => fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, magnetization: [{ temperatureK: 2, fieldsT: [1], momentMuB: [1], errorMuB: [0] }] })).toThrow(InputError);
  });
});
