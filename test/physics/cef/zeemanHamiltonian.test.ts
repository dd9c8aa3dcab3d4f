import { describe, it, expect } from 'vitest';
import { zeemanHamiltonian } from '@multiplet/physics/cef';
import { hermitianEigen } from '@multiplet/physics/linalg';
import { BOHR_MAGNETON_MEV_PER_T } from '@multiplet/physics/units';

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
