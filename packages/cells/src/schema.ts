/**
 * Input schemas of cell kinds: one `FieldSpec` per field, with its type, unit, default, allowed values and doc
 * text. `coerceInputs` checks a parsed YAML body against a schema and returns the normalized inputs (quantities
 * as numbers in the field's unit, scans as arrays, references as result names), or throws a positioned CellError.
 */
import { CellError, inputError } from './errors';
import { formatPath, keyPosition, type FieldPath, type ParsedBody } from './syntax/body';
import { parseQuantity, parseRange, QuantityProblem, unitExample } from './syntax/quantity';
import { RESULT_NAME } from './syntax/header';

/** A live control for the JupyterLab extension (slider), in the field's unit. */
export type ControlSpec =
  | { min: number; max: number; step: number }
  /**
   * A slider around the current value: value ± span·|value| (± `zeroSpan` when the value is 0), 1000 steps.
   * For inputs whose scale varies by orders of magnitude (Stevens parameters).
   */
  | { relativeSpan: number; zeroSpan: number };

interface FieldBase {
  /** What the field means, shown by inspection and in the README table. */
  doc: string;
  /** Required fields have no default. */
  required?: boolean;
  /** Value used when the field is absent, written as it would be in a cell (e.g. "4.2 K"). */
  default?: unknown;
  /** Values offered by completion (e.g. ion names) when the type itself does not list them. */
  suggestions?: readonly string[];
}

export type FieldSpec =
  | (FieldBase & {
      type: 'quantity';
      /** The unit the value is converted to (what `run` receives). "" for dimensionless. */
      unit: string;
      min?: number;
      max?: number;
      /** A sibling top-level field naming the unit of bare numbers (e.g. crystal-field's `unit`). */
      bareUnitField?: string;
      control?: ControlSpec;
    })
  | (FieldBase & { type: 'number'; min?: number; max?: number; control?: ControlSpec })
  | (FieldBase & { type: 'integer'; min?: number; max?: number })
  | (FieldBase & { type: 'boolean' })
  | (FieldBase & { type: 'string'; pattern?: RegExp; patternText?: string; maxLength?: number; multiline?: boolean })
  | (FieldBase & { type: 'choice'; values: readonly string[] })
  | (FieldBase & {
      type: 'reference';
      /** Kinds the referenced result may have; empty = any. */
      kinds: readonly string[];
    })
  | (FieldBase & { type: 'range'; unit: string; min?: number; max?: number })
  | (FieldBase & { type: 'list'; of: FieldSpec; minItems?: number; maxItems?: number })
  | (FieldBase & {
      type: 'map';
      /** Value type of every entry. */
      of: FieldSpec;
      /** Normalizes and checks a key; returns the canonical key or undefined if not allowed. */
      key?: (key: string) => string | undefined;
      /** Text for "expected" when a key is refused. */
      keyText?: string;
      /** Keys offered by completion. */
      keySuggestions?: readonly string[];
    })
  | (FieldBase & { type: 'record'; fields: Record<string, FieldSpec> });

export type Schema = Record<string, FieldSpec>;

/** What coercion needs from the session: existing results (for references). */
export interface CoercionContext {
  body: ParsedBody;
  /** kind of an existing result, or undefined. */
  resultKind(name: string): string | undefined;
  /** Names of all existing results, in definition order (for messages). */
  resultNames(): string[];
  /** Collected reference names (dependency edges). */
  references: Set<string>;
}

/** A human phrase for what a field expects. */
export function describeField(spec: FieldSpec): string {
  switch (spec.type) {
    case 'quantity':
      return spec.unit === '' ? 'a number' : `a quantity in ${spec.unit} (e.g. ${unitExample(spec.unit)})`;
    case 'number':
      return 'a number';
    case 'integer':
      return 'an integer';
    case 'boolean':
      return 'true or false';
    case 'string':
      return spec.patternText ?? 'text';
    case 'choice':
      return `one of ${spec.values.join(', ')}`;
    case 'reference':
      return spec.kinds.length ? `the name of an earlier ${spec.kinds.join(' or ')} result` : 'the name of an earlier result';
    case 'range':
      return `a scan "a ${spec.unit} .. b ${spec.unit} / n [log]", a list of quantities, or one quantity`;
    case 'list':
      return `a list of ${describeField(spec.of)}`;
    case 'map':
      return `a mapping of ${spec.keyText ?? 'name'}: ${describeField(spec.of)}`;
    case 'record':
      return `a mapping with fields ${Object.keys(spec.fields).join(', ')}`;
  }
}

