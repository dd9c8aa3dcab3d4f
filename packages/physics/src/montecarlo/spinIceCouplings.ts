/**
 * The Ising spin-ice Hamiltonian on a periodic pyrochlore supercell, as a pair matrix and a Zeeman field.
 *
 * Moments m_i = μ σ_i ẑ_i (σ_i = ±1, ẑ_i the local ⟨111⟩ axis of `lattice/pyrochlore.ts`). Energy in K:
 *   H = Σ_{pairs} J_s ẑ_i·ẑ_j σ_i σ_j  (shells s = J1, J2, J3a, J3b; J > 0 antiferromagnetic in the vector sense,
 *       the convention H = Σ J S_i·S_j with unit Ising vectors S_i = σ_i ẑ_i)
 *     + dipolar Ewald energy ½ Σ_ij D_ij σ_i σ_j (conducting boundary, `lattice/pyrochloreDipolarMatrix.ts`)
 *     − Σ_i μ μB B·ẑ_i σ_i / k_B.
 * In the nearest-neighbour language of the dipolar spin-ice model (PRL 84, 3430 (2000)): J_nn = −J1/3 (ẑ_i·ẑ_j = −1/3)
 * and D_nn = 5D/3; spin ice needs J_eff = J_nn + D_nn > 0.
 * Stored as E = ½ Σ_{i≠j} J_ij σ_i σ_j − Σ b_i σ_i + constantK, J_ij symmetric with zero diagonal.
 */
import { pyrochloreSupercell, type PyrochloreSupercell } from '../lattice/supercell';
import { supercellNeighbourLists, type NeighbourList } from '../lattice/supercellNeighbourLists';
import { pyrochloreDipolarMatrix } from '../lattice/pyrochloreDipolarMatrix';
import type { ShellName } from '../lattice/neighbourShells';
import { BOHR_MAGNETON_J_PER_T, BOLTZMANN_J_PER_K } from '../units';
import { InputError } from '../errors';

/** μB/k_B in K per T (≈ 0.6717), from the CODATA constants of `units`. */
export const BOHR_MAGNETON_K_PER_T = BOHR_MAGNETON_J_PER_T / BOLTZMANN_J_PER_K;

/** A spin-ice model. */
export interface SpinIceModel {
  /** Cubic cells along each axis (N = 16 L³ spins). */
  L: number;
  /** Cubic lattice constant a in Å. */
  latticeConstantAngstrom: number;
  /** Ising moment μ in μB (Dy³⁺, Ho³⁺ in the titanates: ≈ 10 μB). */
  momentMuB: number;
  /** Exchange constants in K, H = Σ J S_i·S_j (positive: antiferromagnetic). Missing shells are zero. */
  exchangeK?: Partial<Record<ShellName, number>>;
  /** Include the Ewald dipolar interaction (conducting boundary). */
  dipolar: boolean;
  /** Applied field vector in T (cubic axes). Default zero. */
  fieldTesla?: readonly [number, number, number];
  /** Unit vector along which the magnetization is reported (default: the field direction, else [0,0,1]). */
  magnetizationDirection?: readonly [number, number, number];
}

/** The assembled couplings. `dense` is used when the dipolar sum is on, the compressed rows otherwise. */
export interface SpinIceCouplings {
  model: SpinIceModel;
  cell: PyrochloreSupercell;
  numberOfSites: number;
  /** J_ij in K (N×N, zero diagonal) or null. */
  dense: Float64Array | null;
  /** Compressed rows of J_ij (K) for the short-range case; empty when dense. */
  offsets: Int32Array;
  neighbours: Int32Array;
  values: Float64Array;
  /** b_i = μ μB B·ẑ_i / k_B in K. */
  zeemanK: Float64Array;
  /** ẑ_i · n̂ for the magnetization direction n̂. */
  projection: Float64Array;
  /** Constant part of the energy in K (dipolar self-image terms). */
  constantK: number;
  /** Dipolar D = (μ0/4π) μ²/r_nn³ in K (0 when off). */
  dipolarDK: number;
  /** Per-shell neighbour lists and the sign ẑ_i·ẑ_j, to split the energy into shell sums (for reweighting). */
  shellLists: Record<ShellName, NeighbourList>;
}

const SHELLS: ShellName[] = ['J1', 'J2', 'J3a', 'J3b'];

