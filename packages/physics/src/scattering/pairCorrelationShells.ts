/**
 * Spin pair correlations of a periodic Ising configuration, grouped by pair distance, in the form the
 * Blech–Averbach powder average needs (Blech & Averbach, Physics 1, 31 (1964)):
 *   for a pair at distance r with unit Ising axes ẑ_i, ẑ_j and r̂ = r/|r|,
 *   a_ij = ẑ_i·ẑ_j − (ẑ_i·r̂)(ẑ_j·r̂),   b_ij = 3 (ẑ_i·r̂)(ẑ_j·r̂) − ẑ_i·ẑ_j,
 *   A(r) = (1/N) Σ_{i≠j, |r_ij| = r} ⟨σ_i σ_j⟩ a_ij,   B(r) likewise with b_ij.
 * Pairs are taken by the minimum image up to half the box (r < L a / 2), the usual truncation for a supercell.
 */
import type { PyrochloreSupercell } from '../lattice/supercell';
import { InputError } from '../errors';

/** Correlation shells: distances in Å with A(r), B(r) per spin (dimensionless, averaged over configurations). */
export interface CorrelationShells {
  distancesAngstrom: Float64Array;
  a: Float64Array;
  b: Float64Array;
  /** Number of configurations averaged. */
  configurations: number;
}

/** A prepared pair table for one supercell, reusable for many configurations. */
export interface PairTable {
  cell: PyrochloreSupercell;
  distancesAngstrom: Float64Array;
  pairI: Int32Array;
  pairJ: Int32Array;
  pairShell: Int32Array;
  pairA: Float64Array;
  pairB: Float64Array;
}

/**
 * All pairs i < j with minimum-image distance below L a / 2, with their shell index and a_ij, b_ij.
 * @example pairTable(pyrochloreSupercell(2, 10.1)).distancesAngstrom[0] // 3.571 (first neighbours)
 * See also: pairCorrelationShells, powderIntensity
 */
export function pairTable(cell: PyrochloreSupercell): PairTable {
  const N = cell.numberOfSites;
  const G = 4 * cell.L;
  const q = cell.quarterCellCoordinates;
  const z = cell.localAxes;
  const half2 = (G / 2) * (G / 2);
  const shellOf = new Map<number, number>();
  const r2s: number[] = [];
  const I: number[] = [], J: number[] = [], S: number[] = [], A: number[] = [], Bv: number[] = [];
  const mi = (d: number) => d - G * Math.round(d / G);
  for (let i = 0; i < N; i++)
    for (let j = i + 1; j < N; j++) {
      const dx = mi(q[3 * j] - q[3 * i]), dy = mi(q[3 * j + 1] - q[3 * i + 1]), dz = mi(q[3 * j + 2] - q[3 * i + 2]);
      const r2 = dx * dx + dy * dy + dz * dz;
      if (r2 >= half2) continue;
      let s = shellOf.get(r2);
      if (s === undefined) {
        s = r2s.length;
        shellOf.set(r2, s);
        r2s.push(r2);
      }
      const r = Math.sqrt(r2);
      const zi = [z[3 * i], z[3 * i + 1], z[3 * i + 2]], zj = [z[3 * j], z[3 * j + 1], z[3 * j + 2]];
      const zz = zi[0] * zj[0] + zi[1] * zj[1] + zi[2] * zj[2];
      const ri = (zi[0] * dx + zi[1] * dy + zi[2] * dz) / r;
      const rj = (zj[0] * dx + zj[1] * dy + zj[2] * dz) / r;
      I.push(i);
      J.push(j);
      S.push(s);
      A.push(zz - ri * rj);
      Bv.push(3 * ri * rj - zz);
    }
  return {
    cell,
    distancesAngstrom: Float64Array.from(r2s, (r2) => (Math.sqrt(r2) * cell.latticeConstantAngstrom) / 4),
    pairI: Int32Array.from(I),
    pairJ: Int32Array.from(J),
    pairShell: Int32Array.from(S),
    pairA: Float64Array.from(A),
    pairB: Float64Array.from(Bv),
  };
}

/**
 * Average A(r), B(r) over Ising configurations (each an Int8Array of ±1 of length N).
 * @example pairCorrelationShells(pairTable(cell), run.raw.snapshots[k])
 * See also: powderIntensity
 */
export function pairCorrelationShells(table: PairTable, configurations: readonly Int8Array[]): CorrelationShells {
  const N = table.cell.numberOfSites;
  if (configurations.length === 0) throw new InputError('configurations', 0, 'at least one spin configuration');
  const nS = table.distancesAngstrom.length;
  const a = new Float64Array(nS);
  const b = new Float64Array(nS);
  const { pairI, pairJ, pairShell, pairA, pairB } = table;
  for (const s of configurations) {
    if (s.length !== N) throw new InputError('configurations', s.length, `${N} spins per configuration`);
    for (let p = 0; p < pairI.length; p++) {
      const ss = s[pairI[p]] * s[pairJ[p]];
      a[pairShell[p]] += ss * pairA[p];
      b[pairShell[p]] += ss * pairB[p];
    }
  }
  // Both orders (i, j) and (j, i), per spin, per configuration.
  const f = 2 / (N * configurations.length);
  for (let k = 0; k < nS; k++) {
    a[k] *= f;
    b[k] *= f;
  }
  return { distancesAngstrom: table.distancesAngstrom, a, b, configurations: configurations.length };
}
