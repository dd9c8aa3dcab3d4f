import { describe, expect, it } from 'vitest';
import { curieWeissFit } from '@multiplet/physics/thermo/curieWeiss';
import { CURIE_PREFACTOR_EMU_K_PER_MOL } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('curieWeissFit', () => {
  const t = Array.from({ length: 60 }, (_, i) => 20 + 5 * i);

  it('recovers C, θ_CW and χ0 from exact Curie–Weiss data, and μ_eff of free Gd³⁺ = 7.94 μB (g√(J(J+1)), Kittel table)', () => {
    const c = CURIE_PREFACTOR_EMU_K_PER_MOL * 4 * 3.5 * 4.5; // Gd³⁺: g = 2, J = 7/2
    const chi = t.map((x) => c / (x + 12) + 2e-4);
    const fit = curieWeissFit(t, chi, { withChi0: true });
    expect(fit.curieConstantEmuKPerMol).toBeCloseTo(c, 6);
    expect(fit.weissTemperatureK).toBeCloseTo(-12, 5);
    expect(fit.chi0EmuPerMol).toBeCloseTo(2e-4, 8);
    expect(fit.effectiveMomentMuB).toBeCloseTo(7.94, 2);
    expect(c).toBeCloseTo(7.88, 2); // from memory: C(Gd³⁺) ≈ 7.88 emu K/mol
  });

  it('fits only the chosen range and gives error bars that cover the truth for noisy data', () => {
    const chi = t.map((x, i) => (1.5 / (x - 3)) * (1 + 0.002 * Math.sin(7 * i)));
    const fit = curieWeissFit(t, chi, { rangeK: [50, 300] });
    expect(fit.pointsUsed).toBe(t.filter((x) => x >= 50 && x <= 300).length);
    expect(Math.abs(fit.curieConstantEmuKPerMol - 1.5)).toBeLessThan(4 * fit.uncertainty.curieConstantEmuKPerMol + 1e-9);
    expect(Math.abs(fit.weissTemperatureK - 3)).toBeLessThan(4 * fit.uncertainty.weissTemperatureK + 1e-9);
    expect(fit.uncertainty.weissTemperatureK).toBeGreaterThan(0);
  });

  it('rejects too few points in range, mismatched lengths and T ≤ 0', () => {
    expect(() => curieWeissFit([10, 20, 30], [1, 0.5, 0.3], { rangeK: [15, 25] })).toThrow(InputError);
    expect(() => curieWeissFit([10, 20, 30], [1, 0.5])).toThrow(InputError);
    expect(() => curieWeissFit([0, 20, 30], [1, 0.5, 0.3])).toThrow(InputError);
  });
});
