/**
 * The sample state: one per session. It holds every named result with its provenance, which result is the
 * current sample, and the dependency graph (each result lists the results it read). Datasets are the results
 * whose role is "dataset".
 *
 * Changes are atomic: a cell computes its record first and `commit` swaps it in with one assignment, so a
 * failing cell leaves the state exactly as it was (byte for byte in `serialize()`).
 *
 * Saved form (versioned): `{ "format": "multiplet-state", "version": 1, "sample": name|null,
 * "order": [names in definition order], "results": { name: ResultRecord } }`, keys sorted, no wall clock.
 */
import { CellError } from './errors';
import { canonicalJson, type JsonValue } from './json';

export const STATE_FORMAT = 'multiplet-state';
export const STATE_VERSION = 1;

export type ResultRole = 'sample' | 'dataset' | 'result';

export interface ResultRecord {
  name: string;
  kind: string;
  role: ResultRole;
  /** The cell text that produced it (rerun and write-back use it). */
  source: string;
  /** The body as written (YAML values). */
  inputsGiven: JsonValue;
  /** Normalized inputs: quantities as numbers in the schema's units. */
  inputs: JsonValue;
  result: JsonValue;
  /** Names of the results this one read (sorted). */
  reads: string[];
  seed: number;
  /** Version of @multiplet/cells that computed it. */
  version: string;
  /** True once an upstream result was recomputed after this one. */
  stale: boolean;
  /** Jupyter execution count of the producing request (null when rerun from a comm or rerunStale). */
  executionCount: number | null;
}

export interface StateData {
  sample: string | null;
  order: string[];
  results: Record<string, ResultRecord>;
}

const EMPTY: StateData = Object.freeze({ sample: null, order: [], results: {} }) as StateData;

export class SampleState {
  private data: StateData = EMPTY;

  get sampleName(): string | null {
    return this.data.sample;
  }

  get(name: string): ResultRecord | undefined {
    return Object.prototype.hasOwnProperty.call(this.data.results, name) ? this.data.results[name] : undefined;
  }

  /** Result names in definition order. */
  names(): string[] {
    return this.data.order.slice();
  }

  datasets(): string[] {
    return this.data.order.filter((n) => this.data.results[n]!.role === 'dataset');
  }

  /** Every result that depends on `name`, directly or not, in definition order. */
  dependantsOf(name: string): string[] {
    const found = new Set<string>();
    let grew = true;
    while (grew) {
      grew = false;
      for (const n of this.data.order) {
        if (found.has(n) || n === name) continue;
        const reads = this.data.results[n]!.reads;
        if (reads.includes(name) || reads.some((r) => found.has(r))) {
          found.add(n);
          grew = true;
        }
      }
    }
    return this.data.order.filter((n) => found.has(n));
  }

  /**
   * Check that storing `name` reading `reads` keeps the graph acyclic; throws CellReferenceError otherwise.
   */
  checkAcyclic(name: string, reads: readonly string[]): void {
    if (reads.includes(name)) {
      throw new CellError('CellReferenceError', `${name} cannot read itself`, { field: name, given: name, expected: 'a reference to another result' });
    }
    const downstream = new Set(this.dependantsOf(name));
    const loop = reads.find((r) => downstream.has(r));
    if (loop) {
      throw new CellError(
        'CellReferenceError',
        `${name} would read ${loop}, which itself depends on ${name}: a dependency cycle`,
        { field: name, given: loop, expected: 'references to results that do not depend on this one' },
      );
    }
  }

  /**
   * Store a record (new or replacing one of the same name). Dependants of a replaced result become stale.
   * Returns the names marked stale.
   */
  commit(record: ResultRecord): string[] {
    const existed = this.get(record.name) !== undefined;
    const staleNames = existed ? this.dependantsOf(record.name) : [];
    const results = { ...this.data.results, [record.name]: record };
    for (const n of staleNames) results[n] = { ...results[n]!, stale: true };
    this.data = {
      sample: record.role === 'sample' ? record.name : this.data.sample === record.name ? null : this.data.sample,
      order: existed ? this.data.order : [...this.data.order, record.name],
      results,
    };
    return staleNames;
  }

