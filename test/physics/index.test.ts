import { describe, expect, it } from 'vitest';
import * as physics from '@multiplet/physics';

describe('@multiplet/physics public surface', () => {
  it('exposes every module as a namespace, and they work together', () => {
    const ion = physics.ions.getIon('Ce3+');
    // Ce3+ in a cubic field: Γ7/Γ8 split by 360·B4 (Hutchings 1964), through the package's bare entry point.
    const b4 = 0.01;
    const solution = physics.cef.solveCef(ion, { B40: b4, B44: 5 * b4 });
    expect(solution.levels.map((l) => l.degeneracy).sort()).toEqual([2, 4]);
    expect(solution.levels[1]!.energyMeV).toBeCloseTo(360 * b4, 10);
    expect(physics.units.BOLTZMANN_MEV_PER_K).toBeCloseTo(0.08617333, 8); // CODATA 2018: k_B = 8.617333262e-5 eV/K
  });
});
