/**
 * What a cell kind is: its input schema, what it reads and writes in the sample state, its `run` and its
 * `render`. See packages/cells/README.md, "Adding a cell kind", for a complete example.
 */
import type { Random } from '@multiplet/physics/random';
import type { LongTask } from '@multiplet/physics/progress';
import type { Schema } from '../schema';
import type { JsonValue } from '../json';
import type { SourcePosition } from '../errors';

/** The readable forms of a result; the session adds the result JSON (`application/vnd.multiplet.result+json`). */
export interface RenderedResult {
  /** `text/plain`: a readable summary (a few lines). */
  text: string;
  /** `text/html`: tables with units in the column headers. */
  html: string;
  /** `application/vnd.vegalite.v5+json`, where a plot fits. Must compile with vega-lite 5. */
  vegaLite?: Record<string, unknown>;
}

export interface RenderInfo {
  name: string;
  kind: string;
  /** Normalized inputs (numbers in the schema's units). */
  inputs: Record<string, JsonValue>;
}

/** The sample as stored by a `sample` cell (see kinds/sample.ts). */
export interface SampleResult {
  compound: string;
  ion: string;
  siteSymmetry: string;
  latticeConstantAngstrom: number | null;
  ionsPerFormulaUnit: number;
  molarMassGramPerMol: number | null;
}

/** A dataset as stored by a `data` cell (see kinds/data.ts). */
export interface DatasetResult {
  columns: { name: string; unit: string; values: number[] }[];
  rows: number;
  source: { file: string | null; sha256: string };
}

export interface RunContext {
  /** The result name from the header. */
  readonly name: string;
  /** The sample defined by the latest `[sample]` cell; throws a clear CellError if there is none. */
  sample(): SampleResult;
  /** The sample, or undefined if no sample cell ran yet. */
  sampleIfDefined(): SampleResult | undefined;
  /**
   * A referenced result (deep-frozen). Only names given in `reference` fields of this cell may be read, so the
   * dependency graph is complete.
   */
  result<T = JsonValue>(name: string): T;
  /** Kind of a referenced result. */
  resultKind(name: string): string;
  /** The seed (the cell's `seed` field, or derived from the result name) and a Random made from it. */
  readonly seed: number;
  readonly random: Random;
  /** Progress (shown with update_display_data) and cooperative cancellation. */
  readonly task: LongTask;
  /**
   * Let the host's event loop run (the kernel serves interrupt and comm messages on the same thread), then throw
   * CancelledError if an interrupt arrived. Long kinds call `await ctx.yieldNow()` every ~50 ms of work.
   */
  yieldNow(): Promise<void>;
  /** Directory that relative file names are resolved against (the notebook's directory). */
  readonly notebookDir: string;
  /** Throw a CellInputError positioned at `fieldPath` (e.g. "B.B20"). */
  fail(fieldPath: string, given: unknown, expected: string): never;
  /** Line and column (1-based) of a field's value in the cell text, if present. */
  positionOf(fieldPath: string): SourcePosition | undefined;
  /** The cell text as written. */
  readonly source: string;
}

export interface CellKind<Input = Record<string, unknown>, Result = JsonValue> {
  /** Name used in the header: `[kind] resultName`. Lower case, hyphenated. */
  kind: string;
  /** One line for completion, inspection and the README. */
  summary: string;
  /** The input schema: every field with its type, unit, default, allowed values and doc. */
  fields: Schema;
  /** What it reads from the state: the current sample, named results through reference fields, or nothing. */
  reads: readonly ('sample' | 'references')[];
  /** Where the result goes: the sample slot, the datasets, or a plain named result. */
  writes: 'sample' | 'dataset' | 'result';
  /** Cross-field checks after each field was coerced. Use ctx.fail for errors. */
  check?(input: Input, ctx: Pick<RunContext, 'fail'>): void;
  /** Compute the result: plain JSON (numbers finite, arrays not typed arrays). No wall clock, no Math.random. */
  run(input: Input, ctx: RunContext): Result | Promise<Result>;
  render(result: Result, info: RenderInfo): RenderedResult;
}

/** Identity helper that keeps `Input` and `Result` typed while registering a kind. */
export function defineKind<Input, Result>(kind: CellKind<Input, Result>): CellKind<Input, Result> {
  return kind;
}

// Kinds are stored type-erased in the registry.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyCellKind = CellKind<any, any>;
