/**
 * Effective pseudospin-1/2 exchange of one bond from the CEF eigenstates of both ions and a microscopic coupling
 * V = Σ_ab J_i^a K_ab J_j^b, by degenerate perturbation theory on the two-site Hilbert space
 * (dimension (2J_i+1)(2J_j+1)), done generically with matrices, not with hand-derived formulas:
 *
 *   H0 = H_CEF,i ⊗ 1 + 1 ⊗ H_CEF,j (diagonal in the product of CEF eigenstates), P = projector on the four
 *   ground-doublet products (energy E0), Q = 1 − P:
 *   H_eff = P V P  +  P V Q (E0 − H0)⁻¹ Q V P  + O(V³)
 *   (second-order degenerate perturbation theory / Schrieffer–Wolff: Cohen-Tannoudji, Dupont-Roc & Grynberg,
 *   "Atom–Photon Interactions" (1992), ch. I.B; Bravyi, DiVincenzo & Loss, Ann. Phys. 326, 2793 (2011), eq. 3.24).
 * Second-order corrections are Hermitian because E0 is the common energy of the whole P space.
 *
 * The two-site check diagonalises H0 + V exactly and compares its four lowest levels with those of H_eff.
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';
import { hermitianEigen } from '../linalg/hermitianEigen';
import { bondPhases, type BondGeometry, type BondPhases } from './bondGeometry';
import { frameRows, toLocalFrames, type Matrix3 } from './matrix3';
import type { PseudospinSite } from './pseudospinSite';
import { couplingRatios, couplingsFromHamiltonian, interpretRatios, type CouplingRatios, type PseudospinCouplings } from './pseudospinCouplings';

/** Options of effectiveExchange. */
export interface EffectiveExchangeOptions {
  /** 1: first order only; 2 (default): also second order. */
  order?: 1 | 2;
  /** Run the exact two-site diagonalisation check (default true). */
  twoSiteCheck?: boolean;
}

/** Exact two-site diagonalisation against the effective model. */
export interface TwoSiteCheck {
  /** Four lowest exact levels of H0 + V, meV, relative to E0 = the ground doublets' energy. */
  exactLevelsMeV: number[];
  /** Eigenvalues of the effective 4×4 Hamiltonian at the highest computed order, meV. */
  effectiveLevelsMeV: number[];
  /** Largest |exact − effective|, meV. */
  maxDifferenceMeV: number;
  /** Order of the effective model compared. */
  order: 1 | 2;
}

/** The effective exchange of one bond. */
export interface EffectiveExchangeResult {
  /** The bond phases used for J_±± and J_z±. */
  phases: BondPhases;
  /** Microscopic coupling K in the two local frames (rows: ion i's x, y, z), meV. */
  couplingLocalMeV: Matrix3;
  /** Couplings from P V P. */
  first: PseudospinCouplings;
  /** Couplings through second order (first + second-order correction), or null for order 1. */
  second: PseudospinCouplings | null;
  ratios: { first: CouplingRatios; second: CouplingRatios | null };
  /** A sentence on the ratios at the highest computed order. */
  interpretation: string;
  twoSiteCheck: TwoSiteCheck | null;
  /** The 4×4 effective Hamiltonians (|↑↑⟩, |↑↓⟩, |↓↑⟩, |↓↓⟩), meV. */
  hamiltonianFirst: ComplexMatrix;
  hamiltonianSecond: ComplexMatrix | null;
  /** Gaps of the two ions, meV. */
  gapIMeV: number;
  gapJMeV: number;
}

/**
 * Rows of V = Σ_ab K_ab J_i^a ⊗ J_j^b for the given two-site basis states (index p·nj + q), all columns.
 * Returned as [re, im] arrays of size rows.length × (ni·nj).
 */
