import { describe, it, expect } from 'vitest';
import { pyrochloreSupercell } from '@multiplet/physics/lattice/supercell';
import { pairTable, pairCorrelationShells } from '@multiplet/physics/scattering/pairCorrelationShells';
import { powderIntensity } from '@multiplet/physics/scattering/powderIntensity';
import { singleCrystalIntensity } from '@multiplet/physics/scattering/singleCrystalIntensity';
import { clusterPowderIntensity, clusterSingleCrystalIntensity } from '@multiplet/physics/scattering/clusterIntensity';
import { lebedevGrid } from '@multiplet/physics/quadrature';
import { createRandom } from '@multiplet/physics/random';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';

const pref = MAGNETIC_PREFACTOR_MB / 1000; // (γ r0/2)² in barn

describe('powder and single-crystal scattering', () => {
  it('uncorrelated Ising spins: powder S(Q) per spin = (2/3) μ² at every Q (and the single crystal too, any Q)', () => {
    const cell = pyrochloreSupercell(2, 10);
    const rng = createRandom(21);
    const configs = Array.from({ length: 400 }, () => Int8Array.from({ length: cell.numberOfSites }, () => (rng.next() < 0.5 ? -1 : 1)));
    const shells = pairCorrelationShells(pairTable(cell), configs);
    const Q = [0.3, 0.8, 1.3, 2.1, 3.4];
    const I = powderIntensity(shells, Q, 10);
    for (const v of I) expect(Math.abs(v / (pref * 100 * (2 / 3)) - 1)).toBeLessThan(0.05);
    // Single crystal: Σ_μ (ẑ_μ·Q̂)² = 4/3 for the four ⟨111⟩ axes, so ⟨|m⊥|²⟩ = (2/3) μ² for every Q direction.
    const q = Float64Array.of(0.7, 0.2, 0.1, 1.1, 1.1, 0.4, 0, 0, 2.3);
    const Isc = singleCrystalIntensity(cell, configs, q, 10);
    for (const v of Isc) expect(Math.abs(v / (pref * 100 * (2 / 3)) - 1)).toBeLessThan(0.12);
  });

  it('Blech–Averbach equals the numerical orientation average of the single-crystal intensity (Lebedev 5810 points)', () => {
    const cell = pyrochloreSupercell(1, 10.1);
    const rng = createRandom(3);
    const N = cell.numberOfSites;
    const m = new Float64Array(3 * N);
    for (let i = 0; i < N; i++) {
      const s = rng.next() < 0.5 ? -7 : 7;
      for (let c = 0; c < 3; c++) m[3 * i + c] = s * cell.localAxes[3 * i + c];
    }
    const grid = lebedevGrid(131);
    for (const Q of [0.4, 1.2, 2.5]) {
      const qs = new Float64Array(3 * grid.count);
      for (let k = 0; k < 3 * grid.count; k++) qs[k] = Q * grid.directions[k];
      const sc = clusterSingleCrystalIntensity(cell.positionsAngstrom, m, qs);
      let avg = 0;
      for (let k = 0; k < grid.count; k++) avg += grid.weights[k] * sc[k];
      const ba = clusterPowderIntensity(cell.positionsAngstrom, m, [Q])[0];
      expect(Math.abs(avg - ba) / ba).toBeLessThan(1e-8);
    }
  });

  it('ordered ferromagnetic-like pair correlations change the powder pattern (pair terms enter)', () => {
    const cell = pyrochloreSupercell(1, 10);
    const allUp = [Int8Array.from({ length: 16 }, () => 1)];
    const I = powderIntensity(pairCorrelationShells(pairTable(cell), allUp), [0.5, 1.0], 1);
    expect(Math.abs(I[0] / (pref * (2 / 3)) - 1)).toBeGreaterThan(0.05);
  });
});
