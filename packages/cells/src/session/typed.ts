/**
 * Running one typed cell: parse the header and body, coerce the inputs, run the kind, render. Nothing here
 * touches the state: the caller commits the returned record, so a failure anywhere leaves the state unchanged.
 */
import { createRandom } from '@multiplet/physics/random';
import { InputError, CancelledError } from '@multiplet/physics/errors';
import { CellError, inputError, type SourcePosition } from '../errors';
import { parseBody, formatPath } from '../syntax/body';
import type { CellHeader } from '../syntax/header';
import { coerceRecord, suggest, type CoercionContext, type FieldSpec, type Schema } from '../schema';
import { getKind, kindNames } from '../kinds';
import type { AnyCellKind, RunContext, SampleResult } from '../kinds/types';
import { frozenCopy, toJsonValue, type JsonValue } from '../json';
import type { SampleState, ResultRecord } from '../state';
import { CELLS_PACKAGE, CELLS_VERSION } from '../version';
import { RESULT_MIME_TYPE, RESULT_MIME_VERSION, VEGALITE_MIME_TYPE, type ResultControl, type ResultPayload } from '../mime';
import type { CellOutput, MimeBundle } from '../protocol';
import { createProgressTask } from './progress';

/** Fields every kind accepts besides its own. */
export const COMMON_FIELDS: Schema = {
  seed: {
    type: 'integer',
    min: 0,
    max: 4294967295,
    doc: 'Seed of the random numbers this cell uses (default: derived from the result name, so reruns are identical).',
  },
};

export interface TypedRunEnv {
  state: SampleState;
  notebookDir: string;
  emit(output: CellOutput): void;
  cancelFlag?: Int32Array;
  executionCount: number | null;
  /** Unique id for the progress display of this run. */
  progressDisplayId: string;
}

export interface TypedRunOutcome {
  record: ResultRecord;
  bundle: MimeBundle;
  metadata: Record<string, unknown>;
}

/** 32-bit FNV-1a of the result name: the default seed (stable across hosts and versions). */
export function seedFromName(name: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < name.length; i++) {
    h ^= name.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h >>> 0;
}

export function lookupKind(header: CellHeader): AnyCellKind {
  const kind = getKind(header.kind);
  if (!kind) {
    const names = kindNames();
    throw new CellError('CellSyntaxError', `header: unknown cell kind "${header.kind}"${suggest(header.kind, names)}, expected one of ${names.join(', ')}`, {
      position: { line: header.lineIndex + 1, column: header.kindOffset - header.offset + 1 },
      field: 'header',
      given: header.kind,
      expected: `one of ${names.join(', ')}`,
    });
  }
  return kind;
}

function pathFromText(field: string): (string | number)[] {
  const out: (string | number)[] = [];
  for (const part of field.split('.')) {
    const m = /^([^[\]]*)((?:\[\d+\])*)$/.exec(part);
    if (!m) {
      out.push(part);
      continue;
    }
    if (m[1]) out.push(m[1]);
    for (const index of m[2]!.matchAll(/\[(\d+)\]/g)) out.push(Number(index[1]));
  }
  return out;
}

export async function runTypedCell(source: string, header: CellHeader, body: string, env: TypedRunEnv): Promise<TypedRunOutcome> {
  const kind = lookupKind(header);
  const headerPosition: SourcePosition = { line: header.lineIndex + 1, column: 1 };
  const parsed = parseBody(body, headerPosition);
  const references = new Set<string>();
  const coercion: CoercionContext = {
    body: parsed,
    resultKind: (name) => env.state.get(name)?.kind,
    resultNames: () => env.state.names(),
    references,
  };
  const raw = parsed.value;
  const common = coerceRecord(COMMON_FIELDS, Object.fromEntries(Object.entries(raw).filter(([k]) => k in COMMON_FIELDS)), [], coercion, raw);
  // Sibling lookups (a quantity's bareUnitField) see defaults too.
  const defaults = Object.fromEntries(Object.entries(kind.fields).filter(([, spec]) => spec.default !== undefined).map(([k, spec]) => [k, spec.default]));
  const inputs = coerceRecord(kind.fields, raw, [], coercion, { ...defaults, ...raw }, Object.keys(COMMON_FIELDS));
  const seed = (common.seed as number | undefined) ?? seedFromName(header.name);

  const positionOf = (field: string): SourcePosition | undefined => (field === '' ? headerPosition : parsed.positionOf(pathFromText(field)));
  const fail = (field: string, given: unknown, expected: string): never => {
    throw inputError(field, given, expected, positionOf(field));
  };
  kind.check?.(inputs, { fail });

  // The sample is read implicitly by kinds that declare it; it becomes a dependency when it exists.
  const reads = new Set(references);
  const sampleName = env.state.sampleName;
  if (kind.reads.includes('sample') && sampleName !== null && sampleName !== header.name) reads.add(sampleName);
  try {
    env.state.checkAcyclic(header.name, [...reads]);
  } catch (error) {
    // Point at the reference field that closes the loop.
    if (!(error instanceof CellError)) throw error;
    const loopField = Object.keys(raw).find((k) => raw[k] === error.given) ?? '';
    throw new CellError(error.ename, error.detail, { position: positionOf(loopField), field: loopField || error.field, given: error.given, expected: error.expected });
  }

  const task = createProgressTask(header.name, env.progressDisplayId, env.emit, env.cancelFlag);

  const ctx: RunContext = {
    name: header.name,
    source,
    seed,
    random: createRandom(seed),
    task,
    async yieldNow() {
      await new Promise<void>((resolve) => setImmediate(resolve));
      task.checkpoint();
    },
    notebookDir: env.notebookDir,
    fail,
    positionOf,
    sample(): SampleResult {
      const s = this.sampleIfDefined();
      if (!s) {
        throw new CellError('CellReferenceError', `[${kind.kind}] ${header.name} needs a sample: run a [sample] cell first (compound, ion, site symmetry)`, {
          position: headerPosition,
          field: 'sample',
          expected: 'a [sample] cell before this one',
        });
      }
      return s;
    },
    sampleIfDefined(): SampleResult | undefined {
      if (sampleName === null || !kind.reads.includes('sample')) return undefined;
      return frozenCopy(env.state.get(sampleName)!.result) as unknown as SampleResult;
    },
    result<T>(name: string): T {
      if (!references.has(name)) {
        throw new CellError('CellReferenceError', `[${kind.kind}] ${header.name} read "${name}" without a reference field naming it`, { position: headerPosition });
      }
      return frozenCopy(env.state.get(name)!.result) as T;
    },
    resultKind(name: string): string {
      return env.state.get(name)?.kind ?? '';
    },
  };

  let result: JsonValue;
  try {
    result = toJsonValue(await kind.run(inputs, ctx));
  } catch (error) {
    throw toCellError(error, positionOf, headerPosition);
  }
  task.finish();

  const inputsJson = toJsonValue(inputs, 'inputs') as Record<string, JsonValue>;
  const record: ResultRecord = {
    name: header.name,
    kind: kind.kind,
    role: kind.writes,
    source,
    inputsGiven: toJsonValue(raw, 'inputs'),
    inputs: inputsJson,
    result,
    reads: [...reads].sort(),
    seed,
    version: CELLS_VERSION,
    stale: false,
    executionCount: env.executionCount,
  };
  const { bundle, metadata } = renderRecord(record);
  return { record, bundle, metadata };
}

