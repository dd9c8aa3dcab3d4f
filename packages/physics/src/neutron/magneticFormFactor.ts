/**
 * Magnetic form factor of a rare-earth ion in the dipole approximation:
 *   f(Q) = ⟨j0(Q)⟩ + ((2 − g_J)/g_J) ⟨j2(Q)⟩
 * (Lovesey, Theory of Neutron Scattering from Condensed Matter, Vol. 2 (1984), eq. 11.58; Brown, International Tables
 * Vol. C §4.4.5 and §6.1.2.3), with ⟨j0⟩, ⟨j2⟩ from Brown's analytic approximation (neutron/formFactorTable.ts).
 *
 * @example magneticFormFactor('Er3+', 1.5) // ≈ 0.93
 * See also: radialFormFactors, neutronSpectrum
 */
import { InputError } from '../errors';
import { getIon } from '../ions';
import { FORM_FACTOR_TABLE, type FormFactorCoefficients } from './formFactorTable';

function expansion(c: FormFactorCoefficients, s2: number): number {
  return c[0] * Math.exp(-c[1] * s2) + c[2] * Math.exp(-c[3] * s2) + c[4] * Math.exp(-c[5] * s2) + c[6];
}

/**
 * ⟨j0⟩ and ⟨j2⟩ of the ion at momentum transfer Q (Å⁻¹), plus the table's approximation note if any.
 * @example radialFormFactors('Dy3+', 0).j0 // ≈ 1
 */
export function radialFormFactors(ionName: string, qInvAngstrom: number): { j0: number; j2: number; approximation?: string } {
  const name = getIon(ionName).name;
  const entry = FORM_FACTOR_TABLE[name];
  if (!entry) throw new InputError('ion', ionName, `an ion with tabulated form factors: ${Object.keys(FORM_FACTOR_TABLE).join(', ')}`);
  if (typeof qInvAngstrom !== 'number' || !Number.isFinite(qInvAngstrom) || qInvAngstrom < 0)
    throw new InputError('qInvAngstrom', qInvAngstrom, 'a finite Q ≥ 0 in Å⁻¹');
  const s = qInvAngstrom / (4 * Math.PI);
  const s2 = s * s;
  return { j0: expansion(entry.j0, s2), j2: s2 * expansion(entry.j2, s2), approximation: entry.approximation };
}

/** Dipole magnetic form factor f(Q) (dimensionless, f(0) ≈ 1) of a trivalent rare-earth ion at Q in Å⁻¹. */
export function magneticFormFactor(ionName: string, qInvAngstrom: number): number {
  const ion = getIon(ionName);
  const { j0, j2 } = radialFormFactors(ion.name, qInvAngstrom);
  // g_J = 0 does not occur for the trivalent 4f ions with J > 0 (Eu3+ has J = 0 and no dipole moment at all).
  if (ion.gJ === 0 || ion.J === 0) return j0;
  return j0 + ((2 - ion.gJ) / ion.gJ) * j2;
}
