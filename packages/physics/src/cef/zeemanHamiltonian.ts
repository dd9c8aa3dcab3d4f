/**
 * The Zeeman Hamiltonian of a J multiplet, H_Z = −g_J μB B·J (DEVELOPERS.md § Conventions: the moment
 * g_J μB ⟨J⟩ points along the field), in meV.
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';
import { BOHR_MAGNETON_MEV_PER_T } from '../units';
import { angularMomentumMatrices } from './angularMomentum';

/**
 * H_Z = −g_J μB (Bx Jx + By Jy + Bz Jz) in meV for a field in tesla (components in the CEF frame).
 *
 * @example zeemanHamiltonian(0.5, 2, [0, 0, 1]) // diag(−μB, +μB) meV, μB = 0.05788 meV/T
 * See also: cefHamiltonian, angularMomentumMatrices
 */
export function zeemanHamiltonian(J: number, gJ: number, fieldTesla: readonly [number, number, number]): ComplexMatrix {
  if (typeof gJ !== 'number' || !Number.isFinite(gJ)) throw new InputError('gJ', gJ, 'a finite Landé factor');
  if (!Array.isArray(fieldTesla) || fieldTesla.length !== 3 || !fieldTesla.every((b) => typeof b === 'number' && Number.isFinite(b)))
    throw new InputError('fieldTesla', fieldTesla, 'three finite field components [Bx, By, Bz] in tesla');
  const { Jx, Jy, Jz } = angularMomentumMatrices(J);
  const h = zeros(Jx.n);
  const s = -gJ * BOHR_MAGNETON_MEV_PER_T;
  const [bx, by, bz] = fieldTesla;
  for (let k = 0; k < h.re.length; k++) {
    h.re[k] = s * (bx * Jx.re[k] + by * Jy.re[k] + bz * Jz.re[k]);
    h.im[k] = s * (bx * Jx.im[k] + by * Jy.im[k] + bz * Jz.im[k]);
  }
  return h;
}
