/**
 * Comms for the JupyterLab extension (message shapes documented in packages/cells/README.md, "Comm protocol").
 *
 * multiplet.controls  {action:"set", result, field, value} → rerun that cell (value written back into its text)
 *                     and its dependants, update their displays in place, reply {action:"updated", results, source};
 *                     {action:"writeback", result} → {action:"writeback", result, source}
 * multiplet.state     {action:"snapshot"|"rerun-stale"|"save"|"load"}; the session also pushes a snapshot after
 *                     every execution to every open state comm.
 */
import type { CommHost, ExecuteOptions } from '../protocol';
import { CellError } from '../errors';
import type { SampleState } from '../state';
import type { MultipletSession } from './session';
import { setFieldInSource, valueText } from './writeback';
import { getKind } from '../kinds';
import { controlsFor } from './typed';
import type { JsonValue } from '../json';

export const CONTROLS_TARGET = 'multiplet.controls';
export const STATE_TARGET = 'multiplet.state';

export interface StateSnapshot {
  sample: (Record<string, unknown> & { name: string }) | null;
  datasets: { name: string; rows: number; columns: { name: string; unit: string }[] }[];
  results: {
    name: string;
    kind: string;
    role: string;
    stale: boolean;
    reads: string[];
    executionCount: number | null;
    /** nbformat id of the notebook cell that last produced it, when the host passed one (null otherwise). */
    cellId: string | null;
  }[];
}

export function stateSnapshot(state: SampleState, cellIdOf: (name: string) => string | undefined = () => undefined): StateSnapshot {
  const sampleName = state.sampleName;
  const sample = sampleName === null ? null : { name: sampleName, ...(state.get(sampleName)!.result as Record<string, unknown>) };
  const datasets = state.datasets().map((name) => {
    const r = state.get(name)!.result as { rows: number; columns: { name: string; unit: string }[] };
    return { name, rows: r.rows, columns: r.columns.map((c) => ({ name: c.name, unit: c.unit })) };
  });
  const results = state.names().map((name) => {
    const r = state.get(name)!;
    return { name, kind: r.kind, role: r.role, stale: r.stale, reads: r.reads, executionCount: r.executionCount, cellId: cellIdOf(name) ?? null };
  });
  return { sample, datasets, results };
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

function asRecord(data: unknown): Record<string, unknown> {
  return typeof data === 'object' && data !== null && !Array.isArray(data) ? (data as Record<string, unknown>) : {};
}

export function openControlsComm(session: MultipletSession, host: CommHost) {
  return {
    async onMessage(data: unknown, options: ExecuteOptions): Promise<void> {
      const message = asRecord(data);
      const action = message.action;
      const name = typeof message.result === 'string' ? message.result : '';
      const record = session.state.get(name);
      if (action !== 'set' && action !== 'writeback') {
        host.send({ action: 'error', message: `unknown action ${JSON.stringify(action)}, expected "set" or "writeback"` });
        return;
      }
      if (!record) {
        host.send({ action: 'error', result: name, message: `no result named ${JSON.stringify(message.result)}; known: ${session.state.names().join(', ') || 'none'}` });
        return;
      }
      if (action === 'writeback') {
        host.send({ action: 'writeback', result: name, source: record.source, cellId: session.cellIdOf(name) ?? null });
        return;
      }
      const field = typeof message.field === 'string' ? message.field : '';
      try {
        const kind = getKind(record.kind);
        const control = kind ? controlsFor(kind, record.inputs as Record<string, JsonValue>).find((c) => c.field === field) : undefined;
        let text: string;
        if (typeof message.value === 'number' && Number.isFinite(message.value)) {
          if (!control) throw new CellError('CellInputError', `${field}: not a live control of ${name}`, { field, given: field, expected: 'a field listed in the result\'s controls' });
          text = valueText(message.value, control.unit);
        } else if (typeof message.value === 'string' && message.value.length <= 200 && !/[\n\r#:{}[\],&*!|>'"%@`]/.test(message.value)) {
          text = message.value;
        } else {
          throw new CellError('CellInputError', `${field}: got ${JSON.stringify(message.value)?.slice(0, 60)}, expected a finite number (in ${control?.unit || 'the control unit'}) or a "value unit" text`, { field });
        }
        const source = setFieldInSource(record.source, field, text);
        const reports = await session.rerunWithSource(name, source, options);
        host.send({ action: 'updated', result: name, field, source, cellId: session.cellIdOf(name) ?? null, results: reports });
      } catch (error) {
        host.send({ action: 'error', result: name, field, message: messageOf(error) });
      }
    },
    onClose() {},
  };
}

export function openStateComm(session: MultipletSession, host: CommHost) {
  return {
    async onMessage(data: unknown, options: ExecuteOptions): Promise<void> {
      const message = asRecord(data);
      try {
        switch (message.action) {
          case 'snapshot':
            host.send({ action: 'snapshot', ...session.snapshot() });
            return;
          case 'rerun-stale': {
            const results = await session.rerunStale(options);
            host.send({ action: 'rerun-stale', results });
            return;
          }
          case 'save': {
            if (typeof message.path !== 'string' || message.path === '') throw new CellError('CellInputError', 'save: expected a path', { field: 'path' });
            host.send({ action: 'saved', path: session.save(message.path) });
            return;
          }
          case 'load': {
            if (typeof message.path !== 'string' || message.path === '') throw new CellError('CellInputError', 'load: expected a path', { field: 'path' });
            session.load(message.path);
            host.send({ action: 'loaded', path: message.path });
            return;
          }
          default:
            host.send({ action: 'error', message: `unknown action ${JSON.stringify(message.action)}, expected snapshot, rerun-stale, save or load` });
        }
      } catch (error) {
        host.send({ action: 'error', message: messageOf(error) });
      }
    },
    onClose() {},
  };
}
