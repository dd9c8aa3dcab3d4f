/**
 * Neighbour lists of a periodic supercell for each exchange shell, in compressed-row form.
 */
import type { PyrochloreSupercell } from './supercell';
import { pyrochloreNeighbourShells, type ShellName } from './neighbourShells';

/** Compressed-row neighbour list: neighbours of site i are `neighbours[offsets[i] .. offsets[i+1])`. */
export interface NeighbourList {
  offsets: Int32Array;
  neighbours: Int32Array;
}

/**
 * For each shell, the neighbours of every site of the supercell through the periodic boundaries. For very small
 * cells (L = 1) the same pair can appear more than once (distinct periodic images); each image is one bond.
 * @example supercellNeighbourLists(pyrochloreSupercell(2, 10.1)).J1.offsets[1] // 6
 * See also: pyrochloreNeighbourShells
 */
export function supercellNeighbourLists(cell: PyrochloreSupercell): Record<ShellName, NeighbourList> {
  const shells = pyrochloreNeighbourShells(cell.latticeConstantAngstrom);
  const N = cell.numberOfSites;
  const G = 4 * cell.L;
  const wrap = (v: number) => ((v % G) + G) % G;
  const out = {} as Record<ShellName, NeighbourList>;
  for (const name of ['J1', 'J2', 'J3a', 'J3b'] as ShellName[]) {
    const offsets = new Int32Array(N + 1);
    const list: number[] = [];
    for (let i = 0; i < N; i++) {
      const mu = cell.sublattice[i];
      const x = cell.quarterCellCoordinates[3 * i];
      const y = cell.quarterCellCoordinates[3 * i + 1];
      const z = cell.quarterCellCoordinates[3 * i + 2];
      for (const b of shells.bonds[mu]) {
        if (b.shell !== name) continue;
        const v = b.vectorQuarterCells;
        list.push(cell.siteAtGrid[(wrap(x + v[0]) * G + wrap(y + v[1])) * G + wrap(z + v[2])]);
      }
      offsets[i + 1] = list.length;
    }
    out[name] = { offsets, neighbours: Int32Array.from(list) };
  }
  return out;
}
