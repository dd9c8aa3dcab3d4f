/**
 * Neighbour shells of the pyrochlore lattice up to the third neighbours.
 *
 * Distances (a = cubic lattice constant; common practice, from the geometry of `pyrochlore.ts`):
 *   J1  first neighbours   r = a√2/4, 6 per site, on the other three sublattices;
 *   J2  second neighbours  r = a√6/4, 12 per site, on the other three sublattices;
 *   J3a, J3b third neighbours r = a√2/2, 6 + 6 per site, both on the same sublattice (they are fcc translations).
 *   J3b: the pair lies on a straight line through a common first neighbour (r_ij = 2 × a first-neighbour bond).
 *   J3a: the pair lies across a hexagon of the kagome plane (no site halfway between).
 * Papers disagree on which of the two third-neighbour bonds is called "a" (or J3' vs J3''): check the figure of
 * the paper before copying numbers.
 */
import { PYROCHLORE_SUBLATTICE_FRACTIONAL, FCC_TRANSLATIONS_FRACTIONAL, type Vector3 } from './pyrochlore';
import { InputError } from '../errors';

/** Names of the exchange shells handled here. */
export type ShellName = 'J1' | 'J2' | 'J3a' | 'J3b';

/** All shell names in order of distance. */
export const SHELL_NAMES: readonly ShellName[] = ['J1', 'J2', 'J3a', 'J3b'];

/** One bond from a site of sublattice `from` to a site of sublattice `to`. */
export interface Bond {
  shell: ShellName;
  from: number;
  to: number;
  /** r_to − r_from in units of a/4 (integers). */
  vectorQuarterCells: Vector3;
  /** r_to − r_from in Å. */
  vectorAngstrom: Vector3;
  distanceAngstrom: number;
}

/** The shells with their distances in Å and all bonds leaving each sublattice. */
export interface NeighbourShells {
  distanceAngstrom: Record<ShellName, number>;
  /** bonds[μ] lists every bond (all shells) leaving a site of sublattice μ. */
  bonds: Bond[][];
}

/** Integer coordinates (units of a/4) of sublattice μ plus fcc translation f. */
export function quarterCellCoordinates(mu: number, f: number): Vector3 {
  const d = PYROCHLORE_SUBLATTICE_FRACTIONAL[mu];
  const t = FCC_TRANSLATIONS_FRACTIONAL[f];
  return [Math.round(4 * (d[0] + t[0])), Math.round(4 * (d[1] + t[1])), Math.round(4 * (d[2] + t[2]))];
}

/** Sublattice of a site at integer coordinates (units of a/4), or −1 when no 16d site is there. */
export function sublatticeAt(x: number, y: number, z: number): number {
  for (let mu = 0; mu < 4; mu++) {
    for (let f = 0; f < 4; f++) {
      const q = quarterCellCoordinates(mu, f);
      if (mod(x - q[0], 4) === 0 && mod(y - q[1], 4) === 0 && mod(z - q[2], 4) === 0) return mu;
    }
  }
  return -1;
}

function mod(a: number, n: number): number {
  return ((a % n) + n) % n;
}

/**
 * First, second and the two third-neighbour shells of the pyrochlore lattice, for a lattice constant in Å.
 * @example pyrochloreNeighbourShells(10.1).distanceAngstrom.J1 // 3.571 (= 10.1·√2/4)
 * See also: pyrochloreSupercell, supercellNeighbourLists
 */
export function pyrochloreNeighbourShells(latticeConstantAngstrom: number): NeighbourShells {
  if (!(latticeConstantAngstrom > 0) || !Number.isFinite(latticeConstantAngstrom)) {
    throw new InputError('latticeConstantAngstrom', latticeConstantAngstrom, 'a positive length in Å');
  }
  const a = latticeConstantAngstrom;
  const bonds: Bond[][] = [[], [], [], []];
  for (let mu = 0; mu < 4; mu++) {
    const o = quarterCellCoordinates(mu, 0);
    const nnVectors: Vector3[] = [];
    for (let dx = -2; dx <= 2; dx++)
      for (let dy = -2; dy <= 2; dy++)
        for (let dz = -2; dz <= 2; dz++) {
          if (dx * dx + dy * dy + dz * dz === 2 && sublatticeAt(o[0] + dx, o[1] + dy, o[2] + dz) >= 0) nnVectors.push([dx, dy, dz]);
        }
    for (let dx = -3; dx <= 3; dx++)
      for (let dy = -3; dy <= 3; dy++)
        for (let dz = -3; dz <= 3; dz++) {
          const r2 = dx * dx + dy * dy + dz * dz;
          if (r2 !== 2 && r2 !== 6 && r2 !== 8) continue;
          const nu = sublatticeAt(o[0] + dx, o[1] + dy, o[2] + dz);
          if (nu < 0) continue;
          let shell: ShellName;
          if (r2 === 2) shell = 'J1';
          else if (r2 === 6) shell = 'J2';
          else {
            const collinear = nnVectors.some((v) => 2 * v[0] === dx && 2 * v[1] === dy && 2 * v[2] === dz);
            shell = collinear ? 'J3b' : 'J3a';
          }
          bonds[mu].push({
            shell,
            from: mu,
            to: nu,
            vectorQuarterCells: [dx, dy, dz],
            vectorAngstrom: [(dx * a) / 4, (dy * a) / 4, (dz * a) / 4],
            distanceAngstrom: (Math.sqrt(r2) * a) / 4,
          });
        }
  }
  return {
    distanceAngstrom: { J1: (a * Math.SQRT2) / 4, J2: (a * Math.sqrt(6)) / 4, J3a: (a * Math.SQRT2) / 2, J3b: (a * Math.SQRT2) / 2 },
    bonds,
  };
}
