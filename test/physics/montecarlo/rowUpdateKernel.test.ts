import { describe, it, expect } from 'vitest';
import { createRowUpdateKernel } from '@multiplet/physics/montecarlo/rowUpdateKernel';
import { spinIceCouplings } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { createReplica } from '@multiplet/physics/montecarlo/replicaState';
import { metropolisSweep } from '@multiplet/physics/montecarlo/metropolisSweep';
import { loopMove } from '@multiplet/physics/montecarlo/loopMove';
import { createRandom } from '@multiplet/physics/random';

describe('createRowUpdateKernel (WebAssembly SIMD row update)', () => {
  it('adds α × row i to the fields of one replica only', () => {
    const J = Float64Array.from({ length: 64 }, (_, k) => Math.sin(k) * 0.37);
    const k = createRowUpdateKernel(J, 8, 2)!;
    expect(k).toBeDefined();
    k.addRow(1, 3, -2);
    expect(Array.from(k.fields(1))).toEqual(Array.from({ length: 8 }, (_, j) => -2 * J[24 + j]));
    expect(Array.from(k.fields(0))).toEqual(new Array(8).fill(0));
  });

  it('Metropolis and loop moves with the kernel are bit-identical to the JavaScript loops (dipolar spin ice)', () => {
    const c = spinIceCouplings({ L: 1, latticeConstantAngstrom: 10.124, momentMuB: 10, exchangeK: { J1: 3.72 }, dipolar: true });
    const plain = createReplica(c, createRandom(8));
    const kernel = createRowUpdateKernel(c.dense!, c.numberOfSites, 1)!;
    const withKernel = createReplica({ ...c, dense: kernel.matrix }, createRandom(8), undefined, kernel, 0);
    for (let s = 0; s < 200; s++) {
      const beta = 1 / (0.2 + (2 * s) / 200);
      metropolisSweep(c, plain, beta);
      metropolisSweep({ ...c, dense: kernel.matrix }, withKernel, beta);
      loopMove(c, plain, beta);
      loopMove({ ...c, dense: kernel.matrix }, withKernel, beta);
    }
    expect(Array.from(withKernel.spins)).toEqual(Array.from(plain.spins));
    expect(Array.from(withKernel.fieldsK)).toEqual(Array.from(plain.fieldsK));
    expect(withKernel.energyK).toBe(plain.energyK);
  });
});
