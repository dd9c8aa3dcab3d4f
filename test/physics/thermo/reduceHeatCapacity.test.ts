import { describe, expect, it } from 'vitest';
import { reduceHeatCapacity } from '@multiplet/physics/thermo/reduceHeatCapacity';
import { schottkyHeatCapacity } from '@multiplet/physics/thermo/schottky';
import { debyeHeatCapacity } from '@multiplet/physics/thermo/debye';
import { nuclearSchottkyHeatCapacity } from '@multiplet/physics/thermo/nuclearSchottky';
import { R_LN2_J_PER_MOL_K } from '@multiplet/physics/thermo/magneticEntropy';
import { InputError } from '@multiplet/physics/errors';

describe('reduceHeatCapacity', () => {
  const t = Array.from({ length: 150 }, (_, i) => 0.2 * (300 / 0.2) ** (i / 149));
  // Synthetic A2B2O7-like data per formula unit: 2 ions, each with a doublet split by 0.3 meV (R ln 2 released),
  // a Debye lattice of 11 atoms, a nuclear term, and 2 % of an impurity phase with its own two-level anomaly.
  const magneticIon = schottkyHeatCapacity([0, 0.3], t).heatCapacityJPerMolK;
  const lattice = debyeHeatCapacity(t, 350, 11);
  const nuclearParams = { hyperfineMeV: 0.004, nuclearSpin: 3.5, abundance: 0.3 };
  const nuclearIon = nuclearSchottkyHeatCapacity(t, nuclearParams).heatCapacityJPerMolK;
  const impurityPhase = schottkyHeatCapacity([0, 1.0], t).heatCapacityJPerMolK;
  const f = 0.02;
  const measured = t.map((_, i) => (1 - f) * (2 * magneticIon[i] + lattice[i] + 2 * nuclearIon[i]) + f * impurityPhase[i]);

  it('subtracts lattice, nuclear and impurity parts and integrates R ln 2 per ion (Schottky doublet)', () => {
    const r = reduceHeatCapacity({
      temperaturesK: t,
      heatCapacityJPerMolK: measured,
      ionsPerFormulaUnit: 2,
      phonon: { debye: { atoms: 11, temperatureK: 350 } },
      nuclear: [nuclearParams],
      impurity: { fraction: f, levelsMeV: [0, 1.0] },
    });
    r.magneticJPerMolIonK.forEach((c, i) => expect(c).toBeCloseTo(magneticIon[i], 9));
    const sAt60K = r.entropy.entropyJPerMolK[t.findIndex((x) => x > 60)];
    expect(Math.abs(sAt60K / R_LN2_J_PER_MOL_K - 1)).toBeLessThan(0.005);
    expect(r.comparisonLinesJPerMolK.rLn2).toBeCloseTo(5.763, 3);
  });

  it('fits the Debye temperature in a high-temperature range when not given', () => {
    const r = reduceHeatCapacity({
      temperaturesK: t,
      heatCapacityJPerMolK: t.map((_, i) => 2 * magneticIon[i] + lattice[i]),
      ionsPerFormulaUnit: 2,
      phonon: { debye: { atoms: 11 }, fitRangeK: [40, 300] },
    });
    expect(r.phononModel!.debye!.temperatureK).toBeCloseTo(350, 0);
  });

  it('rejects two lattice sources, a fraction ≥ 1 and non-monotonic data', () => {
    const analogue = { temperaturesK: t, heatCapacityJPerMolK: Array.from(lattice), molarMassGPerMol: 500, sample: { molarMassGPerMol: 600 } };
    expect(() =>
      reduceHeatCapacity({ temperaturesK: t, heatCapacityJPerMolK: measured, phonon: { debye: { atoms: 11, temperatureK: 350 } }, analogue }),
    ).toThrow(InputError);
    expect(() => reduceHeatCapacity({ temperaturesK: t, heatCapacityJPerMolK: measured, impurity: { fraction: 1, levelsMeV: [0, 1] } })).toThrow(InputError);
    expect(() => reduceHeatCapacity({ temperaturesK: [1, 2, 2], heatCapacityJPerMolK: [1, 1, 1] })).toThrow(InputError);
  });
});
