/**
 * The loop move for spin ice: a closed directed loop of spins, each pointing head to tail along the loop, is
 * reversed. Reversing it keeps the number of in- and out-pointing spins of every tetrahedron, so it moves between
 * ice states that single flips only reach through costly defects (Melko et al., Phys. Rev. Lett. 87,
 * 067203 (2001); Barkema & Newman, Phys. Rev. E 57, 1155 (1998) for the ice-model loop).
 *
 * Construction ("short loop"): pick a spin uniformly; follow its arrow into a tetrahedron; leave by one of that
 * tetrahedron's outgoing spins chosen uniformly; repeat until a tetrahedron already on the path is reached; the
 * spins from that tetrahedron on form the loop, the tail before it is discarded. Reversing the loop leaves every
 * tetrahedron's number of outgoing spins unchanged, so the probability of proposing the reversed loop from the new
 * state equals that of the forward loop (summed over start spins and tails); the move is accepted with
 * min(1, e^{−βΔE}) on the full energy, which gives detailed balance (checked by exact enumeration in the tests).
 */
import type { SpinIceCouplings } from './spinIceCouplings';
import type { ReplicaState } from './replicaState';

/** Outcome of one loop move: 0 no loop (a tetrahedron without outgoing spin), 1 rejected, 2 accepted. */
export type LoopOutcome = 0 | 1 | 2;

/**
 * Attempt one loop move at inverse temperature β (1/K). Returns 0 (no loop), 1 (rejected), 2 (accepted); on
 * acceptance the spins, fields and energy of the replica are updated.
 * @example loopMove(couplings, replica, 1 / 0.2)
 * See also: metropolisSweep
 */
export function loopMove(c: SpinIceCouplings, r: ReplicaState, betaPerK: number): LoopOutcome {
  const N = c.numberOfSites;
  const s = r.spins;
  const F = r.fieldsK;
  const rng = r.random;
  const up = c.cell.upTetrahedron;
  const down = c.cell.downTetrahedron;
  const tet = c.cell.tetrahedronSites;
  const nUp = c.cell.numberOfTetrahedra / 2;
  const path = r.pathSpins;
  const stampArr = r.visitStamp;
  const posArr = r.visitPosition;
  r.stamp++;
  if (r.stamp === 0x7fffffff) {
    stampArr.fill(0);
    r.siteStamp.fill(0);
    r.stamp = 1;
  }
  const stamp = r.stamp;
  // σ = +1 points out of the up tetrahedron into the down one.
  let spin = rng.nextInt(N);
  const from = s[spin] > 0 ? up[spin] : down[spin];
  let to = s[spin] > 0 ? down[spin] : up[spin];
  stampArr[from] = stamp;
  posArr[from] = 0;
  path[0] = spin;
  let len = 1;
  let loopStart = -1;
  for (;;) {
    if (stampArr[to] === stamp) {
      loopStart = posArr[to];
      break;
    }
    stampArr[to] = stamp;
    posArr[to] = len;
    // Outgoing spins of tetrahedron `to`: σ = +1 on an up tetrahedron, σ = −1 on a down tetrahedron.
    const want = to < nUp ? 1 : -1;
    let nOut = 0;
    for (let k = 0; k < 4; k++) if (s[tet[4 * to + k]] === want) nOut++;
    if (nOut === 0) return 0;
    let pick = rng.nextInt(nOut);
    let next = -1;
    for (let k = 0; k < 4; k++) {
      const site = tet[4 * to + k];
      if (s[site] === want) {
        if (pick === 0) {
          next = site;
          break;
        }
        pick--;
      }
    }
    spin = next;
    to = s[spin] > 0 ? down[spin] : up[spin];
    path[len++] = spin;
  }
  // ΔE of flipping the set S = path[loopStart..len): −2 Σ σ_i F_i + 4 Σ_{i<j∈S} J_ij σ_i σ_j.
  let dE = 0;
  for (let a = loopStart; a < len; a++) dE -= 2 * s[path[a]] * F[path[a]];
  if (c.dense) {
    const J = c.dense;
    for (let a = loopStart; a < len; a++) {
      const i = path[a];
      const row = i * N;
      let h = 0;
      for (let b = a + 1; b < len; b++) h += J[row + path[b]] * s[path[b]];
      dE += 4 * s[i] * h;
    }
  } else {
    // Mark the loop's sites, then scan each one's neighbours: every coupled pair inside the loop is seen twice.
    const mark = r.siteStamp;
    for (let a = loopStart; a < len; a++) mark[path[a]] = stamp;
    for (let a = loopStart; a < len; a++) {
      const i = path[a];
      let h = 0;
      for (let p = c.offsets[i]; p < c.offsets[i + 1]; p++) {
        const j = c.neighbours[p];
        if (mark[j] === stamp) h += c.values[p] * s[j];
      }
      dE += 2 * s[i] * h;
    }
  }
  if (!(dE <= 0 || rng.next() < Math.exp(-betaPerK * dE))) return 1;
  for (let a = loopStart; a < len; a++) {
    const i = path[a];
    const twoS = -2 * s[i];
    s[i] = -s[i];
    if (r.kernel) r.kernel.addRow(r.kernelIndex, i, twoS);
    else if (c.dense) {
      const J = c.dense;
      const row = i * N;
      for (let j = 0; j < N; j++) F[j] += twoS * J[row + j];
    } else {
      for (let p = c.offsets[i]; p < c.offsets[i + 1]; p++) F[c.neighbours[p]] += twoS * c.values[p];
    }
  }
  r.energyK += dE;
  return 2;
}
