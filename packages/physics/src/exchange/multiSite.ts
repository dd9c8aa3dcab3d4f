/**
 * Degenerate perturbation theory on a cluster of N ions coupled pairwise (V = Σ_bonds J_sᵀ K_st J_t), generic on
 * the product space of CEF eigenstates (dimension Π(2J_s+1)):
 *   H_eff = P V P + P V Q (E0 − H0)⁻¹ Q V P      (same references as effectiveExchange.ts),
 * with P the 2^N products of ground doublets. Used for the further-neighbour couplings that a virtually excited
 * middle ion generates between two outer ions (three-site cluster), and for exact cluster diagonalisation.
 * Basis: mixed radix, site 0 most significant; P states are ordered by their pseudospin bits (↑ = 0).
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';
import { hermitianEigen } from '../linalg/hermitianEigen';
import type { PseudospinSite } from './pseudospinSite';
import type { Matrix3 } from './matrix3';

/** A coupling between cluster sites s and t with K in the local frames of s (rows) and t (columns), meV. */
export interface ClusterBond {
  s: number;
  t: number;
  kLocalMeV: Matrix3;
}

/** Sparse row of V: column index → [re, im]. */
type SparseRow = Map<number, [number, number]>;

function strides(sites: readonly PseudospinSite[]): number[] {
  const out = new Array<number>(sites.length);
  let stride = 1;
  for (let s = sites.length - 1; s >= 0; s--) {
    out[s] = stride;
    stride *= sites[s].dimension;
  }
  return out;
}

function digitsOf(index: number, sites: readonly PseudospinSite[], stride: number[]): number[] {
  return sites.map((site, s) => Math.floor(index / stride[s]) % site.dimension);
}

/** ⟨x|V|c⟩ for all c, as a sparse row. */
function couplingRow(x: number, sites: readonly PseudospinSite[], bonds: readonly ClusterBond[], stride: number[]): SparseRow {
  const row: SparseRow = new Map();
  const xd = digitsOf(x, sites, stride);
  for (const { s, t, kLocalMeV } of bonds) {
    const ns = sites[s].dimension, nt = sites[t].dimension;
    const base = x - xd[s] * stride[s] - xd[t] * stride[t];
    for (let cs = 0; cs < ns; cs++)
      for (let ct = 0; ct < nt; ct++) {
        let re = 0, im = 0;
        for (let a = 0; a < 3; a++) {
          const ja = sites[s].jLocal[a];
          const ar = ja.re[xd[s] * ns + cs], ai = ja.im[xd[s] * ns + cs];
          if (ar === 0 && ai === 0) continue;
          for (let b = 0; b < 3; b++) {
            const k = kLocalMeV[a][b];
            if (k === 0) continue;
            const jb = sites[t].jLocal[b];
            const br = jb.re[xd[t] * nt + ct], bi = jb.im[xd[t] * nt + ct];
            re += k * (ar * br - ai * bi);
            im += k * (ar * bi + ai * br);
          }
        }
        if (re === 0 && im === 0) continue;
        const c = base + cs * stride[s] + ct * stride[t];
        const old = row.get(c);
        if (old) {
          old[0] += re;
          old[1] += im;
        } else row.set(c, [re, im]);
      }
  }
  return row;
}

function checkCluster(sites: readonly PseudospinSite[], bonds: readonly ClusterBond[]): void {
  if (sites.length < 2 || sites.length > 6) throw new InputError('sites', sites.length, 'between 2 and 6 cluster sites');
  bonds.forEach((b, i) => {
    if (!Number.isInteger(b.s) || !Number.isInteger(b.t) || b.s === b.t || b.s < 0 || b.t < 0 || b.s >= sites.length || b.t >= sites.length)
      throw new InputError(`bonds[${i}]`, [b.s, b.t], `two different site indices below ${sites.length}`);
  });
}

/** The P-space indices, ordered by pseudospin bits (site 0 most significant, ↑ = 0). */
export function clusterGroundIndices(sites: readonly PseudospinSite[]): number[] {
  const stride = strides(sites);
  const n = sites.length;
  return Array.from({ length: 1 << n }, (_, bits) => {
    let index = 0;
    for (let s = 0; s < n; s++) index += ((bits >> (n - 1 - s)) & 1) * stride[s];
    return index;
  });
}

/**
 * The 2^N × 2^N effective Hamiltonian (meV) of a cluster through the given order, relative to the ground doublets.
 * @example clusterEffectiveHamiltonian([a, b, c], [{ s: 0, t: 1, kLocalMeV: k01 }, { s: 1, t: 2, kLocalMeV: k12 }], 2)
 * See also: effectiveExchange (two sites), furtherNeighbourExchange
 */
export function clusterEffectiveHamiltonian(sites: readonly PseudospinSite[], bonds: readonly ClusterBond[], order: 1 | 2): ComplexMatrix {
  checkCluster(sites, bonds);
  const stride = strides(sites);
  const p = clusterGroundIndices(sites);
  const inP = new Map(p.map((index, k) => [index, k]));
  const m = p.length;
  const rows = p.map((x) => couplingRow(x, sites, bonds, stride));
  const h = zeros(m);
  rows.forEach((row, x) => {
    for (const [c, [re, im]] of row) {
      const y = inP.get(c);
      if (y !== undefined) {
        h.re[x * m + y] += re;
        h.im[x * m + y] += im;
      }
    }
  });
  if (order === 2) {
    for (let x = 0; x < m; x++)
      for (let y = 0; y < m; y++) {
        let sr = 0, si = 0;
        const rx = rows[x], ry = rows[y];
        for (const [c, [ar, ai]] of rx) {
          if (inP.has(c)) continue;
          const b = ry.get(c);
          if (!b) continue;
          const d = digitsOf(c, sites, stride);
          let energy = 0;
          d.forEach((k, s) => (energy += sites[s].energiesMeV[k]));
          // V_xc conj(V_yc) / (E0 − E_c)
          sr += (ar * b[0] + ai * b[1]) / -energy;
          si += (ai * b[0] - ar * b[1]) / -energy;
        }
        h.re[x * m + y] += sr;
        h.im[x * m + y] += si;
      }
  }
  return h;
}

/**
 * The `count` lowest exact eigenvalues (meV, relative to the ground doublets) of H0 + V on the full cluster space.
 * Dense: keep Π(2J+1) below about 1000.
 * @example exactClusterLevels([a, b, c], bonds, 8)
 */
export function exactClusterLevels(sites: readonly PseudospinSite[], bonds: readonly ClusterBond[], count: number): number[] {
  checkCluster(sites, bonds);
  const stride = strides(sites);
  const dim = sites.reduce((d, s) => d * s.dimension, 1);
  if (dim > 4096) throw new InputError('sites', dim, 'a cluster space of at most 4096 states for exact diagonalisation');
  const h = zeros(dim);
  for (let x = 0; x < dim; x++) {
    for (const [c, [re, im]] of couplingRow(x, sites, bonds, stride)) {
      h.re[x * dim + c] += re;
      h.im[x * dim + c] += im;
    }
    digitsOf(x, sites, stride).forEach((k, s) => (h.re[x * dim + x] += sites[s].energiesMeV[k]));
  }
  const { values } = hermitianEigen(h, { vectors: false, field: 'cluster Hamiltonian', hermitianTolerance: 1e-8 });
  return Array.from(values.slice(0, count));
}
