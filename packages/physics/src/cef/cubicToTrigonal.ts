/**
 * The cubic crystal field written with z along a three-fold axis [111] (Hutchings 1964, cubic fields; from
 * memory, and reproduced by rotateCefParameters in test/physics/cef/cubicToTrigonal.test.ts):
 *
 *   H = B4 (O40 + 5 O44) + B6 (O60 − 21 O64)                                   (z ∥ [001])
 *     = −(2/3) B4 (O40 − 20√2 O43) + (16/9) B6 (O60 + (35√2/4) O63 + (77/8) O66)   (z ∥ [111])
 *
 * Frame of the trigonal form: z' ∥ [111], x' ∥ [1̄1̄2], y' ∥ [11̄0] (cubic axes). Turning x' by 180° about z'
 * (x' ∥ [112̄]) flips the signs of the O43 and O63 terms.
 */
import { InputError } from '../errors';
import type { CefParameters } from './cefHamiltonian';

/** The rotation matrix (rows = new axes in cubic coordinates) of the trigonal frame used by cubicToTrigonal. */
export const TRIGONAL_FRAME_OF_CUBIC: readonly (readonly number[])[] = Object.freeze([
  Object.freeze([-1 / Math.sqrt(6), -1 / Math.sqrt(6), 2 / Math.sqrt(6)]),
  Object.freeze([1 / Math.SQRT2, -1 / Math.SQRT2, 0]),
  Object.freeze([1 / Math.sqrt(3), 1 / Math.sqrt(3), 1 / Math.sqrt(3)]),
]);

/**
 * Trigonal-frame Stevens parameters (meV, z ∥ [111]) of the cubic field with B40 = B4 and B60 = B6 (z ∥ [001]).
 *
 * @example cubicToTrigonal(0.01, 0) // { B40: −0.00667, B43: +0.1886 }
 * See also: rotateCefParameters, TRIGONAL_FRAME_OF_CUBIC
 */
export function cubicToTrigonal(B40MeV: number, B60MeV = 0): CefParameters {
  if (typeof B40MeV !== 'number' || !Number.isFinite(B40MeV)) throw new InputError('B40', B40MeV, 'a finite number (meV)');
  if (typeof B60MeV !== 'number' || !Number.isFinite(B60MeV)) throw new InputError('B60', B60MeV, 'a finite number (meV)');
  const b4 = (-2 / 3) * B40MeV;
  const b6 = (16 / 9) * B60MeV;
  const out: Record<string, number> = {};
  if (b4 !== 0) Object.assign(out, { B40: b4, B43: -20 * Math.SQRT2 * b4 });
  if (b6 !== 0) Object.assign(out, { B60: b6, B63: ((35 * Math.SQRT2) / 4) * b6, B66: (77 / 8) * b6 });
  return Object.freeze(out);
}
