/** Microscopic couplings: dipolar energy scale and the coupling matrix. */
import { describe, it, expect } from 'vitest';
import { dipolarEnergyMeV, microscopicCouplingMatrix, pyrochloreBond } from '@multiplet/physics/exchange';
import { KELVIN_IN_MEV } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('dipolarEnergyMeV', () => {
  it('D = μ0 μ²/(4π r_nn³) ≈ 1.41 K for μ = 10 μB, r_nn = 3.54 Å (dipolar spin ice value; from memory)', () => {
    const dK = dipolarEnergyMeV(10, 10, 3.54) / KELVIN_IN_MEV;
    expect(dK).toBeGreaterThan(1.40);
    expect(dK).toBeLessThan(1.42);
  });
  it('scales as μ1 μ2 / r³', () => {
    expect(dipolarEnergyMeV(2, 3, 2) / dipolarEnergyMeV(1, 1, 1)).toBeCloseTo(6 / 8, 14);
  });
});

describe('microscopicCouplingMatrix', () => {
  const bond = pyrochloreBond(10.1);
  it('isotropic + matrix add up; dipolar part is traceless with the bond as the −2D axis', () => {
    const k = microscopicCouplingMatrix({ isotropicMeV: 0.1, matrixMeV: [[0, 0.01, 0], [0, 0, 0], [0, 0, 0.02]] }, bond, 1, 1);
    expect(k[0][0]).toBeCloseTo(0.1, 15);
    expect(k[0][1]).toBeCloseTo(0.01, 15);
    expect(k[2][2]).toBeCloseTo(0.12, 15);
    const d = microscopicCouplingMatrix({ dipolar: true }, bond, 4 / 3, 4 / 3);
    expect(d[0][0] + d[1][1] + d[2][2]).toBeCloseTo(0, 14);
    const r = bond.bondVectorAngstrom, len = Math.hypot(...r);
    let along = 0;
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) along += (r[a] / len) * d[a][b] * (r[b] / len);
    expect(along).toBeCloseTo(-2 * dipolarEnergyMeV(4 / 3, 4 / 3, len), 14);
  });
  it('bad input: wrong matrix shape, non-numeric entry, nothing given', () => {
    expect(() => microscopicCouplingMatrix({ matrixMeV: [[1, 2], [3, 4]] }, bond, 1, 1)).toThrow(/coupling.matrixMeV/);
    expect(() => microscopicCouplingMatrix({ matrixMeV: [[1, 2, 3], [4, 5, 6], [7, 8, 'x']] } as never, bond, 1, 1)).toThrow(/matrixMeV\[2\]\[2\]/);
    expect(() => microscopicCouplingMatrix({}, bond, 1, 1)).toThrow(InputError);
    expect(() => microscopicCouplingMatrix({ isotropicMeV: NaN }, bond, 1, 1)).toThrow(/isotropicMeV/);
  });
});
