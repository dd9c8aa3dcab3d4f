import { describe, it, expect } from 'vitest';
import { fitHeatCapacity } from '@multiplet/physics/montecarlo/fitHeatCapacity';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo/runSpinIceMonteCarlo';
import { InputError } from '@multiplet/physics/errors';

describe('fitHeatCapacity', () => {
  it('recovers J2 from synthetic C(T) made by an independent run (reweighting in J and T)', () => {
    const truth = { L: 2, latticeConstantAngstrom: 10, momentMuB: 1, dipolar: false, exchangeK: { J1: -3, J2: 0.35 } };
    const dataT = [0.25, 0.35, 0.45, 0.6, 0.8, 1.1, 1.5];
    const synth = runSpinIceMonteCarlo({ model: truth, temperaturesK: dataT, sweeps: 4000, seed: 100 }).result;
    const data = {
      temperaturesK: dataT,
      heatCapacityJPerMolK: synth.heatCapacityJPerMolK,
      errorJPerMolK: synth.heatCapacityErrorJPerMolK.map((e, k) => Math.hypot(e, 0.02 * synth.heatCapacityJPerMolK[k], 0.05)),
    };
    const fit = fitHeatCapacity({
      model: { ...truth, exchangeK: { J1: -3, J2: 0 } },
      data, parameters: ['J2'], sweeps: 1500, seed: 7, maxSimulations: 4,
      simulationTemperaturesK: [0.2, 0.25, 0.3, 0.35, 0.42, 0.5, 0.6, 0.72, 0.86, 1.05, 1.3, 1.6, 2],
    });
    expect(fit.history.length).toBeGreaterThan(1);
    expect(fit.history[0].chiSquare).toBeGreaterThan(fit.chiSquare);
    expect(Math.abs(fit.parametersK.J2! - 0.35)).toBeLessThan(Math.max(3 * fit.uncertaintiesK.J2!, 0.08));
    expect(fit.uncertaintiesK.J2!).toBeGreaterThan(0);
    expect(fit.reducedChiSquare).toBeLessThan(5);
  });

  it('rejects fitting D without the dipolar interaction', () => {
    expect(() =>
      fitHeatCapacity({
        model: { L: 1, latticeConstantAngstrom: 10, momentMuB: 1, dipolar: false },
        data: { temperaturesK: [1, 2, 3], heatCapacityJPerMolK: [1, 1, 1], errorJPerMolK: [0.1, 0.1, 0.1] },
        parameters: ['D'], sweeps: 100, seed: 1,
      }),
    ).toThrow(InputError);
  });
});