export function couplingRows(
  siteI: PseudospinSite,
  siteJ: PseudospinSite,
  kLocal: Matrix3,
  rows: readonly number[],
): { re: Float64Array; im: Float64Array } {
  const ni = siteI.dimension, nj = siteJ.dimension, dim = ni * nj;
  const re = new Float64Array(rows.length * dim), im = new Float64Array(rows.length * dim);
  // For each a: B_a = Σ_b K_ab J_j^b (nj×nj), then V[(p q),(r s)] = Σ_a J_i^a[p][r] B_a[q][s].
  const bRe: Float64Array[] = [], bIm: Float64Array[] = [];
  for (let a = 0; a < 3; a++) {
    const r = new Float64Array(nj * nj), i = new Float64Array(nj * nj);
    for (let b = 0; b < 3; b++) {
      const k = kLocal[a][b];
      if (k === 0) continue;
      const m = siteJ.jLocal[b];
      for (let x = 0; x < nj * nj; x++) {
        r[x] += k * m.re[x];
        i[x] += k * m.im[x];
      }
    }
    bRe.push(r);
    bIm.push(i);
  }
  rows.forEach((row, idx) => {
    const p = Math.floor(row / nj), q = row - p * nj;
    const off = idx * dim;
    for (let a = 0; a < 3; a++) {
      const ja = siteI.jLocal[a];
      const br = bRe[a], bi = bIm[a];
      for (let r = 0; r < ni; r++) {
        const xr = ja.re[p * ni + r], xi = ja.im[p * ni + r];
        if (xr === 0 && xi === 0) continue;
        for (let s = 0; s < nj; s++) {
          const yr = br[q * nj + s], yi = bi[q * nj + s];
          re[off + r * nj + s] += xr * yr - xi * yi;
          im[off + r * nj + s] += xr * yi + xi * yr;
        }
      }
    }
  });
  return { re, im };
}

/** The four P-space indices p·nj + q with p, q ∈ {0, 1}, in the order |↑↑⟩, |↑↓⟩, |↓↑⟩, |↓↓⟩. */
export function groundIndices(nj: number): number[] {
  return [0, 1, nj, nj + 1];
}

/**
 * First- and second-order effective Hamiltonians (4×4, meV) of a bond with local coupling matrix K.
 * See effectiveExchange for the method.
 */
export function effectiveHamiltonians(
  siteI: PseudospinSite,
  siteJ: PseudospinSite,
  kLocal: Matrix3,
  order: 1 | 2,
): { first: ComplexMatrix; second: ComplexMatrix | null } {
  const nj = siteJ.dimension, dim = siteI.dimension * nj;
  const pIdx = groundIndices(nj);
  const v = couplingRows(siteI, siteJ, kLocal, pIdx);
  const first = zeros(4);
  for (let x = 0; x < 4; x++)
    for (let y = 0; y < 4; y++) {
      first.re[x * 4 + y] = v.re[x * dim + pIdx[y]];
      first.im[x * 4 + y] = v.im[x * dim + pIdx[y]];
    }
  symmetrize(first);
  if (order === 1) return { first, second: null };
  const second = zeros(4);
  const inP = new Uint8Array(dim);
  for (const k of pIdx) inP[k] = 1;
  for (let c = 0; c < dim; c++) {
    if (inP[c]) continue;
    const r = Math.floor(c / nj), s = c - r * nj;
    const denominator = -(siteI.energiesMeV[r] + siteJ.energiesMeV[s]); // E0 − E_c, E0 = 0
    for (let x = 0; x < 4; x++) {
      const axr = v.re[x * dim + c], axi = v.im[x * dim + c];
      if (axr === 0 && axi === 0) continue;
      for (let y = 0; y < 4; y++) {
        // V_xc V_cy = V_xc conj(V_yc)
        const byr = v.re[y * dim + c], byi = -v.im[y * dim + c];
        second.re[x * 4 + y] += (axr * byr - axi * byi) / denominator;
        second.im[x * 4 + y] += (axr * byi + axi * byr) / denominator;
      }
    }
  }
  for (let k = 0; k < 16; k++) {
    second.re[k] += first.re[k];
    second.im[k] += first.im[k];
  }
  symmetrize(second);
  return { first, second };
}

function symmetrize(h: ComplexMatrix): void {
  const n = h.n;
  for (let i = 0; i < n; i++) {
    h.im[i * n + i] = 0;
    for (let j = 0; j < i; j++) {
      const r = 0.5 * (h.re[i * n + j] + h.re[j * n + i]);
      const m = 0.5 * (h.im[i * n + j] - h.im[j * n + i]);
      h.re[i * n + j] = r;
      h.im[i * n + j] = m;
      h.re[j * n + i] = r;
      h.im[j * n + i] = -m;
    }
  }
}

/**
 * The four lowest eigenvalues (meV, relative to the ground doublets) of the full two-site H0 + V.
 * @example exactTwoSiteLevels(site, site, kLocal) // 4 numbers, compare with the effective model
 * See also: effectiveExchange
 */
