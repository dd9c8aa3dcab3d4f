import { describe, expect, it } from 'vitest';
import { debyeHeatCapacity } from '@multiplet/physics/thermo/debye';
import { GAS_CONSTANT_J_PER_MOL_K as R } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('debyeHeatCapacity', () => {
  it('C/(3nR) = 0.952 at T = θ_D (Debye 1912; Kittel, Introduction to Solid State Physics, ch. 5 table of the Debye function)', () => {
    expect(debyeHeatCapacity([250], 250, 2)[0] / (3 * 2 * R)).toBeCloseTo(0.952, 3);
  });

  it('T³ law C = (12π⁴/5) n R (T/θ_D)³ at T ≪ θ_D (Debye 1912)', () => {
    const theta = 400;
    for (const t of [0.5, 2, 4]) {
      const law = ((12 * Math.PI ** 4) / 5) * 3 * R * (t / theta) ** 3;
      expect(debyeHeatCapacity([t], theta, 3)[0] / law).toBeCloseTo(1, 8);
    }
  });

  it('Dulong–Petit limit 3nR at T ≫ θ_D (common practice)', () => {
    expect(debyeHeatCapacity([1e5], 100, 5)[0] / (15 * R)).toBeCloseTo(1, 6);
  });

  it('is continuous across the x = 60 switch to the closed-form integral', () => {
    const theta = 600;
    const [a, b] = debyeHeatCapacity([theta / 59.999, theta / 60.001], theta);
    expect(Math.abs(a - b) / a).toBeLessThan(1e-3);
  });

  it('rejects θ_D ≤ 0 and T ≤ 0', () => {
    expect(() => debyeHeatCapacity([10], 0)).toThrow(InputError);
    expect(() => debyeHeatCapacity([-1], 100)).toThrow(InputError);
  });
});
