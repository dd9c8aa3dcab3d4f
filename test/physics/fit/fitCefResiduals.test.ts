/** Residuals per dataset in the fit report: spectra point by point, peaks, χ(T) and M(B). */
import { describe, expect, it } from 'vitest';
import { fitCef, type SpectrumObservation } from '@multiplet/physics/fit/fitCef';
import { neutronSpectrum } from '@multiplet/physics/neutron/neutronSpectrum';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { vanVleckSusceptibility } from '@multiplet/physics/thermo';
import { getIon } from '@multiplet/physics/ions';

const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const energies = Array.from({ length: 81 }, (_, k) => 2 + 0.75 * k);
const resolution = { fwhmPolynomialMeV: [1.2] };

function spectrum(T: number, weight: number): SpectrumObservation {
  const s = neutronSpectrum('Er3+', TRUTH, { temperatureK: T, energiesMeV: energies, resolution }).intensity;
  const intensity = [...s].map((v) => 3 * v + 0.5);
  return { temperatureK: T, energiesMeV: energies, intensity, error: intensity.map((v) => 0.02 * v + 0.01), resolution, weight };
}

describe('fitCef residuals per dataset', () => {
  it('give each spectrum its own point-by-point residuals (√w (s·S + c − I)/σ) whose squares sum to its χ²; peaks and χ(T) too', () => {
    // B40 fixed 10 % off: the fit cannot be exact, so the residuals are not zero
    const start = { ...TRUTH, B40: 1.32e-3 };
    const spectra = [spectrum(5, 1), spectrum(60, 2)];
    const peak = cefTransitions('Er3+', TRUTH, 5).levels[1].energyMeV;
    const single = { J: getIon('Er3+').J, gJ: getIon('Er3+').gJ, parametersMeV: TRUTH };
    const temperaturesK = [10, 30, 100, 300];
    const chi = Array.from(vanVleckSusceptibility(single, { temperaturesK, direction: 'powder' }).chiEmuPerMol);
    const report = fitCef({
      ion: 'Er3+', symmetry: 'D3d', start, free: ['B20', 'B43'], spectra,
      peaks: [{ energyMeV: peak + 0.05, errorMeV: 0.1, intensity: 1, intensityError: 0.1, temperatureK: 5 }, { energyMeV: peak, errorMeV: 0.1, temperatureK: 60 }],
      susceptibility: [{ temperaturesK, chiEmuPerMol: chi, errorEmuPerMol: chi.map((v) => 0.01 * v) }],
    });
    const best = report.best;
    const r = best.residualsByDataset;
    expect(r.spectra).toHaveLength(2);
    spectra.forEach((sp, k) => {
      expect(r.spectra[k]).toHaveLength(energies.length);
      const sum = r.spectra[k].reduce((a, v) => a + v * v, 0);
      expect(sum).toBeCloseTo(best.chi2ByDataset.spectra[k], 8);
      expect(sum).toBeGreaterThan(1);
      // recomputed independently from the fitted parameters, scale and background
      const model = neutronSpectrum('Er3+', best.parametersMeV, { temperatureK: sp.temperatureK, energiesMeV: energies, resolution }).intensity;
      const [scale, background] = best.spectrumScales[k];
      for (const i of [0, 20, 40, 80]) {
        const expected = (Math.sqrt(sp.weight!) * (scale * model[i] + background - sp.intensity[i])) / sp.error[i];
        expect(r.spectra[k][i]).toBeCloseTo(expected, 8);
      }
    });
    expect(r.peaks.energy).toHaveLength(2);
    expect(r.peaks.energy[0]).toBeCloseTo(best.peakEnergyResiduals[0], 12);
    expect(r.peaks.intensity[1]).toBeNull();
    expect(typeof r.peaks.intensity[0]).toBe('number');
    const peakSum = r.peaks.energy.reduce((a, v) => a + v * v, 0) + (r.peaks.intensity[0] as number) ** 2;
    expect(peakSum).toBeCloseTo(best.chi2ByDataset.peaks, 10);
    expect(r.susceptibility[0]).toHaveLength(4);
    expect(r.susceptibility[0].reduce((a, v) => a + v * v, 0)).toBeCloseTo(best.chi2ByDataset.susceptibility[0], 10);
    expect(r.magnetization).toEqual([]);
  });
});
