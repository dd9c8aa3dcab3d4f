/**
 * `createCellSession`: the implementation of the host ↔ cells contract (protocol.ts). One session = one sample
 * state. Both hosts (the ZeroMQ kernel and the headless runner) drive it the same way, and nothing in its outputs
 * depends on the host, the wall clock or the machine.
 */
import { dirname, resolve } from 'node:path';
import { readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import type vm from 'node:vm';
import type { CellSession, CommHost, CompletenessReply, CompletionReply, ExecuteOptions, ExecuteOutcome, InspectionReply } from '../protocol';
import { CellError } from '../errors';
import { splitCell } from '../syntax/header';
import { SampleState } from '../state';
import { runTypedCell, renderRecord } from './typed';
import { createProgressTask } from './progress';
import { runScript, createScriptContext } from '../script/runScript';
import { PHYSICS_SCOPE } from '../script/scope';
import { frozenCopy } from '../json';
import { CELLS_VERSION } from '../version';
import { complete, inspect, isComplete } from '../complete';
import { openControlsComm, openStateComm, stateSnapshot, CONTROLS_TARGET, STATE_TARGET, type StateSnapshot } from './comms';

export interface CellSessionOptions {
  /** Directory relative file names (data cells, save/load) resolve against. Default: process.cwd(). */
  notebookDir?: string;
}

/** Outcome of rerunning one result (comms, rerunStale). */
export interface RerunReport {
  name: string;
  status: 'ok' | 'error';
  error?: string;
}

/** The session API beyond the protocol: state access for the runner, comms and tests. */
export interface MultipletSession extends CellSession {
  readonly state: SampleState;
  /** Rerun every stale result in dependency order; stops at the first failure (that result stays stale). */
  rerunStale(options: ExecuteOptions): Promise<RerunReport[]>;
  /** Rerun one stored result from new cell text (a control change) and then its stale dependants. */
  rerunWithSource(name: string, source: string, options: ExecuteOptions): Promise<RerunReport[]>;
  /** Save the state as versioned JSON (path relative to notebookDir). */
  save(path: string): string;
  /** Load a saved state (replaces the current one; nothing changes on error). */
  load(path: string): void;
  snapshot(): StateSnapshot;
  /** Display ids that currently show a result (updated in place after reruns). */
  displayIdsOf(name: string): string[];
  /** nbformat id of the cell that last produced a result, when the host passed ExecuteOptions.cellId. */
  cellIdOf(name: string): string | undefined;
}

function errorOutcome(error: unknown, source: string): ExecuteOutcome {
  const cellError =
    error instanceof CellError ? error : new CellError('CellRunError', `internal error: ${error instanceof Error ? error.message : String(error)}`);
  const traceback = [`${cellError.ename}: ${cellError.message}`];
  if (cellError.position) {
    const line = source.split('\n')[cellError.position.line - 1];
    if (line !== undefined) {
      const number = String(cellError.position.line);
      traceback.push(`${number} | ${line.replace(/\r$/, '')}`, `${' '.repeat(number.length)} | ${' '.repeat(Math.max(0, cellError.position.column - 1))}^`);
    }
  }
  return { status: 'error', ename: cellError.ename, evalue: cellError.message, traceback };
}

export function createCellSession(options: CellSessionOptions = {}): MultipletSession {
  const notebookDir = resolve(options.notebookDir ?? process.cwd());
  const state = new SampleState();
  let scriptContext: vm.Context = createScriptContext();
  let displayCounter = 0;
  /** result name → display ids showing it. Host-side bookkeeping, never part of outputs. */
  let displays = new Map<string, string[]>();
  /** result name → producing notebook cell id. Host-side bookkeeping, never part of outputs or saved state. */
  let cellIds = new Map<string, string>();
  const stateComms = new Set<CommHost>();

  const nextDisplayId = (prefix: string) => `multiplet-${prefix}-${++displayCounter}`;

  const stateView = () => {
    const results: Record<string, unknown> = {};
    const info: Record<string, unknown> = {};
    for (const name of state.names()) {
      const r = state.get(name)!;
      results[name] = r.result;
      info[name] = { kind: r.kind, role: r.role, stale: r.stale, inputs: r.inputs, seed: r.seed, reads: r.reads };
    }
    const sampleName = state.sampleName;
    return frozenCopy({
      sample: sampleName === null ? null : state.get(sampleName)!.result,
      datasets: Object.fromEntries(state.datasets().map((n) => [n, state.get(n)!.result])),
      results,
      info,
      names: state.names(),
    });
  };

  const pushSnapshot = () => {
    if (stateComms.size === 0) return;
    const snapshot = { action: 'snapshot', ...stateSnapshot(state, (n) => cellIds.get(n)) };
    for (const host of stateComms) host.send(snapshot);
  };

  /** Execute typed cell text and commit; returns the bundle (used by execute and by reruns). */
  async function executeTyped(source: string, execOptions: ExecuteOptions, executionCount: number | null) {
    const split = splitCell(source);
    if (split.type !== 'typed') throw new CellError('CellSyntaxError', 'expected a typed cell with a [kind] name header');
    const outcome = await runTypedCell(source, split.header, split.body, {
      state,
      notebookDir,
      emit: execOptions.emit,
      cancelFlag: execOptions.cancelFlag,
      executionCount,
      progressDisplayId: nextDisplayId('progress'),
    });
    // Interrupt requested after the last checkpoint: still nothing committed.
    if (execOptions.cancelFlag && Atomics.load(execOptions.cancelFlag, 0) !== 0) {
      throw new CellError('CellInterrupted', 'interrupted: the cell was stopped before it finished; the state is unchanged');
    }
    const staled = state.commit(outcome.record);
    return { ...outcome, staled };
  }

  /** Refresh every display of the given results in place. */
  function refreshDisplays(names: string[], emit: ExecuteOptions['emit']): void {
    for (const name of names) {
      const record = state.get(name);
      if (!record) continue;
      const { bundle, metadata } = renderRecord(record);
      for (const displayId of displays.get(name) ?? []) emit({ type: 'update_display_data', data: bundle, metadata, displayId });
    }
  }

  const session: MultipletSession = {
    state,

    async execute(code: string, execOptions: ExecuteOptions): Promise<ExecuteOutcome> {
      try {
        const split = splitCell(code);
        if (split.type === 'script') {
          if (code.trim() === '') return { status: 'ok' };
          const value = await runScript(code, scriptContext, {
            physics: PHYSICS_SCOPE,
            state: stateView(),
            task: createProgressTask('script', nextDisplayId('progress'), execOptions.emit, execOptions.cancelFlag),
            emit: execOptions.emit,
            nextDisplayId: () => nextDisplayId('display'),
            ...(execOptions.cancelFlag ? { cancelFlag: execOptions.cancelFlag } : {}),
          });
          return value ? { status: 'ok', result: { data: value, metadata: {} } } : { status: 'ok' };
        }
        const { record, bundle, metadata, staled } = await executeTyped(code, execOptions, execOptions.executionCount ?? null);
        const displayId = nextDisplayId(record.name);
        displays.set(record.name, [...(displays.get(record.name) ?? []), displayId]);
        if (execOptions.cellId) cellIds.set(record.name, execOptions.cellId);
        else cellIds.delete(record.name);
        refreshDisplays(staled, execOptions.emit);
        return { status: 'ok', result: { data: bundle, metadata, displayId } };
      } catch (error) {
        return errorOutcome(error, code);
      } finally {
        pushSnapshot();
      }
    },

    async rerunStale(execOptions: ExecuteOptions): Promise<RerunReport[]> {
      const reports: RerunReport[] = [];
      for (const name of state.staleInOrder()) {
        const record = state.get(name);
        if (!record || !record.stale) continue;
        try {
          const { staled } = await executeTyped(record.source, execOptions, null);
          refreshDisplays([name, ...staled], execOptions.emit);
          reports.push({ name, status: 'ok' });
        } catch (error) {
          const outcome = errorOutcome(error, record.source);
          reports.push({ name, status: 'error', error: outcome.status === 'error' ? outcome.evalue : '' });
          break;
        }
      }
      pushSnapshot();
      return reports;
    },

    async rerunWithSource(name: string, source: string, execOptions: ExecuteOptions): Promise<RerunReport[]> {
      const split = splitCell(source);
      if (split.type !== 'typed' || split.header.name !== name) {
        throw new CellError('CellInputError', `rerun of ${name}: the new cell text must keep the header naming ${name}`);
      }
      const { staled } = await executeTyped(source, execOptions, null);
      refreshDisplays([name, ...staled], execOptions.emit);
      const reports: RerunReport[] = [{ name, status: 'ok' }];
      // Only the dependants of this change; other stale results wait for an explicit rerun-stale.
      for (const dependant of state.staleInOrder().filter((n) => staled.includes(n))) {
        const record = state.get(dependant);
        if (!record?.stale) continue;
        try {
          const result = await executeTyped(record.source, execOptions, null);
          refreshDisplays([dependant, ...result.staled], execOptions.emit);
          reports.push({ name: dependant, status: 'ok' });
        } catch (error) {
          const outcome = errorOutcome(error, record.source);
          reports.push({ name: dependant, status: 'error', error: outcome.status === 'error' ? outcome.evalue : '' });
          break;
        }
      }
      pushSnapshot();
      return reports;
    },

    save(path: string): string {
      const target = resolve(notebookDir, path);
      mkdirSync(dirname(target), { recursive: true });
      writeFileSync(target, state.serialize(2) + '\n');
      return target;
    },

    load(path: string): void {
      const target = resolve(notebookDir, path);
      let text: string;
      try {
        text = readFileSync(target, 'utf8');
      } catch {
        throw new CellError('CellInputError', `load: cannot read ${path} (relative to ${notebookDir})`, { field: 'path', given: path, expected: 'a readable state file' });
      }
      state.load(text);
      displays = new Map();
      cellIds = new Map();
      pushSnapshot();
    },

    snapshot: () => stateSnapshot(state, (n) => cellIds.get(n)),
    displayIdsOf: (name) => (displays.get(name) ?? []).slice(),
    cellIdOf: (name) => cellIds.get(name),

    complete: (code, cursorPos): CompletionReply => complete(code, cursorPos, state),
    inspect: (code, cursorPos, detailLevel): InspectionReply => inspect(code, cursorPos, detailLevel, state),
    isComplete: (code): CompletenessReply => isComplete(code),

    commTargets: () => [CONTROLS_TARGET, STATE_TARGET],

    openComm(target, _commId, _data, host) {
      if (target === CONTROLS_TARGET) return openControlsComm(session, host);
      if (target === STATE_TARGET) {
        stateComms.add(host);
        const handler = openStateComm(session, host);
        return {
          onMessage: handler.onMessage,
          onClose() {
            stateComms.delete(host);
          },
        };
      }
      return undefined;
    },

    languageInfo: () => ({
      name: 'multiplet',
      version: CELLS_VERSION,
      mimetype: 'text/x-multiplet',
      file_extension: '.multiplet',
      codemirror_mode: 'yaml',
    }),

    banner: () =>
      `Multiplet ${CELLS_VERSION}: typed science cells ("[kind] name" + YAML body) and TypeScript script cells.\n` +
      `Kinds: see packages/cells/README.md.`,

    reset() {
      state.clear();
      scriptContext = createScriptContext();
      displays = new Map();
      cellIds = new Map();
      displayCounter = 0;
    },
  };
  return session;
}