/** Edit distance, for "did you mean" suggestions. */
function distance(a: string, b: string): number {
  const d = Array.from({ length: a.length + 1 }, (_, i) => [i, ...new Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) d[0]![j] = j;
  for (let i = 1; i <= a.length; i++)
    for (let j = 1; j <= b.length; j++)
      d[i]![j] = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
  return d[a.length]![b.length]!;
}

export function suggest(given: string, options: readonly string[]): string {
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const option of options) {
    const dist = distance(given.toLowerCase(), option.toLowerCase());
    if (dist < bestDistance) {
      bestDistance = dist;
      best = option;
    }
  }
  return best !== undefined && bestDistance <= Math.max(2, Math.floor(given.length / 3)) ? ` (did you mean ${best}?)` : '';
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && !(value instanceof Date);
}

/** Coerce a whole body against a schema. Extra `seed` is handled by the session, not here. */
export function coerceRecord(
  fields: Schema,
  raw: Record<string, unknown>,
  path: FieldPath,
  ctx: CoercionContext,
  top: Record<string, unknown>,
  ignore: readonly string[] = [],
): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const known = Object.keys(fields);
  for (const key of Object.keys(raw)) {
    if (ignore.includes(key) && path.length === 0) continue;
    if (!(key in fields)) {
      const where = keyPosition(ctx.body, [...path, key]);
      const list = [...known, ...(path.length === 0 ? ignore : [])];
      throw new CellError(
        'CellInputError',
        `${formatPath([...path, key])}: unknown field${suggest(key, list)}, expected one of ${list.join(', ')}`,
        { position: where, field: formatPath([...path, key]), given: key, expected: `one of ${list.join(', ')}` },
      );
    }
  }
  for (const [key, spec] of Object.entries(fields)) {
    const fieldPath = [...path, key];
    let value = raw[key];
    if (value === undefined || value === null) {
      if (spec.default !== undefined) value = spec.default;
      else if (spec.required) {
        throw inputError(formatPath(fieldPath), undefined, `${describeField(spec)} (required field: ${spec.doc})`, ctx.body.positionOf(path));
      } else continue;
    }
    out[key] = coerceValue(spec, value, fieldPath, ctx, top);
  }
  return out;
}

