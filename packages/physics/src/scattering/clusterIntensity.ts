/**
 * Magnetic scattering of a finite set of classical moments (no periodicity), single crystal and powder:
 *   single crystal: I(Q) = (γ r0/2)² Σ_ij (m_i⊥·m_j⊥) e^{iQ·(r_j − r_i)} / N = (γ r0/2)² (|F|² − |Q̂·F|²)/N,
 *     F(Q) = Σ_i m_i e^{iQ·r_i}, m⊥ = m − Q̂(Q̂·m)  (Squires, Introduction to the Theory of Thermal Neutron
 *     Scattering (1978), ch. 7);
 *   powder: the Blech–Averbach average of the same double sum over Q directions (Blech & Averbach 1964):
 *     Σ_ij [ (m_i·m_j − (m_i·r̂)(m_j·r̂)) j0(Qr) + (3 (m_i·r̂)(m_j·r̂) − m_i·m_j) j1(Qr)/(Qr) ] / N, i = j terms (2/3)|m_i|².
 * Units: barn/sr per moment, moments in μB, positions in Å, Q in Å⁻¹ (form factor not included).
 */
import { MAGNETIC_PREFACTOR_MB } from '../units';

/**
 * Single-crystal intensity at the wavevectors `q` (xyz interleaved, Å⁻¹) of moments `m` (μB, xyz) at `r` (Å, xyz).
 * @example clusterSingleCrystalIntensity(r, m, Float64Array.of(1, 0, 0))
 * See also: clusterPowderIntensity, singleCrystalIntensity
 */
export function clusterSingleCrystalIntensity(positionsAngstrom: Float64Array, momentsMuB: Float64Array, qInvAngstrom: Float64Array): Float64Array {
  const n = positionsAngstrom.length / 3;
  const nq = qInvAngstrom.length / 3;
  const out = new Float64Array(nq);
  const pref = MAGNETIC_PREFACTOR_MB / 1000;
  for (let k = 0; k < nq; k++) {
    const qx = qInvAngstrom[3 * k], qy = qInvAngstrom[3 * k + 1], qz = qInvAngstrom[3 * k + 2];
    const q = Math.hypot(qx, qy, qz);
    let fxr = 0, fxi = 0, fyr = 0, fyi = 0, fzr = 0, fzi = 0;
    for (let i = 0; i < n; i++) {
      const ph = qx * positionsAngstrom[3 * i] + qy * positionsAngstrom[3 * i + 1] + qz * positionsAngstrom[3 * i + 2];
      const c = Math.cos(ph), s = Math.sin(ph);
      fxr += momentsMuB[3 * i] * c; fxi += momentsMuB[3 * i] * s;
      fyr += momentsMuB[3 * i + 1] * c; fyi += momentsMuB[3 * i + 1] * s;
      fzr += momentsMuB[3 * i + 2] * c; fzi += momentsMuB[3 * i + 2] * s;
    }
    let total = fxr * fxr + fxi * fxi + fyr * fyr + fyi * fyi + fzr * fzr + fzi * fzi;
    if (q > 0) {
      const ux = qx / q, uy = qy / q, uz = qz / q;
      const pr = ux * fxr + uy * fyr + uz * fzr, pi = ux * fxi + uy * fyi + uz * fzi;
      total -= pr * pr + pi * pi;
    }
    out[k] = (pref * total) / n;
  }
  return out;
}

/**
 * Powder (orientation-averaged) intensity at |Q| values (Å⁻¹) of moments `m` (μB) at `r` (Å), barn/sr per moment.
 * @example clusterPowderIntensity(r, m, [0.5, 1.0])
 */
export function clusterPowderIntensity(positionsAngstrom: Float64Array, momentsMuB: Float64Array, qInvAngstrom: readonly number[]): number[] {
  const n = positionsAngstrom.length / 3;
  const pref = MAGNETIC_PREFACTOR_MB / 1000;
  return qInvAngstrom.map((Q) => {
    let s = 0;
    for (let i = 0; i < n; i++) {
      const mi = [momentsMuB[3 * i], momentsMuB[3 * i + 1], momentsMuB[3 * i + 2]];
      s += (2 / 3) * (mi[0] * mi[0] + mi[1] * mi[1] + mi[2] * mi[2]);
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const d = [0, 1, 2].map((c) => positionsAngstrom[3 * j + c] - positionsAngstrom[3 * i + c]);
        const r = Math.hypot(d[0], d[1], d[2]);
        const mj = [momentsMuB[3 * j], momentsMuB[3 * j + 1], momentsMuB[3 * j + 2]];
        const mm = mi[0] * mj[0] + mi[1] * mj[1] + mi[2] * mj[2];
        const a = (mi[0] * d[0] + mi[1] * d[1] + mi[2] * d[2]) / r;
        const b = (mj[0] * d[0] + mj[1] * d[1] + mj[2] * d[2]) / r;
        const x = Q * r;
        const j0 = Math.sin(x) / x;
        const j1x = Math.sin(x) / (x * x * x) - Math.cos(x) / (x * x);
        s += (mm - a * b) * j0 + (3 * a * b - mm) * j1x;
      }
    }
    return (pref * s) / n;
  });
}
