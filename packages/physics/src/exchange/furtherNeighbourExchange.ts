/**
 * Effective further-neighbour pseudospin couplings generated at second order by a virtually excited middle ion:
 * ion i couples to k, k to j (nearest-neighbour bonds); the processes V_ik … V_kj with k in an excited CEF state
 * give an i–j term although i and j are not coupled directly. Computed generically on the three-site cluster
 * (clusterEffectiveHamiltonian) and read off as the two-body part
 *   J^{ij}_ab = Tr(H_eff σ_i^a ⊗ 1_k ⊗ σ_j^b) / 2     (Pauli expansion on three pseudospins, S = σ/2),
 * summed over every common nearest neighbour k of the pair. On the pyrochlore lattice the second neighbours (J2)
 * and the collinear third neighbours (J3b) have one common nearest neighbour; the J3a pair has none (no mediated
 * term); a nearest-neighbour pair has two (the other two ions of its tetrahedron), which adds a mediated
 * correction to J1. Shell names: lattice/neighbourShells.ts.
 */
import { InputError } from '../errors';
import type { Vector3 } from '../lattice/pyrochlore';
import { pyrochloreLocalFrames } from '../lattice/localFrames';
import { pyrochloreNeighbourShells, type ShellName } from '../lattice/neighbourShells';
import type { BondGeometry } from './bondGeometry';
import { frameRows, toLocalFrames, type Matrix3 } from './matrix3';
import { microscopicCouplingMatrix } from './microscopicCoupling';
import { clusterEffectiveHamiltonian } from './multiSite';
import type { PseudospinSite } from './pseudospinSite';
import type { ComplexMatrix } from '../linalg/complexMatrix';

/** The mediated coupling of one further-neighbour pair. */
export interface MediatedCoupling {
  shell: ShellName;
  from: number;
  to: number;
  vectorAngstrom: Vector3;
  distanceAngstrom: number;
  /** Number of common nearest neighbours k summed over. */
  middleIons: number;
  /** Σ_k J^{ij}_ab (local frames of i and j: rows i's x, y, z), meV. Second order in the coupling. */
  matrixLocalMeV: number[][];
  /** The zz element (Ising part along the two local axes), meV. */
  JzzMeV: number;
  /** The first-order direct dipolar coupling of the same pair (local frames), meV, when dipolar is on; else null. */
  directDipolarLocalMeV: number[][] | null;
}

const SIGMA: Array<[number[], number[]]> = [
  [[0, 1, 1, 0], [0, 0, 0, 0]],
  [[0, 0, 0, 0], [0, -1, 1, 0]],
  [[1, 0, 0, -1], [0, 0, 0, 0]],
];

/** Tr(H σ_0^a ⊗ 1 ⊗ σ_2^b) / 2 for an 8×8 H (bits: site 0 most significant). */
function outerPair(h: ComplexMatrix): number[][] {
  const out = [0, 1, 2].map(() => [0, 0, 0]);
  for (let a = 0; a < 3; a++)
    for (let b = 0; b < 3; b++) {
      let s = 0;
      for (let x = 0; x < 8; x++)
        for (let y = 0; y < 8; y++) {
          const [x0, x1, x2] = [(x >> 2) & 1, (x >> 1) & 1, x & 1];
          const [y0, y1, y2] = [(y >> 2) & 1, (y >> 1) & 1, y & 1];
          if (x1 !== y1) continue;
          // (σ^a ⊗ 1 ⊗ σ^b)[y][x] = σ^a[y0][x0] σ^b[y2][x2]
          const ar = SIGMA[a][0][y0 * 2 + x0], ai = SIGMA[a][1][y0 * 2 + x0];
          const br = SIGMA[b][0][y2 * 2 + x2], bi = SIGMA[b][1][y2 * 2 + x2];
          const pr = ar * br - ai * bi, pi = ar * bi + ai * br;
          s += h.re[x * 8 + y] * pr - h.im[x * 8 + y] * pi;
        }
      out[a][b] = s / 2;
    }
  return out;
}

