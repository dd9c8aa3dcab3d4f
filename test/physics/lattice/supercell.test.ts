import { describe, it, expect } from 'vitest';
import { pyrochloreSupercell } from '@multiplet/physics/lattice/supercell';
import { supercellNeighbourLists } from '@multiplet/physics/lattice/supercellNeighbourLists';
import { InputError } from '@multiplet/physics/errors';

describe('pyrochloreSupercell', () => {
  const cell = pyrochloreSupercell(2, 10);
  it('has 16 L³ sites and N/2 tetrahedra, each with one site of every sublattice, every site in one up and one down', () => {
    expect(cell.numberOfSites).toBe(128);
    expect(cell.numberOfTetrahedra).toBe(64);
    const seen = new Int32Array(128);
    for (let t = 0; t < 64; t++) {
      const sites = Array.from(cell.tetrahedronSites.subarray(4 * t, 4 * t + 4));
      expect(new Set(sites.map((s) => cell.sublattice[s]))).toEqual(new Set([0, 1, 2, 3]));
      for (const s of sites) seen[s]++;
      for (const s of sites) expect(t < 32 ? cell.upTetrahedron[s] : cell.downTetrahedron[s]).toBe(t);
    }
    expect(Array.from(seen).every((c) => c === 2)).toBe(true);
  });
  it('first neighbours are exactly the other three sites of the two tetrahedra of a site', () => {
    const nl = supercellNeighbourLists(cell).J1;
    for (let i = 0; i < 128; i++) {
      const nb = Array.from(nl.neighbours.subarray(nl.offsets[i], nl.offsets[i + 1])).sort((p, q) => p - q);
      const tet = [cell.upTetrahedron[i], cell.downTetrahedron[i]].flatMap((t) => Array.from(cell.tetrahedronSites.subarray(4 * t, 4 * t + 4)));
      expect(nb).toEqual(tet.filter((s) => s !== i).sort((p, q) => p - q));
    }
  });
  it('each shell list is symmetric (j in list of i ⇔ i in list of j)', () => {
    const lists = supercellNeighbourLists(cell);
    for (const name of ['J2', 'J3a', 'J3b'] as const) {
      const nl = lists[name];
      for (let i = 0; i < 128; i++)
        for (let p = nl.offsets[i]; p < nl.offsets[i + 1]; p++) {
          const j = nl.neighbours[p];
          expect(Array.from(nl.neighbours.subarray(nl.offsets[j], nl.offsets[j + 1]))).toContain(i);
        }
    }
  });
  it('rejects L = 0', () => {
    expect(() => pyrochloreSupercell(0, 10)).toThrow(InputError);
  });
});
