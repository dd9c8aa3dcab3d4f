import { describe, it, expect } from 'vitest';
import { cefHamiltonian, CEF_PARAMETER_KEYS } from '@multiplet/physics/cef';
import { trace, hermiticityError } from '@multiplet/physics/linalg';
import { createRandom } from '@multiplet/physics/random';

describe('cefHamiltonian', () => {
  it('is Hermitian and traceless for random parameter sets (Tr O_n^m = 0)', () => {
    const rng = createRandom(3);
    for (const J of [2.5, 6, 8]) {
      const B: Record<string, number> = {};
      for (const key of CEF_PARAMETER_KEYS) B[key] = rng.normal();
      const h = cefHamiltonian(J, B);
      expect(hermiticityError(h)).toBeLessThan(1e-9);
      const scale = Math.max(...Array.from(h.re, Math.abs));
      expect(Math.abs(trace(h)[0]) / scale).toBeLessThan(1e-12);
    }
  });

  it('B20 alone gives E(m) = B20 (3m² − J(J+1)) (Stevens 1952)', () => {
    const h = cefHamiltonian(4, { B20: -0.3 });
    for (let k = 0; k < 9; k++) expect(h.re[k * 9 + k]).toBeCloseTo(-0.3 * (3 * (4 - k) ** 2 - 20), 12);
  });

  it('does not share state between calls (operators are cached, results are fresh)', () => {
    const a = cefHamiltonian(3, { B40: 1 });
    a.re.fill(0);
    expect(Math.max(...Array.from(cefHamiltonian(3, { B40: 1 }).re, Math.abs))).toBeGreaterThan(0);
  });

  it('rejects bad keys and values', () => {
    expect(() => cefHamiltonian(3, { B8: 1 })).toThrow(/^B\.B8:/);
    expect(() => cefHamiltonian(3, { B20: Number.POSITIVE_INFINITY })).toThrow(/^B\.B20:/);
    expect(() => cefHamiltonian(1.25, { B20: 1 })).toThrow(/^J:/);
  });
});
