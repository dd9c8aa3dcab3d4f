/**
 * From a 4×4 effective Hamiltonian on two pseudospins-1/2 to the couplings of the nearest-neighbour anisotropic
 * model (pseudospins in the local frames, S = σ/2, phases from exchange/bondGeometry.ts):
 *
 *   H_ij = c + h_i·S_i + h_j·S_j + Σ_ab J_ab S_i^a S_j^b,
 *   J_ab = Tr(H σ_i^a ⊗ σ_j^b),  h_i^a = Tr(H σ_i^a ⊗ 1)/2,  c = Tr(H)/4      (Pauli-basis expansion);
 *
 *   Σ_ab J_ab S_i^a S_j^b = J_zz S^z_i S^z_j − J_±(S⁺_i S⁻_j + S⁻_i S⁺_j) + J_±±(γ_ij S⁺_i S⁺_j + γ*_ij S⁻_i S⁻_j)
 *                         + J_z±[S^z_i(ζ_ij S⁺_j + ζ*_ij S⁻_j) + (ζ_ji S⁺_i + ζ*_ji S⁻_i) S^z_j]
 *   (the form of Phys. Rev. X 1, 021002 (2011), eq. 2; from memory).
 * The four couplings are the orthogonal projection of J_ab onto the four basis matrices of this form (they are
 * mutually orthogonal); `residualMeV` is the Frobenius norm of what the form does not capture (zero for a bond
 * with the pyrochlore nearest-neighbour symmetry).
 */
import type { ComplexMatrix } from '../linalg/complexMatrix';
import type { BondPhases } from './bondGeometry';
import { frobenius3, zeros3, type Matrix3 } from './matrix3';

/** The effective pseudospin couplings of one bond, meV. */
export interface PseudospinCouplings {
  Jzz: number;
  Jpm: number;
  Jpmpm: number;
  Jzpm: number;
  /** J_ab of Σ J_ab S_i^a S_j^b in the local frames (rows: ion i's x, y, z; columns: ion j's), meV. */
  matrixLocalMeV: number[][];
  /** ‖J_ab − form(J_zz, J_±, J_±±, J_z±)‖_F, meV. */
  residualMeV: number;
  /** Single-site (field-like) terms h_i, h_j generated on the bond, meV (zero for Kramers doublets). */
  fieldIMeV: number[];
  fieldJMeV: number[];
  /** Constant energy shift c, meV. */
  constantMeV: number;
}

/** Ratios to J_zz (null when J_zz is zero). */
export interface CouplingRatios {
  JpmOverJzz: number | null;
  JpmpmOverJzz: number | null;
  JzpmOverJzz: number | null;
}

const SIGMA: Array<[number[], number[]]> = [
  // [re, im] of σ^x, σ^y, σ^z (row-major 2×2) in the (↑, ↓) basis
  [[0, 1, 1, 0], [0, 0, 0, 0]],
  [[0, 0, 0, 0], [0, -1, 1, 0]],
  [[1, 0, 0, -1], [0, 0, 0, 0]],
];
const IDENTITY: [number[], number[]] = [[1, 0, 0, 1], [0, 0, 0, 0]];

/** Re Tr(H (A ⊗ B)) for a 4×4 H in the basis index 2p + q. */
function traceWith(h: ComplexMatrix, a: [number[], number[]], b: [number[], number[]]): number {
  let s = 0;
  for (let p = 0; p < 2; p++)
    for (let q = 0; q < 2; q++)
      for (let p2 = 0; p2 < 2; p2++)
        for (let q2 = 0; q2 < 2; q2++) {
          // (A⊗B)[(p2 q2)][(p q)] = A[p2][p] B[q2][q]
          const ar = a[0][p2 * 2 + p], ai = a[1][p2 * 2 + p], br = b[0][q2 * 2 + q], bi = b[1][q2 * 2 + q];
          const abr = ar * br - ai * bi, abi = ar * bi + ai * br;
          const x = (p * 2 + q) * 4 + (p2 * 2 + q2);
          s += h.re[x] * abr - h.im[x] * abi;
        }
  return s;
}

/** The four basis matrices of the anisotropic form for given bond phases (see module comment). */
export function couplingBasis(phases: BondPhases): { Jzz: Matrix3; Jpm: Matrix3; Jpmpm: Matrix3; Jzpm: Matrix3 } {
  const zz = zeros3();
  zz[2][2] = 1;
  const pm = zeros3();
  pm[0][0] = -2;
  pm[1][1] = -2;
  const [gr, gi] = phases.gamma;
  const pmpm = zeros3();
  pmpm[0][0] = 2 * gr;
  pmpm[1][1] = -2 * gr;
  pmpm[0][1] = -2 * gi;
  pmpm[1][0] = -2 * gi;
  const zpm = zeros3();
  zpm[2][0] = 2 * phases.zetaIJ[0];
  zpm[2][1] = -2 * phases.zetaIJ[1];
  zpm[0][2] = 2 * phases.zetaJI[0];
  zpm[1][2] = -2 * phases.zetaJI[1];
  return { Jzz: zz, Jpm: pm, Jpmpm: pmpm, Jzpm: zpm };
}