export function coerceValue(spec: FieldSpec, value: unknown, path: FieldPath, ctx: CoercionContext, top: Record<string, unknown>): unknown {
  const fail = (expected: string): never => {
    throw inputError(formatPath(path), value, expected, ctx.body.positionOf(path));
  };
  const bounds = (x: number, min?: number, max?: number, unit = ''): number => {
    const u = unit ? ` ${unit}` : '';
    if (min !== undefined && x < min) fail(`${describeField(spec)} of at least ${min}${u}`);
    if (max !== undefined && x > max) fail(`${describeField(spec)} of at most ${max}${u}`);
    return x;
  };
  switch (spec.type) {
    case 'quantity': {
      let bareUnit: string | undefined;
      if (spec.bareUnitField) {
        const named = top[spec.bareUnitField];
        bareUnit = typeof named === 'string' ? named : undefined;
      }
      try {
        return bounds(parseQuantity(value, spec.unit, bareUnit), spec.min, spec.max, spec.unit);
      } catch (problem) {
        if (problem instanceof QuantityProblem) return fail(problem.expected);
        throw problem;
      }
    }
    case 'number':
      if (typeof value !== 'number' || !Number.isFinite(value)) return fail('a finite number');
      return bounds(value, spec.min, spec.max);
    case 'integer':
      if (typeof value !== 'number' || !Number.isSafeInteger(value)) return fail('an integer');
      return bounds(value, spec.min, spec.max);
    case 'boolean':
      if (typeof value !== 'boolean') return fail('true or false');
      return value;
    case 'string':
      if (typeof value !== 'string') return fail(describeField(spec));
      if (spec.maxLength !== undefined && value.length > spec.maxLength) return fail(`${describeField(spec)} of at most ${spec.maxLength} characters`);
      if (spec.pattern && !spec.pattern.test(value)) return fail(describeField(spec));
      return value;
    case 'choice':
      if (typeof value !== 'string' || !spec.values.includes(value)) {
        return fail(`one of ${spec.values.join(', ')}${typeof value === 'string' ? suggest(value, spec.values) : ''}`);
      }
      return value;
    case 'reference': {
      if (typeof value !== 'string' || !RESULT_NAME.test(value)) return fail(describeField(spec));
      const kind = ctx.resultKind(value);
      const names = ctx.resultNames().filter((n) => spec.kinds.length === 0 || spec.kinds.includes(ctx.resultKind(n)!));
      const known = names.length ? `known: ${names.join(', ')}` : 'none defined yet';
      if (kind === undefined) {
        throw inputError(formatPath(path), value, `${describeField(spec)} (${known})${suggest(value, names)}`, ctx.body.positionOf(path), 'CellReferenceError');
      }
      if (spec.kinds.length && !spec.kinds.includes(kind)) {
        throw inputError(formatPath(path), value, `${describeField(spec)}, not a ${kind} result (${known})`, ctx.body.positionOf(path), 'CellReferenceError');
      }
      ctx.references.add(value);
      return value;
    }
    case 'range': {
      let values: number[];
      try {
        if (Array.isArray(value)) {
          if (value.length === 0) return fail(describeField(spec));
          values = value.map((item, i) => {
            try {
              return parseQuantity(item, spec.unit);
            } catch (problem) {
              if (problem instanceof QuantityProblem) throw inputError(formatPath([...path, i]), item, problem.expected, ctx.body.positionOf([...path, i]));
              throw problem;
            }
          });
        } else if (typeof value === 'string' && value.includes('..')) values = parseRange(value, spec.unit).values;
        else values = [parseQuantity(value, spec.unit)];
      } catch (problem) {
        if (problem instanceof QuantityProblem) return fail(problem.expected);
        throw problem;
      }
      for (const x of values) bounds(x, spec.min, spec.max, spec.unit);
      return values;
    }
    case 'list': {
      if (!Array.isArray(value)) return fail(describeField(spec));
      if (spec.minItems !== undefined && value.length < spec.minItems) return fail(`${describeField(spec)} with at least ${spec.minItems} items`);
      if (spec.maxItems !== undefined && value.length > spec.maxItems) return fail(`${describeField(spec)} with at most ${spec.maxItems} items`);
      return value.map((item, i) => coerceValue(spec.of, item, [...path, i], ctx, top));
    }
    case 'map': {
      if (!isPlainObject(value)) return fail(describeField(spec));
      const out: Record<string, unknown> = {};
      for (const [key, item] of Object.entries(value)) {
        const canonical = spec.key ? spec.key(key) : key;
        if (canonical === undefined) {
          throw inputError(formatPath([...path, key]), key, spec.keyText ?? 'a known key', keyPosition(ctx.body, [...path, key]));
        }
        if (canonical in out) {
          throw inputError(formatPath([...path, key]), key, `each key once (${canonical} is already given)`, keyPosition(ctx.body, [...path, key]));
        }
        out[canonical] = coerceValue(spec.of, item, [...path, key], ctx, top);
      }
      return out;
    }
    case 'record':
      if (!isPlainObject(value)) return fail(describeField(spec));
      return coerceRecord(spec.fields, value, path, ctx, top);
  }
}

/** Find the spec at a path (for completion and inspection). Map entries resolve to the map's value spec. */
export function specAt(schema: Schema, path: readonly string[]): FieldSpec | undefined {
  let fields: Schema | undefined = schema;
  let spec: FieldSpec | undefined;
  for (const part of path) {
    if (spec?.type === 'map') {
      spec = spec.of;
      fields = spec.type === 'record' ? spec.fields : undefined;
      continue;
    }
    if (!fields) return undefined;
    spec = fields[part];
    if (!spec) return undefined;
    fields = spec.type === 'record' ? spec.fields : undefined;
  }
  return spec;
}

/** The unit shown for a field ("" if none). */
export function fieldUnit(spec: FieldSpec): string {
  if (spec.type === 'quantity' || spec.type === 'range') return spec.unit;
  if (spec.type === 'map' || spec.type === 'list') return fieldUnit(spec.of);
  return '';
}
