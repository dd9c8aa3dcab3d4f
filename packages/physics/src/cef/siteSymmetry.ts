/**
 * Which Stevens parameters a site symmetry allows, for the frame conventions stated here (z along the principal
 * axis). The selection rules follow from invariance of Re/Im[(x+iy)^m] p_nm(z) under the group's operations
 * (group theory as in Hutchings 1964; common practice for the frames; checked by invariance under each group's generators in test/physics/cef/siteSymmetry.test.ts):
 * - a C_k rotation about z keeps only m ≡ 0 (mod k); σ_h (z → −z) keeps only even m (n is even);
 *   S4 keeps m ≡ 0 (mod 4); inversion changes nothing for even n.
 * - a mirror plane xz (y → −y) removes the sine types; a two-fold axis along y removes the sine types too;
 *   a two-fold axis along x keeps cos for even n − m and sin for odd n − m.
 *
 * Frames:
 * - cubic Oh, Td, O: z ∥ [001], x ∥ [100]; B40, B44 = 5 B40, B60, B64 = −21 B60 (Hutchings 1964, cubic fields; from memory).
 * - D4h, D4, C4v, D2d: z ∥ 4-fold (S4 for D2d), x along a two-fold axis / in a mirror: B20, B40, B44, B60, B64.
 * - C4h, C4, S4: B20, B40, B44, B4-4, B60, B64, B6-4.
 * - D3d, D3, C3v: z ∥ 3-fold, y along a two-fold axis (D3, D3d), xz a mirror plane (C3v, D3d). With this frame all
 *   three groups allow cosine terms only: B20, B40, B43, B60, B63, B66. (With x along the two-fold axis of D3, B43
 *   and B63 would turn into sine terms; rotate by 90° about z with rotateCefParameters to change frame.)
 * - S6, C3: B20, B40, B43, B4-3, B60, B63, B6-3, B66, B6-6.
 * - D6h, D6, C6v, D3h: B20, B40, B60, B66 (x along a two-fold axis / in a mirror). C6h, C6, C3h: also B6-6.
 * - D2h, D2, C2v: z along a two-fold axis, x and y along the others (in the mirrors for C2v): all even-m cosine
 *   terms B20, B22, B40, B42, B44, B60, B62, B64, B66.
 * - C2h, C2, Cs (z along the two-fold axis or the mirror normal): even m, cosine and sine.
 * - none, C1, Ci: all 27.
 */
import { InputError } from '../errors';
import { CEF_PARAMETER_KEYS, parameterKey } from './parameterKeys';

function keysWhere(keep: (n: number, m: number) => boolean): string[] {
  const out: string[] = [];
  for (const n of [2, 4, 6])
    for (let m = -n; m <= n; m++) if (keep(n, m)) out.push(parameterKey(n, m));
  return CEF_PARAMETER_KEYS.filter((k) => out.includes(k));
}

const cosOnly = (fold: number) => (n: number, m: number) => m >= 0 && m % fold === 0;
const cosAndSin = (fold: number) => (_n: number, m: number) => Math.abs(m) % fold === 0;

const CUBIC = ['B40', 'B44', 'B60', 'B64'];

const TABLE: Record<string, string[]> = {
  // Th and T are left out on purpose: they allow a second sixth-order invariant that this table does not model.
  Oh: CUBIC, Td: CUBIC, O: CUBIC,
  D4h: keysWhere(cosOnly(4)), D4: keysWhere(cosOnly(4)), C4v: keysWhere(cosOnly(4)), D2d: keysWhere(cosOnly(4)),
  C4h: keysWhere(cosAndSin(4)), C4: keysWhere(cosAndSin(4)), S4: keysWhere(cosAndSin(4)),
  D3d: keysWhere(cosOnly(3)), D3: keysWhere(cosOnly(3)), C3v: keysWhere(cosOnly(3)),
  S6: keysWhere(cosAndSin(3)), C3: keysWhere(cosAndSin(3)),
  D6h: keysWhere(cosOnly(6)), D6: keysWhere(cosOnly(6)), C6v: keysWhere(cosOnly(6)), D3h: keysWhere(cosOnly(6)),
  C6h: keysWhere(cosAndSin(6)), C6: keysWhere(cosAndSin(6)), C3h: keysWhere(cosAndSin(6)),
  D2h: keysWhere(cosOnly(2)), D2: keysWhere(cosOnly(2)), C2v: keysWhere(cosOnly(2)),
  C2h: keysWhere(cosAndSin(2)), C2: keysWhere(cosAndSin(2)), Cs: keysWhere(cosAndSin(2)),
  none: [...CEF_PARAMETER_KEYS], C1: [...CEF_PARAMETER_KEYS], Ci: [...CEF_PARAMETER_KEYS],
};

/** Site symmetries (Schoenflies symbols) understood by allowedParameters, plus 'none'. */
export const SITE_SYMMETRIES: readonly string[] = Object.freeze(Object.keys(TABLE));

/** Cubic point groups (parameters tied by B44 = 5 B40, B64 = −21 B60). */
export const CUBIC_SYMMETRIES: readonly string[] = Object.freeze(['Oh', 'Td', 'O']);

/** Resolve a symmetry name (exact Schoenflies spelling; case-insensitive fallback) or throw InputError. */
export function resolveSymmetry(symmetry: string, field = 'symmetry'): string {
  if (typeof symmetry === 'string') {
    const s = symmetry.trim();
    if (s in TABLE) return s;
    const match = SITE_SYMMETRIES.find((k) => k.toLowerCase() === s.toLowerCase());
    if (match) return match;
  }
  throw new InputError(field, symmetry, `a site symmetry, one of ${SITE_SYMMETRIES.join(', ')}`);
}

/**
 * The Stevens parameter keys allowed by a site symmetry in the frame documented above (z along the principal axis).
 *
 * @example allowedParameters('D3d') // ['B20', 'B40', 'B43', 'B60', 'B63', 'B66']
 * See also: normalizeCefParameters, SITE_SYMMETRIES
 */
export function allowedParameters(symmetry: string): string[] {
  return [...TABLE[resolveSymmetry(symmetry)]];
}
