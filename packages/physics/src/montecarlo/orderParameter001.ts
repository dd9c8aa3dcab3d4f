/**
 * Order parameter of the q = (001) ordered state of dipolar spin ice (Melko et al., PRL 87, 067203
 * (2001): the low-temperature state selected by the long-range dipolar interaction has ordering wavevector
 * (0,0,1)·2π/a or its cubic equivalents).
 *
 * For each sublattice μ and each X point q ∈ {(1,0,0), (0,1,0), (0,0,1)}·2π/a,
 *   m_μ(q) = (4/N) Σ_{i∈μ} σ_i e^{i q·r_i},   ψ = [ (1/4) Σ_μ Σ_q |m_μ(q)|² ]^{1/2}.
 * ψ = 1 when each sublattice is fully modulated at one X point (the ordered state; checked against the exact
 * ground state of an L = 1 cell in the tests) and ψ ~ N^{−1/2} in the paramagnet.
 */
import type { PyrochloreSupercell } from '../lattice/supercell';

// e^{i q·r} for q = 2π/a along one axis and r = g·a/4: e^{iπg/2} cycles through 1, i, −1, −i.
const COS = [1, 0, -1, 0];
const SIN = [0, 1, 0, -1];

/**
 * ψ of the q = (001) state for one configuration (dimensionless, 0..1).
 * @example orderParameter001(cell, spins) // ≈ 1 in the ordered state
 * See also: runSpinIceMonteCarlo
 */
export function orderParameter001(cell: PyrochloreSupercell, spins: Int8Array): number {
  const N = cell.numberOfSites;
  const g = cell.quarterCellCoordinates;
  let total = 0;
  for (let axis = 0; axis < 3; axis++) {
    const re = [0, 0, 0, 0];
    const im = [0, 0, 0, 0];
    for (let i = 0; i < N; i++) {
      const ph = g[3 * i + axis] & 3;
      const mu = cell.sublattice[i];
      re[mu] += spins[i] * COS[ph];
      im[mu] += spins[i] * SIN[ph];
    }
    for (let mu = 0; mu < 4; mu++) total += (re[mu] * re[mu] + im[mu] * im[mu]) * (16 / (N * N));
  }
  return Math.sqrt(total / 4);
}
