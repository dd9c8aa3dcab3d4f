/**
 * Microscopic couplings between the total angular momenta J_i, J_j of two rare-earth ions, as one 3×3 matrix K
 * (global Cartesian frame, meV):  H_ij = Σ_αβ J_i^α K_αβ J_j^β.
 *  - isotropic exchange J_ex J_i·J_j:      K = J_ex 1;
 *  - a general anisotropic exchange matrix: K as given (global frame of the bond);
 *  - magnetic dipolar coupling of the moments m = g_J μB J:
 *      K = D_J (1 − 3 r̂ r̂ᵀ),  D_J = μ0 (g_Ji μB)(g_Jj μB) / (4π r³)
 *    (classical dipole–dipole energy, Jackson, Classical Electrodynamics, 3rd ed., eq. 5.98; the sign of m
 *    relative to J drops out of the product).
 */
import { InputError } from '../errors';
import { MU0_T_M_PER_A, BOHR_MAGNETON_J_PER_T, MEV_IN_J } from '../units';
import type { BondGeometry } from './bondGeometry';
import { norm3, zeros3, type Matrix3 } from './matrix3';

/** Which microscopic couplings act on the bond (any combination; at least one). */
export interface MicroscopicCouplingSpec {
  /** J_ex of J_ex J_i·J_j, meV. */
  isotropicMeV?: number;
  /** A general 3×3 exchange matrix (global frame), meV. */
  matrixMeV?: number[][];
  /** Include the magnetic dipolar coupling between the two ions. */
  dipolar?: boolean;
}

/**
 * μ0 μ1 μ2 / (4π r³) in meV for moments in μB and r in Å (CODATA constants from physics/units).
 * @example dipolarEnergyMeV(10, 10, 3.54) // ≈ 0.1210 meV ≈ 1.404 K
 * See also: microscopicCouplingMatrix
 */
export function dipolarEnergyMeV(moment1MuB: number, moment2MuB: number, distanceAngstrom: number): number {
  if (!(distanceAngstrom > 0) || !Number.isFinite(distanceAngstrom)) throw new InputError('distanceAngstrom', distanceAngstrom, 'a positive distance in Å');
  const r = distanceAngstrom * 1e-10;
  return (MU0_T_M_PER_A / (4 * Math.PI)) * moment1MuB * moment2MuB * BOHR_MAGNETON_J_PER_T ** 2 / (r * r * r) / MEV_IN_J;
}

/** Validate a 3×3 matrix of finite numbers. */
export function checkMatrix3(m: unknown, field: string): Matrix3 {
  if (!Array.isArray(m) || m.length !== 3 || m.some((row) => !Array.isArray(row) || row.length !== 3))
    throw new InputError(field, m, 'a 3×3 matrix (three rows of three numbers) in meV');
  m.forEach((row: unknown[], i) =>
    row.forEach((x, j) => {
      if (typeof x !== 'number' || !Number.isFinite(x)) throw new InputError(`${field}[${i}][${j}]`, x, 'a finite number (meV)');
    }),
  );
  return (m as number[][]).map((row) => row.slice());
}

/**
 * The total coupling matrix K (global frame, meV) of H = J_iᵀ K J_j for a bond, from the coupling spec.
 * @example microscopicCouplingMatrix({ isotropicMeV: 0.01, dipolar: true }, pyrochloreBond(10.1), 4/3, 4/3)
 * @throws InputError for a non-finite isotropic value, a malformed matrix, or no coupling at all.
 * See also: dipolarEnergyMeV, effectiveExchange
 */
export function microscopicCouplingMatrix(
  spec: MicroscopicCouplingSpec,
  geometry: BondGeometry,
  gJi: number,
  gJj: number,
  field = 'coupling',
): Matrix3 {
  if (spec === null || typeof spec !== 'object') throw new InputError(field, spec, 'an object {isotropicMeV?, matrixMeV?, dipolar?}');
  const k = zeros3();
  let any = false;
  if (spec.isotropicMeV !== undefined) {
    if (typeof spec.isotropicMeV !== 'number' || !Number.isFinite(spec.isotropicMeV))
      throw new InputError(`${field}.isotropicMeV`, spec.isotropicMeV, 'a finite number (meV)');
    for (let a = 0; a < 3; a++) k[a][a] += spec.isotropicMeV;
    any = true;
  }
  if (spec.matrixMeV !== undefined) {
    const m = checkMatrix3(spec.matrixMeV, `${field}.matrixMeV`);
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) k[a][b] += m[a][b];
    any = true;
  }
  if (spec.dipolar !== undefined && typeof spec.dipolar !== 'boolean') throw new InputError(`${field}.dipolar`, spec.dipolar, 'true or false');
  if (spec.dipolar) {
    const r = geometry.bondVectorAngstrom;
    const d = norm3(r);
    const dJ = dipolarEnergyMeV(gJi, gJj, d);
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) k[a][b] += dJ * ((a === b ? 1 : 0) - (3 * r[a] * r[b]) / (d * d));
    any = true;
  }
  if (!any) throw new InputError(field, spec, 'at least one of isotropicMeV, matrixMeV, dipolar: true');
  return k;
}