/**
 * Assemble the couplings of a spin-ice model.
 * @example spinIceCouplings({ L: 2, latticeConstantAngstrom: 10.1, momentMuB: 10, exchangeK: { J1: 3.72 }, dipolar: true })
 * See also: runSpinIceMonteCarlo, pyrochloreDipolarMatrix
 */
export function spinIceCouplings(model: SpinIceModel): SpinIceCouplings {
  if (!(model.momentMuB > 0) || !Number.isFinite(model.momentMuB)) throw new InputError('momentMuB', model.momentMuB, 'a positive moment in μB');
  if (model.dipolar && model.L > 6) throw new InputError('L', model.L, 'at most 6 with the dipolar interaction (dense N×N pair matrix)');
  const cell = pyrochloreSupercell(model.L, model.latticeConstantAngstrom);
  const N = cell.numberOfSites;
  const ex = model.exchangeK ?? {};
  for (const s of SHELLS) {
    const v = ex[s];
    if (v !== undefined && !Number.isFinite(v)) throw new InputError(`exchangeK.${s}`, v, 'a finite coupling in K');
  }
  const lists = supercellNeighbourLists(cell);
  const axes = cell.localAxes;
  const zz = (i: number, j: number) => axes[3 * i] * axes[3 * j] + axes[3 * i + 1] * axes[3 * j + 1] + axes[3 * i + 2] * axes[3 * j + 2];
  let dense: Float64Array | null = null;
  let constantK = 0;
  let dipolarDK = 0;
  let offsets = new Int32Array(N + 1);
  let neighbours = new Int32Array(0);
  let values = new Float64Array(0);
  if (model.dipolar) {
    const d = pyrochloreDipolarMatrix(cell, model.momentMuB);
    dense = d.matrixK;
    dipolarDK = d.couplingDK;
    for (let i = 0; i < N; i++) constantK += 0.5 * d.diagonalK[i];
    for (const s of SHELLS) {
      const J = ex[s] ?? 0;
      if (J === 0) continue;
      const nl = lists[s];
      for (let i = 0; i < N; i++) for (let p = nl.offsets[i]; p < nl.offsets[i + 1]; p++) dense[i * N + nl.neighbours[p]] += J * zz(i, nl.neighbours[p]);
    }
  } else {
    const rows: Map<number, number>[] = Array.from({ length: N }, () => new Map());
    for (const s of SHELLS) {
      const J = ex[s] ?? 0;
      if (J === 0) continue;
      const nl = lists[s];
      for (let i = 0; i < N; i++)
        for (let p = nl.offsets[i]; p < nl.offsets[i + 1]; p++) {
          const j = nl.neighbours[p];
          rows[i].set(j, (rows[i].get(j) ?? 0) + J * zz(i, j));
        }
    }
    const nb: number[] = [];
    const val: number[] = [];
    for (let i = 0; i < N; i++) {
      for (const [j, v] of rows[i]) {
        if (j === i) {
          constantK += 0.5 * v;
          continue;
        }
        nb.push(j);
        val.push(v);
      }
      offsets[i + 1] = nb.length;
    }
    neighbours = Int32Array.from(nb);
    values = Float64Array.from(val);
  }
  const B = model.fieldTesla ?? [0, 0, 0];
  if (B.length !== 3 || !B.every(Number.isFinite)) throw new InputError('fieldTesla', B, 'a field vector [Bx, By, Bz] in T');
  const Bnorm = Math.hypot(B[0], B[1], B[2]);
  let n = model.magnetizationDirection ?? (Bnorm > 0 ? [B[0] / Bnorm, B[1] / Bnorm, B[2] / Bnorm] : [0, 0, 1]);
  const nn = Math.hypot(n[0], n[1], n[2]);
  if (!(nn > 0) || !Number.isFinite(nn)) throw new InputError('magnetizationDirection', n, 'a non-zero vector');
  n = [n[0] / nn, n[1] / nn, n[2] / nn];
  const zeemanK = new Float64Array(N);
  const projection = new Float64Array(N);
  for (let i = 0; i < N; i++) {
    const bz = B[0] * axes[3 * i] + B[1] * axes[3 * i + 1] + B[2] * axes[3 * i + 2];
    zeemanK[i] = model.momentMuB * BOHR_MAGNETON_K_PER_T * bz;
    projection[i] = n[0] * axes[3 * i] + n[1] * axes[3 * i + 1] + n[2] * axes[3 * i + 2];
  }
  return { model, cell, numberOfSites: N, dense, offsets, neighbours, values, zeemanK, projection, constantK, dipolarDK, shellLists: lists };
}
