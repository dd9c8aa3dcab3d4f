import { describe, it, expect } from 'vitest';
import { getIon, ION_NAMES } from '@multiplet/physics/ions';
import {
  solveCef,
  describeLevels,
  doubletGTensor,
  angularMomentumMatrices,
  normalizeCefParameters,
  CEF_PARAMETER_KEYS,
  classifyDoublet,
  type CefSolution,
} from '@multiplet/physics/cef';
import { createRandom } from '@multiplet/physics/random';

/** g values of every doublet level of a solution (isotropic doublets: the three principal values are equal). */
function doubletGValues(solution: CefSolution): number[][] {
  const jm = angularMomentumMatrices(solution.J);
  return solution.levels
    .filter((l) => l.degeneracy === 2)
    .map((l) => doubletGTensor(solution.eigenvectors, l.stateIndices[0], l.stateIndices[1], jm, solution.ion.gJ).principalValues);
}

describe('solveCef: checks against published results', () => {
  it('Ce3+ in a cubic field B4(O40 + 5 O44): Γ7 doublet and Γ8 quartet split by 360·B4, Γ7 isotropic g = 10/7 (Hutchings 1964; Abragam & Bleaney 1970)', () => {
    const B4 = 0.01;
    const s = solveCef(getIon('Ce3+'), { B40: B4, B44: 5 * B4 });
    expect(s.levels.map((l) => l.degeneracy)).toEqual([2, 4]);
    expect(s.levels[1].energyMeV).toBeCloseTo(360 * B4, 12);
    // absolute eigenvalues: Γ7 at −240 B4, Γ8 at +120 B4 (Hutchings 1964, J = 5/2 cubic eigenvalues; from memory)
    expect(s.groundEnergyMeV).toBeCloseTo(-240 * B4, 12);
    const g = s.groundDoublet!;
    expect(g.gParallel).toBeCloseTo(10 / 7, 12);
    expect(g.gPerpendicular).toBeCloseTo(10 / 7, 12);
    for (const v of g.gPrincipalValues) expect(v).toBeCloseTo(10 / 7, 12);
    expect(s.classification).toBe('Heisenberg');
    expect(g.kramers).toBe(true);
    // B4 < 0 puts the Γ8 quartet lowest: no ground doublet
    const q = solveCef(getIon('Ce3+'), { B40: -B4, B44: -5 * B4 });
    expect(q.levels.map((l) => l.degeneracy)).toEqual([4, 2]);
    expect(q.groundDoublet).toBeNull();
    expect(q.classification).toBe('quartet');
  });

  it('isotropic g of the cubic Γ6 and Γ7 doublets: Yb3+ 8/3 and 24/7, Er3+ 6.8 and 6.0 (Abragam & Bleaney 1970, cubic-field tables; from memory)', () => {
    const cubic = (ion: string, x: number) =>
      solveCef(getIon(ion), normalizeCefParameters({ B40: 0.01 * x, B60: 0.0001 * (1 - Math.abs(x)) }, { symmetry: 'Oh' }));
    for (const x of [-0.7, 0.4]) {
      const yb = doubletGValues(cubic('Yb3+', x)).map((v) => {
        expect(v[2] - v[0]).toBeLessThan(1e-10); // isotropic
        return v[0];
      });
      expect(yb.sort()).toEqual([expect.closeTo(8 / 3, 10), expect.closeTo(24 / 7, 10)]);
      const er = doubletGValues(cubic('Er3+', x)).map((v) => v[1]);
      expect(er.sort()).toEqual([expect.closeTo(6.0, 10), expect.closeTo(6.8, 10)]);
    }
  });

  it('a pure |±J⟩ ground doublet has g∥ = 2 g_J J and g⊥ = 0 (exact limit): Dy3+ with B20 < 0', () => {
    const dy = getIon('Dy3+');
    const s = solveCef(dy, { B20: -0.5 });
    expect(s.groundDoublet!.gParallel).toBeCloseTo(2 * dy.gJ * dy.J, 12); // 20
    expect(s.groundDoublet!.gPerpendicular).toBeLessThan(1e-12);
    expect(s.groundDoublet!.momentParallelMuB).toBeCloseTo(10, 12);
    expect(s.classification).toBe('Ising');
    const [plus, minus] = describeLevels(s)[0].states;
    expect(plus.components).toEqual([{ m: 7.5, re: expect.closeTo(1, 12), im: expect.closeTo(0, 12), weight: expect.closeTo(1, 12) }]);
    expect(minus.components[0].m).toBe(-7.5);
    expect(plus.ket).toBe('1.000|15/2⟩');
    expect(plus.momentMuB[2]).toBeCloseTo(10, 12);
  });

  it('a non-Kramers doublet on a three-fold axis has g⊥ = 0 (time reversal; Abragam & Bleaney 1970, non-Kramers doublets): Ho3+ and Tb3+ in D3d', () => {
    for (const [ion, B] of [
      ['Ho3+', { B20: -0.05, B40: 2e-4, B43: 3e-3, B60: -1e-6, B63: 2e-5, B66: -3e-5 }],
      ['Tb3+', { B20: -0.4, B40: 4e-3, B43: 2e-2, B60: -2e-5, B63: -1e-4, B66: 1e-4 }],
    ] as const) {
      const s = solveCef(getIon(ion), normalizeCefParameters(B, { symmetry: 'D3d' }));
      expect(s.levels[0].degeneracy, ion).toBe(2);
      const g = s.groundDoublet!;
      expect(g.kramers).toBe(false);
      expect(g.gPerpendicular, ion).toBeLessThan(1e-9);
      expect(g.gParallel, ion).toBeGreaterThan(1);
      // the |±m⟩ content is mixed by B43: not a pure |±J⟩ state, so g∥ < 2 g_J J
      expect(g.gParallel).toBeLessThan(2 * getIon(ion).gJ * getIon(ion).J);
    }
  });

  it('Kramers theorem: every level of an odd-electron ion is even-degenerate for random real parameter sets (all 27 terms)', () => {
    const rng = createRandom(20261202);
    for (const name of ION_NAMES.filter((n) => getIon(n).kramers && getIon(n).L > 0)) {
      for (let trial = 0; trial < 4; trial++) {
        const B: Record<string, number> = {};
        for (const key of CEF_PARAMETER_KEYS) B[key] = rng.normal() * { 2: 0.1, 4: 1e-3, 6: 1e-5 }[Number(key[1])]!;
        const s = solveCef(getIon(name), B, { degeneracyToleranceMeV: 1e-8 });
        for (const level of s.levels) expect(level.degeneracy % 2, `${name} trial ${trial}`).toBe(0);
        expect(s.energiesMeV.length).toBe(2 * getIon(name).J + 1);
      }
    }
  });

  it('a non-Kramers ion with random parameters has only singlets (contrast to the Kramers case)', () => {
    const rng = createRandom(7);
    const B: Record<string, number> = {};
    for (const key of CEF_PARAMETER_KEYS) B[key] = rng.normal() * { 2: 0.1, 4: 1e-3, 6: 1e-5 }[Number(key[1])]!;
    const s = solveCef(getIon('Ho3+'), B);
    expect(s.levels.every((l) => l.degeneracy === 1)).toBe(true);
    expect(s.groundDoublet).toBeNull();
    expect(s.classification).toBe('singlet');
  });
});

