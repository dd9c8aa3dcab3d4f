/**
 * Typed errors shared by every Multiplet package.
 *
 * `InputError` names the field (a path such as `B.B43` or `peaks[2].errorMeV`), the value given and what was
 * expected, so that a notebook cell or the `compute` command can print one precise line.
 */
export class InputError extends Error {
  readonly field: string;
  readonly value: unknown;
  readonly expected: string;

  constructor(field: string, value: unknown, expected: string, detail?: string) {
    super(`${field}: got ${describeValue(value)}, expected ${expected}${detail ? ` (${detail})` : ''}`);
    this.name = 'InputError';
    this.field = field;
    this.value = value;
    this.expected = expected;
  }
}

/** Thrown by long computations when their cancellation token fires. */
export class CancelledError extends Error {
  constructor(message = 'cancelled') {
    super(message);
    this.name = 'CancelledError';
  }
}

/** A short, printable rendering of an arbitrary input value for error messages. */
export function describeValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (typeof value === 'string') return JSON.stringify(value.length > 60 ? value.slice(0, 57) + '...' : value);
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  try {
    const s = JSON.stringify(value);
    if (s === undefined) return String(value);
    return s.length > 60 ? s.slice(0, 57) + '...' : s;
  } catch {
    return String(value);
  }
}
