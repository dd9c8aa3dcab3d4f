import { describe, expect, it } from 'vitest';
import { latticeFromAnalogue } from '@multiplet/physics/thermo/latticeFromAnalogue';
import { debyeHeatCapacity } from '@multiplet/physics/thermo/debye';
import { InputError } from '@multiplet/physics/errors';

describe('latticeFromAnalogue', () => {
  // A Debye solid analogue: rescaling by θ ratio must give the Debye C of the sample's θ (the law it assumes).
  const ta = Array.from({ length: 400 }, (_, i) => 0.5 + 0.25 * i);
  const thetaA = 300;
  const analogue = { temperaturesK: ta, heatCapacityJPerMolK: Array.from(debyeHeatCapacity(ta, thetaA, 11)), molarMassGPerMol: 533.9 };

  it('mass scaling θ ∝ M^(−1/2) (common practice): C_s(T) = Debye(T; θ_A √(M_A/M_S))', () => {
    const r = latticeFromAnalogue([5, 20, 60], analogue, { molarMassGPerMol: 740.6 });
    expect(r.scaling).toBe('mass');
    expect(r.debyeTemperatureRatio).toBeCloseTo(Math.sqrt(533.9 / 740.6), 12);
    const expected = debyeHeatCapacity([5, 20, 60], thetaA * r.debyeTemperatureRatio, 11);
    r.heatCapacityJPerMolK.forEach((c, i) => expect(c / expected[i]).toBeCloseTo(1, 2));
  });

  it('Bouvier et al. (1991) form with molar volumes: r = (M_A/M_S)^(1/2) (V_A/V_S)^(1/3)', () => {
    const r = latticeFromAnalogue([10], { ...analogue, molarVolumeCm3PerMol: 75 }, { molarMassGPerMol: 740.6, molarVolumeCm3PerMol: 73 });
    expect(r.scaling).toBe('mass-volume');
    expect(r.debyeTemperatureRatio).toBeCloseTo(Math.sqrt(533.9 / 740.6) * Math.cbrt(75 / 73), 12);
  });

  it('rejects temperatures outside the analogue range, one molar volume only, non-increasing analogue data', () => {
    expect(() => latticeFromAnalogue([0.3], analogue, { molarMassGPerMol: 740.6 })).toThrow(InputError);
    expect(() => latticeFromAnalogue([10], { ...analogue, molarVolumeCm3PerMol: 75 }, { molarMassGPerMol: 740.6 })).toThrow(InputError);
    expect(() => latticeFromAnalogue([10], { ...analogue, temperaturesK: [...ta].reverse() }, { molarMassGPerMol: 740.6 })).toThrow(InputError);
  });
});
