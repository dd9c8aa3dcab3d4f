import { describe, expect, it } from 'vitest';
import {
  magneticEntropy,
  PAULING_ENTROPY_J_PER_MOL_K,
  R_LN2_J_PER_MOL_K,
  SPIN_ICE_ENTROPY_J_PER_MOL_K,
} from '@multiplet/physics/thermo/magneticEntropy';
import { schottkyHeatCapacity } from '@multiplet/physics/thermo/schottky';
import { InputError } from '@multiplet/physics/errors';

const logGrid = (from: number, to: number, n: number) => Array.from({ length: n }, (_, i) => from * (to / from) ** (i / (n - 1)));

describe('magneticEntropy', () => {
  it('comparison lines: Pauling (R/2) ln(3/2) = 1.686 J/(mol K) (Pauling 1935), R ln 2 = 5.763, spin ice 4.078', () => {
    expect(PAULING_ENTROPY_J_PER_MOL_K).toBeCloseTo(1.686, 3);
    expect(R_LN2_J_PER_MOL_K).toBeCloseTo(5.763, 3);
    expect(SPIN_ICE_ENTROPY_J_PER_MOL_K).toBeCloseTo(4.078, 3);
  });

  it('round trip: ∫C/T of a computed Schottky C(T) equals the computed S(T) within 0.5 % (issue check)', () => {
    const levels = [0, 0, 1.2, 1.2, 3.5, 3.5, 7, 7];
    const t = logGrid(0.3, 300, 120);
    const exact = schottkyHeatCapacity(levels, t);
    const s = magneticEntropy(t, exact.heatCapacityJPerMolK).entropyJPerMolK;
    for (let i = 0; i < t.length; i++) {
      if (exact.entropyJPerMolK[i] < 0.05) continue; // below that S is exponentially small; compare in absolute terms
      expect(Math.abs(s[i] / exact.entropyJPerMolK[i] - 1)).toBeLessThan(0.005);
    }
    expect(Math.abs(s[t.length - 1] - exact.entropyJPerMolK[t.length - 1])).toBeLessThan(0.005 * exact.entropyJPerMolK[t.length - 1]);
  });

  it('power-law extrapolation recovers a T³ heat capacity exactly below the first point', () => {
    const t = [0.5, 0.6, 0.7, 0.8, 0.9, 1.0];
    const c = t.map((x) => 0.3 * x ** 3);
    const r = magneticEntropy(t, c, { extrapolation: 'power-law', lowPoints: 4 });
    expect(r.extrapolation.exponent).toBeCloseTo(3, 10);
    expect(r.extrapolation.prefactorJPerMolKPerKn).toBeCloseTo(0.3, 10);
    expect(r.entropyJPerMolK[0]).toBeCloseTo((0.3 * 0.5 ** 3) / 3, 12);
    expect(r.extrapolation.uncertaintyJPerMolK).toBeLessThan(1e-12);
  });

  it('propagates independent point errors through the trapezoid weights', () => {
    const t = [1, 2, 3, 4];
    const sigma = [0.1, 0.2, 0.1, 0.3];
    const r = magneticEntropy(t, [1, 1, 1, 1], { uncertaintyJPerMolK: sigma });
    // S(4) = ½(C1/1) + (C2/2) + (C3/3) + ½(C4/4): weights 0.5, 1, 1, 0.5 on C_i/T_i (uniform spacing h = 1).
    const expected = Math.hypot(0.5 * 0.1, 0.2 / 2, 0.1 / 3, (0.5 * 0.3) / 4);
    expect(r.uncertaintyJPerMolK[3]).toBeCloseTo(expected, 12);
    expect(r.uncertaintyJPerMolK[1]).toBeCloseTo(Math.hypot(0.5 * 0.1, (0.5 * 0.2) / 2), 12);
  });

  it('rejects non-monotonic temperatures, mismatched lengths and unfit power laws', () => {
    expect(() => magneticEntropy([1, 3, 2], [1, 1, 1])).toThrow(InputError);
    expect(() => magneticEntropy([1, 2, 3], [1, 1])).toThrow(InputError);
    expect(() => magneticEntropy([1, 2, 3], [1, -1, 1], { extrapolation: 'power-law', lowPoints: 2 })).toThrow(InputError);
    expect(() => magneticEntropy([1, 2, 3], [3, 2, 1], { extrapolation: 'power-law', lowPoints: 3 })).toThrow(InputError);
    expect(() => magneticEntropy([1, 2], [1, 1], { extrapolation: 'linear' as never })).toThrow(InputError);
  });
});
