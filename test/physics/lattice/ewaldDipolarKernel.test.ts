import { describe, it, expect } from 'vitest';
import { ewaldDipolarKernel } from '@multiplet/physics/lattice/ewaldDipolarKernel';
import { pyrochloreSupercell } from '@multiplet/physics/lattice/supercell';
import { pyrochloreDipolarMatrix, DIPOLAR_K_A3_PER_MUB2 } from '@multiplet/physics/lattice/pyrochloreDipolarMatrix';
import { createRandom } from '@multiplet/physics/random';

/** Ising dipolar energy ½ Σ_ij σ_i σ_j ẑ_i·W·ẑ_j in Å⁻³ units (moment 1) for a configuration. */
function ewaldEnergy(alphaTimesBox: number, sigma: number[], cell = pyrochloreSupercell(1, 10)) {
  const B = cell.L * cell.latticeConstantAngstrom;
  const k = ewaldDipolarKernel(B, { alphaPerAngstrom: alphaTimesBox / B });
  const W = new Float64Array(6);
  const p = cell.positionsAngstrom;
  const z = cell.localAxes;
  let e = 0;
  for (let i = 0; i < cell.numberOfSites; i++)
    for (let j = 0; j < cell.numberOfSites; j++) {
      k.tensor(p[3 * j] - p[3 * i], p[3 * j + 1] - p[3 * i + 1], p[3 * j + 2] - p[3 * i + 2], W);
      const a = [z[3 * i], z[3 * i + 1], z[3 * i + 2]];
      const b = [z[3 * j], z[3 * j + 1], z[3 * j + 2]];
      const wb = [W[0] * b[0] + W[3] * b[1] + W[4] * b[2], W[3] * b[0] + W[1] * b[1] + W[5] * b[2], W[4] * b[0] + W[5] * b[1] + W[2] * b[2]];
      e += 0.5 * sigma[i] * sigma[j] * (a[0] * wb[0] + a[1] * wb[1] + a[2] * wb[2]);
    }
  return e;
}

describe('ewaldDipolarKernel', () => {
  const rng = createRandom(7);
  const sigma = Array.from({ length: 16 }, () => (rng.next() < 0.5 ? -1 : 1));

  it('energy of a random configuration does not depend on the splitting parameter (1e-8 relative)', () => {
    const e1 = ewaldEnergy(4.5, sigma);
    const e2 = ewaldEnergy(6, sigma);
    const e3 = ewaldEnergy(8, sigma);
    expect(Math.abs(e1 - e2) / Math.abs(e2)).toBeLessThan(1e-8);
    expect(Math.abs(e3 - e2) / Math.abs(e2)).toBeLessThan(1e-8);
  });

  it('matches a direct spherical sum over images plus the surface term (2π/3V)|M|² (de Leeuw, Perram & Smith 1980)', () => {
    const cell = pyrochloreSupercell(1, 10);
    const B = 10;
    const p = cell.positionsAngstrom;
    const z = cell.localAxes;
    const m = (i: number) => [sigma[i] * z[3 * i], sigma[i] * z[3 * i + 1], sigma[i] * z[3 * i + 2]];
    const M = [0, 1, 2].map((c) => sigma.reduce((s, _, i) => s + m(i)[c], 0));
    // Direct sum over whole image cells inside a sphere |n| ≤ R (each image cell is summed as a unit).
    const direct = (R: number) => {
      let e = 0;
      for (let nx = -R; nx <= R; nx++)
        for (let ny = -R; ny <= R; ny++)
          for (let nz = -R; nz <= R; nz++) {
            if (nx * nx + ny * ny + nz * nz > R * R) continue;
            for (let i = 0; i < 16; i++)
              for (let j = 0; j < 16; j++) {
                if (nx === 0 && ny === 0 && nz === 0 && i === j) continue;
                const r = [p[3 * j] - p[3 * i] + nx * B, p[3 * j + 1] - p[3 * i + 1] + ny * B, p[3 * j + 2] - p[3 * i + 2] + nz * B];
                const r2 = r[0] ** 2 + r[1] ** 2 + r[2] ** 2;
                const mi = m(i), mj = m(j);
                const mimj = mi[0] * mj[0] + mi[1] * mj[1] + mi[2] * mj[2];
                const mir = mi[0] * r[0] + mi[1] * r[1] + mi[2] * r[2];
                const mjr = mj[0] * r[0] + mj[1] * r[1] + mj[2] * r[2];
                e += 0.5 * (mimj / (r2 * Math.sqrt(r2)) - (3 * mir * mjr) / (r2 * r2 * Math.sqrt(r2)));
              }
          }
      return e;
    };
    const ewaldVacuum = ewaldEnergy(6, sigma) + ((2 * Math.PI) / (3 * B ** 3)) * (M[0] ** 2 + M[1] ** 2 + M[2] ** 2);
    const d = direct(24);
    expect(Math.abs(d - ewaldVacuum) / Math.abs(ewaldVacuum)).toBeLessThan(1e-5);
    // ... and the surface term matters: without it (conducting boundary) the two differ by far more.
    expect(Math.abs(d - ewaldEnergy(6, sigma)) / Math.abs(ewaldVacuum)).toBeGreaterThan(1e-3);
  });

  it('a simple cubic lattice of parallel dipoles feels the Lorentz field 4π/3 · m/a³ (conducting boundary)', () => {
    // Kittel, Introduction to Solid State Physics, ch. 16: cubic site, sum over the Lorentz sphere vanishes.
    const a = 4.2;
    const W = new Float64Array(6);
    ewaldDipolarKernel(a).tensor(0, 0, 0, W);
    expect(W[2] / ((-4 * Math.PI) / 3 / a ** 3)).toBeCloseTo(1, 10);
    expect(W[0]).toBeCloseTo(W[2], 12);
    expect(Math.abs(W[3]) + Math.abs(W[4]) + Math.abs(W[5])).toBeLessThan(1e-12);
    // the same from a 2×2×2 box (8 sites): Σ_j W(r_j) = −4π/3a³ on the diagonal
    const k2 = ewaldDipolarKernel(2 * a);
    let sum = 0;
    for (let n = 0; n < 8; n++) {
      k2.tensor((n & 1) * a, ((n >> 1) & 1) * a, ((n >> 2) & 1) * a, W);
      sum += W[2];
    }
    expect(sum / ((-4 * Math.PI) / 3 / a ** 3)).toBeCloseTo(1, 10);
  });

  it('pyrochlore dipolar matrix is symmetric and its nearest-neighbour element tends to D_nn = 5D/3 of the bare dipole sum', () => {
    const cell = pyrochloreSupercell(2, 10.124);
    const d = pyrochloreDipolarMatrix(cell, 10);
    const N = cell.numberOfSites;
    for (let i = 0; i < N; i += 7) for (let j = 0; j < N; j += 5) expect(d.matrixK[i * N + j]).toBeCloseTo(d.matrixK[j * N + i], 10);
    expect(d.couplingDK).toBeCloseTo((DIPOLAR_K_A3_PER_MUB2 * 100) / ((10.124 * Math.SQRT2) / 4) ** 3, 12);
    // Nearest neighbours 0 and 1: the bare pair term is (5/3) D (PRL 84, 3430 (2000)); the Ewald value adds
    // the images, a small correction.
    expect(d.matrixK[1] / ((5 / 3) * d.couplingDK)).toBeGreaterThan(0.97);
    expect(d.matrixK[1] / ((5 / 3) * d.couplingDK)).toBeLessThan(1.03);
  });
});
