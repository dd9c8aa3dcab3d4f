// Input checks shared by the thermo functions: one message style, always an InputError naming the field.
import { InputError } from '../../errors';

/** A finite number, or InputError. */
export function finiteNumber(value: unknown, field: string, expected = 'a finite number'): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new InputError(field, value, expected);
  return value;
}

/** A finite number > 0, or InputError. */
export function positiveNumber(value: unknown, field: string, expected = 'a finite number > 0'): number {
  const x = finiteNumber(value, field, expected);
  if (x <= 0) throw new InputError(field, value, expected);
  return x;
}

/** A non-empty array of finite numbers as a Float64Array, or InputError. */
export function numberArray(value: unknown, field: string, what = 'numbers'): Float64Array {
  if (!(Array.isArray(value) || ArrayBuffer.isView(value)) || (value as ArrayLike<unknown>).length === 0)
    throw new InputError(field, value, `a non-empty array of ${what}`);
  const arr = value as ArrayLike<unknown>;
  const out = new Float64Array(arr.length);
  for (let i = 0; i < arr.length; i++) out[i] = finiteNumber(arr[i], `${field}[${i}]`, `a finite number (${what})`);
  return out;
}

/** Temperatures in K, each > 0 (a thermal average at T = 0 or below is not defined). */
export function temperatureArray(value: unknown, field = 'temperaturesK'): Float64Array {
  const t = numberArray(value, field, 'temperatures in K');
  t.forEach((x, i) => {
    if (x <= 0) throw new InputError(`${field}[${i}]`, x, 'a temperature > 0 K');
  });
  return t;
}

/** Strictly increasing array (data to be integrated or interpolated), or InputError at the first offender. */
export function requireIncreasing(values: Float64Array, field: string): Float64Array {
  for (let i = 1; i < values.length; i++)
    if (!(values[i] > values[i - 1]))
      throw new InputError(`${field}[${i}]`, values[i], `a value > ${values[i - 1]} (the data must be strictly increasing)`);
  return values;
}

/** Two arrays of the same length, or InputError naming the second. */
export function requireSameLength(a: ArrayLike<unknown>, b: ArrayLike<unknown>, fieldA: string, fieldB: string): void {
  if (a.length !== b.length) throw new InputError(fieldB, `${b.length} values`, `${a.length} values (one per entry of ${fieldA})`);
}
