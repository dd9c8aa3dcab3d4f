/** Symmetry twins of a crystal field: derived from the rotation code, merged only when the data cannot tell them apart. */
import { describe, expect, it } from 'vitest';
import { fitCef, cefLeastSquaresProblem, type PeakObservation } from '@multiplet/physics/fit/fitCef';
import { CefFitModel } from '@multiplet/physics/fit/cef/cefFitModel';
import { CefTwins, cefTwinMaps } from '@multiplet/physics/fit/cef/cefTwins';
import { multiStartSearch } from '@multiplet/physics/fit/multiStartSearch';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { neutronSpectrum } from '@multiplet/physics/neutron/neutronSpectrum';

// The D3d Er3+ field of fitCef.test.ts; TWIN is its image under the 180° rotation about z (B43, B63 → −B43, −B63).
const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const TWIN = { ...TRUTH, B43: 1.1e-2, B63: 7e-5 };

function peaks(): PeakObservation[] {
  const out: PeakObservation[] = [];
  for (const T of [5, 60]) {
    const t = cefTransitions('Er3+', TRUTH, T);
    for (const v of t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5))
      out.push({ energyMeV: v.energyMeV, errorMeV: 0.1, intensity: v.weight, intensityError: 0.05 * v.weight + 0.01, temperatureK: T });
  }
  return out;
}
const scaled = (model: CefFitModel, b: Record<string, number>) => Float64Array.from(model.freeKeys, (k, j) => b[k] * model.norms[j]);

