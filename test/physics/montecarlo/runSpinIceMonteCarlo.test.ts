import { describe, it, expect } from 'vitest';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo/runSpinIceMonteCarlo';
import { createTask } from '@multiplet/physics/progress';
import { CancelledError, InputError } from '@multiplet/physics/errors';
import { GAS_CONSTANT_J_PER_MOL_K } from '@multiplet/physics/units';

const nnModel = (L: number, extra = {}) => ({ L, latticeConstantAngstrom: 10, momentMuB: 1, exchangeK: { J1: -3 }, dipolar: false, ...extra });

describe('runSpinIceMonteCarlo', () => {
  it('is reproducible: the same seed gives identical numbers, another seed different ones', () => {
    const opts = { model: nnModel(1), temperaturesK: [3, 1, 0.4], sweeps: 60, seed: 11 };
    const a = runSpinIceMonteCarlo(opts).result;
    const b = runSpinIceMonteCarlo(opts).result;
    const c = runSpinIceMonteCarlo({ ...opts, seed: 12 }).result;
    expect(b).toEqual(a);
    expect(c.energyKPerSpin).not.toEqual(a.energyKPerSpin);
  });

  it('nearest-neighbour spin ice: residual entropy within 1.5 % of Nagle 0.2050 R (Nagle, J. Math. Phys. 7, 1484 (1966))', () => {
    // J_nn = −J1/3 = 1 K (the usual dipolar spin-ice convention, PRL 84, 3430 (2000)). Pauling's estimate (R/2) ln(3/2) = 0.2027 R.
    // L = 4 (1024 spins): the ice-state entropy of small periodic cells lies above Nagle's value (measured: L = 3
    // about +2 %, L = 4 about +1 %, L = 5 about +0.5 %; seed-to-seed scatter ±0.4 %). This seed gives +0.35 %;
    // npm run validate:spin-ice repeats the check at L = 5.
    const temps: number[] = [];
    for (let k = 0; k < 24; k++) temps.push(0.12 * Math.pow(250, k / 23));
    const r = runSpinIceMonteCarlo({ model: nnModel(4), temperaturesK: temps, sweeps: 2000, seed: 3 }).result;
    const s0 = r.entropyJPerMolK[0] / GAS_CONSTANT_J_PER_MOL_K;
    expect(Math.abs(s0 - 0.205) / 0.205).toBeLessThan(0.015);
    // ice-state energy: per tetrahedron J_nn (2 − 4) = −2 J_nn, N/2 tetrahedra, so −J_nn per spin
    expect(r.energyKPerSpin[0]).toBeCloseTo(-1, 2);
    // the high-temperature end approaches R ln 2
    expect(r.entropyJPerMolK[23] / GAS_CONSTANT_J_PER_MOL_K).toBeGreaterThan(0.69);
  });

  it('[111] field: kagome-ice plateau at 1/3 of the moment per spin, saturation at 1/2 (3-in-1-out geometry)', () => {
    const mag = (B: number) => {
      const n = 1 / Math.sqrt(3);
      const r = runSpinIceMonteCarlo({ model: nnModel(2, { fieldTesla: [B * n, B * n, B * n] }), temperaturesK: [0.03, 0.06, 0.12], sweeps: 400, seed: 5 }).result;
      return r.magnetizationMuBPerSpin[0];
    };
    expect(mag(0.5)).toBeCloseTo(1 / 3, 2);
    expect(mag(20)).toBeCloseTo(1 / 2, 3);
  });

  it('reports progress each step and stops with CancelledError when cancelled', () => {
    const reports: number[] = [];
    const task = createTask((done) => {
      reports.push(done);
      if (done === 10) task.cancel();
    });
    expect(() => runSpinIceMonteCarlo({ model: nnModel(1), temperaturesK: [1], sweeps: 100, seed: 1 }, task)).toThrow(CancelledError);
    expect(reports).toEqual(Array.from({ length: 10 }, (_, k) => k + 1));
  });

  it('rejects bad input with InputError', () => {
    expect(() => runSpinIceMonteCarlo({ model: nnModel(1), temperaturesK: [1, -2], sweeps: 100, seed: 1 })).toThrow(InputError);
    expect(() => runSpinIceMonteCarlo({ model: nnModel(1), temperaturesK: [1], sweeps: 10, seed: 1 })).toThrow(InputError);
    expect(() => runSpinIceMonteCarlo({ model: { ...nnModel(8), dipolar: true }, temperaturesK: [1], sweeps: 100, seed: 1 })).toThrow(InputError);
  });
});
