import { describe, expect, it } from 'vitest';
import { schottkyHeatCapacity } from '@multiplet/physics/thermo/schottky';
import { BOLTZMANN_MEV_PER_K, GAS_CONSTANT_J_PER_MOL_K as R } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('schottkyHeatCapacity', () => {
  it('two levels of equal degeneracy: peak C/R = 0.4392 at k_BT/Δ = 0.4168 (Gopal, Specific Heats at Low Temperatures, ch. 4)', () => {
    const gapMeV = 2;
    const ratios = Array.from({ length: 4001 }, (_, i) => 0.3 + (0.25 * i) / 4000);
    const t = ratios.map((r) => (r * gapMeV) / BOLTZMANN_MEV_PER_K);
    const c = schottkyHeatCapacity([0, gapMeV], t).heatCapacityJPerMolK;
    let best = 0;
    c.forEach((v, i) => {
      if (v > c[best]) best = i;
    });
    expect(c[best] / R).toBeCloseTo(0.4392, 4);
    expect(ratios[best]).toBeCloseTo(0.4168, 3);
  });

  it('S(T → ∞) = R ln(number of states); S(0) = R ln g₀ with a degenerate ground level', () => {
    const levels = [0, 0, 1.5, 1.5, 4, 4, 9, 9]; // a Kramers ion with J = 7/2: four doublets
    const r = schottkyHeatCapacity(levels, [1e6, 1e-3]);
    expect(r.totalEntropyJPerMolK[0]).toBeCloseTo(R * Math.log(8), 4);
    expect(r.groundStateEntropyJPerMolK).toBeCloseTo(R * Math.LN2, 12);
    expect(r.entropyJPerMolK[0]).toBeCloseTo(R * Math.log(4), 4); // released above the ground doublet
    expect(r.entropyJPerMolK[1]).toBe(0);
    expect(r.heatCapacityJPerMolK[1]).toBe(0);
  });

  it('degeneracies multiply levels: [0, Δ] with g = [1, 3] equals four explicit levels', () => {
    const t = [1, 10, 100];
    const a = schottkyHeatCapacity([0, 1], t, { degeneracies: [1, 3] });
    const b = schottkyHeatCapacity([0, 1, 1, 1], t);
    for (let i = 0; i < 3; i++) expect(a.heatCapacityJPerMolK[i]).toBeCloseTo(b.heatCapacityJPerMolK[i], 12);
  });

  it('C = dU/dT (thermodynamic consistency, central difference)', () => {
    const levels = [0, 0.7, 3.1, 5];
    const tK = 17, h = 1e-3;
    const u = schottkyHeatCapacity(levels, [tK - h, tK + h]).internalEnergyJPerMol;
    expect(schottkyHeatCapacity(levels, [tK]).heatCapacityJPerMolK[0]).toBeCloseTo((u[1] - u[0]) / (2 * h), 6);
  });

  it('rejects T ≤ 0, empty levels and bad degeneracies', () => {
    expect(() => schottkyHeatCapacity([0, 1], [0])).toThrow(InputError);
    expect(() => schottkyHeatCapacity([], [1])).toThrow(InputError);
    expect(() => schottkyHeatCapacity([0, 1], [1], { degeneracies: [1] })).toThrow(InputError);
    expect(() => schottkyHeatCapacity([0, 1], [1], { degeneracies: [1, 0.5] })).toThrow(InputError);
  });
});
