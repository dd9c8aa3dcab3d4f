/**
 * The message router: verifies and decodes incoming frames, queues shell requests (one at a time, in order),
 * serves control requests at once, and wraps every request in busy → … → idle on IOPub.
 *
 * Nothing that arrives can throw out of `receive`: frames that fail decoding or signature checks are logged to
 * stderr and dropped before any handler sees them.
 */
import type { CellOutput, CellSession } from '@multiplet/cells/protocol';
import { CommRegistry } from './comms';
import { HistoryStore } from './history';
import type { MessageFactory } from './messageFactory';
import { ReplayGuard, type Signer } from './signing';
import { decodeMessage, encodeMessage, type JsonObject, type ReceivedMessage } from './wire';
import { CONTROL_HANDLERS, SHELL_HANDLERS } from './handlers/index';
import { CANCEL_REQUESTED, SIGINT_TARGET, TASK_GENERATION, TASK_RUNNING } from './controlChannel';
import type { Channel, HandlerContext, KernelIdentity, KernelState } from './handlers/context';

export type SocketName = 'shell' | 'control' | 'iopub' | 'stdin';

export interface RouterOptions {
  session: CellSession;
  signer: Signer;
  factory: MessageFactory;
  identity: KernelIdentity;
  /** Queue frames for sending on a socket (the sockets layer serialises sends per socket). */
  send(socket: SocketName, frames: Buffer[]): Promise<void>;
  log(text: string): void;
  /** Shared with the control worker: slot TASK_RUNNING is 1 while a cancellable task (cell, comm handler) runs. */
  taskState?: Int32Array;
  /** Called after a shutdown_request's reply and idle are out. */
  onShutdown?(restart: boolean): void;
}

/** Display transient: a display id ties display_data to later update_display_data. */
function outputMessage(output: CellOutput): [string, JsonObject] {
  switch (output.type) {
    case 'stream':
      return ['stream', { name: output.name, text: output.text }];
    case 'display_data':
      return ['display_data', { data: output.data, metadata: output.metadata, transient: output.displayId !== undefined ? { display_id: output.displayId } : {} }];
    case 'update_display_data':
      return ['update_display_data', { data: output.data, metadata: output.metadata, transient: { display_id: output.displayId } }];
    case 'clear_output':
      return ['clear_output', { wait: output.wait }];
  }
}

export class KernelRouter {
  readonly state: KernelState = { executionCount: 0, history: new HistoryStore(), comms: new CommRegistry() };
  private readonly shellQueue: { message: ReceivedMessage }[] = [];
  private readonly aborted = new Set<ReceivedMessage>();
  private pumping: Promise<void> | undefined;
  private readonly control = new Set<Promise<void>>();
  private cancelFlag: Int32Array | undefined;
  private readonly replays = new ReplayGuard();
  private shuttingDown = false;
  private shellParent: JsonObject | undefined;

  constructor(private readonly options: RouterOptions) {}

  /** Frames from a socket. Never throws; invalid input is logged and dropped. */
  receive(socket: Exclude<SocketName, 'iopub'>, frames: readonly Buffer[]): void {
    let decoded;
    try {
      decoded = decodeMessage(frames, this.options.signer);
    } catch (err) {
      decoded = { ok: false as const, reason: `decoder failed: ${String(err)}` };
    }
    if (!decoded.ok) {
      this.options.log(`dropped a message on ${socket}: ${decoded.reason}`);
      return;
    }
    const message = decoded.value;
    // The four signed frames' signature doubles as a message fingerprint for replay detection.
    if (this.options.signer.enabled && !this.replays.accept(message.signature)) {
      this.options.log(`dropped a replayed message on ${socket}: ${message.header.msg_type} ${message.header.msg_id}`);
      return;
    }
    if (this.shuttingDown) {
      this.options.log(`ignored ${message.header.msg_type} on ${socket}: shutting down`);
      return;
    }
    if (socket === 'stdin') {
      // Cells never ask for input, so nothing is expected here.
      this.options.log(`ignored ${message.header.msg_type} on stdin: no input was requested`);
      return;
    }
    if (socket === 'control') {
      const task = this.handle(message, 'control').finally(() => this.control.delete(task));
      this.control.add(task);
      return;
    }
    this.shellQueue.push({ message });
    this.pumping ??= this.pump().finally(() => {
      this.pumping = undefined;
    });
  }

  /** Resolves when the shell queue is empty and no control request is in progress. */
  async drained(): Promise<void> {
    while (this.pumping || this.control.size > 0) {
      await this.pumping;
      await Promise.all([...this.control]);
    }
  }

  /** Interrupt the running execute or comm handler (interrupt_request, SIGINT). No-op when idle. */
  interrupt(): void {
    if (this.cancelFlag) Atomics.store(this.cancelFlag, 0, 1);
  }

