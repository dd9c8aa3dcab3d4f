/**
 * What the front end reads and sends. The kernel side (packages/cells) owns these formats and documents them in
 * packages/cells/README.md; this file is the front end's typed view of them, tolerant of extra fields.
 */

/** The MIME type of a typed cell's result, rendered by `ResultRenderer`. */
export const RESULT_MIME_TYPE = 'application/vnd.multiplet.result+json';

/** Comm target for live controls: the front end sends new control values, the kernel reruns cells. */
export const CONTROLS_COMM_TARGET = 'multiplet.controls';

/** Comm target for the sample state: snapshots from the kernel; snapshot, rerun-stale, save and load requests. */
export const STATE_COMM_TARGET = 'multiplet.state';

/** The vega-lite v5 MIME type the kernel puts beside the result (JupyterLab 4 renders v5 natively). */
export const VEGALITE_MIME_TYPE = 'application/vnd.vegalite.v5+json';

/** A free input of a cell the user can move without editing the text (values in `unit`). */
export interface ResultControl {
  /** Field path in the cell body, e.g. "B.B20". */
  field: string;
  label: string;
  unit: string;
  value: number;
  min: number;
  max: number;
  step: number;
}

/** What the renderer shows of one output bundle. */
export interface ResultPayload {
  version: number;
  kind: string;
  name: string;
  stale: boolean;
  controls: ResultControl[];
  /** `text/html` of the bundle: tables with units (only text is taken over, see renderer.ts). */
  html: string;
  /** `text/plain` of the bundle. */
  text: string;
  /** The vega-lite v5 plot of the bundle, if the kind draws one. */
  vegaLite: Record<string, unknown> | null;
}

/** One named result in the sample state. */
export interface StateResultEntry {
  name: string;
  kind: string;
  role: string;
  stale: boolean;
  reads: string[];
  executionCount: number | null;
  /** nbformat id of the notebook cell that last produced it, when the kernel knows it. */
  cellId: string | null;
}

export interface StateDataset {
  name: string;
  rows: number;
  columns: { name: string; unit: string }[];
}

export interface StateSnapshot {
  /** The sample (`name` plus the sample cell's result), or null before a sample cell ran. */
  sample: Record<string, unknown> | null;
  datasets: StateDataset[];
  results: StateResultEntry[];
}

function asRecord(value: unknown): Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : {};
}

function asArray(value: unknown): unknown[] {
  return Array.isArray(value) ? value : [];
}

function finite(value: unknown): number | undefined {
  return typeof value === 'number' && Number.isFinite(value) ? value : undefined;
}

function text(value: unknown): string {
  if (typeof value === 'string') return value;
  if (Array.isArray(value)) return value.join('');
  return '';
}

/** Read an output bundle whose preferred type is `RESULT_MIME_TYPE`; unknown fields are ignored. */
export function parseResult(bundle: Record<string, unknown>): ResultPayload {
  const data = asRecord(bundle[RESULT_MIME_TYPE]);
  const controls: ResultControl[] = [];
  for (const item of asArray(data.controls)) {
    const c = asRecord(item);
    const value = finite(c.value);
    if (typeof c.field !== 'string' || value === undefined) continue;
    const span = Math.max(Math.abs(value), 1);
    const min = finite(c.min) ?? value - span;
    const max = finite(c.max) ?? value + span;
    controls.push({
      field: c.field,
      label: typeof c.label === 'string' ? c.label : c.field,
      unit: typeof c.unit === 'string' ? c.unit : '',
      value,
      min,
      max,
      step: finite(c.step) ?? (max - min) / 200,
    });
  }
  const plot = asRecord(bundle[VEGALITE_MIME_TYPE]);
  return {
    version: finite(data.version) ?? 1,
    kind: String(data.kind ?? ''),
    name: String(data.name ?? ''),
    stale: data.stale === true,
    controls,
    html: text(bundle['text/html']),
    text: text(bundle['text/plain']),
    vegaLite: Object.keys(plot).length > 0 ? plot : null,
  };
}

/** Read a `snapshot` message of the state comm. */
export function parseSnapshot(raw: unknown): StateSnapshot {
  const data = asRecord(raw);
  return {
    sample: data.sample === null || data.sample === undefined ? null : asRecord(data.sample),
    datasets: asArray(data.datasets).map((d) => {
      const ds = asRecord(d);
      return {
        name: String(ds.name ?? ''),
        rows: finite(ds.rows) ?? 0,
        columns: asArray(ds.columns).map((c) => ({ name: String(asRecord(c).name ?? ''), unit: String(asRecord(c).unit ?? '') })),
      };
    }),
    results: asArray(data.results).map((r) => {
      const entry = asRecord(r);
      return {
        name: String(entry.name ?? ''),
        kind: String(entry.kind ?? ''),
        role: String(entry.role ?? ''),
        stale: entry.stale === true,
        reads: asArray(entry.reads).map(String),
        executionCount: finite(entry.executionCount) ?? null,
        cellId: typeof entry.cellId === 'string' && entry.cellId !== '' ? entry.cellId : null,
      };
    }),
  };
}