  /** Stale results in an order that respects dependencies (definition order breaks ties). */
  staleInOrder(): string[] {
    const stale = this.data.order.filter((n) => this.data.results[n]!.stale);
    const done = new Set<string>();
    const out: string[] = [];
    const visit = (n: string, path: Set<string>): void => {
      if (done.has(n) || path.has(n)) return;
      path.add(n);
      for (const r of this.data.results[n]?.reads ?? []) if (stale.includes(r)) visit(r, path);
      path.delete(n);
      done.add(n);
      out.push(n);
    };
    for (const n of stale) visit(n, new Set());
    return out;
  }

  /** The whole state as canonical JSON (sorted keys): equal states give equal strings. */
  serialize(indent?: number): string {
    return canonicalJson({ format: STATE_FORMAT, version: STATE_VERSION, ...this.data }, indent);
  }

  /** Replace the whole state with a parsed saved state (validated first; on error nothing changes). */
  load(text: string): void {
    this.data = parseSavedState(text);
  }

  clear(): void {
    this.data = EMPTY;
  }

  /** An independent copy (for trial runs). */
  copyData(): StateData {
    return JSON.parse(JSON.stringify(this.data)) as StateData;
  }
}

/** Validate a saved state file; throws CellInputError naming the first bad field. */
export function parseSavedState(text: string): StateData {
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (error) {
    throw new CellError('CellInputError', `state file: not JSON (${(error as Error).message})`, { expected: 'a multiplet-state JSON file' });
  }
  const bad = (field: string, given: unknown, expected: string): never => {
    throw new CellError('CellInputError', `state file ${field}: got ${JSON.stringify(given)?.slice(0, 60)}, expected ${expected}`, { field, given, expected });
  };
  if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) return bad('(top)', parsed, 'an object');
  const p = parsed as Record<string, unknown>;
  if (p.format !== STATE_FORMAT) bad('format', p.format, `"${STATE_FORMAT}"`);
  if (p.version !== STATE_VERSION) bad('version', p.version, `${STATE_VERSION} (this is the only version this build reads)`);
  if (!Array.isArray(p.order) || !p.order.every((n) => typeof n === 'string')) bad('order', p.order, 'a list of result names');
  if (typeof p.results !== 'object' || p.results === null || Array.isArray(p.results)) bad('results', p.results, 'an object of result records');
  const order = p.order as string[];
  const results = p.results as Record<string, Record<string, unknown>>;
  if (new Set(order).size !== order.length || order.length !== Object.keys(results).length || !order.every((n) => n in results)) {
    bad('order', order, 'each name in results exactly once');
  }
  for (const name of order) {
    const r = results[name]!;
    const at = `results.${name}`;
    if (typeof r !== 'object' || r === null) bad(at, r, 'a result record');
    if (r.name !== name) bad(`${at}.name`, r.name, JSON.stringify(name));
    for (const key of ['kind', 'source', 'version'] as const) if (typeof r[key] !== 'string') bad(`${at}.${key}`, r[key], 'text');
    if (r.role !== 'sample' && r.role !== 'dataset' && r.role !== 'result') bad(`${at}.role`, r.role, 'sample, dataset or result');
    if (!Array.isArray(r.reads) || !(r.reads as unknown[]).every((x) => typeof x === 'string' && x in results)) {
      bad(`${at}.reads`, r.reads, 'names of results in this file');
    }
    if (typeof r.seed !== 'number' || !Number.isSafeInteger(r.seed)) bad(`${at}.seed`, r.seed, 'an integer');
    if (typeof r.stale !== 'boolean') bad(`${at}.stale`, r.stale, 'true or false');
    if (r.executionCount !== null && typeof r.executionCount !== 'number') bad(`${at}.executionCount`, r.executionCount, 'a number or null');
    if (!('result' in r) || !('inputs' in r) || !('inputsGiven' in r)) bad(at, Object.keys(r), 'result, inputs and inputsGiven');
  }
  if (p.sample !== null && (typeof p.sample !== 'string' || results[p.sample]?.role !== 'sample')) {
    bad('sample', p.sample, 'null or the name of a sample result');
  }
  return { sample: p.sample as string | null, order: order.slice(), results: results as unknown as Record<string, ResultRecord> };
}