export function exactTwoSiteLevels(siteI: PseudospinSite, siteJ: PseudospinSite, kLocal: Matrix3): number[] {
  const nj = siteJ.dimension, dim = siteI.dimension * nj;
  const all = Array.from({ length: dim }, (_, k) => k);
  const v = couplingRows(siteI, siteJ, kLocal, all);
  const h: ComplexMatrix = { n: dim, re: v.re, im: v.im };
  for (let c = 0; c < dim; c++) {
    const r = Math.floor(c / nj), s = c - r * nj;
    h.re[c * dim + c] += siteI.energiesMeV[r] + siteJ.energiesMeV[s];
  }
  const { values } = hermitianEigen(h, { vectors: false, field: 'two-site Hamiltonian', hermitianTolerance: 1e-8 });
  return Array.from(values.slice(0, 4));
}

/**
 * Effective pseudospin-1/2 exchange of a bond to first and second order in the microscopic coupling.
 *
 * Units: K in meV (global Cartesian frame, H = J_iᵀ K J_j), energies in meV. The CEF of each site is in its
 * local frame (geometry.frameI / frameJ); pseudospin conventions: exchange/pseudospinSite.ts; bond phases:
 * exchange/bondGeometry.ts; coupling form: exchange/pseudospinCouplings.ts.
 * @example
 *   const site = pseudospinSiteFromParameters(getIon('Yb3+'), B);
 *   const bond = pyrochloreBond(10.03);
 *   const k = microscopicCouplingMatrix({ isotropicMeV: 0.01, dipolar: true }, bond, site.ion.gJ, site.ion.gJ);
 *   effectiveExchange(site, site, bond, k).second.Jpm
 * @throws InputError when the coupling is not small compared with the gaps (‖K‖·J_i·J_j ≥ gap/2).
 * See also: microscopicCouplingMatrix, exactTwoSiteLevels, furtherNeighbourExchange
 */
export function effectiveExchange(
  siteI: PseudospinSite,
  siteJ: PseudospinSite,
  geometry: BondGeometry,
  couplingGlobalMeV: Matrix3,
  options: EffectiveExchangeOptions = {},
): EffectiveExchangeResult {
  const order = options.order ?? 2;
  if (order !== 1 && order !== 2) throw new InputError('order', order, '1 or 2');
  const kLocal = toLocalFrames(couplingGlobalMeV, frameRows(geometry.frameI), frameRows(geometry.frameJ));
  let kNorm = 0;
  for (const row of kLocal) for (const x of row) kNorm = Math.max(kNorm, Math.abs(x));
  const scale = 3 * kNorm * siteI.J * siteJ.J;
  const gap = Math.min(siteI.gapMeV, siteJ.gapMeV);
  if (order === 2 && !(scale < 0.5 * gap))
    throw new InputError(
      'coupling',
      `${scale.toPrecision(3)} meV (3·max|K|·J_i·J_j)`,
      `a coupling well below the CEF gap (${gap.toPrecision(3)} meV) for perturbation theory; reduce it or use order 1`,
    );
  const phases = bondPhases(geometry);
  const h = effectiveHamiltonians(siteI, siteJ, kLocal, order);
  const kramers = siteI.kramers && siteJ.kramers;
  const first = couplingsFromHamiltonian(h.first, phases, kramers);
  const second = h.second ? couplingsFromHamiltonian(h.second, phases, kramers) : null;
  let check: TwoSiteCheck | null = null;
  if (options.twoSiteCheck !== false) {
    const exact = exactTwoSiteLevels(siteI, siteJ, kLocal);
    const eff = Array.from(hermitianEigen(h.second ?? h.first, { vectors: false }).values);
    check = {
      exactLevelsMeV: exact,
      effectiveLevelsMeV: eff,
      maxDifferenceMeV: Math.max(...exact.map((e, k) => Math.abs(e - eff[k]))),
      order,
    };
  }
  const top = second ?? first;
  return {
    phases,
    couplingLocalMeV: kLocal,
    first,
    second,
    ratios: { first: couplingRatios(first), second: second ? couplingRatios(second) : null },
    interpretation: interpretRatios(top),
    twoSiteCheck: check,
    hamiltonianFirst: h.first,
    hamiltonianSecond: h.second,
    gapIMeV: siteI.gapMeV,
    gapJMeV: siteJ.gapMeV,
  };
}
