/** Pauli expansion of two-pseudospin Hamiltonians and the projection on the anisotropic form. */
import { describe, it, expect } from 'vitest';
import { zeros } from '@multiplet/physics/linalg';
import { createRandom } from '@multiplet/physics/random';
import {
  bondPhases,
  pyrochloreBond,
  couplingBasis,
  matrixFromCouplings,
  couplingsFromHamiltonian,
  couplingRatios,
  interpretRatios,
} from '@multiplet/physics/exchange';

const SIGMA = [
  [[[0, 0], [1, 0]], [[1, 0], [0, 0]]],
  [[[0, 0], [0, -1]], [[0, 1], [0, 0]]],
  [[[1, 0], [0, 0]], [[0, 0], [-1, 0]]],
] as number[][][][];

/** H = Σ J_ab S^a ⊗ S^b + h·S ⊗ 1 + c (S = σ/2), basis 2p + q. */
function hamiltonian(j: number[][], h: number[], c: number) {
  const m = zeros(4);
  const add = (a: number[][][] | null, b: number[][][] | null, w: number) => {
    for (let p = 0; p < 2; p++)
      for (let q = 0; q < 2; q++)
        for (let r = 0; r < 2; r++)
          for (let s = 0; s < 2; s++) {
            const [xr, xi] = a ? a[p][r] : [p === r ? 1 : 0, 0];
            const [yr, yi] = b ? b[q][s] : [q === s ? 1 : 0, 0];
            m.re[(2 * p + q) * 4 + 2 * r + s] += w * (xr * yr - xi * yi);
            m.im[(2 * p + q) * 4 + 2 * r + s] += w * (xr * yi + xi * yr);
          }
  };
  for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) add(SIGMA[a], SIGMA[b], j[a][b] / 4);
  for (let a = 0; a < 3; a++) add(SIGMA[a], null, h[a] / 2);
  add(null, null, c);
  return m;
}

describe('couplingsFromHamiltonian', () => {
  const phases = bondPhases(pyrochloreBond(10, 0, 2));
  it('the four basis matrices are mutually orthogonal (Frobenius), so the projection is unique', () => {
    const basis = Object.values(couplingBasis(phases));
    for (let i = 0; i < 4; i++)
      for (let k = i + 1; k < 4; k++) {
        let dot = 0;
        for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) dot += basis[i][a][b] * basis[k][a][b];
        expect(Math.abs(dot)).toBeLessThan(1e-14);
      }
  });

  it('round trip: couplings → J_ab → 4×4 Hamiltonian → the same couplings, fields and constant; residual 0', () => {
    const c = { Jzz: 0.3, Jpm: -0.07, Jpmpm: 0.05, Jzpm: -0.11 };
    const h = hamiltonian(matrixFromCouplings(c, phases), [0.01, -0.02, 0.03], 0.5);
    const back = couplingsFromHamiltonian(h, phases, true);
    for (const key of ['Jzz', 'Jpm', 'Jpmpm', 'Jzpm'] as const) expect(back[key]).toBeCloseTo(c[key], 14);
    expect(back.residualMeV).toBeLessThan(1e-14);
    expect(back.fieldIMeV[2]).toBeCloseTo(0.03, 14);
    expect(back.constantMeV).toBeCloseTo(0.5, 14);
  });

  it('a random J_ab: residual = distance to the form; non-Kramers reports J_z± = 0', () => {
    const rng = createRandom(5);
    const j = [0, 1, 2].map(() => [0, 1, 2].map(() => rng.normal()));
    const back = couplingsFromHamiltonian(hamiltonian(j, [0, 0, 0], 0), phases, false);
    expect(back.Jzpm).toBe(0);
    const model = matrixFromCouplings(back, phases);
    let d2 = 0;
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) d2 += (j[a][b] - model[a][b]) ** 2;
    expect(back.residualMeV).toBeCloseTo(Math.sqrt(d2), 12);
    back.matrixLocalMeV.forEach((row, a) => row.forEach((x, b) => expect(x).toBeCloseTo(j[a][b], 13)));
  });

  it('ratios and their reading', () => {
    expect(couplingRatios({ Jzz: 0, Jpm: 1, Jpmpm: 0, Jzpm: 0 }).JpmOverJzz).toBeNull();
    expect(interpretRatios({ Jzz: 1, Jpm: 0.001, Jpmpm: 0, Jzpm: 0 })).toMatch(/Ising limit/);
    expect(interpretRatios({ Jzz: 1, Jpm: 0.05, Jpmpm: 0, Jzpm: 0 })).toMatch(/quantum spin ice/);
    expect(interpretRatios({ Jzz: 1, Jpm: 0.5, Jpmpm: 0, Jzpm: 0 })).toMatch(/Sizeable/);
  });
});
