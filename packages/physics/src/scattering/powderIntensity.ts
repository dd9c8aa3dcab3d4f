/**
 * Powder-averaged magnetic diffuse scattering in absolute units from Ising pair correlations, by the
 * Blech–Averbach formula (Blech & Averbach, Physics 1, 31 (1964)):
 *   dσ/dΩ per ion = (γ r0/2)² f(Q)² μ² [ 2/3 + Σ_r ( A(r) sin(Qr)/(Qr) + B(r) (sin(Qr)/(Qr)³ − cos(Qr)/(Qr)²) ) ]
 * with μ the Ising moment in μB, (γ r0/2)² = 72.65 mb (units/MAGNETIC_PREFACTOR_MB), A, B from
 * `pairCorrelationShells`. The 2/3 is the orientation average of the perpendicular projection of one moment
 * (the self term); uncorrelated Ising spins give exactly (2/3)(γ r0/2)² μ² f².
 */
import type { CorrelationShells } from './pairCorrelationShells';
import { MAGNETIC_PREFACTOR_MB } from '../units';
import { InputError } from '../errors';

/**
 * I(Q) in barn/sr per magnetic ion at each Q (Å⁻¹); `formFactor` maps Q to f(Q) (default 1).
 * @example powderIntensity(shells, [0.5, 1, 1.5], 10, (q) => magneticFormFactor('Ho3+', q))
 * See also: pairCorrelationShells, singleCrystalIntensity, normalizeToParamagnet
 */
export function powderIntensity(
  shells: CorrelationShells,
  qInvAngstrom: readonly number[],
  momentMuB: number,
  formFactor: (qInvAngstrom: number) => number = () => 1,
): number[] {
  if (!(momentMuB > 0)) throw new InputError('momentMuB', momentMuB, 'a positive moment in μB');
  const pref = (MAGNETIC_PREFACTOR_MB / 1000) * momentMuB * momentMuB;
  return qInvAngstrom.map((Q, k) => {
    if (!(Q > 0) || !Number.isFinite(Q)) throw new InputError(`QInvAngstrom[${k}]`, Q, 'a positive Q in Å⁻¹');
    let s = 2 / 3;
    const r = shells.distancesAngstrom;
    for (let m = 0; m < r.length; m++) {
      const x = Q * r[m];
      const sx = Math.sin(x);
      s += shells.a[m] * (sx / x) + shells.b[m] * (sx / (x * x * x) - Math.cos(x) / (x * x));
    }
    const f = formFactor(Q);
    return pref * f * f * s;
  });
}