describe('solveCef: result shape, options and warnings', () => {
  it('energies ascend from 0, levels cover every state, eigenvectors are orthonormal', () => {
    const s = solveCef(getIon('Dy3+'), { B20: -0.2, B40: 1e-3, B43: 1e-2 });
    expect(s.energiesMeV[0]).toBe(0);
    for (let i = 1; i < s.energiesMeV.length; i++) expect(s.energiesMeV[i]).toBeGreaterThanOrEqual(s.energiesMeV[i - 1]);
    expect(s.levels.flatMap((l) => l.stateIndices).sort((a, b) => a - b)).toEqual(Array.from({ length: 16 }, (_, i) => i));
    const v = s.eigenvectors;
    for (let a = 0; a < 16; a++)
      for (let b = 0; b < 16; b++) {
        let re = 0, im = 0;
        for (let k = 0; k < 16; k++) {
          re += v.re[k * 16 + a] * v.re[k * 16 + b] + v.im[k * 16 + a] * v.im[k * 16 + b];
          im += v.re[k * 16 + a] * v.im[k * 16 + b] - v.im[k * 16 + a] * v.re[k * 16 + b];
        }
        expect(Math.hypot(re - (a === b ? 1 : 0), im)).toBeLessThan(1e-12);
      }
    // the weights of each state sum to 1
    for (const level of describeLevels(s, 0)) for (const st of level.states) expect(st.components.reduce((t, c) => t + c.weight, 0)).toBeCloseTo(1, 12);
  });

  it('warns when the first excited level lies within isolationWarningMeV of the ground doublet', () => {
    const close = solveCef(getIon('Dy3+'), { B20: -0.01 }); // |±13/2⟩ at 0.01·(3·(225−169)/4)… ≈ 0.42 meV
    expect(close.warnings.some((w) => /not well isolated/.test(w))).toBe(true);
    const far = solveCef(getIon('Dy3+'), { B20: -0.5 });
    expect(far.warnings).toEqual([]);
    const custom = solveCef(getIon('Dy3+'), { B20: -0.5 }, { isolationWarningMeV: 100 });
    expect(custom.warnings.length).toBe(1);
    expect(close.summary).toMatch(/^Ising Kramers doublet, g∥ = 20\.000, g⊥ = 0\.000; next level at/);
  });

  it('warns about sixth-order terms for J = 5/2 and treats J = 0 (Eu3+) and Gd3+ (all θ = 0 ⇒ no splitting)', () => {
    const ce = solveCef(getIon('Ce3+'), { B20: 1, B60: 1 });
    expect(ce.warnings.some((w) => /B60 has no effect for J = 2.5/.test(w))).toBe(true);
    const eu = solveCef(getIon('Eu3+'), {});
    expect(Array.from(eu.energiesMeV)).toEqual([0]);
    expect(eu.classification).toBe('singlet');
    const gd = solveCef(getIon('Gd3+'), {});
    expect(gd.levels).toEqual([{ energyMeV: 0, degeneracy: 8, stateIndices: [0, 1, 2, 3, 4, 5, 6, 7] }]);
    expect(gd.classification).toBe('multiplet');
  });

  it('classification thresholds', () => {
    expect(classifyDoublet(20, 0)).toBe('Ising');
    expect(classifyDoublet(2.6, 6.8)).toBe('XY'); // Er-type doublet (g∥ ≈ 2.6, g⊥ ≈ 6.8; from memory)
    expect(classifyDoublet(10 / 7, 10 / 7)).toBe('Heisenberg');
    expect(classifyDoublet(3, 2)).toBe('intermediate');
    expect(classifyDoublet(0, 0)).toBe('nonmagnetic');
  });

  it('rejects bad options and parameters with InputErrors naming the field', () => {
    expect(() => solveCef(getIon('Dy3+'), { B20: Number.NaN })).toThrow(/^B\.B20: got NaN, expected a finite number/);
    expect(() => solveCef(getIon('Dy3+'), { B23: 1 } as never)).toThrow(/^B\.B23:/);
    expect(() => solveCef(getIon('Dy3+'), {}, { degeneracyToleranceMeV: -1 })).toThrow(/^degeneracyToleranceMeV/);
  });
});