/**
 * Further-neighbour couplings mediated by virtual CEF excitations of a common nearest neighbour, for the pyrochlore
 * shells J1 (mediated correction), J2, J3a (none) and J3b, from sublattice 0 to the first listed partner of each
 * shell. Couplings: isotropic J_ex and/or dipolar on the nearest-neighbour bonds (a general matrix is not
 * transformed between bonds, so it is refused here).
 * @example furtherNeighbourExchange(site, 10.1, { isotropicMeV: 0.01 }).find((c) => c.shell === 'J2')
 * See also: clusterEffectiveHamiltonian, effectiveExchange
 */
export function furtherNeighbourExchange(
  site: PseudospinSite,
  latticeConstantAngstrom: number,
  coupling: { isotropicMeV?: number; dipolar?: boolean; matrixMeV?: unknown },
): MediatedCoupling[] {
  if (coupling.matrixMeV !== undefined)
    throw new InputError('coupling.matrixMeV', coupling.matrixMeV, 'isotropicMeV and/or dipolar only for further neighbours (a bond matrix is not mapped to other bonds)');
  const shells = pyrochloreNeighbourShells(latticeConstantAngstrom);
  const frames = pyrochloreLocalFrames();
  const a = latticeConstantAngstrom;
  const geometry = (mu: number, nu: number, v: Vector3): BondGeometry => ({
    bondVectorAngstrom: [(v[0] * a) / 4, (v[1] * a) / 4, (v[2] * a) / 4],
    frameI: frames[mu],
    frameJ: frames[nu],
    label: '',
  });
  const kLocal = (mu: number, nu: number, v: Vector3, spec: { isotropicMeV?: number; dipolar?: boolean }): Matrix3 => {
    const g = geometry(mu, nu, v);
    return toLocalFrames(microscopicCouplingMatrix(spec, g, site.ion.gJ, site.ion.gJ), frameRows(g.frameI), frameRows(g.frameJ));
  };
  const spec = { isotropicMeV: coupling.isotropicMeV, dipolar: coupling.dipolar };
  const out: MediatedCoupling[] = [];
  for (const shell of ['J1', 'J2', 'J3a', 'J3b'] as const) {
    const pair = shells.bonds[0].find((b) => b.shell === shell);
    if (!pair) continue;
    const rij = pair.vectorQuarterCells;
    const total = [0, 1, 2].map(() => [0, 0, 0]);
    let middles = 0;
    for (const first of shells.bonds[0]) {
      if (first.shell !== 'J1') continue;
      const rik = first.vectorQuarterCells;
      const rkj: Vector3 = [rij[0] - rik[0], rij[1] - rik[1], rij[2] - rik[2]];
      const second = shells.bonds[first.to].find((b) => b.shell === 'J1' && b.to === pair.to && b.vectorQuarterCells.every((x, c) => x === rkj[c]));
      if (!second) continue;
      middles++;
      const h = clusterEffectiveHamiltonian(
        [site, site, site],
        [
          { s: 0, t: 1, kLocalMeV: kLocal(0, first.to, rik, spec) },
          { s: 1, t: 2, kLocalMeV: kLocal(first.to, pair.to, rkj, spec) },
        ],
        2,
      );
      const part = outerPair(h);
      for (let x = 0; x < 3; x++) for (let y = 0; y < 3; y++) total[x][y] += part[x][y];
    }
    let direct: number[][] | null = null;
    if (coupling.dipolar) {
      // First-order projection of the direct dipolar coupling: P J^c P = Σ_a t[c][a] S^a with t[c][a] = Tr(P J^c P σ^a),
      // so J_ab = Σ_cd K_cd t[c][a] t[d][b].
      const k = kLocal(0, pair.to, rij, { dipolar: true });
      const t = site.gLocal.map((row) => row.map((g) => g / site.ion.gJ)); // t[c][a] = Tr(P J^c P σ^a)
      direct = [0, 1, 2].map((x) => [0, 1, 2].map((y) => {
        let s = 0;
        for (let c = 0; c < 3; c++) for (let d = 0; d < 3; d++) s += k[c][d] * t[c][x] * t[d][y];
        return s;
      }));
    }
    out.push({
      shell,
      from: 0,
      to: pair.to,
      vectorAngstrom: pair.vectorAngstrom,
      distanceAngstrom: pair.distanceAngstrom,
      middleIons: middles,
      matrixLocalMeV: total,
      JzzMeV: total[2][2],
      directDipolarLocalMeV: direct,
    });
  }
  return out;
}
