import { describe, it, expect } from 'vitest';
import { spinIceCouplings } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { orderParameter001 } from '@multiplet/physics/montecarlo/orderParameter001';
import { createRandom } from '@multiplet/physics/random';

describe('orderParameter001', () => {
  it('is 1 in the exact ground state of dipolar spin ice on one cubic cell (enumeration of 2^16 states)', () => {
    // Dipolar spin ice (a dysprosium pyrochlore: J_nn = −1.24 K, D_nn = 2.35 K; PRL 84, 3430 (2000)) orders with
    // q = (001) (Melko et al. 2001); that state fits in one cubic cell.
    const c = spinIceCouplings({ L: 1, latticeConstantAngstrom: 10.124, momentMuB: 10, exchangeK: { J1: 3.72 }, dipolar: true });
    const J = c.dense!;
    const N = 16;
    let best = Infinity;
    let bestCodes: number[] = [];
    for (let code = 0; code < 1 << N; code++) {
      let e = 0;
      for (let i = 0; i < N; i++) {
        const si = (code >> i) & 1 ? 1 : -1;
        for (let j = i + 1; j < N; j++) e += J[i * N + j] * si * ((code >> j) & 1 ? 1 : -1);
      }
      if (e < best - 1e-9) {
        best = e;
        bestCodes = [code];
      } else if (Math.abs(e - best) < 1e-9) bestCodes.push(code);
    }
    const spins = new Int8Array(N);
    for (const code of bestCodes) {
      for (let i = 0; i < N; i++) spins[i] = (code >> i) & 1 ? 1 : -1;
      expect(orderParameter001(c.cell, spins)).toBeCloseTo(1, 12);
      // two in, two out on every tetrahedron
      for (let t = 0; t < c.cell.numberOfTetrahedra; t++) {
        let q = 0;
        for (let k = 0; k < 4; k++) q += spins[c.cell.tetrahedronSites[4 * t + k]];
        expect(q).toBe(0);
      }
    }
    // Random spins on a larger cell give a small value.
    const big = spinIceCouplings({ L: 3, latticeConstantAngstrom: 10, momentMuB: 1, dipolar: false });
    const rng = createRandom(1);
    const rnd = Int8Array.from({ length: big.numberOfSites }, () => (rng.next() < 0.5 ? -1 : 1));
    expect(orderParameter001(big.cell, rnd)).toBeLessThan(0.25);
  });
});
