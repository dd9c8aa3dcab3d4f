/**
 * Names of Stevens parameters B_n^m (DEVELOPERS.md § Conventions): 'B20', 'B43' for the cosine-type operators
 * O_n^m (m ≥ 0), 'B4-3' (alias 'B4m3') for the sine-type O_n^{−m}; n = 2, 4, 6 and −n ≤ m ≤ n.
 */
import { InputError } from '../errors';

/** Rank n and component m of a Stevens parameter. */
export interface StevensIndex {
  n: number;
  m: number;
}

/** The ranks that enter a 4f crystal field (time-even, parity-even: n = 2, 4, 6). */
export const CEF_RANKS: readonly number[] = [2, 4, 6];

/** Canonical key of (n, m): 'B43', 'B4-3'. */
export function parameterKey(n: number, m: number): string {
  return `B${n}${m}`;
}

/** All 27 keys in a fixed order: n = 2, 4, 6; within n, m = 0, 1, −1, 2, −2, …, n, −n. */
export const CEF_PARAMETER_KEYS: readonly string[] = Object.freeze(
  CEF_RANKS.flatMap((n) => {
    const keys = [parameterKey(n, 0)];
    for (let m = 1; m <= n; m++) keys.push(parameterKey(n, m), parameterKey(n, -m));
    return keys;
  }),
);

const KEY_PATTERN = /^B([246])(-|m)?([0-6])$/;

/**
 * Parse a parameter key; returns undefined when it is not one ('B20', 'B4-3', 'B4m3' are keys; 'B23', 'B8' are not).
 * @example parseParameterKey('B4m3') // { n: 4, m: -3 }
 */
export function parseParameterKey(key: string): StevensIndex | undefined {
  const match = KEY_PATTERN.exec(key.trim());
  if (!match) return undefined;
  const n = Number(match[1]);
  const abs = Number(match[3]);
  if (abs > n) return undefined;
  if (match[2] && abs === 0) return undefined;
  return { n, m: match[2] ? -abs : abs };
}

/** Parse a key or throw an InputError naming `${field}.${key}`. */
export function requireParameterKey(key: string, field: string): StevensIndex {
  const index = parseParameterKey(key);
  if (!index)
    throw new InputError(`${field}.${key}`, key, 'a Stevens parameter name Bnm or Bn-m (n = 2, 4, 6; 0 ≤ m ≤ n), e.g. B20, B43, B4-3');
  return index;
}
