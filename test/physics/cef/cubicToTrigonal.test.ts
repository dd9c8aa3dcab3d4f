import { describe, it, expect } from 'vitest';
import { cubicToTrigonal, TRIGONAL_FRAME_OF_CUBIC, rotateCefParameters, cefHamiltonian } from '@multiplet/physics/cef';
import { hermitianEigen } from '@multiplet/physics/linalg';
import { getIon } from '@multiplet/physics/ions';

describe('cubic field with z ∥ [111]', () => {
  it('rotation of B4(O40 + 5 O44) + B6(O60 − 21 O64) reproduces Hutchings (1964) coefficients: −2/3, ∓20√2, 16/9, ±35√2/4, 77/8', () => {
    const frame = TRIGONAL_FRAME_OF_CUBIC.map((row) => [...row]);
    const B4 = 0.013, B6 = -2.1e-4;
    const rotated = rotateCefParameters({ B40: B4, B44: 5 * B4, B60: B6, B64: -21 * B6 }, 7.5, frame);
    const published = cubicToTrigonal(B4, B6);
    expect(Object.keys(rotated).sort()).toEqual(['B40', 'B43', 'B60', 'B63', 'B66']);
    for (const key of Object.keys(published)) expect(Math.abs(rotated[key] - published[key])).toBeLessThan(1e-12 * Math.abs(published[key]) + 1e-17);
    // the published numbers, written out (Hutchings 1964; from memory)
    expect(published.B40 / B4).toBeCloseTo(-2 / 3, 14);
    expect(published.B43 / published.B40).toBeCloseTo(-20 * Math.SQRT2, 12);
    expect(published.B60 / B6).toBeCloseTo(16 / 9, 14);
    expect(published.B63 / published.B60).toBeCloseTo((35 * Math.SQRT2) / 4, 12);
    expect(published.B66 / published.B60).toBeCloseTo(77 / 8, 12);
  });

  it('the cubic and trigonal forms have the same spectra to 1e-10 (Dy3+, Er3+, Yb3+, Tb3+)', () => {
    for (const name of ['Dy3+', 'Er3+', 'Yb3+', 'Tb3+']) {
      const J = getIon(name).J;
      const B4 = 0.02, B6 = 3e-4;
      const cubic = hermitianEigen(cefHamiltonian(J, { B40: B4, B44: 5 * B4, B60: B6, B64: -21 * B6 }), { vectors: false }).values;
      const trigonal = hermitianEigen(cefHamiltonian(J, cubicToTrigonal(B4, B6)), { vectors: false }).values;
      cubic.forEach((e, k) => expect(Math.abs(trigonal[k] - e), name).toBeLessThan(1e-10));
    }
  });

  it('rejects non-numeric input', () => {
    expect(() => cubicToTrigonal(Number.NaN)).toThrow(/^B40:/);
  });
});
