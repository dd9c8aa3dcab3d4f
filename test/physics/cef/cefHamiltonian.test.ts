import { describe, it, expect } from 'vitest';
import { cefHamiltonian, zeemanHamiltonian, angularMomentumMatrices, CEF_PARAMETER_KEYS } from '@multiplet/physics/cef';
import { multiply, trace, hermiticityError, maxAbsDifference, addScaled, zeros, hermitianEigen } from '@multiplet/physics/linalg';
import { BOHR_MAGNETON_MEV_PER_T } from '@multiplet/physics/units';
import { createRandom } from '@multiplet/physics/random';

describe('angular momentum matrices', () => {
  it('satisfy [Jx, Jy] = i Jz and J² = J(J+1) (exact algebra)', () => {
    for (const J of [0.5, 3, 7.5]) {
      const { Jx, Jy, Jz } = angularMomentumMatrices(J);
      const comm = addScaled(multiply(Jx, Jy), multiply(Jy, Jx), -1);
      const iJz = zeros(Jz.n);
      iJz.im.set(Jz.re);
      expect(maxAbsDifference(comm, iJz)).toBeLessThan(1e-12);
      const j2 = addScaled(addScaled(multiply(Jx, Jx), multiply(Jy, Jy)), multiply(Jz, Jz));
      for (let k = 0; k < Jz.n; k++) expect(j2.re[k * Jz.n + k]).toBeCloseTo(J * (J + 1), 12);
      expect(Jz.re[0]).toBe(J); // basis index 0 is m = +J (DEVELOPERS.md)
    }
  });
});

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

describe('zeemanHamiltonian', () => {
  it('spin 1/2, g = 2, 1 T along z: levels ∓μB, the lower state has ⟨Jz⟩ = +1/2 (moment along the field; DEVELOPERS.md)', () => {
    const h = zeemanHamiltonian(0.5, 2, [0, 0, 1]);
    const { values, vectors } = hermitianEigen(h);
    expect(values[0]).toBeCloseTo(-BOHR_MAGNETON_MEV_PER_T, 15);
    expect(values[1]).toBeCloseTo(BOHR_MAGNETON_MEV_PER_T, 15);
    expect(Math.hypot(vectors.re[0], vectors.im[0])).toBeCloseTo(1, 12); // m = +1/2 component of the ground state
    // μB = 0.0578838 meV/T (CODATA 2018; from memory)
    expect(BOHR_MAGNETON_MEV_PER_T).toBeCloseTo(0.0578838, 7);
  });

  it('splitting of a J multiplet in a field along any direction is g_J μB |B| per step in m (rotational invariance)', () => {
    const e = hermitianEigen(zeemanHamiltonian(7.5, 4 / 3, [0.3, -0.4, 1.2]), { vectors: false }).values;
    const step = (4 / 3) * BOHR_MAGNETON_MEV_PER_T * Math.hypot(0.3, -0.4, 1.2);
    for (let k = 1; k < e.length; k++) expect(e[k] - e[k - 1]).toBeCloseTo(step, 12);
  });

  it('rejects malformed fields', () => {
    expect(() => zeemanHamiltonian(1, 2, [0, 0] as never)).toThrow(/^fieldTesla:/);
  });
});
