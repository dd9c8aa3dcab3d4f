import { describe, expect, it } from 'vitest';
import { nuclearSchottkyHeatCapacity } from '@multiplet/physics/thermo/nuclearSchottky';
import { schottkyHeatCapacity } from '@multiplet/physics/thermo/schottky';
import { BOLTZMANN_MEV_PER_K, GAS_CONSTANT_J_PER_MOL_K as R } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('nuclearSchottkyHeatCapacity', () => {
  it('high-T tail C = x R A² I(I+1)/(3 (k_BT)²) (Abragam & Bleaney ch. 17; expansion of the Schottky formula)', () => {
    const a = 0.002, spin = 3.5, abundance = 0.19, t = 20;
    const c = nuclearSchottkyHeatCapacity([t], { hyperfineMeV: a, nuclearSpin: spin, abundance }).heatCapacityJPerMolK[0];
    const tail = (abundance * R * a * a * spin * (spin + 1)) / (3 * (BOLTZMANN_MEV_PER_K * t) ** 2);
    expect(c / tail).toBeCloseTo(1, 4);
  });

  it('I = 1/2 is a two-level Schottky anomaly with gap |A|', () => {
    const t = [0.01, 0.05, 0.2];
    const a = nuclearSchottkyHeatCapacity(t, { hyperfineMeV: -0.003, nuclearSpin: 0.5 }).heatCapacityJPerMolK;
    const b = schottkyHeatCapacity([0, 0.003], t).heatCapacityJPerMolK;
    for (let i = 0; i < t.length; i++) expect(a[i]).toBeCloseTo(b[i], 12);
  });

  it('total nuclear entropy tends to x R ln(2I+1)', () => {
    const r = nuclearSchottkyHeatCapacity([100], { hyperfineMeV: 0.001, nuclearSpin: 2.5, abundance: 0.5, quadrupoleMeV: 0.0002 });
    expect(r.entropyJPerMolK[0]).toBeCloseTo(0.5 * R * Math.log(6), 5);
  });

  it('rejects a nuclear spin that is not a multiple of 1/2 and abundances outside [0, 1]', () => {
    expect(() => nuclearSchottkyHeatCapacity([1], { hyperfineMeV: 0.01, nuclearSpin: 0.7 })).toThrow(InputError);
    expect(() => nuclearSchottkyHeatCapacity([1], { hyperfineMeV: 0.01, nuclearSpin: 1, abundance: 1.2 })).toThrow(InputError);
  });
});