/**
 * The 3×3 pseudospin matrix J_ab = Σ of the model form for given couplings (meV) and phases.
 * @example matrixFromCouplings({ Jzz: 1, Jpm: 0, Jpmpm: 0, Jzpm: 0 }, phases) // only [2][2] = 1
 * See also: couplingsFromHamiltonian
 */
export function matrixFromCouplings(c: { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number }, phases: BondPhases): Matrix3 {
  const basis = couplingBasis(phases);
  const out = zeros3();
  for (const key of ['Jzz', 'Jpm', 'Jpmpm', 'Jzpm'] as const)
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) out[a][b] += c[key] * basis[key][a][b];
  return out;
}

/**
 * Expand a 4×4 two-pseudospin Hamiltonian (basis |↑↑⟩, |↑↓⟩, |↓↑⟩, |↓↓⟩; meV) in Pauli products and project the
 * bilinear part on the anisotropic nearest-neighbour form. For a non-Kramers doublet J_z± is forbidden by time
 * reversal and reported as 0 (any such part stays in residualMeV).
 * @example couplingsFromHamiltonian(h4, bondPhases(pyrochloreBond(10.1)), true).Jzz
 * See also: effectiveExchange, couplingBasis
 */
export function couplingsFromHamiltonian(h: ComplexMatrix, phases: BondPhases, kramers: boolean): PseudospinCouplings {
  const j = zeros3();
  for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) j[a][b] = traceWith(h, SIGMA[a], SIGMA[b]);
  const basis = couplingBasis(phases);
  const keys = kramers ? (['Jzz', 'Jpm', 'Jpmpm', 'Jzpm'] as const) : (['Jzz', 'Jpm', 'Jpmpm'] as const);
  const values: Record<string, number> = { Jzz: 0, Jpm: 0, Jpmpm: 0, Jzpm: 0 };
  for (const key of keys) {
    let num = 0, den = 0;
    for (let a = 0; a < 3; a++)
      for (let b = 0; b < 3; b++) {
        num += j[a][b] * basis[key][a][b];
        den += basis[key][a][b] ** 2;
      }
    values[key] = num / den;
  }
  const model = matrixFromCouplings(values as { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number }, phases);
  const diff = j.map((row, a) => row.map((x, b) => x - model[a][b]));
  return {
    Jzz: values.Jzz,
    Jpm: values.Jpm,
    Jpmpm: values.Jpmpm,
    Jzpm: values.Jzpm,
    matrixLocalMeV: j,
    residualMeV: frobenius3(diff),
    fieldIMeV: [0, 1, 2].map((a) => traceWith(h, SIGMA[a], IDENTITY) / 2),
    fieldJMeV: [0, 1, 2].map((a) => traceWith(h, IDENTITY, SIGMA[a]) / 2),
    constantMeV: traceWith(h, IDENTITY, IDENTITY) / 4,
  };
}

/**
 * J_±/J_zz, J_±±/J_zz, J_z±/J_zz (null when J_zz = 0).
 * See also: interpretRatios
 */
export function couplingRatios(c: { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number }): CouplingRatios {
  const r = (x: number): number | null => (c.Jzz === 0 ? null : x / c.Jzz);
  return { JpmOverJzz: r(c.Jpm), JpmpmOverJzz: r(c.Jpmpm), JzpmOverJzz: r(c.Jzpm) };
}

/**
 * One sentence on what the ratios mean. Thresholds (our own, stated here): largest |ratio| < 0.01: Ising limit;
 * < 0.2: perturbative transverse terms (for J_zz > 0 a quantum spin ice regime, where the ring exchange
 * 12 J_±³/J_zz² sets the emergent-photon scale: PRB 69, 064404 (2004); from memory);
 * otherwise sizeable transverse terms (not an Ising model).
 * @example interpretRatios({ Jzz: 0.1, Jpm: 0.0001, Jpmpm: 0, Jzpm: 0 }) // "Ising limit: …"
 */
export function interpretRatios(c: { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number }): string {
  if (c.Jzz === 0) return 'J_zz vanishes: the transverse couplings dominate; not an Ising-like model.';
  const largest = Math.max(Math.abs(c.Jpm), Math.abs(c.Jpmpm), Math.abs(c.Jzpm)) / Math.abs(c.Jzz);
  const ice = c.Jzz > 0 ? 'spin ice (J_zz > 0: two-in-two-out favoured)' : 'all-in-all-out order (J_zz < 0)';
  if (largest < 0.01)
    return `Ising limit: transverse terms below 1% of J_zz (largest ratio ${largest.toPrecision(2)}); classical ${ice}.`;
  if (largest < 0.2)
    return `Perturbative transverse terms (largest ratio ${largest.toPrecision(2)} of J_zz): ${c.Jzz > 0 ? `quantum spin ice regime, ring exchange ≈ 12 J_±³/J_zz² = ${((12 * Math.abs(c.Jpm) ** 3) / c.Jzz ** 2).toPrecision(2)} meV` : 'quantum corrections to all-in-all-out order'}.`;
  return `Sizeable transverse terms (largest ratio ${largest.toPrecision(2)} of J_zz): not an Ising model; the full anisotropic model is needed.`;
}
