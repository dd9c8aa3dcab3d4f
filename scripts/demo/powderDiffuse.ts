/**
 * Powder-averaged magnetic diffuse scattering of Ising spin-ice snapshots, in mbarn/sr per magnetic ion, used by the
 * demo data generator (the physics package's scattering module is the place for a general version).
 *
 * Classical moments m_i = μ σ_i ẑ_i; the powder average of the magnetic cross-section is the Blech–Averbach form
 * (I. A. Blech & B. L. Averbach, Physics 1, 31 (1964), from memory):
 *   dσ/dΩ = (γ r0/2)² f(Q)² (1/N) Σ_ij μ² σ_i σ_j [A_ij sin x/x + B_ij (sin x/x³ − cos x/x²)],  x = Q r_ij,
 *   A_ij = ẑ_i·ẑ_j − (ẑ_i·r̂)(ẑ_j·r̂),  B_ij = 3(ẑ_i·r̂)(ẑ_j·r̂) − ẑ_i·ẑ_j,
 * whose i = j term is 2μ²/3. Pairs use the minimum image of the periodic supercell and are kept for r < L a / 2,
 * so correlations are followed to half the box (10 Å for L = 2, a ≈ 10.2 Å).
 */
import type { PyrochloreSupercell } from '@multiplet/physics/lattice';
import { magneticFormFactor } from '@multiplet/physics/neutron';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';

export function powderDiffuseScattering(
  cell: PyrochloreSupercell,
  snapshots: readonly Int8Array[],
  qInvAngstrom: readonly number[],
  options: { momentMuB: number; ion: string },
): Float64Array {
  const N = cell.numberOfSites;
  const box = cell.L * cell.latticeConstantAngstrom;
  const cutoff = box / 2 - 1e-6;
  if (snapshots.length === 0) throw new RangeError('powderDiffuseScattering: no snapshots (run with snapshotEvery > 0)');
  // ⟨σ_i σ_j⟩ over the snapshots.
  const corr = new Float64Array(N * N);
  for (const s of snapshots) for (let i = 0; i < N; i++) for (let j = i + 1; j < N; j++) corr[i * N + j] += s[i] * s[j];
  const out = new Float64Array(qInvAngstrom.length);
  const p = cell.positionsAngstrom;
  const z = cell.localAxes;
  for (let i = 0; i < N; i++) {
    for (let j = i + 1; j < N; j++) {
      let dx = p[3 * j] - p[3 * i];
      let dy = p[3 * j + 1] - p[3 * i + 1];
      let dz = p[3 * j + 2] - p[3 * i + 2];
      dx -= box * Math.round(dx / box);
      dy -= box * Math.round(dy / box);
      dz -= box * Math.round(dz / box);
      const r = Math.hypot(dx, dy, dz);
      if (r > cutoff) continue;
      const c = corr[i * N + j] / snapshots.length;
      const zizj = z[3 * i] * z[3 * j] + z[3 * i + 1] * z[3 * j + 1] + z[3 * i + 2] * z[3 * j + 2];
      const zir = (z[3 * i] * dx + z[3 * i + 1] * dy + z[3 * i + 2] * dz) / r;
      const zjr = (z[3 * j] * dx + z[3 * j + 1] * dy + z[3 * j + 2] * dz) / r;
      const a = zizj - zir * zjr;
      const b = 3 * zir * zjr - zizj;
      qInvAngstrom.forEach((q, k) => {
        const x = q * r;
        const s = Math.sin(x);
        out[k] += 2 * c * (a * (s / x) + b * (s / x ** 3 - Math.cos(x) / x ** 2));
      });
    }
  }
  return Float64Array.from(out, (v, k) => {
    const f = magneticFormFactor(options.ion, qInvAngstrom[k]);
    return MAGNETIC_PREFACTOR_MB * options.momentMuB ** 2 * f * f * (2 / 3 + v / N);
  });
}
