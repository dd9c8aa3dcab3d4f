/**
 * What the front end reads and sends. The kernel side (packages/cells) owns these formats and documents them in
 * packages/cells/README.md; this file is the front end's typed view of them, tolerant of extra fields.
 */

/** The MIME type of a typed cell's result, rendered by `ResultRenderer`. */
export const RESULT_MIME_TYPE = 'application/vnd.multiplet.result+json';

/** Comm target for live controls: the front end sends new control values, the kernel reruns cells. */
export const CONTROLS_COMM_TARGET = 'multiplet.controls';

/** Comm target for the sample state: snapshots from the kernel, save/load/template requests from the front end. */
export const STATE_COMM_TARGET = 'multiplet.state';

/** One column of a result table; `unit` is shown in the header. */
export interface TableColumn {
  name: string;
  unit?: string;
}

export interface ResultTable {
  title?: string;
  columns: TableColumn[];
  rows: unknown[][];
}

export interface ResultPlot {
  title?: string;
  /** A vega-lite v5 specification. */
  spec: Record<string, unknown>;
  /** What the plot shows, for the test suite and screen readers ("levels", "magnetization", …). */
  role?: string;
}

/** A free input of a cell the user can move without editing the text. */
export interface ResultControl {
  /** Field path in the cell body, e.g. "B20" or "parameters.B20". */
  path: string;
  label?: string;
  unit?: string;
  value: number;
  min?: number;
  max?: number;
  step?: number;
}

export interface ResultPayload {
  kind: string;
  name: string;
  cellId?: string;
  summary?: string;
  tables: ResultTable[];
  plots: ResultPlot[];
  controls: ResultControl[];
  stale: boolean;
}

/** One named result in the sample state. */
export interface StateResultEntry {
  name: string;
  kind: string;
  cellId?: string;
  executionCount?: number;
  stale: boolean;
  dependsOn: string[];
}

export interface StateDataset {
  name: string;
  description: string;
}

export interface StateSnapshot {
  compound: Record<string, unknown> | null;
  datasets: StateDataset[];
  results: StateResultEntry[];
}

function asRecord(value: unknown): Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : {};
}

function asArray(value: unknown): unknown[] {
  return Array.isArray(value) ? value : [];
}

function optionalString(value: unknown): string | undefined {
  return typeof value === 'string' && value !== '' ? value : undefined;
}

function optionalNumber(value: unknown): number | undefined {
  return typeof value === 'number' && Number.isFinite(value) ? value : undefined;
}

/** Read a result payload as the kernel sent it; unknown fields are ignored, missing lists become empty. */
export function parseResult(raw: unknown): ResultPayload {
  const data = asRecord(raw);
  const tables: ResultTable[] = asArray(data.tables).map((t) => {
    const table = asRecord(t);
    return {
      title: optionalString(table.title),
      columns: asArray(table.columns).map((c) =>
        typeof c === 'string' ? { name: c } : { name: String(asRecord(c).name ?? ''), unit: optionalString(asRecord(c).unit) },
      ),
      rows: asArray(table.rows).map((r) => asArray(r)),
    };
  });
  const plots: ResultPlot[] = asArray(data.plots)
    .map((p) => asRecord(p))
    .filter((p) => Object.keys(asRecord(p.spec)).length > 0)
    .map((p) => ({ title: optionalString(p.title), role: optionalString(p.role), spec: asRecord(p.spec) }));
  const controls: ResultControl[] = asArray(data.controls)
    .map((c) => asRecord(c))
    .filter((c) => typeof (c.path ?? c.name) === 'string' && optionalNumber(c.value) !== undefined)
    .map((c) => ({
      path: String(c.path ?? c.name),
      label: optionalString(c.label),
      unit: optionalString(c.unit),
      value: c.value as number,
      min: optionalNumber(c.min),
      max: optionalNumber(c.max),
      step: optionalNumber(c.step),
    }));
  return {
    kind: String(data.kind ?? ''),
    name: String(data.name ?? ''),
    cellId: optionalString(data.cellId),
    summary: optionalString(data.summary),
    tables,
    plots,
    controls,
    stale: data.stale === true,
  };
}

/** Read a state snapshot sent on the state comm. */
export function parseSnapshot(raw: unknown): StateSnapshot {
  const data = asRecord(raw);
  const compound = data.compound === null || data.compound === undefined ? null : asRecord(data.compound);
  return {
    compound,
    datasets: asArray(data.datasets).map((d) => {
      const ds = asRecord(d);
      return { name: String(ds.name ?? ''), description: String(ds.description ?? '') };
    }),
    results: asArray(data.results).map((r) => {
      const entry = asRecord(r);
      return {
        name: String(entry.name ?? ''),
        kind: String(entry.kind ?? ''),
        cellId: optionalString(entry.cellId),
        executionCount: optionalNumber(entry.executionCount),
        stale: entry.stale === true,
        dependsOn: asArray(entry.dependsOn).map(String),
      };
    }),
  };
}
