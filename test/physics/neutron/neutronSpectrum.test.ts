import { describe, expect, it } from 'vitest';
import { neutronSpectrum } from '@multiplet/physics/neutron/neutronSpectrum';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { magneticFormFactor } from '@multiplet/physics/neutron/magneticFormFactor';
import { getIon } from '@multiplet/physics/ions';
import { BOLTZMANN_MEV_PER_K, MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

// A D3d crystal field for Er3+ (z ∥ 3-fold), levels spread over ~0–60 meV; values chosen for the test only.
const B = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };

describe('cefTransitions', () => {
  it('detailed balance: weight(b → a) / weight(a → b) = exp(−(E_b − E_a)/k_B T)', () => {
    const T = 80;
    const t = cefTransitions('Er3+', B, T);
    let checked = 0;
    for (const up of t.transitions) {
      if (up.energyMeV <= 0) continue;
      const down = t.transitions.find((d) => d.fromLevel === up.toLevel && d.toLevel === up.fromLevel);
      if (!down) continue;
      expect(down.strength).toBeCloseTo(up.strength, 10);
      expect(down.weight / up.weight).toBeCloseTo(Math.exp(-up.energyMeV / (BOLTZMANN_MEV_PER_K * T)), 10);
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
  });

  it('Kramers ion: all levels doubly degenerate; populations sum to 1', () => {
    const t = cefTransitions('Er3+', B, 30);
    expect(t.levels.every((l) => l.degeneracy === 2)).toBe(true);
    expect(t.levels.reduce((s, l) => s + l.populationPerState * l.degeneracy, 0)).toBeCloseTo(1, 12);
  });

  it('rejects a negative temperature', () => {
    expect(() => cefTransitions('Er3+', B, -1)).toThrow(InputError);
  });
});

describe('neutronSpectrum', () => {
  it('absolute units: ∫ S(E) dE = (γr0/2)² g_J² f(Q)² (2/3) J(J+1) (total-moment sum rule, Squires §7.6)', () => {
    const ion = getIon('Er3+');
    const q = 2;
    const energies = Array.from({ length: 40001 }, (_, k) => -150 + k * 0.0075);
    const s = neutronSpectrum(ion, B, { temperatureK: 50, energiesMeV: energies, qInvAngstrom: q, lineShape: 'gaussian', resolution: { fwhmPolynomialMeV: [0.5, -0.004] } });
    let integral = 0;
    for (const v of s.intensity) integral += v * 0.0075;
    const expected = MAGNETIC_PREFACTOR_MB * ion.gJ ** 2 * magneticFormFactor('Er3+', q) ** 2 * (2 / 3) * ion.J * (ion.J + 1);
    expect(integral / expected).toBeCloseTo(1, 4);
  });

  it('detailed balance in the spectrum: I(−E)/I(E) = exp(−E/k_B T) at well separated peaks (no k_f/k_i)', () => {
    const T = 100;
    const t = cefTransitions('Er3+', B, T);
    const first = t.levels[1].energyMeV;
    const s = neutronSpectrum('Er3+', B, { temperatureK: T, energiesMeV: [first, -first], resolution: { fwhmPolynomialMeV: [0.05] }, lineShape: 'gaussian' });
    // lines nearer than 0.5 meV to ±first would spoil the comparison; check that there are none
    const near = t.transitions.filter((x) => Math.abs(Math.abs(x.energyMeV) - first) < 0.5 && x.fromLevel !== 0 && x.toLevel !== 0);
    expect(near.length).toBe(0);
    expect(s.intensity[1] / s.intensity[0]).toBeCloseTo(Math.exp(-first / (BOLTZMANN_MEV_PER_K * T)), 6);
  });

  it('k_f/k_i suppresses energy loss near E_i and removes it beyond', () => {
    const base = { temperatureK: 5, energiesMeV: [10, 200], resolution: { fwhmPolynomialMeV: [3] } } as const;
    const free = neutronSpectrum('Er3+', B, base);
    const withEi = neutronSpectrum('Er3+', B, { ...base, incidentEnergyMeV: 40 });
    expect(withEi.intensity[0] / free.intensity[0]).toBeCloseTo(Math.sqrt(1 - 10 / 40), 12);
    expect(withEi.intensity[1]).toBe(0);
  });

  it('pseudo-Voigt and Lorentzian lines keep unit area; background adds a + bE', () => {
    const energies = Array.from({ length: 40001 }, (_, k) => -400 + k * 0.02);
    const s = neutronSpectrum('Er3+', B, { temperatureK: 10, energiesMeV: energies, lineShape: 'pseudo-voigt', intrinsicFwhmMeV: 0.3, resolution: { fwhmPolynomialMeV: [0.4] } });
    let integral = 0;
    for (const v of s.intensity) integral += v * 0.02;
    const ion = getIon('Er3+');
    // The Lorentzian part's tails beyond the ±400 meV window hold < 1e-3 of the area: (1/π)·Γ/d per line, Γ ≲ 0.7 meV.
    const ratio = integral / (MAGNETIC_PREFACTOR_MB * ion.gJ ** 2 * (2 / 3) * ion.J * (ion.J + 1));
    expect(ratio).toBeLessThan(1.0005); // Riemann-sum error of the 0.02 meV grid
    expect(ratio).toBeGreaterThan(0.998);
    const bg = neutronSpectrum('Er3+', B, { temperatureK: 10, energiesMeV: [500], background: { constant: 2, slope: 0.01 } });
    expect(bg.intensity[0]).toBeCloseTo(7, 6);
  });

  it('rejects bad input with InputError naming the field', () => {
    expect(() => neutronSpectrum('Er3+', B, { temperatureK: 5, energiesMeV: [] })).toThrow(InputError);
    expect(() => neutronSpectrum('Er3+', B, { temperatureK: 5, energiesMeV: [1], resolution: { fwhmPolynomialMeV: [-1] } })).toThrow(/resolution/);
    expect(() => neutronSpectrum('Er3+', { B21x: 1 } as never, { temperatureK: 5, energiesMeV: [1] })).toThrow(InputError);
  });
});
