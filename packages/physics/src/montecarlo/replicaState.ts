/**
 * One Monte Carlo replica: Ising variables, the local fields kept up to date, the running energy and the scratch
 * space of the loop move (allocated once, so the update loops allocate nothing).
 */
import type { SpinIceCouplings } from './spinIceCouplings';
import type { Random } from '../random';
import type { RowUpdateKernel } from './rowUpdateKernel';

/** State of one replica. fields[i] = Σ_j J_ij σ_j − b_i (K), so flipping i costs ΔE = −2 σ_i fields[i]. */
export interface ReplicaState {
  spins: Int8Array;
  fieldsK: Float64Array;
  energyK: number;
  random: Random;
  /** Loop-move scratch: tetrahedron visit stamps, their positions on the path, and the path itself. */
  visitStamp: Int32Array;
  visitPosition: Int32Array;
  stamp: number;
  pathSpins: Int32Array;
  /** Per-site stamps marking the current loop. */
  siteStamp: Int32Array;
  /** WebAssembly row update over the dense matrix, when the fields live in its memory (index `kernelIndex`). */
  kernel: RowUpdateKernel | null;
  kernelIndex: number;
}

/**
 * A replica with random initial spins drawn from `random` (which it keeps for its own moves). With a
 * `kernel` (whose matrix must be `c.dense`), the fields live in the kernel's memory at `kernelIndex`.
 * @example const r = createReplica(couplings, createRandom(1).fork())
 * See also: metropolisSweep, loopMove
 */
export function createReplica(
  c: SpinIceCouplings,
  random: Random,
  initialSpins?: Int8Array,
  kernel: RowUpdateKernel | null = null,
  kernelIndex = 0,
): ReplicaState {
  const N = c.numberOfSites;
  const spins = new Int8Array(N);
  for (let i = 0; i < N; i++) spins[i] = initialSpins ? initialSpins[i] : random.next() < 0.5 ? -1 : 1;
  const nT = c.cell.numberOfTetrahedra;
  const r: ReplicaState = {
    spins,
    fieldsK: kernel ? kernel.fields(kernelIndex) : new Float64Array(N),
    energyK: 0,
    random,
    visitStamp: new Int32Array(nT),
    visitPosition: new Int32Array(nT),
    stamp: 0,
    pathSpins: new Int32Array(nT + 1),
    siteStamp: new Int32Array(N),
    kernel,
    kernelIndex,
  };
  refreshReplica(c, r);
  return r;
}

/** Recompute the local fields and the energy from scratch (removes rounding drift of the running sums). */
export function refreshReplica(c: SpinIceCouplings, r: ReplicaState): void {
  const N = c.numberOfSites;
  const s = r.spins;
  const F = r.fieldsK;
  if (c.dense) {
    const J = c.dense;
    for (let i = 0; i < N; i++) {
      let h = 0;
      const row = i * N;
      for (let j = 0; j < N; j++) h += J[row + j] * s[j];
      F[i] = h - c.zeemanK[i];
    }
  } else {
    for (let i = 0; i < N; i++) {
      let h = 0;
      for (let p = c.offsets[i]; p < c.offsets[i + 1]; p++) h += c.values[p] * s[c.neighbours[p]];
      F[i] = h - c.zeemanK[i];
    }
  }
  r.energyK = configurationEnergyK(c, s, F);
}

/** E = ½ Σ σ_i (F_i + b_i) − Σ b_i σ_i + constant (K), from spins and up-to-date fields. */
export function configurationEnergyK(c: SpinIceCouplings, spins: Int8Array, fieldsK: Float64Array): number {
  let e = c.constantK;
  for (let i = 0; i < spins.length; i++) e += 0.5 * spins[i] * fieldsK[i] - 0.5 * c.zeemanK[i] * spins[i];
  return e;
}
