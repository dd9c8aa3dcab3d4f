/**
 * The Lea–Leask–Wolf parametrisation of a cubic crystal field (K. R. Lea, M. J. M. Leask and W. P. Wolf,
 * J. Phys. Chem. Solids 23, 1381 (1962)):
 *   B40 F4 = W x,   B60 F6 = W (1 − |x|),   −1 ≤ x ≤ 1,
 * with B44 = 5 B40 and B64 = −21 B60 (z ∥ [001]). F4, F6 are LLW's common factors per J (their Table 1; from
 * memory, see the test for what is checked about them). For J < 3 there is no sixth-order term and F6 is not used.
 */
import { InputError } from '../errors';
import { checkJ } from './angularMomentum';
import type { CefParameters } from './cefHamiltonian';

/**
 * LLW's F4 and F6 for J = 5/2 … 8, keyed by 2J (Lea, Leask & Wolf 1962, Table 1; from memory). J = 11/2 and J = 7
 * are left out on purpose: the factors we recalled for them (F6 = 27720 and F4 = 60) fail the check in
 * test/physics/cef/leaLeaskWolf.test.ts (integer E/W for once-occurring representations at x = ±1, 0), so we could
 * not confirm them; llwParameters refuses those J rather than give an unconfirmed x scale.
 */
export const LLW_FACTORS: Readonly<Record<number, { F4: number; F6: number | null }>> = Object.freeze({
  5: { F4: 60, F6: null },
  6: { F4: 15, F6: 180 },
  7: { F4: 60, F6: 1260 },
  8: { F4: 60, F6: 1260 },
  9: { F4: 84, F6: 2520 },
  10: { F4: 60, F6: 2520 },
  12: { F4: 60, F6: 7560 },
  13: { F4: 60, F6: 7560 },
  15: { F4: 60, F6: 13860 },
  16: { F4: 60, F6: 13860 },
});

/**
 * Stevens parameters (in the unit of W, usually meV) of the LLW point (x, W) for a J multiplet.
 *
 * @example llwParameters(3.5, 0.5, 1) // Yb3+: { B40: 1/120, B44: 5/120, B60: 1/2520, B64: −21/2520 }
 * See also: normalizeCefParameters (cubic relations), solveCef
 */
export function llwParameters(J: number, x: number, W: number): CefParameters {
  checkJ(J);
  const factors = LLW_FACTORS[Math.round(2 * J)];
  if (!factors) throw new InputError('J', J, `a J with confirmed Lea–Leask–Wolf factors: ${Object.keys(LLW_FACTORS).map((k) => `${k}/2`).join(', ')}`);
  if (typeof x !== 'number' || !Number.isFinite(x) || x < -1 || x > 1) throw new InputError('x', x, 'a number with −1 ≤ x ≤ 1');
  if (typeof W !== 'number' || !Number.isFinite(W)) throw new InputError('W', W, 'a finite energy scale');
  const B40 = (W * x) / factors.F4;
  const out: Record<string, number> = { B40, B44: 5 * B40 };
  if (factors.F6 !== null) {
    const B60 = (W * (1 - Math.abs(x))) / factors.F6;
    out.B60 = B60;
    out.B64 = -21 * B60;
  }
  return Object.freeze(out);
}
