/**
 * Single-crystal magnetic diffuse scattering of Ising configurations on a pyrochlore supercell, in absolute units:
 *   I(Q) per ion = (γ r0/2)² f(Q)² ⟨|F⊥(Q)|²⟩ / N,  F(Q) = μ Σ_i σ_i ẑ_i e^{iQ·r_i},  F⊥ = F − Q̂(Q̂·F)
 * (Squires (1978) ch. 7: only the moment component perpendicular to Q scatters). Q values commensurate with the
 * supercell (multiples of 2π/(L a) along each axis) are exact for the periodic system; others interpolate.
 */
import type { PyrochloreSupercell } from '../lattice/supercell';
import { MAGNETIC_PREFACTOR_MB } from '../units';
import { InputError } from '../errors';

/**
 * I(Q) in barn/sr per ion at wavevectors q (xyz interleaved, Å⁻¹, cubic axes), averaged over configurations.
 * @example singleCrystalIntensity(cell, snapshots, hhlPlaneWavevectors(10.1, 4, 4, 33).q, 10)
 * See also: hhlPlaneWavevectors, powderIntensity
 */
export function singleCrystalIntensity(
  cell: PyrochloreSupercell,
  configurations: readonly Int8Array[],
  qInvAngstrom: Float64Array,
  momentMuB: number,
  formFactor: (qInvAngstrom: number) => number = () => 1,
): Float64Array {
  if (configurations.length === 0) throw new InputError('configurations', 0, 'at least one spin configuration');
  if (!(momentMuB > 0)) throw new InputError('momentMuB', momentMuB, 'a positive moment in μB');
  const N = cell.numberOfSites;
  const nq = qInvAngstrom.length / 3;
  const out = new Float64Array(nq);
  const p = cell.positionsAngstrom;
  const z = cell.localAxes;
  const pref = ((MAGNETIC_PREFACTOR_MB / 1000) * momentMuB * momentMuB) / (N * configurations.length);
  const cosT = new Float64Array(N);
  const sinT = new Float64Array(N);
  for (let k = 0; k < nq; k++) {
    const qx = qInvAngstrom[3 * k], qy = qInvAngstrom[3 * k + 1], qz = qInvAngstrom[3 * k + 2];
    const q = Math.hypot(qx, qy, qz);
    for (let i = 0; i < N; i++) {
      const ph = qx * p[3 * i] + qy * p[3 * i + 1] + qz * p[3 * i + 2];
      cosT[i] = Math.cos(ph);
      sinT[i] = Math.sin(ph);
    }
    let sum = 0;
    for (const s of configurations) {
      if (s.length !== N) throw new InputError('configurations', s.length, `${N} spins per configuration`);
      let fxr = 0, fxi = 0, fyr = 0, fyi = 0, fzr = 0, fzi = 0;
      for (let i = 0; i < N; i++) {
        const c = s[i] * cosT[i], sn = s[i] * sinT[i];
        fxr += z[3 * i] * c; fxi += z[3 * i] * sn;
        fyr += z[3 * i + 1] * c; fyi += z[3 * i + 1] * sn;
        fzr += z[3 * i + 2] * c; fzi += z[3 * i + 2] * sn;
      }
      let t = fxr * fxr + fxi * fxi + fyr * fyr + fyi * fyi + fzr * fzr + fzi * fzi;
      if (q > 0) {
        const pr = (qx * fxr + qy * fyr + qz * fzr) / q, pi = (qx * fxi + qy * fyi + qz * fzi) / q;
        t -= pr * pr + pi * pi;
      }
      sum += t;
    }
    const f = q > 0 ? formFactor(q) : 1;
    out[k] = pref * sum * f * f;
  }
  return out;
}

/**
 * Wavevectors of the (h h l) plane: Q = (2π/a)(h, h, l) on an n×n grid with h, l ∈ [−max, max] (r.l.u.).
 * @example hhlPlaneWavevectors(10.1, 3, 3, 25) // { h, l, q } with q xyz interleaved in Å⁻¹
 */
export function hhlPlaneWavevectors(latticeConstantAngstrom: number, hMax: number, lMax: number, points: number): { h: number[]; l: number[]; q: Float64Array } {
  if (!(latticeConstantAngstrom > 0)) throw new InputError('latticeConstantAngstrom', latticeConstantAngstrom, 'a positive length in Å');
  if (!Number.isInteger(points) || points < 2 || points > 401) throw new InputError('points', points, 'an integer from 2 to 401');
  if (!(hMax > 0) || !(lMax > 0)) throw new InputError('hMax', [hMax, lMax], 'positive ranges in r.l.u.');
  const h = Array.from({ length: points }, (_, k) => -hMax + (2 * hMax * k) / (points - 1));
  const l = Array.from({ length: points }, (_, k) => -lMax + (2 * lMax * k) / (points - 1));
  const q = new Float64Array(3 * points * points);
  const s = (2 * Math.PI) / latticeConstantAngstrom;
  for (let a = 0; a < points; a++)
    for (let b = 0; b < points; b++) {
      const k = a * points + b;
      q[3 * k] = s * h[a];
      q[3 * k + 1] = s * h[a];
      q[3 * k + 2] = s * l[b];
    }
  return { h, l, q };
}
