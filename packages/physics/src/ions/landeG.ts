/**
 * The Landé g-factor of an LS-coupled J multiplet.
 *
 * g_J = 1 + [J(J+1) + S(S+1) − L(L+1)] / [2J(J+1)], with the electron spin g-factor taken as 2
 * (Landé formula, e.g. Abragam & Bleaney 1970, chapter 1; g_s = 2 is common practice for rare-earth ions).
 */
import { InputError } from '../errors';

/**
 * Landé g_J from S, L, J (dimensionless). For J = 0 (Eu3+) the multiplet carries no moment and the formula is 0/0;
 * we return 0 there, so that g_J·J = 0 gives the correct zero first-order moment.
 *
 * @example landeG(2.5, 5, 7.5) // Dy3+: 4/3
 * See also: hundsRuleTerm (ions/hundsRules.ts)
 */
export function landeG(S: number, L: number, J: number): number {
  for (const [name, v] of [['S', S], ['L', L], ['J', J]] as const)
    if (!Number.isFinite(v) || v < 0 || !Number.isInteger(2 * v)) throw new InputError(name, v, 'a non-negative integer or half-integer');
  if (J < Math.abs(L - S) || J > L + S) throw new InputError('J', J, `|L − S| ≤ J ≤ L + S (L = ${L}, S = ${S})`);
  if (J === 0) return 0;
  const x = J * (J + 1);
  return 1 + (x + S * (S + 1) - L * (L + 1)) / (2 * x);
}
