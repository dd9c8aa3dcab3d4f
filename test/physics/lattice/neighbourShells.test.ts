import { describe, it, expect } from 'vitest';
import { pyrochloreNeighbourShells } from '@multiplet/physics/lattice/neighbourShells';
import { InputError } from '@multiplet/physics/errors';

describe('pyrochloreNeighbourShells', () => {
  const a = 10.1;
  const shells = pyrochloreNeighbourShells(a);
  it('counts 6 first, 12 second, 6 + 6 third neighbours per site at the geometric distances', () => {
    for (let mu = 0; mu < 4; mu++) {
      const b = shells.bonds[mu];
      expect(b.filter((x) => x.shell === 'J1')).toHaveLength(6);
      expect(b.filter((x) => x.shell === 'J2')).toHaveLength(12);
      expect(b.filter((x) => x.shell === 'J3a')).toHaveLength(6);
      expect(b.filter((x) => x.shell === 'J3b')).toHaveLength(6);
      for (const x of b) expect(x.distanceAngstrom).toBeCloseTo(shells.distanceAngstrom[x.shell], 12);
      // First and second neighbours sit on the other sublattices, third neighbours on the same one.
      for (const x of b) expect(x.to === mu).toBe(x.shell === 'J3a' || x.shell === 'J3b');
    }
    expect(shells.distanceAngstrom.J1).toBeCloseTo((a * Math.SQRT2) / 4, 12);
    expect(shells.distanceAngstrom.J2).toBeCloseTo((a * Math.sqrt(6)) / 4, 12);
    expect(shells.distanceAngstrom.J3a).toBeCloseTo(a / Math.SQRT2, 12);
  });
  it('J3b bonds are twice a first-neighbour bond; J3a bonds are not', () => {
    const nn = shells.bonds[0].filter((x) => x.shell === 'J1').map((x) => x.vectorQuarterCells.join());
    for (const x of shells.bonds[0].filter((x) => x.shell === 'J3b')) expect(nn).toContain(x.vectorQuarterCells.map((v) => v / 2).join());
    for (const x of shells.bonds[0].filter((x) => x.shell === 'J3a')) expect(nn).not.toContain(x.vectorQuarterCells.map((v) => v / 2).join());
  });
  it('rejects a bad lattice constant', () => {
    expect(() => pyrochloreNeighbourShells(-1)).toThrow(InputError);
  });
});
