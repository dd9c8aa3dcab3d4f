import { describe, it, expect } from 'vitest';
import { allowedParameters, SITE_SYMMETRIES, rotateCefParameters, CEF_PARAMETER_KEYS } from '@multiplet/physics/cef';

/**
 * Independent check of the symmetry table: a parameter (or the cubic combination) is allowed iff the crystal field
 * is invariant under the group's generators. Improper operations act on even-rank operators like the proper
 * rotation obtained by multiplying with the inversion: a mirror with normal n acts as C2 about n, S4 as C4⁻¹
 * (standard group theory, e.g. Tinkham, Group Theory and Quantum Mechanics, ch. 4; common practice).
 */
const c = Math.cos, s = Math.sin;
const Cz = (k: number) => [[c((2 * Math.PI) / k), s((2 * Math.PI) / k), 0], [-s((2 * Math.PI) / k), c((2 * Math.PI) / k), 0], [0, 0, 1]];
const C2x = [[1, 0, 0], [0, -1, 0], [0, 0, -1]];
const C2y = [[-1, 0, 0], [0, 1, 0], [0, 0, -1]];
const C3_111 = [[0, 1, 0], [0, 0, 1], [1, 0, 0]]; // cyclic x → y → z

const GENERATORS: Record<string, number[][][]> = {
  Oh: [Cz(4), C3_111], Td: [Cz(4), C3_111], O: [Cz(4), C3_111],
  D4h: [Cz(4), C2x], D4: [Cz(4), C2x], C4v: [Cz(4), C2y /* mirror xz */], D2d: [Cz(4) /* S4·i */, C2x],
  C4h: [Cz(4)], C4: [Cz(4)], S4: [Cz(4)],
  D3d: [Cz(3), C2y], D3: [Cz(3), C2y], C3v: [Cz(3), C2y /* mirror xz */],
  S6: [Cz(3)], C3: [Cz(3)],
  D6h: [Cz(6), C2x], D6: [Cz(6), C2x], C6v: [Cz(6), C2y], D3h: [Cz(3), Cz(2) /* σh·i */, C2x],
  C6h: [Cz(6)], C6: [Cz(6)], C3h: [Cz(3), Cz(2)],
  D2h: [Cz(2), C2x], D2: [Cz(2), C2x], C2v: [Cz(2), C2y /* mirror xz */],
  C2h: [Cz(2)], C2: [Cz(2)], Cs: [Cz(2) /* mirror xy */],
  none: [], C1: [], Ci: [],
};

function invariant(B: Record<string, number>, generators: number[][][]): boolean {
  return generators.every((g) => {
    const r = rotateCefParameters(B, 6, g);
    return CEF_PARAMETER_KEYS.every((k) => Math.abs((r[k] ?? 0) - (B[k] ?? 0)) < 1e-10);
  });
}

describe('site symmetry table', () => {
  it('covers the required groups', () => {
    for (const g of ['Oh', 'Td', 'O', 'D3d', 'D3', 'C3v', 'D4h', 'D4', 'C4v', 'D2d', 'D2h', 'C2v', 'none']) expect(SITE_SYMMETRIES).toContain(g);
    expect(allowedParameters('none')).toHaveLength(27);
    expect(allowedParameters('D3d')).toEqual(['B20', 'B40', 'B43', 'B60', 'B63', 'B66']);
    expect(allowedParameters('D4h')).toEqual(['B20', 'B40', 'B44', 'B60', 'B64']);
    expect(allowedParameters('d3d')).toEqual(allowedParameters('D3d'));
    expect(() => allowedParameters('Q7')).toThrow(/^symmetry: got "Q7", expected a site symmetry, one of Oh/);
  });

  it('non-cubic groups: exactly the allowed parameters are invariant under the generators', () => {
    for (const group of SITE_SYMMETRIES.filter((g) => !['Oh', 'Td', 'O'].includes(g))) {
      const allowed = allowedParameters(group);
      for (const key of CEF_PARAMETER_KEYS) expect(invariant({ [key]: 1 }, GENERATORS[group]), `${group} ${key}`).toBe(allowed.includes(key));
    }
  });

  it('cubic groups: B40(O40 + 5 O44) and B60(O60 − 21 O64) are invariant, O40 alone and O44 alone are not (Hutchings 1964, cubic fields; from memory)', () => {
    for (const group of ['Oh', 'Td', 'O']) {
      expect(invariant({ B40: 1, B44: 5 }, GENERATORS[group])).toBe(true);
      expect(invariant({ B60: 1, B64: -21 }, GENERATORS[group])).toBe(true);
      expect(invariant({ B40: 1 }, GENERATORS[group])).toBe(false);
      expect(invariant({ B44: 1 }, GENERATORS[group])).toBe(false);
      expect(invariant({ B20: 1 }, GENERATORS[group])).toBe(false);
    }
  });
});
