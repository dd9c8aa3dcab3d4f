import { describe, expect, it } from 'vitest';
import { cefHeatCapacity } from '@multiplet/physics/thermo/heatCapacity';
import { magneticEntropy } from '@multiplet/physics/thermo/magneticEntropy';
import { GAS_CONSTANT_J_PER_MOL_K as R } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

const er = { J: 7.5, gJ: 6 / 5, parametersMeV: { B20: -0.06, B40: 4e-4, B43: -3e-3, B60: 1e-6, B63: 1e-5, B66: 1e-5 } };

describe('cefHeatCapacity', () => {
  it('S(T → ∞) = R ln(2J+1) (statistical entropy), released part R ln((2J+1)/2) above a Kramers doublet', () => {
    const r = cefHeatCapacity(er, { temperaturesK: [1e6] });
    expect(r.totalEntropyJPerMolK[0]).toBeCloseTo(R * Math.log(16), 3);
    expect(r.groundStateEntropyJPerMolK).toBeCloseTo(R * Math.LN2, 10);
    expect(r.entropyJPerMolK[0]).toBeCloseTo(R * Math.log(8), 3);
  });

  it('an isolated Kramers doublet split by a small field gives the plateau R ln 2', () => {
    // Strong axial field: the |±15/2⟩ doublet is 42 meV (490 K) below the next level; 0.05 T splits it by 0.087 meV
    // (1 K). Between the two scales S − S(0) = R ln 2 up to (Δ/2k_BT)²/2 ≈ 3e-4 R and e^{−490/T} terms.
    const ion = { J: 7.5, gJ: 4 / 3, parametersMeV: { B20: -1 } };
    const r = cefHeatCapacity(ion, { temperaturesK: [20, 40], fieldTesla: [0, 0, 0.05] });
    expect(r.entropyJPerMolK[0] / (R * Math.LN2)).toBeCloseTo(1, 3);
    expect(r.entropyJPerMolK[1] / (R * Math.LN2)).toBeCloseTo(1, 3);
  });

  it('round trip: ∫C/T dT of the computed C(T) equals the computed S(T) within 0.5 % (issue check)', () => {
    const t = Array.from({ length: 200 }, (_, i) => 0.01 * (600 / 0.01) ** (i / 199));
    const r = cefHeatCapacity(er, { temperaturesK: t, ionsPerFormulaUnit: 2 });
    const s = magneticEntropy(t, r.heatCapacityJPerMolK).entropyJPerMolK;
    t.forEach((_, i) => {
      if (r.entropyJPerMolK[i] > 0.05) expect(Math.abs(s[i] / r.entropyJPerMolK[i] - 1)).toBeLessThan(0.005);
    });
    expect(r.heatCapacityJPerMolFormulaUnitK[100]).toBeCloseTo(2 * r.heatCapacityJPerMolK[100], 12);
  });

  it('rejects T ≤ 0 and a malformed field', () => {
    expect(() => cefHeatCapacity(er, { temperaturesK: [0] })).toThrow(InputError);
    expect(() => cefHeatCapacity(er, { temperaturesK: [1], fieldTesla: [0, 1] as never })).toThrow(InputError);
  });
});
