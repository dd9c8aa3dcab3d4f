import { describe, expect, it } from 'vitest';
import { magneticFormFactor, radialFormFactors } from '@multiplet/physics/neutron/magneticFormFactor';
import { getIon, ION_NAMES } from '@multiplet/physics/ions';
import { BOHR_RADIUS_ANGSTROM } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('magnetic form factor (Brown, International Tables Vol. C §4.4.5)', () => {
  it('⟨j0⟩(0) = A + B + C + D = 1 to the tables’ precision (4 decimals) and ⟨j2⟩(0) = 0, for every ion', () => {
    for (const name of ION_NAMES) {
      const { j0, j2 } = radialFormFactors(name, 0);
      expect(Math.abs(j0 - 1), name).toBeLessThanOrEqual(1.5e-3);
      expect(j2).toBe(0);
      expect(Math.abs(magneticFormFactor(name, 0) - 1)).toBeLessThanOrEqual(1.5e-3);
    }
  });

  // Independent check against a second source: for small Q, j0(Qr) ≈ 1 − Q²r²/6 and j2(Qr) ≈ Q²r²/15, so
  // ⟨j0⟩ ≈ 1 − Q²⟨r²⟩/6 and ⟨j2⟩ ≈ Q²⟨r²⟩/15 with ⟨r²⟩ the 4f radial integral of Freeman & Desclaux (1979) in the
  // ions table. The analytic fits are not built for Q → 0 slopes; we accept 25 %.
  it('small-Q behaviour agrees with the Freeman–Desclaux ⟨r²⟩ of the ions table', () => {
    const q = 0.5;
    for (const name of ['Nd3+', 'Sm3+', 'Gd3+', 'Tb3+', 'Dy3+', 'Ho3+', 'Er3+', 'Tm3+', 'Yb3+']) {
      const r2 = getIon(name).radial.r2 * BOHR_RADIUS_ANGSTROM ** 2;
      const { j0, j2 } = radialFormFactors(name, q);
      const j0At0 = radialFormFactors(name, 0).j0;
      expect((j0At0 - j0) / ((q * q * r2) / 6), name).toBeGreaterThan(0.75);
      expect((j0At0 - j0) / ((q * q * r2) / 6), name).toBeLessThan(1.25);
      expect(j2 / ((q * q * r2) / 15), name).toBeGreaterThan(0.75);
      expect(j2 / ((q * q * r2) / 15), name).toBeLessThan(1.25);
    }
  });

  it('values at a few sin θ/λ reproduce Brown’s formula with the Er3+ coefficients', () => {
    // Er3+ ⟨j0⟩: A a B b C c D = 0.0586 17.9802 0.3540 7.0964 0.6126 2.7482 −0.0251 (Table 4.4.5.3), typed again here.
    const brown = (s: number) => 0.0586 * Math.exp(-17.9802 * s * s) + 0.354 * Math.exp(-7.0964 * s * s) + 0.6126 * Math.exp(-2.7482 * s * s) - 0.0251;
    for (const s of [0.1, 0.2, 0.4, 0.6]) expect(radialFormFactors('Er3+', 4 * Math.PI * s).j0).toBeCloseTo(brown(s), 12);
  });

  it('falls with Q for the heavy ions and mixes ⟨j2⟩ with the weight (2 − g_J)/g_J', () => {
    const ion = getIon('Ho3+');
    const q = 3;
    const { j0, j2 } = radialFormFactors('Ho3+', q);
    expect(magneticFormFactor('Ho3+', q)).toBeCloseTo(j0 + ((2 - ion.gJ) / ion.gJ) * j2, 14);
    let last = 1.01;
    for (let qq = 0; qq <= 6; qq += 0.5) {
      const f = magneticFormFactor('Ho3+', qq);
      expect(f).toBeLessThan(last);
      last = f;
    }
  });

  it('rejects a negative Q and unknown ions', () => {
    expect(() => magneticFormFactor('Er3+', -1)).toThrow(InputError);
    expect(() => magneticFormFactor('Xx3+', 1)).toThrow(InputError);
  });
});