  /**
   * SIGINT arrived. A signal the control worker raised for a cell that has ended since (the main thread was
   * blocked until it finished) is ignored, so it cannot interrupt the next cell; any other SIGINT interrupts.
   */
  interruptFromSignal(): boolean {
    const taskState = this.options.taskState;
    const target = taskState ? Atomics.exchange(taskState, SIGINT_TARGET, 0) : 0;
    if (target !== 0 && taskState && (Atomics.load(taskState, TASK_GENERATION) !== target || Atomics.load(taskState, TASK_RUNNING) !== 1)) return false;
    this.interrupt();
    return true;
  }

  private async pump(): Promise<void> {
    for (let next = this.shellQueue.shift(); next; next = this.shellQueue.shift()) {
      if (this.aborted.delete(next.message)) await this.abortReply(next.message);
      else {
        this.shellParent = next.message.header;
        try {
          await this.handle(next.message, 'shell');
        } finally {
          this.shellParent = undefined;
        }
      }
    }
  }

  private publish(msgType: string, content: JsonObject, parent: JsonObject): Promise<void> {
    const frames = encodeMessage([], this.options.factory.message(msgType, content, parent), this.options.signer);
    return this.options.send('iopub', frames).catch((err) => this.options.log(`iopub send failed: ${String(err)}`));
  }

  private async sendReply(channel: Channel, request: ReceivedMessage, msgType: string, content: JsonObject): Promise<void> {
    const frames = encodeMessage(request.identities, this.options.factory.message(msgType, content, request.header), this.options.signer);
    try {
      await this.options.send(channel, frames);
    } catch (err) {
      this.options.log(`${channel} send failed: ${String(err)}`);
    }
  }

  private async abortReply(request: ReceivedMessage): Promise<void> {
    this.publish('status', { execution_state: 'busy' }, request.header);
    await this.sendReply('shell', request, 'execute_reply', { status: 'aborted', execution_count: this.state.executionCount });
    this.publish('status', { execution_state: 'idle' }, request.header);
  }

  private async handle(request: ReceivedMessage, channel: Channel): Promise<void> {
    const msgType = request.header.msg_type;
    const handler = (channel === 'control' ? CONTROL_HANDLERS : SHELL_HANDLERS)[msgType];
    let shutdownRequested: boolean | undefined;
    this.publish('status', { execution_state: 'busy' }, request.header);
    if (!handler) {
      this.options.log(`no handler for ${msgType} on ${channel}; ignored`);
    } else {
      const context: HandlerContext = {
        request,
        channel,
        session: this.options.session,
        state: this.state,
        identity: this.options.identity,
        reply: (replyType, content) => this.sendReply(channel, request, replyType, content),
        publish: (type, content, parent) => this.publish(type, content, parent ?? request.header),
        publishOutput: (output, parent) => {
          const [type, content] = outputMessage(output);
          this.publish(type, content, parent ?? request.header);
        },
        cancellable: async (work) => {
          const taskState = this.options.taskState;
          // With the control worker the flag is a slot it shares, so it can set the flag itself (controlChannel.ts).
          const flag = taskState
            ? new Int32Array(taskState.buffer, taskState.byteOffset + CANCEL_REQUESTED * Int32Array.BYTES_PER_ELEMENT, 1)
            : new Int32Array(new SharedArrayBuffer(4));
          Atomics.store(flag, 0, 0);
          this.cancelFlag = flag;
          if (taskState) {
            const generation = Atomics.add(taskState, TASK_GENERATION, 1) + 1;
            // A worker SIGINT still on its way can only be meant for the task just before; an older target was
            // consumed by `breakOnSigint` without reaching the listener and must not swallow a later signal.
            const target = Atomics.load(taskState, SIGINT_TARGET);
            if (target !== 0 && target < generation - 1) Atomics.compareExchange(taskState, SIGINT_TARGET, target, 0);
            Atomics.store(taskState, TASK_RUNNING, 1);
          }
          try {
            return await work(flag);
          } finally {
            if (this.cancelFlag === flag) this.cancelFlag = undefined;
            if (taskState) Atomics.store(taskState, TASK_RUNNING, 0);
          }
        },
        abortQueuedExecutes: () => {
          for (const queued of this.shellQueue) if (queued.message.header.msg_type === 'execute_request') this.aborted.add(queued.message);
        },
        interrupt: () => this.interrupt(),
        currentShellParent: () => this.shellParent,
        requestShutdown: (restart) => {
          shutdownRequested = restart;
        },
        log: (text) => this.options.log(text),
      };
      try {
        await handler(context);
      } catch (err) {
        this.options.log(`${msgType} handler failed: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
      }
    }
    this.publish('status', { execution_state: 'idle' }, request.header);
    if (shutdownRequested !== undefined) this.shutdown(shutdownRequested);
  }

  private shutdown(restart: boolean): void {
    if (restart) {
      this.state.comms.closeAll((commId, err) => this.options.log(`comm ${commId}: close handler failed: ${String(err)}`));
      this.state.history.clear();
      this.state.executionCount = 0;
      try {
        this.options.session.reset();
      } catch (err) {
        this.options.log(`session reset failed: ${String(err)}`);
      }
    }
    // A restart keeps this router serving (an in-process host carries on); the process host exits either way.
    this.shuttingDown = !restart;
    this.options.onShutdown?.(restart);
  }
}
