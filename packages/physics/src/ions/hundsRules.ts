/**
 * Hund's rules for the ground term of a 4f^n configuration (l = 3).
 *
 * Reference: F. Hund, Linienspektren und periodisches System der Elemente (1927); stated in every textbook
 * (e.g. Abragam & Bleaney 1970, chapter 1). Rule 1: maximal S; rule 2: maximal L for that S; rule 3: J = |L − S| for a
 * shell less than half full, J = L + S for a shell more than half full (and L = 0, J = S at half filling).
 */
import { InputError } from '../errors';

/** Ground-term quantum numbers of an l^n configuration. */
export interface HundsTerm {
  /** Total spin S. */
  S: number;
  /** Total orbital angular momentum L. */
  L: number;
  /** Total angular momentum J. */
  J: number;
}

/**
 * S, L, J of the Hund's-rule ground term of 4f^n, found by filling the orbitals m_l = 3, 2, …, −3 first with spin up,
 * then with spin down.
 *
 * @param nf number of 4f electrons, 0 … 14
 * @example hundsRuleTerm(9) // Dy3+: { S: 2.5, L: 5, J: 7.5 }
 * See also: landeG (ions/landeG.ts), getIon (ions/ionTable.ts)
 */
export function hundsRuleTerm(nf: number): HundsTerm {
  if (!Number.isInteger(nf) || nf < 0 || nf > 14) throw new InputError('nf', nf, 'an integer number of 4f electrons, 0 to 14');
  const l = 3;
  const orbitals = 2 * l + 1;
  const up = Math.min(nf, orbitals);
  const down = nf - up;
  let mlSum = 0;
  for (let i = 0; i < up; i++) mlSum += l - i;
  for (let i = 0; i < down; i++) mlSum += l - i;
  const S = (up - down) / 2;
  const L = Math.abs(mlSum);
  const J = nf < orbitals ? Math.abs(L - S) : L + S;
  return { S, L, J };
}
