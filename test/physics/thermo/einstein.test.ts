import { describe, expect, it } from 'vitest';
import { einsteinHeatCapacity } from '@multiplet/physics/thermo/einstein';
import { GAS_CONSTANT_J_PER_MOL_K as R } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('einsteinHeatCapacity', () => {
  it('at T = θ_E equals 3nR e/(e − 1)² = 0.9207·3nR (Einstein 1907)', () => {
    expect(einsteinHeatCapacity([80], 80, 2)[0] / (6 * R)).toBeCloseTo(Math.E / (Math.E - 1) ** 2, 12);
    expect(Math.E / (Math.E - 1) ** 2).toBeCloseTo(0.9207, 4);
  });

  it('tends to 3nR at high T and vanishes exponentially at low T', () => {
    expect(einsteinHeatCapacity([1e5], 100, 1)[0] / (3 * R)).toBeCloseTo(1, 6);
    expect(einsteinHeatCapacity([1], 1000, 1)[0]).toBe(0);
    const low = einsteinHeatCapacity([10], 200, 1)[0];
    expect(low / (3 * R * 400 * Math.exp(-20))).toBeCloseTo(1, 6);
  });

  it('rejects θ_E ≤ 0', () => {
    expect(() => einsteinHeatCapacity([10], -5)).toThrow(InputError);
  });
});
