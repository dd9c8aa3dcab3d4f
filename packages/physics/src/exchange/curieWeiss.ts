/**
 * Mean-field (first-order high-temperature) relation between the nearest-neighbour pseudospin couplings and the
 * Curie–Weiss temperature of the powder susceptibility of the ground doublets, on the pyrochlore lattice:
 *
 *   θ_CW = −(1 / 4k_B) Σ_{j ∈ nn(i)} Tr(G_i J_ij G_jᵀ) / Tr(G_i G_iᵀ),
 *
 * where G_i = R_iᵀ g (3×3: pseudospin → moment in μB, global frame), J_ij the 3×3 pseudospin coupling of bond ij
 * (H = Σ S_iᵀ J_ij S_j, S = σ/2) and the sum runs over the six nearest neighbours. Derivation: expand
 * χ = β⟨M²⟩ − β²⟨M² H⟩ + … with ⟨S^a S^b⟩ = δ_ab/4 and compare with C/(T − θ) ≈ (C/T)(1 + θ/T) (standard
 * high-temperature expansion, e.g. Blundell, "Magnetism in Condensed Matter" (2001), §5.1, for the isotropic
 * case θ = −zJS(S+1)/3k_B, which the formula reduces to for G ∝ 1). For an Ising doublet (only g_zz) it gives
 * θ_CW = J_zz / (2k_B). It holds for T well below the first excited CEF level (only the doublet populated) and
 * well above |θ|; couplings beyond nearest neighbours (and the long-range dipolar sum) are not included.
 */
import { InputError } from '../errors';
import { KELVIN_IN_MEV } from '../units';
import { pyrochloreBond, bondPhases } from './bondGeometry';
import { frameRows } from './matrix3';
import { matrixFromCouplings } from './pseudospinCouplings';
import type { PseudospinSite } from './pseudospinSite';
import { effectiveExchange } from './effectiveExchange';
import { microscopicCouplingMatrix, type MicroscopicCouplingSpec } from './microscopicCoupling';

type Couplings = { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number };

/**
 * θ_CW in K of the nearest-neighbour pyrochlore pseudospin model (formula in the module comment).
 * @example curieWeissThetaK({ Jzz: 0.1, Jpm: 0, Jpmpm: 0, Jzpm: 0 }, isingG) // 0.1/(2 k_B) ≈ 0.58 K
 * See also: exchangeScaleFromCurieWeiss
 */
export function curieWeissThetaK(couplings: Couplings, gLocal: number[][]): number {
  let total = 0;
  let norm = 0;
  const lattice = 10; // any lattice constant: phases and frames do not depend on it
  for (let i = 0; i < 4; i++) {
    const gi = globalG(gLocal, frameRows(pyrochloreBond(lattice, i, (i + 1) % 4).frameI));
    norm += traceProduct(gi, transpose(gi));
    for (let j = 0; j < 4; j++) {
      if (j === i) continue;
      const bond = pyrochloreBond(lattice, i, j);
      const jLocal = matrixFromCouplings(couplings, bondPhases(bond));
      const gj = globalG(gLocal, frameRows(bond.frameJ));
      // two nearest neighbours on each other sublattice, with the same bond phases
      total += 2 * traceProduct(multiply3(multiply3(gi, jLocal), transpose(gj)), identity3());
    }
  }
  if (norm === 0) throw new InputError('gLocal', gLocal, 'a doublet with a non-zero g-tensor');
  return -total / (4 * norm) / KELVIN_IN_MEV;
}

/**
 * The isotropic exchange J_ex (meV) that, together with the fixed parts of `spec` (matrix, dipolar), gives the
 * measured θ_CW through the first-order couplings (θ is linear in J_ex at first order).
 * @example exchangeScaleFromCurieWeiss(0.5, site, 10.1, { dipolar: true }) // J_ex in meV
 * @throws InputError when θ does not depend on J_ex (e.g. a doublet with no moment).
 * See also: curieWeissThetaK
 */
export function exchangeScaleFromCurieWeiss(
  thetaK: number,
  site: PseudospinSite,
  latticeConstantAngstrom: number,
  fixed: Omit<MicroscopicCouplingSpec, 'isotropicMeV'> = {},
): { isotropicMeV: number; thetaFixedK: number; thetaPerMeVK: number } {
  if (typeof thetaK !== 'number' || !Number.isFinite(thetaK)) throw new InputError('thetaCW', thetaK, 'a finite temperature in K');
  const bond = pyrochloreBond(latticeConstantAngstrom);
  const theta = (spec: MicroscopicCouplingSpec): number => {
    const k = microscopicCouplingMatrix(spec, bond, site.ion.gJ, site.ion.gJ);
    return curieWeissThetaK(effectiveExchange(site, site, bond, k, { order: 1, twoSiteCheck: false }).first, site.gLocal);
  };
  const thetaFixedK = fixed.matrixMeV !== undefined || fixed.dipolar ? theta({ ...fixed }) : 0;
  const thetaPerMeVK = theta({ ...fixed, isotropicMeV: 1 }) - thetaFixedK;
  if (!(Math.abs(thetaPerMeVK) > 1e-12)) throw new InputError('thetaCW', thetaK, 'a doublet whose Curie–Weiss temperature depends on the exchange');
  return { isotropicMeV: (thetaK - thetaFixedK) / thetaPerMeVK, thetaFixedK, thetaPerMeVK };
}

function globalG(gLocal: number[][], rows: number[][]): number[][] {
  // G = Rᵀ g: moment_p = Σ_a R[a][p] (g S)_a
  return [0, 1, 2].map((p) => [0, 1, 2].map((b) => rows[0][p] * gLocal[0][b] + rows[1][p] * gLocal[1][b] + rows[2][p] * gLocal[2][b]));
}

function multiply3(a: number[][], b: number[][]): number[][] {
  return [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[i][0] * b[0][j] + a[i][1] * b[1][j] + a[i][2] * b[2][j]));
}

function transpose(a: number[][]): number[][] {
  return [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[j][i]));
}

function identity3(): number[][] {
  return [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
}

/** Tr(A B). */
function traceProduct(a: number[][], b: number[][]): number {
  let s = 0;
  for (let i = 0; i < 3; i++) for (let k = 0; k < 3; k++) s += a[i][k] * b[k][i];
  return s;
}