describe('CEF symmetry twins', () => {
  it('the twin maps come from rotateCefParameters: D3d flips B43 and B63, D4h B44 and B64, D6h B66, D2h B22, B42, B62, B66; cubic and a fixed B43 have none', () => {
    const d3d = cefTwinMaps(new CefFitModel({ ion: 'Er3+', symmetry: 'D3d', start: {}, peaks: peaks() }));
    expect(d3d.map((m) => m.flippedKeys)).toEqual([['B43', 'B63']]);
    const d4h = cefTwinMaps(new CefFitModel({ ion: 'Er3+', symmetry: 'D4h', start: {}, peaks: peaks() }));
    expect(d4h.map((m) => m.flippedKeys)).toEqual([['B44', 'B64']]);
    const d6h = cefTwinMaps(new CefFitModel({ ion: 'Er3+', symmetry: 'D6h', start: {}, peaks: peaks() }));
    expect(d6h.map((m) => m.flippedKeys)).toEqual([['B66']]);
    const d2h = cefTwinMaps(new CefFitModel({ ion: 'Er3+', symmetry: 'D2h', start: {}, peaks: peaks() }));
    expect(d2h.map((m) => m.flippedKeys)).toEqual([['B22', 'B42', 'B62', 'B66']]);
    expect(cefTwinMaps(new CefFitModel({ ion: 'Yb3+', symmetry: 'Oh', start: {}, peaks: peaks() }))).toEqual([]);
    const fixedB43 = new CefFitModel({ ion: 'Er3+', symmetry: 'D3d', start: TRUTH, free: ['B20', 'B40', 'B60', 'B63', 'B66'], peaks: peaks() });
    expect(cefTwinMaps(fixedB43)).toEqual([]);
  });

  it('the twin is the same physics: identical levels and powder transition weights (cefTransitions)', () => {
    for (const T of [5, 60]) {
      const a = cefTransitions('Er3+', TRUTH, T).transitions;
      const b = cefTransitions('Er3+', TWIN, T).transitions;
      expect(b.length).toBe(a.length);
      a.forEach((t, i) => {
        expect(b[i].energyMeV).toBeCloseTo(t.energyMeV, 10);
        expect(b[i].weight).toBeCloseTo(t.weight, 10);
      });
    }
  });

  it('twins collapse into one minimum (two hits) instead of two, with the representative of the stated convention', () => {
    const model = new CefFitModel({ ion: 'Er3+', symmetry: 'D3d', start: {}, peaks: peaks() });
    const twins = new CefTwins(model);
    const options = { lower: model.lowerScaled, upper: model.upperScaled, starts: 0, initialPoints: [scaled(model, TRUTH), scaled(model, TWIN)], errorScaling: 'data' as const };
    const apart = multiStartSearch(cefLeastSquaresProblem(model), options);
    expect(apart.minima).toHaveLength(2);
    const merged = multiStartSearch(cefLeastSquaresProblem(model), { ...options, canonicalize: (fit) => twins.canonicalFit(fit) });
    expect(merged.minima).toHaveLength(1);
    expect(merged.minima[0].hits).toBe(2);
    // start without B43: the convention is B43 ≥ 0, i.e. the twin
    const b = model.parametersMeV(merged.best.parameters);
    for (const [key, value] of Object.entries(TWIN)) expect(b[key]).toBeCloseTo(value, 9);
    // correlations carried to the twin: the flipped pair (B43, B63) keeps its sign, B20–B43 changes sign
    const p = model.parameterCount;
    const raw = apart.minima.find((m) => m.fit.parameters[2] < 0)!.fit;
    expect(merged.best.correlation[0 * p + 2]).toBeCloseTo(-raw.correlation[0 * p + 2], 6);
    expect(merged.best.correlation[2 * p + 4]).toBeCloseTo(raw.correlation[2 * p + 4], 6);
  });

  it('fitCef keeps the frame of the start: the reported twin has the sign of the B43 of the start', () => {
    const report = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: { ...TWIN, B20: -0.035 }, peaks: peaks() });
    expect(report.twinFlippedKeys).toEqual(['B43', 'B63']);
    expect(report.best.parametersMeV.B43).toBeCloseTo(TWIN.B43, 8);
    const negative = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: { ...TRUTH, B20: -0.035 }, peaks: peaks() });
    expect(negative.best.parametersMeV.B43).toBeCloseTo(TRUTH.B43, 8);
  });

  it('merged only when the data cannot tell them apart: a single-crystal spectrum cannot, M(B) along [1 0 1] at high field can', () => {
    // Dipole neutron strengths summed over a degenerate level are Q̂ᵀ M Q̂ with a rank-2 tensor M, uniaxial for a
    // trigonal site, so even Q ∥ [1 0 1] sees the twins alike; M(B) contains higher-rank terms (sin 3φ-type in-plane
    // anisotropy) that the 180° rotation about z changes.
    const energies = Array.from({ length: 61 }, (_, k) => 2 + k);
    const s = neutronSpectrum('Er3+', TRUTH, { temperatureK: 5, energiesMeV: energies, resolution: { fwhmPolynomialMeV: [1] }, qDirection: [1, 0, 1] }).intensity;
    const spectrum = { temperatureK: 5, energiesMeV: energies, intensity: [...s], error: [...s].map((v) => 0.01 * v + 1e-3), resolution: { fwhmPolynomialMeV: [1] }, qDirection: [1, 0, 1] as [number, number, number] };
    const withSpectrum = new CefFitModel({ ion: 'Er3+', symmetry: 'D3d', start: TRUTH, spectra: [spectrum] });
    expect(new CefTwins(withSpectrum).equivalentTwins(scaled(withSpectrum, TRUTH))).toHaveLength(1);
    const fieldsT = [5, 10, 20, 30, 40];
    const bulk = (direction: [number, number, number]) => ({ temperatureK: 2, fieldsT, momentMuB: fieldsT.map(() => 5), errorMuB: fieldsT.map(() => 0.001), direction });
    const offAxis = new CefFitModel({ ion: 'Er3+', symmetry: 'D3d', start: TRUTH, peaks: peaks(), magnetization: [bulk([1, 0, 1])] });
    expect(new CefTwins(offAxis).equivalentTwins(scaled(offAxis, TRUTH))).toHaveLength(0);
    const alongZ = new CefFitModel({ ion: 'Er3+', symmetry: 'D3d', start: TRUTH, peaks: peaks(), magnetization: [bulk([0, 0, 1])] });
    expect(new CefTwins(alongZ).equivalentTwins(scaled(alongZ, TRUTH))).toHaveLength(1);
  });
});
