import { describe, it, expect } from 'vitest';
import { llwParameters, LLW_FACTORS, solveCef, cefHamiltonian } from '@multiplet/physics/cef';
import { hermitianEigen } from '@multiplet/physics/linalg';
import type { Ion } from '@multiplet/physics/ions';

/**
 * Degeneracies of the cubic levels of a J multiplet: the decomposition of D^J into irreducible representations
 * of O (O*), as listed by Lea, Leask & Wolf (1962) for each J (Γ1, Γ2 singlets; Γ3, Γ6, Γ7 doublets; Γ4, Γ5
 * triplets; Γ8 quartets). Bethe's decomposition, also in Abragam & Bleaney 1970 (common practice).
 */
const CUBIC_DEGENERACIES: Record<number, number[]> = {
  5: [2, 4], // Γ7 + Γ8
  6: [1, 3, 3], // Γ2 + Γ4 + Γ5
  7: [2, 2, 4], // Γ6 + Γ7 + Γ8
  8: [1, 2, 3, 3], // Γ1 + Γ3 + Γ4 + Γ5
  9: [2, 4, 4], // Γ6 + 2Γ8
  10: [2, 3, 3, 3], // Γ3 + 2Γ4 + Γ5
  11: [2, 2, 4, 4], // Γ6 + Γ7 + 2Γ8
  12: [1, 1, 2, 3, 3, 3], // Γ1 + Γ2 + Γ3 + Γ4 + 2Γ5
  13: [2, 2, 2, 4, 4], // Γ6 + 2Γ7 + 2Γ8
  14: [1, 2, 3, 3, 3, 3], // Γ2 + Γ3 + 2Γ4 + 2Γ5
  15: [2, 2, 4, 4, 4], // Γ6 + Γ7 + 3Γ8
  16: [1, 2, 2, 3, 3, 3, 3], // Γ1 + 2Γ3 + 2Γ4 + 2Γ5
};

/** A stand-in ion carrying only J (the cubic pattern does not depend on the rest). */
function ionWithJ(J: number): Ion {
  return { name: `J=${J}`, element: 'X', nf: 0, S: 0, L: 0, J, gJ: 1, stevens: { alpha: 0, beta: 0, gamma: 0 }, radial: { r2: 0, r4: 0, r6: 0 }, kramers: Number.isInteger(J) === false };
}

describe('Lea–Leask–Wolf cubic fields', () => {
  it('give the cubic degeneracy pattern of every J = 5/2 … 8 at several x (LLW 1962)', () => {
    for (const [twoJ, pattern] of Object.entries(CUBIC_DEGENERACIES)) {
      const J = Number(twoJ) / 2;
      for (const x of [-0.83, -0.41, 0.27, 0.66]) {
        // LLW form with unit factors (the pattern does not depend on F4, F6): B40 = x, B60 = (1 − |x|)/50
        const B40 = x, B60 = (1 - Math.abs(x)) / 50;
        const s = solveCef(ionWithJ(J), { B40, B44: 5 * B40, B60, B64: -21 * B60 }, { degeneracyToleranceMeV: 1e-7 });
        expect(s.levels.map((l) => l.degeneracy).sort((a, b) => a - b), `J=${J} x=${x}`).toEqual(pattern);
      }
    }
  });

  it('F4, F6 (LLW Table 1, from memory) make the energies E/W of representations occurring once integers at x = ±1 and x = 0 ' +
    '(LLW chose the factors to tabulate simple numbers; from memory)', () => {
    expect(Object.keys(LLW_FACTORS).map(Number)).toEqual([5, 6, 7, 8, 9, 10, 12, 13, 15, 16]);
    let checked = 0;
    for (const twoJ of Object.keys(LLW_FACTORS)) {
      const pattern = CUBIC_DEGENERACIES[Number(twoJ)];
      const J = Number(twoJ) / 2;
      for (const x of LLW_FACTORS[Number(twoJ)].F6 === null ? [1, -1] : [1, -1, 0]) {
        const e = hermitianEigen(cefHamiltonian(J, llwParameters(J, x, 1)), { vectors: false }).values;
        // group degenerate eigenvalues; keep groups whose degeneracy appears once in the pattern
        const groups: number[][] = [];
        for (const v of e) {
          const last = groups[groups.length - 1];
          if (last && Math.abs(v - last[0]) < 1e-9) last.push(v);
          else groups.push([v]);
        }
        const considered = groups.filter((g) => pattern.filter((d) => d === g.length).length === 1);
        checked += considered.length;
        for (const g of considered) expect(Math.abs(g[0] - Math.round(g[0])), `J=${J} x=${x} E=${g[0]}`).toBeLessThan(1e-9);
      }
    }
    expect(checked).toBeGreaterThanOrEqual(20);
  });

  it('J = 5/2 at x = 1: Γ7 at −4W and Γ8 at +2W (−240 B4 and +120 B4 with F4 = 60)', () => {
    const e = hermitianEigen(cefHamiltonian(2.5, llwParameters(2.5, 1, 1)), { vectors: false }).values;
    expect(e[0]).toBeCloseTo(-4, 12);
    expect(e[5]).toBeCloseTo(2, 12);
  });

  it('rejects x outside [−1, 1] and J outside the tables', () => {
    expect(() => llwParameters(4, 1.5, 1)).toThrow(/^x:/);
    expect(() => llwParameters(2, 0.5, 1)).toThrow(/^J:/);
    expect(() => llwParameters(7, 0.5, 1)).toThrow(/^J: got 7, expected a J with confirmed Lea–Leask–Wolf factors/);
  });
});
