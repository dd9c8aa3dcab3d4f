import { describe, it, expect } from 'vitest';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo/runSpinIceMonteCarlo';
import { multiHistogramReweighting } from '@multiplet/physics/montecarlo/multiHistogramReweighting';
import { reweightedHeatCapacity } from '@multiplet/physics/montecarlo/reweightedHeatCapacity';
import { BOHR_MAGNETON_K_PER_T } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { GAS_CONSTANT_J_PER_MOL_K } from '@multiplet/physics/units';

describe('multiHistogramReweighting (Ferrenberg & Swendsen 1989)', () => {
  it('free Ising moments in a [001] field: reweighted C(T) between simulated temperatures matches the exact Schottky form', () => {
    // Every moment has ẑ·[001] = ±1/√3, so b = μ μB B/(√3 k_B) and C/k_B per spin = (βb)² sech²(βb) exactly.
    const B = 1;
    const b = (2 * BOHR_MAGNETON_K_PER_T * B) / Math.sqrt(3);
    const temps = [0.3, 0.45, 0.65, 0.9, 1.3];
    const run = runSpinIceMonteCarlo({
      model: { L: 1, latticeConstantAngstrom: 10, momentMuB: 2, dipolar: false, fieldTesla: [0, 0, B] },
      temperaturesK: temps, sweeps: 4000, seed: 9, loopMovesPerSweep: 0,
    });
    const mh = multiHistogramReweighting(run.raw.series.energyK, temps);
    expect(mh.converged).toBe(true);
    const targets = [0.37, 0.55, 0.77, 1.1];
    const rw = reweightedHeatCapacity(mh, targets, 16);
    targets.forEach((T, k) => {
      const x = b / T;
      const exact = (x / Math.cosh(x)) ** 2 * GAS_CONSTANT_J_PER_MOL_K;
      expect(Math.abs(rw.heatCapacityJPerMolK[k] - exact) / exact).toBeLessThan(0.05);
      expect(rw.energyKPerSpin[k]).toBeCloseTo(-b * Math.tanh(x), 1);
    });
    // At a simulated temperature the reweighted value reproduces the direct estimate.
    const direct = run.result.heatCapacityJPerMolK[2];
    expect(Math.abs(reweightedHeatCapacity(mh, [0.65], 16).heatCapacityJPerMolK[0] - direct) / direct).toBeLessThan(0.03);
  });
});
