import { describe, expect, it } from 'vitest';
import { fitCef, type SpectrumObservation } from '@multiplet/physics/fit/fitCef';
import { neutronSpectrum } from '@multiplet/physics/neutron/neutronSpectrum';
import { createRandom } from '@multiplet/physics/random';

// Synthetic round trip: spectra at 5 K and 60 K (Ei = 80 meV, Q = 2 Å⁻¹) generated from a known D3d parameter set,
// scaled, on a flat background, with Gaussian noise of known σ; each is fitted back from the truth (a local fit:
// the global search is tested elsewhere) and the 1σ intervals are counted.
const TRUTH: Record<string, number> = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const KEYS = Object.keys(TRUTH);
const energies = Array.from({ length: 121 }, (_, k) => 1 + k * 0.5);
const common = { energiesMeV: energies, incidentEnergyMeV: 80, qInvAngstrom: 2, resolution: { fwhmPolynomialMeV: [1.2, -0.01] } };
const clean = [5, 60].map((T) => ({ T, intensity: Array.from(neutronSpectrum('Er3+', TRUTH, { ...common, temperatureK: T }).intensity) }));

function noisySpectra(seed: number): SpectrumObservation[] {
  const rng = createRandom(seed);
  return clean.map(({ T, intensity }) => {
    const scaled = intensity.map((v) => 3 * v + 20);
    const error = scaled.map((v) => 0.5 + 0.03 * v);
    return { temperatureK: T, ...common, intensity: scaled.map((v, i) => v + error[i] * rng.normal()), error };
  });
}

describe('fitCef synthetic round trip on spectra (D3d, Er3+)', () => {
  it('fits back within the reported errors, and 1σ intervals cover the truth ≈ 68 % of the time over seeds', () => {
    const seeds = 24;
    let covered = 0;
    let total = 0;
    let chi2RedSum = 0;
    for (let seed = 1; seed <= seeds; seed++) {
      const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: TRUTH, spectra: noisySpectra(seed) });
      const best = report.best;
      expect(best.converged).toBe(true);
      chi2RedSum += best.chi2Reduced;
      for (const key of KEYS) {
        const z = Math.abs(best.parametersMeV[key] - TRUTH[key]) / best.errorsMeV[key];
        expect(z, `${key} seed ${seed}`).toBeLessThan(4.5); // a > 4.5σ miss has probability 7e-6 per parameter
        if (z <= 1) covered++;
        total++;
      }
      expect(best.spectrumScales[0][0]).toBeGreaterThan(2.5);
      expect(best.spectrumScales[0][0]).toBeLessThan(3.5);
    }
    // 144 intervals; parameters of one seed are correlated, so count only the 24 seeds as independent: the binomial
    // standard deviation of the covered fraction is then at most √(0.68·0.32/24) = 0.095. Accept 0.68 ± 2.5·0.095.
    const fraction = covered / total;
    expect(fraction).toBeGreaterThan(0.68 - 0.24);
    expect(fraction).toBeLessThan(0.68 + 0.24);
    // The mean χ²_red of correct-model fits is 1 within √(2/ν)/√seeds ≈ 0.02 (ν = 234).
    expect(chi2RedSum / seeds).toBeGreaterThan(0.9);
    expect(chi2RedSum / seeds).toBeLessThan(1.1);
    if (process.env.MULTIPLET_VERBOSE) console.log(`coverage ${fraction} mean chi2red ${chi2RedSum / seeds}`);
  });
});

describe('fitCef with a fitted intrinsic line width', () => {
  it('recovers a 0.6 meV Lorentzian width (pseudo-Voigt lines) and the parameters within their errors', () => {
    const rng = createRandom(99);
    const spectra: SpectrumObservation[] = [5, 60].map((T) => {
      const model = neutronSpectrum('Er3+', TRUTH, { ...common, temperatureK: T, intrinsicFwhmMeV: 0.6 }).intensity;
      const scaled = Array.from(model, (v) => 3 * v + 20);
      const error = scaled.map((v) => 0.5 + 0.03 * v);
      return { temperatureK: T, ...common, intensity: scaled.map((v, i) => v + error[i] * rng.normal()), error };
    });
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: TRUTH, spectra, fitIntrinsicWidth: true });
    const width = report.best.intrinsicWidth!;
    expect(Math.abs(width.valueMeV - 0.6) / width.errorMeV).toBeLessThan(4);
    expect(width.errorMeV).toBeLessThan(0.2);
    for (const key of KEYS) expect(Math.abs(report.best.parametersMeV[key] - TRUTH[key]) / report.best.errorsMeV[key]).toBeLessThan(4);
    expect(report.best.degreesOfFreedom).toBe(2 * 121 - 7 - 4);
  });
});

describe('fitCef on a single-crystal spectrum', () => {
  it('fits B20 and B43 back from a Q ∥ z spectrum, which differs from the powder one', () => {
    const single = neutronSpectrum('Er3+', TRUTH, { ...common, temperatureK: 5, qDirection: [0, 0, 1] }).intensity;
    const powder = clean[0].intensity;
    expect(Math.max(...single.map((v, i) => Math.abs(v - powder[i])))).toBeGreaterThan(0.05 * Math.max(...powder));
    const error = Array.from(single, (v) => 0.01 * v + 0.01);
    const spectra: SpectrumObservation[] = [{ temperatureK: 5, ...common, qDirection: [0, 0, 1], intensity: Array.from(single), error }];
    const start = { ...TRUTH, B20: -0.037, B43: -0.0104 };
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start, free: ['B20', 'B43'], spectra });
    expect(report.best.chi2).toBeLessThan(1e-6);
    expect(report.best.parametersMeV.B20).toBeCloseTo(TRUTH.B20, 8);
    expect(report.best.parametersMeV.B43).toBeCloseTo(TRUTH.B43, 8);
  });
});
