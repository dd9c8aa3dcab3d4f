/**
 * The kernel side of the front end: for each open notebook, the comms on `multiplet.controls` and
 * `multiplet.state` (message shapes: packages/cells/README.md, "Comm protocol"), the latest sample-state snapshot,
 * and requests (set a control, write back, snapshot, rerun stale, save, load). Widgets read this model; they never
 * talk to the kernel themselves.
 */
import type { ISessionContext } from '@jupyterlab/apputils';
import type { INotebookTracker, NotebookPanel } from '@jupyterlab/notebook';
import type { Kernel, KernelMessage } from '@jupyterlab/services';
import { PromiseDelegate, type JSONObject } from '@lumino/coreutils';
import type { IDisposable } from '@lumino/disposable';
import { Signal, type ISignal } from '@lumino/signaling';
import type { ControlChannel } from './controls';
import {
  CONTROLS_COMM_TARGET,
  parseSnapshot,
  RESULT_MIME_TYPE,
  STATE_COMM_TARGET,
  type ResultControl,
  type ResultPayload,
  type StateSnapshot,
} from './protocol';

/** How long a request on a comm may wait for its answer (a rerun of dependants can take a while). */
const REQUEST_TIMEOUT_MS = 120_000;

type Reply = Record<string, unknown>;

/** A request waiting for the kernel's reply; replies on one comm come in request order. */
interface PendingRequest {
  expects: string[];
  answer: PromiseDelegate<Reply>;
}

/** The cell text `[kind] name` header of a notebook cell, or null for script and markdown cells. */
export function cellHeader(source: string): { kind: string; name: string } | null {
  const first = source.split('\n').find((line) => line.trim() !== '');
  const match = first ? /^\s*\[([a-z][a-z0-9-]*)\]\s+([A-Za-z_][A-Za-z0-9_]*)\s*$/.exec(first) : null;
  return match ? { kind: match[1], name: match[2] } : null;
}

/** Index of the notebook cell that made `result`: the cell with the kernel's cell id, else the one whose header names it; -1 if none. */
export function findResultCell(panel: NotebookPanel, result: string, cellId?: string | null): number {
  const cells = panel.content.widgets;
  const byId = cellId ? cells.findIndex((cell) => cell.model.id === cellId) : -1;
  if (byId >= 0) return byId;
  return cells.findIndex((cell) => cell.model.type === 'code' && cellHeader(cell.model.sharedModel.getSource())?.name === result);
}

/** Result name of an output bundle of ours, or null. */
function resultName(data: unknown): string | null {
  const payload = (data as Record<string, unknown> | undefined)?.[RESULT_MIME_TYPE] as Record<string, unknown> | undefined;
  return typeof payload?.name === 'string' ? payload.name : null;
}

/**
 * Apply an `update_display_data` of a result to the notebook's outputs of that result. JupyterLab's output area
 * updates by display id only outputs that arrived as `display_data`; the kernel sends results as `execute_result`
 * (with the display id in `transient`), so the extension replaces them itself: every output showing the same
 * result name (the kernel keeps one display id list per result name, so these are the same outputs).
 */
export function applyResultUpdate(panel: NotebookPanel, data: Record<string, unknown>, metadata: Record<string, unknown>): number {
  const name = resultName(data);
  if (name === null) return 0;
  let updated = 0;
  for (const cell of panel.content.widgets) {
    if (cell.model.type !== 'code') continue;
    const outputs = (cell.model as unknown as { outputs: { length: number; get(i: number): { toJSON(): Record<string, unknown> }; set(i: number, value: unknown): void } }).outputs;
    for (let index = 0; index < outputs.length; index++) {
      const output = outputs.get(index).toJSON();
      if (output.output_type !== 'execute_result' || resultName(output.data) !== name) continue;
      outputs.set(index, { ...output, data, metadata });
      updated++;
    }
  }
  return updated;
}

/** The comms of one kernel session and what came over them. */
export class SessionLink implements IDisposable {
  /** `onResultUpdate` receives every `update_display_data` of the kernel that carries a Multiplet result. */
  constructor(sessionContext: ISessionContext, onResultUpdate: (data: Record<string, unknown>, metadata: Record<string, unknown>) => void) {
    this._sessionContext = sessionContext;
    this._onResultUpdate = onResultUpdate;
    sessionContext.kernelChanged.connect(this._onKernelChanged, this);
    this._watch(sessionContext.session?.kernel ?? null);
  }

