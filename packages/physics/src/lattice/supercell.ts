/**
 * An L×L×L supercell of the cubic pyrochlore cell with periodic boundaries: site positions, sublattices, the
 * tetrahedra (for ice rules and loop moves) and an integer grid for translations.
 */
import { quarterCellCoordinates } from './neighbourShells';
import { pyrochloreLocalFrames } from './localFrames';
import { InputError } from '../errors';

/** A periodic pyrochlore supercell. Site i = 16·(cell index) + 4·fcc + sublattice, cell index = (x·L + y)·L + z. */
export interface PyrochloreSupercell {
  /** Number of cubic cells along each axis. */
  L: number;
  latticeConstantAngstrom: number;
  /** Number of sites N = 16 L³. */
  numberOfSites: number;
  /** Cartesian positions in Å, xyz interleaved (length 3N), inside the box [0, L·a)³. */
  positionsAngstrom: Float64Array;
  /** Integer positions in units of a/4, xyz interleaved, in [0, 4L). */
  quarterCellCoordinates: Int32Array;
  /** Sublattice μ(i) = 0..3 (selects the local frame). */
  sublattice: Int8Array;
  /** Local easy axes ẑ_μ(i), xyz interleaved (length 3N). */
  localAxes: Float64Array;
  /** Site index at integer grid point (x·4L + y)·4L + z, or −1. */
  siteAtGrid: Int32Array;
  /** Number of tetrahedra N/2: 0..N/4−1 are up, N/4..N/2−1 are down. */
  numberOfTetrahedra: number;
  /** The four sites of each tetrahedron (length 4 × numberOfTetrahedra), ordered by sublattice. */
  tetrahedronSites: Int32Array;
  /** The up tetrahedron of each site (the one ẑ points out of). */
  upTetrahedron: Int32Array;
  /** The down tetrahedron of each site (the one ẑ points into). */
  downTetrahedron: Int32Array;
}

/**
 * Build an L×L×L periodic supercell (N = 16 L³ spins) for lattice constant a in Å.
 * @example pyrochloreSupercell(2, 10.1).numberOfSites // 128
 * See also: pyrochloreCubicCell, supercellNeighbourLists
 */
export function pyrochloreSupercell(L: number, latticeConstantAngstrom: number): PyrochloreSupercell {
  if (!Number.isInteger(L) || L < 1 || L > 16) throw new InputError('L', L, 'an integer number of cubic cells from 1 to 16');
  if (!(latticeConstantAngstrom > 0) || !Number.isFinite(latticeConstantAngstrom)) {
    throw new InputError('latticeConstantAngstrom', latticeConstantAngstrom, 'a positive length in Å');
  }
  const N = 16 * L * L * L;
  const G = 4 * L;
  const positionsAngstrom = new Float64Array(3 * N);
  const grid = new Int32Array(3 * N);
  const sublattice = new Int8Array(N);
  const localAxes = new Float64Array(3 * N);
  const siteAtGrid = new Int32Array(G * G * G).fill(-1);
  const frames = pyrochloreLocalFrames();
  const wrap = (v: number) => ((v % G) + G) % G;
  const gridIndex = (x: number, y: number, z: number) => (wrap(x) * G + wrap(y)) * G + wrap(z);
  for (let cx = 0; cx < L; cx++)
    for (let cy = 0; cy < L; cy++)
      for (let cz = 0; cz < L; cz++) {
        const cell = (cx * L + cy) * L + cz;
        for (let f = 0; f < 4; f++)
          for (let mu = 0; mu < 4; mu++) {
            const i = 16 * cell + 4 * f + mu;
            const q = quarterCellCoordinates(mu, f);
            const gx = wrap(4 * cx + q[0]);
            const gy = wrap(4 * cy + q[1]);
            const gz = wrap(4 * cz + q[2]);
            grid[3 * i] = gx;
            grid[3 * i + 1] = gy;
            grid[3 * i + 2] = gz;
            positionsAngstrom[3 * i] = (gx * latticeConstantAngstrom) / 4;
            positionsAngstrom[3 * i + 1] = (gy * latticeConstantAngstrom) / 4;
            positionsAngstrom[3 * i + 2] = (gz * latticeConstantAngstrom) / 4;
            sublattice[i] = mu;
            localAxes.set(frames[mu].z, 3 * i);
            siteAtGrid[gridIndex(gx, gy, gz)] = i;
          }
      }
  // Tetrahedra: the up tetrahedron of (cell, fcc) holds d_μ + t_f; the down one centred (1/4)(1,1,1) further holds
  // centre_down − ẑ_μ·√3/8, i.e. in quarter cells: 4(c + t_f) + (5/2)(1,1,1) − s_μ/2 with s_μ = √3 ẑ_μ.
  const nT = N / 2;
  const tetrahedronSites = new Int32Array(4 * nT);
  const upTetrahedron = new Int32Array(N).fill(-1);
  const downTetrahedron = new Int32Array(N).fill(-1);
  const s = frames.map((fr) => fr.z.map((c) => Math.round(c * Math.sqrt(3))));
  for (let cx = 0; cx < L; cx++)
    for (let cy = 0; cy < L; cy++)
      for (let cz = 0; cz < L; cz++) {
        const cell = (cx * L + cy) * L + cz;
        for (let f = 0; f < 4; f++) {
          const up = 4 * cell + f;
          const down = nT / 2 + up;
          const t = quarterCellCoordinates(0, f).map((v, k) => v - 2) as number[]; // 4 t_f
          for (let mu = 0; mu < 4; mu++) {
            const u = quarterCellCoordinates(mu, f);
            const iu = siteAtGrid[gridIndex(4 * cx + u[0], 4 * cy + u[1], 4 * cz + u[2])];
            const dx = 4 * cx + t[0] + (5 - s[mu][0]) / 2;
            const dy = 4 * cy + t[1] + (5 - s[mu][1]) / 2;
            const dz = 4 * cz + t[2] + (5 - s[mu][2]) / 2;
            const id = siteAtGrid[gridIndex(dx, dy, dz)];
            tetrahedronSites[4 * up + mu] = iu;
            tetrahedronSites[4 * down + mu] = id;
            upTetrahedron[iu] = up;
            downTetrahedron[id] = down;
          }
        }
      }
  return {
    L,
    latticeConstantAngstrom,
    numberOfSites: N,
    positionsAngstrom,
    quarterCellCoordinates: grid,
    sublattice,
    localAxes,
    siteAtGrid,
    numberOfTetrahedra: nT,
    tetrahedronSites,
    upTetrahedron,
    downTetrahedron,
  };
}
