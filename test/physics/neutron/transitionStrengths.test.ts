import { describe, expect, it } from 'vitest';
import { transitionStrengths } from '@multiplet/physics/neutron/transitionStrengths';
import { cefHamiltonian } from '@multiplet/physics/cef/cefHamiltonian';
import { hermitianEigen } from '@multiplet/physics/linalg/hermitianEigen';
import { createRandom } from '@multiplet/physics/random';
import { CEF_PARAMETER_KEYS } from '@multiplet/physics/cef/parameterKeys';
import { InputError } from '@multiplet/physics/errors';

function randomEigenvectors(J: number, seed: number) {
  const rng = createRandom(seed);
  const b: Record<string, number> = {};
  for (const key of CEF_PARAMETER_KEYS) b[key] = rng.normal() * (key.startsWith('B2') ? 0.1 : key.startsWith('B4') ? 1e-3 : 1e-5);
  return hermitianEigen(cefHamiltonian(J, b)).vectors;
}

describe('transitionStrengths', () => {
  for (const J of [2.5, 4, 7.5, 8]) {
    it(`sum rule Σ_j Σ_α |⟨j|J_α|i⟩|² = J(J+1) for every state, and powder = 2/3 of it (J = ${J})`, () => {
      const v = randomEigenvectors(J, 100 + 2 * J);
      const { n, strengths, totalSquares } = transitionStrengths(J, v);
      for (let i = 0; i < n; i++) {
        let total = 0;
        let powder = 0;
        for (let j = 0; j < n; j++) {
          total += totalSquares[j * n + i];
          powder += strengths[j * n + i];
        }
        expect(total).toBeCloseTo(J * (J + 1), 10);
        expect(powder).toBeCloseTo((2 / 3) * J * (J + 1), 10);
      }
    });
  }

  it('single-crystal strengths averaged over three orthogonal Q directions equal the powder average', () => {
    const J = 7.5;
    const v = randomEigenvectors(J, 5);
    const powder = transitionStrengths(J, v).strengths;
    // an arbitrary orthonormal triad
    const a = [1, 2, 2].map((x) => x / 3), b = [2, 1, -2].map((x) => x / 3), c = [2, -2, 1].map((x) => x / 3);
    const s = [a, b, c].map((q) => transitionStrengths(J, v, { qDirection: q as [number, number, number] }).strengths);
    for (let k = 0; k < powder.length; k++) expect((s[0][k] + s[1][k] + s[2][k]) / 3).toBeCloseTo(powder[k], 10);
  });

  it('with Q ∥ z only J_x, J_y transitions count: a pure |m⟩ basis gives Δm = ±1 lines only', () => {
    const J = 2.5;
    const identity = hermitianEigen(cefHamiltonian(J, { B20: 1 })).vectors; // diagonal H: eigenvectors are |m⟩
    const { n, strengths } = transitionStrengths(J, identity, { qDirection: [0, 0, 1] });
    for (let i = 0; i < n; i++) expect(strengths[i * n + i]).toBeCloseTo(0, 12); // Jz elastic part is ∥ Q: invisible
  });

  it('rejects a zero Q direction', () => {
    expect(() => transitionStrengths(0.5, randomEigenvectors(0.5, 1), { qDirection: [0, 0, 0] })).toThrow(InputError);
  });
});
