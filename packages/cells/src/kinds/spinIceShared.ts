/**
 * Shared by the spin-ice cell kinds (`spin-ice-mc`, `structure-factor`, `mc-fit`): the model fields, running a
 * Monte Carlo job off the kernel thread with progress and interrupt, and a compact text encoding of Ising
 * configurations (so that snapshots live in a result's plain JSON).
 */
import { runSpinIceMonteCarloAsync } from '@multiplet/physics/montecarlo/runSpinIceMonteCarloAsync';
import type { SpinIceRunData } from '@multiplet/physics/montecarlo/spinIceRunData';
import type { SpinIceRunOptions } from '@multiplet/physics/montecarlo/spinIceSimulation';
import type { SpinIceRunResult } from '@multiplet/physics/montecarlo/summarizeSpinIceRun';
import type { SpinIceModel } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { CancelledError } from '@multiplet/physics/errors';
import type { Schema } from '../schema';
import type { RunContext } from './types';

/** Model fields common to `spin-ice-mc` and `mc-fit` (units: K, T, angstrom; moment in μB as a plain number). */
export const SPIN_ICE_MODEL_FIELDS: Schema = {
  L: { type: 'integer', min: 1, max: 8, default: 2, doc: 'Cubic cells per axis (N = 16 L³ spins; at most 6 with the dipolar sum).' },
  J1: { type: 'quantity', unit: 'K', default: '0 K', doc: 'First-neighbour exchange, H = Σ J S_i·S_j with unit Ising vectors (J > 0 antiferromagnetic; J_nn = −J1/3).', control: { min: -10, max: 10, step: 0.01 } },
  J2: { type: 'quantity', unit: 'K', default: '0 K', doc: 'Second-neighbour exchange (r = a√6/4).', control: { min: -2, max: 2, step: 0.005 } },
  J3a: { type: 'quantity', unit: 'K', default: '0 K', doc: 'Third-neighbour exchange across a hexagon (r = a√2/2).', control: { min: -2, max: 2, step: 0.005 } },
  J3b: { type: 'quantity', unit: 'K', default: '0 K', doc: 'Third-neighbour exchange through a shared first neighbour (r = a√2/2).', control: { min: -2, max: 2, step: 0.005 } },
  dipolar: { type: 'boolean', default: false, doc: 'Long-range dipolar interaction by Ewald summation (conducting boundary).' },
  moment: { type: 'number', min: 0, default: 10, doc: 'Ising moment in μB (dipolar strength, Zeeman energy, scattering).' },
  latticeConstant: { type: 'quantity', unit: 'angstrom', min: 0, doc: 'Cubic lattice constant (default: the sample’s, else 10.1 Å).' },
  field: { type: 'quantity', unit: 'T', min: 0, default: '0 T', doc: 'Applied field magnitude.' },
  fieldDirection: { type: 'list', of: { type: 'number', doc: 'Component along the cubic axes.' }, minItems: 3, maxItems: 3, default: [0, 0, 1], doc: 'Field direction [x, y, z] (cubic axes); also the magnetization axis.' },
  sweeps: { type: 'integer', min: 40, default: 2000, doc: 'Measured Monte Carlo steps (N single-flip attempts + loop moves each).' },
  thermalizationSweeps: { type: 'integer', min: 0, doc: 'Discarded steps before measuring (default: sweeps / 2).' },
  loopMovesPerSweep: { type: 'integer', min: 0, doc: 'Loop-move attempts per step and temperature (default N/64).' },
};

/** The model inputs as coerced by the schema above. */
export interface SpinIceModelInput {
  L: number;
  J1: number;
  J2: number;
  J3a: number;
  J3b: number;
  dipolar: boolean;
  moment: number;
  latticeConstant?: number;
  field: number;
  fieldDirection: number[];
  sweeps: number;
  thermalizationSweeps?: number;
  loopMovesPerSweep?: number;
}

/** Build the physics model from the inputs (lattice constant from the sample when not given). */
export function modelFromInput(input: SpinIceModelInput, ctx: RunContext): SpinIceModel {
  const d = input.fieldDirection;
  const n = Math.hypot(d[0], d[1], d[2]);
  if (!(n > 0)) ctx.fail('fieldDirection', d, 'a non-zero vector [x, y, z]');
  const unit = [d[0] / n, d[1] / n, d[2] / n] as [number, number, number];
  const a = input.latticeConstant ?? ctx.sampleIfDefined()?.latticeConstantAngstrom ?? 10.1;
  if (input.dipolar && input.L > 6) ctx.fail('L', input.L, 'at most 6 with the dipolar sum (dense N×N pair matrix)');
  return {
    L: input.L,
    latticeConstantAngstrom: a,
    momentMuB: input.moment,
    exchangeK: { J1: input.J1, J2: input.J2, J3a: input.J3a, J3b: input.J3b },
    dipolar: input.dipolar,
    fieldTesla: [input.field * unit[0], input.field * unit[1], input.field * unit[2]],
    magnetizationDirection: unit,
  };
}

/**
 * Run a Monte Carlo job in a worker thread when the bundled worker is there (the kernel), else in-thread with
 * yields; progress goes to ctx.task, an interrupt (ctx.yieldNow throws) cancels the job within a second.
 */
export async function runSpinIceJob(options: SpinIceRunOptions, ctx: RunContext, phase = ''): Promise<{ result: SpinIceRunResult; data: SpinIceRunData }> {
  const job = runSpinIceMonteCarloAsync(options, { onProgress: (done, total, p) => ctx.task.report(done, total, phase + (p ?? '')) });
  let finished = false;
  const outcome = job.promise.finally(() => {
    finished = true;
  });
  outcome.catch(() => undefined);
  try {
    while (!finished) {
      await ctx.yieldNow();
      if (ctx.task.cancelled) throw new CancelledError();
      await Promise.race([outcome.then(() => undefined, () => undefined), new Promise<void>((r) => setTimeout(r, 50))]);
    }
  } catch (err) {
    job.cancel();
    await outcome.catch(() => undefined);
    throw err;
  }
  return outcome;
}

/** Pack ±1 spins into bits, base64 (8 spins per byte). */
export function encodeSpins(spins: Int8Array): string {
  const bytes = new Uint8Array(Math.ceil(spins.length / 8));
  for (let i = 0; i < spins.length; i++) if (spins[i] > 0) bytes[i >> 3] |= 1 << (i & 7);
  return Buffer.from(bytes).toString('base64');
}

/** Inverse of `encodeSpins` for N spins. */
export function decodeSpins(text: string, N: number): Int8Array {
  const bytes = Buffer.from(text, 'base64');
  const s = new Int8Array(N);
  for (let i = 0; i < N; i++) s[i] = (bytes[i >> 3] >> (i & 7)) & 1 ? 1 : -1;
  return s;
}