/** Convert anything thrown by a kind into a positioned CellError. */
export function toCellError(error: unknown, positionOf: (field: string) => SourcePosition | undefined, fallback: SourcePosition): CellError {
  if (error instanceof CellError) return error;
  if (error instanceof CancelledError) return new CellError('CellInterrupted', 'interrupted: the cell was stopped before it finished; the state is unchanged');
  if (error instanceof InputError) {
    return inputError(error.field, error.value, error.expected, positionOf(error.field) ?? fallback);
  }
  const message = error instanceof Error ? error.message : String(error);
  return new CellError('CellRunError', `the computation failed: ${message}`, { position: fallback });
}

/** Controls for the schema fields that declare one, with the record's current values. */
export function controlsFor(kind: AnyCellKind, inputs: Record<string, JsonValue>): ResultControl[] {
  const out: ResultControl[] = [];
  const visit = (fields: Schema, values: Record<string, JsonValue>, prefix: (string | number)[]): void => {
    for (const [key, spec] of Object.entries(fields)) {
      const value = values[key];
      if (value === undefined || value === null) continue;
      const path = [...prefix, key];
      const add = (s: FieldSpec, v: JsonValue, p: (string | number)[]): void => {
        if ((s.type === 'quantity' || s.type === 'number') && s.control && typeof v === 'number') {
          const c = s.control;
          let min: number, max: number, step: number;
          if ('relativeSpan' in c) {
            const half = v === 0 ? c.zeroSpan : Math.abs(v) * c.relativeSpan;
            [min, max, step] = [v - half, v + half, Number(((2 * half) / 1000).toPrecision(3))];
          } else [min, max, step] = [Math.min(c.min, v), Math.max(c.max, v), c.step];
          out.push({ field: formatPath(p), label: String(p[p.length - 1]), unit: s.type === 'quantity' ? s.unit : '', value: v, min, max, step });
        }
      };
      if (spec.type === 'map' && typeof value === 'object' && !Array.isArray(value)) {
        for (const [k, v] of Object.entries(value)) add(spec.of, v, [...path, k]);
      } else if (spec.type === 'record' && typeof value === 'object' && !Array.isArray(value)) {
        visit(spec.fields, value, path);
      } else add(spec, value, path);
    }
  };
  visit(kind.fields, inputs, []);
  return out;
}

/** The MIME bundle and output metadata of a stored result (also used to refresh displays after a rerun). */
export function renderRecord(record: ResultRecord): { bundle: MimeBundle; metadata: Record<string, unknown> } {
  const kind = getKind(record.kind);
  if (!kind) throw new CellError('CellRunError', `result ${record.name} has kind "${record.kind}", which this build does not know`);
  const inputs = record.inputs as Record<string, JsonValue>;
  const rendered = kind.render(record.result, { name: record.name, kind: record.kind, inputs });
  const controls = controlsFor(kind, inputs);
  const payload: ResultPayload = {
    version: RESULT_MIME_VERSION,
    kind: record.kind,
    name: record.name,
    inputs: record.inputs,
    result: record.result,
    provenance: { kind: record.kind, inputsGiven: record.inputsGiven, seed: record.seed, package: CELLS_PACKAGE, reads: record.reads },
    stale: record.stale,
    ...(controls.length ? { controls } : {}),
  };
  const staleNote = record.stale ? '\n(stale: an input it read was recomputed; rerun it or use rerun-stale)' : '';
  const bundle: MimeBundle = {
    'text/plain': rendered.text + staleNote,
    'text/html': rendered.html,
    ...(rendered.vegaLite ? { [VEGALITE_MIME_TYPE]: rendered.vegaLite } : {}),
    [RESULT_MIME_TYPE]: payload,
  };
  const metadata = { multiplet: { kind: record.kind, name: record.name, seed: record.seed, version: CELLS_VERSION, inputs: record.inputsGiven } };
  return { bundle, metadata };
}