  /** A new snapshot of the sample state arrived (null: the kernel changed or restarted). */
  get stateChanged(): ISignal<this, StateSnapshot | null> {
    return this._stateChanged;
  }

  get snapshot(): StateSnapshot | null {
    return this._snapshot;
  }

  get isDisposed(): boolean {
    return this._disposed;
  }

  /** Rerun the cell of `result` with a new control value, then its dependants; the kernel updates their displays. */
  async setControl(result: string, control: ResultControl, value: number): Promise<Reply> {
    const reply = await this._request(CONTROLS_COMM_TARGET, { action: 'set', result, field: control.field, value }, ['updated']);
    const failed = (Array.isArray(reply.results) ? reply.results : []).map((r) => r as Reply).filter((r) => r.status === 'error');
    if (failed.length > 0) throw new Error(failed.map((r) => `${String(r.name)}: ${String(r.error ?? 'failed')}`).join('; '));
    return reply;
  }

  /** The cell text the kernel last ran for `result` (control values included), and the id of its cell if known. */
  async writebackSource(result: string): Promise<{ source: string; cellId: string | null }> {
    const reply = await this._request(CONTROLS_COMM_TARGET, { action: 'writeback', result }, ['writeback']);
    if (typeof reply.source !== 'string') throw new Error(`the kernel sent no cell text for ${result}`);
    return { source: reply.source, cellId: typeof reply.cellId === 'string' ? reply.cellId : null };
  }

  /** Ask for a fresh snapshot of the sample state. */
  async refreshState(): Promise<StateSnapshot | null> {
    await this._request(STATE_COMM_TARGET, { action: 'snapshot' }, ['snapshot']);
    return this._snapshot;
  }

  /** Rerun every stale result in the kernel (displays update in place); returns the kernel's per-result report. */
  async rerunStale(): Promise<Reply[]> {
    const reply = await this._request(STATE_COMM_TARGET, { action: 'rerun-stale' }, ['rerun-stale']);
    await this.refreshState();
    return (Array.isArray(reply.results) ? reply.results : []) as Reply[];
  }

  /** Save the state file (path relative to the notebook); resolves with the absolute path the kernel wrote. */
  async saveState(path: string): Promise<string> {
    const reply = await this._request(STATE_COMM_TARGET, { action: 'save', path }, ['saved']);
    return String(reply.path ?? path);
  }

  async loadState(path: string): Promise<void> {
    await this._request(STATE_COMM_TARGET, { action: 'load', path }, ['loaded']);
    await this.refreshState();
  }

  dispose(): void {
    if (this._disposed) return;
    this._disposed = true;
    this._closeComms('the notebook was closed');
    this._watch(null);
    Signal.clearData(this);
  }

  private _watch(kernel: Kernel.IKernelConnection | null): void {
    this._watched?.iopubMessage.disconnect(this._onIOPub, this);
    this._watched = kernel;
    kernel?.iopubMessage.connect(this._onIOPub, this);
  }

  private _onIOPub(_: Kernel.IKernelConnection, msg: KernelMessage.IIOPubMessage): void {
    if (msg.header.msg_type !== 'update_display_data') return;
    const content = msg.content as { data?: Record<string, unknown>; metadata?: Record<string, unknown> };
    if (content.data && resultName(content.data) !== null) this._onResultUpdate(content.data, content.metadata ?? {});
  }

  private _onKernelChanged(): void {
    this._watch(this._sessionContext.session?.kernel ?? null);
    this._closeComms('the kernel changed');
    this._snapshot = null;
    this._stateChanged.emit(null);
  }

  private _closeComms(reason: string): void {
    for (const comm of this._comms.values()) if (!comm.isDisposed) comm.dispose();
    this._comms.clear();
    for (const queue of this._pending.values()) for (const request of queue) request.answer.reject(new Error(reason));
    this._pending.clear();
  }

  private async _comm(target: string): Promise<Kernel.IComm> {
    const existing = this._comms.get(target);
    if (existing && !existing.isDisposed) return existing;
    await this._sessionContext.ready;
    const kernel = this._sessionContext.session?.kernel;
    if (!kernel) throw new Error('no kernel is running for this notebook');
    const comm = kernel.createComm(target);
    comm.onMsg = (msg: KernelMessage.ICommMsgMsg) => this._onMessage(target, msg.content.data as Reply);
    comm.onClose = () => {
      this._comms.delete(target);
      for (const request of this._pending.get(target) ?? []) request.answer.reject(new Error(`the kernel closed ${target}`));
      this._pending.delete(target);
    };
    this._comms.set(target, comm);
    await comm.open({}).done;
    return comm;
  }

