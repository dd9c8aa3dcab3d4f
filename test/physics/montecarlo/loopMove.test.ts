import { describe, it, expect } from 'vitest';
import { spinIceCouplings } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { createReplica, refreshReplica } from '@multiplet/physics/montecarlo/replicaState';
import { loopMove } from '@multiplet/physics/montecarlo/loopMove';
import { createRandom } from '@multiplet/physics/random';

describe('loopMove', () => {
  it('obeys detailed balance: sampled frequencies of the 16-spin ice states match exp(−E/T) (exact enumeration)', () => {
    // Non-degenerate energies among the ice states: further-neighbour exchange and a low-symmetry field.
    const c = spinIceCouplings({
      L: 1, latticeConstantAngstrom: 10, momentMuB: 1, dipolar: false,
      exchangeK: { J1: -3, J2: 0.3, J3a: -0.25, J3b: 0.15 }, fieldTesla: [0.1, 0.25, 0.4],
    });
    const N = c.numberOfSites;
    const T = 0.4;
    const tet = c.cell.tetrahedronSites;
    const nUp = c.cell.numberOfTetrahedra / 2;
    const isIce = (s: Int8Array) => {
      for (let t = 0; t < c.cell.numberOfTetrahedra; t++) {
        let q = 0;
        for (let k = 0; k < 4; k++) q += s[tet[4 * t + k]];
        if (q !== 0) return false;
      }
      return true;
    };
    const rep = createReplica(c, createRandom(5));
    const energies = new Map<number, number>();
    const spins = new Int8Array(N);
    for (let code = 0; code < 1 << N; code++) {
      for (let i = 0; i < N; i++) spins[i] = (code >> i) & 1 ? 1 : -1;
      if (!isIce(spins)) continue;
      rep.spins.set(spins);
      refreshReplica(c, rep);
      energies.set(code, rep.energyK);
    }
    expect(energies.size).toBeGreaterThan(20);
    expect(nUp).toBe(4);
    // Start from the first ice state and sample with loop moves only.
    const start = energies.keys().next().value as number;
    for (let i = 0; i < N; i++) rep.spins[i] = (start >> i) & 1 ? 1 : -1;
    refreshReplica(c, rep);
    const counts = new Map<number, number>();
    const moves = 300000;
    for (let m = 0; m < moves; m++) {
      loopMove(c, rep, 1 / T);
      let code = 0;
      for (let i = 0; i < N; i++) if (rep.spins[i] > 0) code |= 1 << i;
      counts.set(code, (counts.get(code) ?? 0) + 1);
    }
    for (const code of counts.keys()) expect(energies.has(code)).toBe(true);
    const emin = Math.min(...energies.values());
    let Z = 0;
    for (const e of energies.values()) Z += Math.exp(-(e - emin) / T);
    let tv = 0;
    let checked = 0;
    for (const [code, e] of energies) {
      const p = Math.exp(-(e - emin) / T) / Z;
      const f = (counts.get(code) ?? 0) / moves;
      tv += 0.5 * Math.abs(p - f);
      if (p > 0.03) {
        expect(Math.abs(f - p) / p).toBeLessThan(0.1);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(2);
    expect(tv).toBeLessThan(0.03);
    // the running energy stayed equal to a fresh evaluation
    const e = rep.energyK;
    refreshReplica(c, rep);
    expect(rep.energyK).toBeCloseTo(e, 9);
  });
});
