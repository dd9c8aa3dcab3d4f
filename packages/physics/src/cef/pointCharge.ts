/**
 * Point-charge estimate of the Stevens parameters from ligand positions and charges (Hutchings, Solid State Physics
 * 16, 227 (1964), §§ 5–6), with optional Sternheimer shielding factors σ_n.
 *
 * An electron at r in the field of ligand charges q_j e at R_j has the potential energy
 *   V(r) = −(e²/4πε0) Σ_j q_j / |R_j − r| = −(e²/4πε0) Σ_j q_j Σ_n r^n / R_j^{n+1} P_n(r̂·R̂_j),
 * and the addition theorem P_n(r̂·R̂) = (4π/(2n+1)) Σ_m f_n^m(r̂) f_n^m(R̂) / N_n^m (N_n^m = ∮ (f_n^m)² dΩ) gives
 *   V = Σ_nm A_n^m r^n f_n^m(r̂),   A_n^m = −(e²/4πε0) (4π/(2n+1)) Σ_j q_j f_n^m(R̂_j) / (N_n^m R_j^{n+1}).
 * Replacing Σ_i r_i^n f_n^m(r̂_i) over the 4f electrons by θ_n ⟨r^n⟩ O_n^m (Stevens' operator equivalents) gives
 *   B_n^m = (1 − σ_n) θ_n ⟨r^n⟩ A_n^m,
 * with θ_n the Stevens factors and ⟨r^n⟩ the Freeman–Desclaux radial integrals of the ions table (bohr^n → Å^n).
 *
 * The point-charge model is a starting point, not a prediction: real B_n^m differ in size and sometimes sign
 * (covalency, overlap); common practice is to use it for signs and ratios and to scale the result.
 *
 * @example pointChargeParameters('Yb3+', [{ positionAngstrom: [0, 0, 2.2], charge: -2 }, …])
 * See also: scaleCefParameters, fitCef
 */
import { InputError } from '../errors';
import { getIon, stevensFactor, type Ion } from '../ions';
import { BOHR_RADIUS_ANGSTROM, COULOMB_MEV_ANGSTROM } from '../units';
import type { CefParameters } from './cefHamiltonian';
import { CEF_PARAMETER_KEYS, parseParameterKey } from './parameterKeys';
import { stevensPolynomial, stevensPolynomialNorm } from './pointChargeHarmonics';

/** One ligand: position relative to the magnetic ion in the CEF frame (Å) and charge in units of e (e.g. −2 for O²⁻). */
export interface PointCharge {
  readonly positionAngstrom: readonly [number, number, number];
  readonly charge: number;
}

export interface PointChargeOptions {
  /** Sternheimer shielding factors σ_2, σ_4, σ_6 (B_n^m × (1 − σ_n)). Default 0. */
  readonly shielding?: { readonly sigma2?: number; readonly sigma4?: number; readonly sigma6?: number };
  /** Parameters smaller than this (meV) are dropped as numerical zeros. Default 1e-12 × the largest |B|. */
  readonly dropBelowMeV?: number;
}

/** A_n^m in meV/Å^n (the crystal-field coefficients before θ_n ⟨r^n⟩), keyed 'B20'… as the parameters. */
export function pointChargeCoefficients(ligands: readonly PointCharge[]): Record<string, number> {
  if (!Array.isArray(ligands) || ligands.length === 0) throw new InputError('ligands', ligands, 'at least one ligand {positionAngstrom: [x, y, z], charge}');
  const checked = ligands.map((ligand, j) => {
    const p = ligand?.positionAngstrom;
    if (!Array.isArray(p) || p.length !== 3 || !p.every((v) => typeof v === 'number' && Number.isFinite(v)))
      throw new InputError(`ligands[${j}].positionAngstrom`, p, '[x, y, z] in Å');
    const distance = Math.hypot(p[0], p[1], p[2]);
    if (!(distance > 0.5)) throw new InputError(`ligands[${j}].positionAngstrom`, p, 'a ligand farther than 0.5 Å from the ion');
    if (typeof ligand.charge !== 'number' || !Number.isFinite(ligand.charge)) throw new InputError(`ligands[${j}].charge`, ligand.charge, 'a charge in units of e, e.g. -2');
    return { unit: [p[0] / distance, p[1] / distance, p[2] / distance] as const, distance, charge: ligand.charge };
  });
  const out: Record<string, number> = {};
  for (const key of CEF_PARAMETER_KEYS) {
    const { n, m } = parseParameterKey(key)!;
    const norm = stevensPolynomialNorm(n, m);
    let sum = 0;
    for (const l of checked) sum += (l.charge * stevensPolynomial(n, m, l.unit[0], l.unit[1], l.unit[2])) / l.distance ** (n + 1);
    out[key] = (-COULOMB_MEV_ANGSTROM * ((4 * Math.PI) / (2 * n + 1)) * sum) / norm;
  }
  return out;
}

/** Point-charge Stevens parameters B_n^m in meV for an ion surrounded by `ligands`. */
export function pointChargeParameters(ionOrName: Ion | string, ligands: readonly PointCharge[], options: PointChargeOptions = {}): CefParameters {
  const ion = typeof ionOrName === 'string' ? getIon(ionOrName) : ionOrName;
  const shielding = options.shielding ?? {};
  const sigma: Record<number, number> = { 2: shielding.sigma2 ?? 0, 4: shielding.sigma4 ?? 0, 6: shielding.sigma6 ?? 0 };
  for (const n of [2, 4, 6]) if (!Number.isFinite(sigma[n])) throw new InputError(`shielding.sigma${n}`, sigma[n], 'a finite shielding factor');
  const radial: Record<number, number> = { 2: ion.radial.r2, 4: ion.radial.r4, 6: ion.radial.r6 };
  const a = pointChargeCoefficients(ligands);
  const raw: Record<string, number> = {};
  let largest = 0;
  for (const [key, value] of Object.entries(a)) {
    const { n } = parseParameterKey(key)!;
    const b = (1 - sigma[n]) * stevensFactor(ion, n) * radial[n] * BOHR_RADIUS_ANGSTROM ** n * value;
    raw[key] = b;
    largest = Math.max(largest, Math.abs(b));
  }
  const threshold = options.dropBelowMeV ?? 1e-12 * largest;
  const out: Record<string, number> = {};
  for (const [key, value] of Object.entries(raw)) if (Math.abs(value) > threshold) out[key] = value;
  return out;
}
