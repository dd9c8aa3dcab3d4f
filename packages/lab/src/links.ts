/**
 * The kernel side of the front end: for each open notebook, the comms on `multiplet.controls` and
 * `multiplet.state`, the latest sample-state snapshot, and requests (set a control, save or load the state file,
 * fetch cell templates). Widgets read this model; they never talk to the kernel themselves.
 */
import type { ISessionContext } from '@jupyterlab/apputils';
import type { INotebookTracker, NotebookPanel } from '@jupyterlab/notebook';
import type { Kernel, KernelMessage } from '@jupyterlab/services';
import { PromiseDelegate, UUID } from '@lumino/coreutils';
import type { IDisposable } from '@lumino/disposable';
import { Signal, type ISignal } from '@lumino/signaling';
import { setFieldValue } from './cellText';
import type { ControlChannel } from './controls';
import { formatNumber } from './controls';
import {
  CONTROLS_COMM_TARGET,
  parseSnapshot,
  STATE_COMM_TARGET,
  type ResultControl,
  type ResultPayload,
  type StateSnapshot,
} from './protocol';

/** How long a request on a comm may wait for its answer. */
const REQUEST_TIMEOUT_MS = 60_000;

/** The comms of one kernel session and what came over them. */
export class SessionLink implements IDisposable {
  constructor(sessionContext: ISessionContext) {
    this._sessionContext = sessionContext;
    sessionContext.kernelChanged.connect(this._onKernelChanged, this);
    this._onKernelChanged();
  }

  /** A new snapshot of the sample state arrived (null: the kernel went away). */
  get stateChanged(): ISignal<this, StateSnapshot | null> {
    return this._stateChanged;
  }

  get snapshot(): StateSnapshot | null {
    return this._snapshot;
  }

  get isDisposed(): boolean {
    return this._disposed;
  }

  /** Ask the kernel to rerun the cell that made `result` with a new control value (and its dependants). */
  async setControl(result: ResultPayload, control: ResultControl, value: number): Promise<void> {
    await this._request(CONTROLS_COMM_TARGET, {
      type: 'set',
      result: result.name,
      cellId: result.cellId,
      path: control.path,
      value,
    });
  }

  /** Ask for a fresh snapshot of the sample state. */
  async refreshState(): Promise<StateSnapshot | null> {
    await this._request(STATE_COMM_TARGET, { type: 'snapshot' });
    return this._snapshot;
  }

  /** Any request on the state comm (save, load, templates); resolves with the kernel's answer. */
  requestState(message: Record<string, unknown>): Promise<Record<string, unknown>> {
    return this._request(STATE_COMM_TARGET, message);
  }

  dispose(): void {
    if (this._disposed) return;
    this._disposed = true;
    this._closeComms();
    Signal.clearData(this);
  }

  private _onKernelChanged(): void {
    this._closeComms();
    this._snapshot = null;
    this._stateChanged.emit(null);
  }

  private _closeComms(): void {
    for (const comm of this._comms.values()) {
      if (!comm.isDisposed) comm.dispose();
    }
    this._comms.clear();
    for (const pending of this._pending.values()) pending.reject(new Error('the kernel connection changed'));
    this._pending.clear();
  }

  private async _comm(target: string): Promise<Kernel.IComm> {
    const existing = this._comms.get(target);
    if (existing && !existing.isDisposed) return existing;
    await this._sessionContext.ready;
    const kernel = this._sessionContext.session?.kernel;
    if (!kernel) throw new Error('no kernel is running for this notebook');
    const comm = kernel.createComm(target);
    comm.onMsg = (msg: KernelMessage.ICommMsgMsg) => this._onMessage(msg.content.data as Record<string, unknown>);
    comm.onClose = () => {
      this._comms.delete(target);
    };
    this._comms.set(target, comm);
    await comm.open({}).done;
    return comm;
  }

  private async _request(target: string, message: Record<string, unknown>): Promise<Record<string, unknown>> {
    const comm = await this._comm(target);
    const requestId = UUID.uuid4();
    const answer = new PromiseDelegate<Record<string, unknown>>();
    this._pending.set(requestId, answer);
    const timer = window.setTimeout(() => {
      if (this._pending.delete(requestId)) answer.reject(new Error(`no answer from the kernel to "${String(message.type)}"`));
    }, REQUEST_TIMEOUT_MS);
    try {
      await comm.send({ ...message, requestId }).done;
      return await answer.promise;
    } finally {
      window.clearTimeout(timer);
      this._pending.delete(requestId);
    }
  }

  private _onMessage(data: Record<string, unknown>): void {
    if (data.state !== undefined) {
      this._snapshot = parseSnapshot(data.state);
      this._stateChanged.emit(this._snapshot);
    }
    const requestId = typeof data.requestId === 'string' ? data.requestId : undefined;
    const pending = requestId ? this._pending.get(requestId) : undefined;
    if (!pending || !requestId) return;
    this._pending.delete(requestId);
    if (data.type === 'error' || typeof data.error === 'string') {
      pending.reject(new Error(String(data.error ?? data.message ?? 'the kernel refused the request')));
    } else {
      pending.resolve(data);
    }
  }

  private _sessionContext: ISessionContext;
  private _comms = new Map<string, Kernel.IComm>();
  private _pending = new Map<string, PromiseDelegate<Record<string, unknown>>>();
  private _snapshot: StateSnapshot | null = null;
  private _stateChanged = new Signal<this, StateSnapshot | null>(this);
  private _disposed = false;
}

/** One `SessionLink` per open notebook, and the `ControlChannel` the result renderer uses. */
export class NotebookLinks implements ControlChannel {
  constructor(tracker: INotebookTracker) {
    this._tracker = tracker;
    tracker.widgetAdded.connect((_, panel) => {
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
      link = new SessionLink(panel.sessionContext);
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
    await this.linkFor(panel).setControl(result, control, value);
  }

  writeIntoCell(origin: HTMLElement, _result: ResultPayload, control: ResultControl, value: number): boolean {
    const panel = this.panelContaining(origin);
    const cell = panel?.content.widgets.find((c) => c.node.contains(origin));
    if (!cell) return false;
    const source = cell.model.sharedModel.getSource();
    const edited = setFieldValue(source, control.path, formatNumber(value));
    if (edited === null) return false;
    cell.model.sharedModel.setSource(edited);
    return true;
  }

  private _tracker: INotebookTracker;
  private _links = new Map<NotebookPanel, SessionLink>();
}
