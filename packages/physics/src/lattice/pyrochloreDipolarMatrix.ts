/**
 * The Ewald-summed dipolar pair matrix of Ising moments on a periodic pyrochlore supercell.
 *
 * For Ising moments m_i = μ σ_i ẑ_i the dipolar energy is E = ½ Σ_ij D_ij σ_i σ_j (K) with
 * D_ij = (μ0/4π) μ² ẑ_i · W(r_j − r_i) · ẑ_j and W the conducting-boundary Ewald tensor (`ewaldDipolarKernel`).
 * The diagonal D_ii (the interaction of a moment with its own periodic images and the Ewald self term) only adds
 * a constant; it is returned but not needed for spin flips. In the nearest-neighbour language of dipolar spin ice,
 * D = (μ0/4π) μ² / r_nn³ and the nearest-neighbour dipolar coupling is D_nn = 5D/3 (Phys. Rev. Lett.
 * 84, 3430 (2000)).
 */
import type { PyrochloreSupercell } from './supercell';
import { ewaldDipolarKernel, type EwaldOptions } from './ewaldDipolarKernel';
import { BOHR_MAGNETON_J_PER_T, BOLTZMANN_J_PER_K, MU0_T_M_PER_A } from '../units';
import { InputError } from '../errors';

/** (μ0/4π) μB² / (1 Å³) / k_B: the dipolar energy scale in K Å³ per μB² (≈ 0.6234). Derived from CODATA constants. */
export const DIPOLAR_K_A3_PER_MUB2 = ((MU0_T_M_PER_A / (4 * Math.PI)) * BOHR_MAGNETON_J_PER_T ** 2) / 1e-30 / BOLTZMANN_J_PER_K;

/** The dense dipolar matrix and its constant part. */
export interface DipolarMatrix {
  /** D_ij in K, N×N row-major, symmetric, with the diagonal set to zero. */
  matrixK: Float64Array;
  /** D_ii in K (the same for every site by symmetry). */
  diagonalK: Float64Array;
  /** D = (μ0/4π) μ²/r_nn³ in K. */
  couplingDK: number;
}

/**
 * Build D_ij (K) for a supercell and a moment in μB. Uses the translation symmetry of the supercell: the Ewald
 * tensor is evaluated for 4 reference sites only (4N tensors instead of N²).
 * @example pyrochloreDipolarMatrix(pyrochloreSupercell(2, 10.124), 10).couplingDK // ≈ 1.36 K
 * See also: ewaldDipolarKernel, dipolarCouplingK
 */
export function pyrochloreDipolarMatrix(cell: PyrochloreSupercell, momentMuB: number, ewald: EwaldOptions = {}): DipolarMatrix {
  if (!(momentMuB > 0) || !Number.isFinite(momentMuB)) throw new InputError('momentMuB', momentMuB, 'a positive moment in μB');
  const N = cell.numberOfSites;
  const G = 4 * cell.L;
  const q = cell.quarterCellCoordinates;
  const axes = cell.localAxes;
  const kernel = ewaldDipolarKernel(cell.L * cell.latticeConstantAngstrom, ewald);
  const scale = DIPOLAR_K_A3_PER_MUB2 * momentMuB * momentMuB;
  const step = cell.latticeConstantAngstrom / 4;
  // rows[μ][j] = D between reference site μ (cell 0, fcc 0) and site j.
  const rows: Float64Array[] = [];
  const W = new Float64Array(6);
  for (let mu = 0; mu < 4; mu++) {
    const row = new Float64Array(N);
    const zi = [axes[3 * mu], axes[3 * mu + 1], axes[3 * mu + 2]];
    for (let j = 0; j < N; j++) {
      kernel.tensor((q[3 * j] - q[3 * mu]) * step, (q[3 * j + 1] - q[3 * mu + 1]) * step, (q[3 * j + 2] - q[3 * mu + 2]) * step, W);
      const zx = axes[3 * j], zy = axes[3 * j + 1], zz = axes[3 * j + 2];
      const wx = W[0] * zx + W[3] * zy + W[4] * zz;
      const wy = W[3] * zx + W[1] * zy + W[5] * zz;
      const wz = W[4] * zx + W[5] * zy + W[2] * zz;
      row[j] = scale * (zi[0] * wx + zi[1] * wy + zi[2] * wz);
    }
    rows.push(row);
  }
  const matrixK = new Float64Array(N * N);
  const diagonalK = new Float64Array(N);
  const wrap = (v: number) => ((v % G) + G) % G;
  for (let i = 0; i < N; i++) {
    const mu = cell.sublattice[i];
    const tx = q[3 * i] - q[3 * mu], ty = q[3 * i + 1] - q[3 * mu + 1], tz = q[3 * i + 2] - q[3 * mu + 2];
    const row = rows[mu];
    for (let j = 0; j < N; j++) {
      const jj = cell.siteAtGrid[(wrap(q[3 * j] - tx) * G + wrap(q[3 * j + 1] - ty)) * G + wrap(q[3 * j + 2] - tz)];
      matrixK[i * N + j] = row[jj];
    }
    diagonalK[i] = matrixK[i * N + i];
    matrixK[i * N + i] = 0;
  }
  return { matrixK, diagonalK, couplingDK: dipolarCouplingK(momentMuB, cell.latticeConstantAngstrom) };
}

/**
 * D = (μ0/4π) μ² / r_nn³ in K, r_nn = a√2/4 (PRL 84, 3430 (2000)). D_nn = 5D/3.
 * @example dipolarCouplingK(10, 10.124) // ≈ 1.36
 */
export function dipolarCouplingK(momentMuB: number, latticeConstantAngstrom: number): number {
  const rnn = (latticeConstantAngstrom * Math.SQRT2) / 4;
  return (DIPOLAR_K_A3_PER_MUB2 * momentMuB * momentMuB) / (rnn * rnn * rnn);
}
