import { describe, it, expect } from 'vitest';
import { angularMomentumMatrices } from '@multiplet/physics/cef';
import { multiply, maxAbsDifference, addScaled, zeros } from '@multiplet/physics/linalg';

describe('angular momentum matrices', () => {
  it('satisfy [Jx, Jy] = i Jz and J² = J(J+1) (exact algebra)', () => {
    for (const J of [0.5, 3, 7.5]) {
      const { Jx, Jy, Jz } = angularMomentumMatrices(J);
      const comm = addScaled(multiply(Jx, Jy), multiply(Jy, Jx), -1);
      const iJz = zeros(Jz.n);
      iJz.im.set(Jz.re);
      expect(maxAbsDifference(comm, iJz)).toBeLessThan(1e-12);
      const j2 = addScaled(addScaled(multiply(Jx, Jx), multiply(Jy, Jy)), multiply(Jz, Jz));
      for (let k = 0; k < Jz.n; k++) expect(j2.re[k * Jz.n + k]).toBeCloseTo(J * (J + 1), 12);
      expect(Jz.re[0]).toBe(J); // basis index 0 is m = +J (DEVELOPERS.md)
    }
  });
});
