/**
 * JSON values and the canonical serialization used for results, saved state and comparisons: keys sorted,
 * no whitespace choices left to chance, so that two runs of a notebook compare byte for byte.
 */
import { CellError } from './errors';

export type JsonValue = null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };

/** JSON.stringify with keys sorted at every level. */
export function canonicalJson(value: unknown, indent?: number): string {
  return JSON.stringify(sortKeys(value), null, indent);
}

function sortKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortKeys);
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const key of Object.keys(value).sort()) out[key] = sortKeys((value as Record<string, unknown>)[key]);
    return out;
  }
  return value;
}

/**
 * Turn a kind's result into plain JSON: typed arrays become arrays; NaN/Infinity, functions, undefined inside
 * arrays and cycles are refused with a CellRunError naming the path (never NaN escaping into a result).
 */
export function toJsonValue(value: unknown, path = 'result', seen: Set<object> = new Set()): JsonValue {
  if (value === null || typeof value === 'boolean' || typeof value === 'string') return value;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new CellError('CellRunError', `${path}: the computation produced ${value}, expected a finite number`);
    return Object.is(value, -0) ? 0 : value;
  }
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    return toJsonValue(Array.from(value as unknown as ArrayLike<number>), path, seen);
  }
  if (typeof value === 'object') {
    if (seen.has(value)) throw new CellError('CellRunError', `${path}: the result refers to itself`);
    seen.add(value);
    try {
      if (Array.isArray(value)) return value.map((item, i) => toJsonValue(item === undefined ? null : item, `${path}[${i}]`, seen));
      const out: Record<string, JsonValue> = {};
      for (const [key, item] of Object.entries(value)) {
        if (item === undefined) continue;
        out[key] = toJsonValue(item, `${path}.${key}`, seen);
      }
      return out;
    } finally {
      seen.delete(value);
    }
  }
  throw new CellError('CellRunError', `${path}: a ${typeof value} cannot be stored in a result, expected JSON data`);
}

/** A deep-frozen deep copy (what cells and scripts get when they read the state). */
export function frozenCopy<T>(value: T): T {
  const copy = JSON.parse(JSON.stringify(value)) as T;
  return deepFreeze(copy);
}

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object') {
    for (const item of Object.values(value)) deepFreeze(item);
    Object.freeze(value);
  }
  return value;
}
