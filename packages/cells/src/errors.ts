/**
 * Errors raised while parsing, validating or running a cell. Each carries the position in the cell text
 * (1-based line and column), the field path inside the YAML body (`B.B20`, `columns[1]`), the value given and
 * what was expected, so that a notebook shows one precise line. Physics `InputError`s raised by a kind's `run`
 * are converted to `CellError` with the position of the field they name (see session/execute.ts).
 */
import { describeValue } from '@multiplet/physics/errors';

export interface SourcePosition {
  /** 1-based line in the cell text. */
  line: number;
  /** 1-based column in the cell text. */
  column: number;
}

/** The Jupyter `ename` of each kind of failure. */
export type CellErrorName =
  | 'CellSyntaxError'
  | 'CellInputError'
  | 'CellReferenceError'
  | 'CellRunError'
  | 'CellInterrupted'
  | 'ScriptError';

export class CellError extends Error {
  readonly ename: CellErrorName;
  readonly position: SourcePosition | undefined;
  readonly field: string | undefined;
  readonly given: unknown;
  readonly expected: string | undefined;
  /** The text of the message without the position prefix. */
  readonly detail: string;

  constructor(
    ename: CellErrorName,
    detail: string,
    options: { position?: SourcePosition; field?: string; given?: unknown; expected?: string } = {},
  ) {
    const where = options.position ? `line ${options.position.line}, column ${options.position.column}: ` : '';
    super(where + detail);
    this.name = ename;
    this.ename = ename;
    this.detail = detail;
    this.position = options.position;
    this.field = options.field;
    this.given = options.given;
    this.expected = options.expected;
  }
}

/** A `CellInputError` in the usual shape: `field: got X, expected Y`. */
export function inputError(
  field: string,
  given: unknown,
  expected: string,
  position?: SourcePosition,
  ename: CellErrorName = 'CellInputError',
): CellError {
  const label = field === '' ? 'cell body' : field;
  return new CellError(ename, `${label}: got ${given === undefined ? 'nothing' : describeValue(given)}, expected ${expected}`, {
    position,
    field,
    given,
    expected,
  });
}
