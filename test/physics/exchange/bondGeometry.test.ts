/**
 * Bond phases of the anisotropic pyrochlore model and the two-site geometry.
 * Reference table: γ_ij of Phys. Rev. X 1, 021002 (2011) (from memory), ζ = −γ*.
 */
import { describe, it, expect } from 'vitest';
import { bondPhases, pyrochloreBond, generalBond } from '@multiplet/physics/exchange';
import { InputError } from '@multiplet/physics/errors';

const w: [number, number] = [-0.5, Math.sqrt(3) / 2];
const w2: [number, number] = [-0.5, -Math.sqrt(3) / 2];
const one: [number, number] = [1, 0];
// from memory: Phys. Rev. X 1, 021002 (2011), γ_ij for sublattices 0..3 with the local frames of lattice/localFrames.ts
const GAMMA: Array<Array<[number, number] | null>> = [
  [null, one, w, w2],
  [one, null, w2, w],
  [w, w2, null, one],
  [w2, w, one, null],
];

describe('bondPhases on the pyrochlore lattice', () => {
  it('reproduces the published γ table and ζ = −γ* for all 12 directed bonds', () => {
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        if (i === j) continue;
        const p = bondPhases(pyrochloreBond(10.1, i, j));
        const g = GAMMA[i][j]!;
        expect(p.gamma[0]).toBeCloseTo(g[0], 12);
        expect(p.gamma[1]).toBeCloseTo(g[1], 12);
        for (const z of [p.zetaIJ, p.zetaJI]) {
          expect(z[0]).toBeCloseTo(-g[0], 12);
          expect(z[1]).toBeCloseTo(g[1], 12);
        }
      }
  });

  it('phases are unit complex numbers and symmetric under i ↔ j', () => {
    for (let i = 0; i < 4; i++)
      for (let j = i + 1; j < 4; j++) {
        const a = bondPhases(pyrochloreBond(9.9, i, j)), b = bondPhases(pyrochloreBond(9.9, j, i));
        expect(Math.hypot(...a.gamma)).toBeCloseTo(1, 14);
        expect(a.gamma[0]).toBeCloseTo(b.gamma[0], 12);
        expect(a.gamma[1]).toBeCloseTo(b.gamma[1], 12);
        expect(a.zetaIJ[0]).toBeCloseTo(b.zetaJI[0], 12);
        expect(a.zetaIJ[1]).toBeCloseTo(b.zetaJI[1], 12);
      }
  });

  it('nearest-neighbour distance a√2/4 (geometry of the 16d site)', () => {
    const b = pyrochloreBond(10.1, 0, 3);
    expect(Math.hypot(...b.bondVectorAngstrom)).toBeCloseTo((10.1 * Math.SQRT2) / 4, 12);
  });
});

describe('geometry input', () => {
  const frame = { x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] };
  it('accepts a general two-site geometry; parallel axes give well-defined phases', () => {
    const g = generalBond([3, 0, 0], frame, frame);
    const p = bondPhases(g);
    expect(Math.hypot(...p.gamma)).toBeCloseTo(1, 14);
    expect(Math.hypot(...p.zetaIJ)).toBeCloseTo(1, 14);
  });

  it('rejects a zero lattice constant, equal sublattices, a zero bond, a left-handed frame', () => {
    expect(() => pyrochloreBond(0)).toThrow(InputError);
    expect(() => pyrochloreBond(0)).toThrow(/latticeConstantAngstrom/);
    expect(() => pyrochloreBond(10, 2, 2)).toThrow(InputError);
    expect(() => generalBond([0, 0, 0], frame, frame)).toThrow(/bondVectorAngstrom/);
    expect(() => generalBond([1, 0, 0], frame, { x: [0, 1, 0], y: [1, 0, 0], z: [0, 0, 1] })).toThrow(/frameJ/);
  });
});
