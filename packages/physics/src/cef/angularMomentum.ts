/**
 * Angular-momentum matrices in the |J, m⟩ basis (basis order: DEVELOPERS.md § Conventions, index k ↔ m = J − k).
 *
 * Matrix elements (Condon–Shortley phases; e.g. Sakurai, Modern Quantum Mechanics, ch. 3):
 *   ⟨J, m±1| J± |J, m⟩ = sqrt(J(J+1) − m(m±1)),   Jx = (J+ + J−)/2,   Jy = (J+ − J−)/(2i).
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';

/** Largest J accepted by the crystal-field functions (2J + 1 = 41): generous for 4f, 5f and transition-metal multiplets. */
export const MAX_J = 20;

/**
 * Check that J is a non-negative integer or half-integer no larger than MAX_J; returns 2J + 1.
 * @example checkJ(7.5) // 16
 */
export function checkJ(J: number, field = 'J'): number {
  if (typeof J !== 'number' || !Number.isFinite(J) || J < 0 || !Number.isInteger(2 * J) || J > MAX_J)
    throw new InputError(field, J, `a non-negative integer or half-integer J ≤ ${MAX_J}`);
  return Math.round(2 * J) + 1;
}

/** The five angular-momentum operators of one J multiplet. */
export interface AngularMomentumMatrices {
  Jx: ComplexMatrix;
  Jy: ComplexMatrix;
  Jz: ComplexMatrix;
  Jplus: ComplexMatrix;
  Jminus: ComplexMatrix;
}

/**
 * Jx, Jy, Jz, J+, J− as (2J+1)×(2J+1) matrices (dimensionless, units of ħ) in the |J, m⟩ basis, m = J … −J.
 *
 * @example angularMomentumMatrices(0.5).Jz // diag(1/2, −1/2)
 * See also: stevensOperator (cef/stevensOperator.ts), zeemanHamiltonian (cef/zeemanHamiltonian.ts)
 */
export function angularMomentumMatrices(J: number): AngularMomentumMatrices {
  const n = checkJ(J);
  const Jz = zeros(n), Jplus = zeros(n), Jminus = zeros(n), Jx = zeros(n), Jy = zeros(n);
  const x = J * (J + 1);
  for (let k = 0; k < n; k++) {
    const m = J - k;
    Jz.re[k * n + k] = m;
    if (k > 0) {
      // J+ |m⟩ = c |m+1⟩, and m+1 has index k−1.
      const c = Math.sqrt(x - m * (m + 1));
      Jplus.re[(k - 1) * n + k] = c;
      Jminus.re[k * n + (k - 1)] = c;
      Jx.re[(k - 1) * n + k] = c / 2;
      Jx.re[k * n + (k - 1)] = c / 2;
      // Jy = (J+ − J−)/(2i) = −i(J+ − J−)/2
      Jy.im[(k - 1) * n + k] = -c / 2;
      Jy.im[k * n + (k - 1)] = c / 2;
    }
  }
  return { Jx, Jy, Jz, Jplus, Jminus };
}