  private async _request(target: string, message: Reply, expects: string[]): Promise<Reply> {
    const comm = await this._comm(target);
    const request: PendingRequest = { expects, answer: new PromiseDelegate<Reply>() };
    const queue = this._pending.get(target) ?? [];
    queue.push(request);
    this._pending.set(target, queue);
    const timer = window.setTimeout(() => this._settle(target, request, new Error(`no answer from the kernel to "${String(message.action)}"`)), REQUEST_TIMEOUT_MS);
    try {
      await comm.send(message as JSONObject).done;
      return await request.answer.promise;
    } finally {
      window.clearTimeout(timer);
    }
  }

  private _settle(target: string, request: PendingRequest, outcome: Reply | Error): void {
    const queue = this._pending.get(target) ?? [];
    const index = queue.indexOf(request);
    if (index < 0) return;
    queue.splice(index, 1);
    if (outcome instanceof Error) request.answer.reject(outcome);
    else request.answer.resolve(outcome);
  }

  private _onMessage(target: string, data: Reply): void {
    const action = String(data.action ?? '');
    if (action === 'snapshot') {
      this._snapshot = parseSnapshot(data);
      this._stateChanged.emit(this._snapshot);
    }
    const queue = this._pending.get(target) ?? [];
    if (action === 'error') {
      if (queue[0]) this._settle(target, queue[0], new Error(String(data.message ?? 'the kernel refused the request')));
      return;
    }
    const waiting = queue.find((request) => request.expects.includes(action));
    if (waiting) this._settle(target, waiting, data);
  }

  private _sessionContext: ISessionContext;
  private _onResultUpdate: (data: Record<string, unknown>, metadata: Record<string, unknown>) => void;
  private _watched: Kernel.IKernelConnection | null = null;
  private _comms = new Map<string, Kernel.IComm>();
  private _pending = new Map<string, PendingRequest[]>();
  private _snapshot: StateSnapshot | null = null;
  private _stateChanged = new Signal<this, StateSnapshot | null>(this);
  private _disposed = false;
}

/** One `SessionLink` per open notebook, and the `ControlChannel` the result renderer uses. */
export class NotebookLinks implements ControlChannel {
  constructor(tracker: INotebookTracker) {
    this._tracker = tracker;
    tracker.widgetAdded.connect((_, panel) => {
      this.linkFor(panel);
      panel.disposed.connect(() => {
        this._links.get(panel)?.dispose();
        this._links.delete(panel);
      });
    });
  }

  get tracker(): INotebookTracker {
    return this._tracker;
  }

  linkFor(panel: NotebookPanel): SessionLink {
    let link = this._links.get(panel);
    if (!link) {
      link = new SessionLink(panel.sessionContext, (data, metadata) => applyResultUpdate(panel, data, metadata));
      this._links.set(panel, link);
    }
    return link;
  }

  /** The notebook an output node sits in. */
  panelContaining(node: HTMLElement): NotebookPanel | null {
    return this._tracker.find((panel) => panel.node.contains(node)) ?? null;
  }

  async setControl(origin: HTMLElement, result: ResultPayload, control: ResultControl, value: number): Promise<void> {
    const panel = this.panelContaining(origin);
    if (!panel) throw new Error('this output is not inside an open notebook');
    await this.linkFor(panel).setControl(result.name, control, value);
  }

  async writeIntoCell(origin: HTMLElement, result: ResultPayload): Promise<void> {
    const panel = this.panelContaining(origin);
    if (!panel) throw new Error('this output is not inside an open notebook');
    const { source, cellId } = await this.linkFor(panel).writebackSource(result.name);
    // The cell holding this output; failing that, the cell the kernel names, or the one whose header names the result.
    const holder = panel.content.widgets.find((c) => c.node.contains(origin));
    const index = holder ? panel.content.widgets.indexOf(holder) : findResultCell(panel, result.name, cellId);
    const cell = index >= 0 ? panel.content.widgets[index] : undefined;
    if (!cell) throw new Error(`no cell of this notebook makes ${result.name}`);
    cell.model.sharedModel.setSource(source);
  }

  private _tracker: INotebookTracker;
  private _links = new Map<NotebookPanel, SessionLink>();
}
