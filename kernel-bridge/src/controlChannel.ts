/**
 * The control socket served from a worker thread, so that an interrupt_request is seen even while the main
 * thread is stuck in synchronous cell code (a script cell's `while (true) {}`), where no message handler can run.
 *
 * The worker binds the control ROUTER and forwards every message to the main thread, which handles control as
 * usual (replies go back through the worker). For a correctly signed, fresh interrupt_request the worker at once
 * sets the running task's cancel flag (slot CANCEL_REQUESTED, which the router hands to the task), and also
 * checks, after INTERRUPT_GRACE_MS, whether the main thread has taken the message yet; if it has not and a cell
 * is running, the main thread is blocked, and the worker raises SIGINT on the process: script cells run under
 * `vm` with `breakOnSigint`, so the synchronous code throws and the cell ends with an error. Signals reach only
 * the main thread, which is exactly where the cell runs (see ../../shared notes on interrupts in Node).
 */
import { Worker } from 'node:worker_threads';

/** Shared Int32 slots between the main thread and the control worker. */
export const TASK_RUNNING = 0;
export const CONTROL_PROCESSED = 1;
/**
 * The running task's cancel flag. The worker sets it as soon as a valid interrupt_request arrives, without
 * waiting for the main thread: long work that checks the flag (task.checkpoint(), the checks in script cells)
 * stops even while the main thread never gives the event loop a turn (synchronous fits, microtask loops).
 */
export const CANCEL_REQUESTED = 2;
/** Incremented by the router whenever a cancellable task starts. */
export const TASK_GENERATION = 3;
/** The generation the worker's SIGINT was meant for (0: none), so a late signal does not hit the next cell. */
export const SIGINT_TARGET = 4;
export const SHARED_SLOTS = 5;
export const INTERRUPT_GRACE_MS = 150;

export interface ControlWorkerData {
  endpoint: string;
  key: string;
  signatureScheme: string;
  shared: SharedArrayBuffer;
}

export type WorkerToMain =
  | { type: 'ready' }
  | { type: 'failed'; message: string }
  | { type: 'frames'; frames: Uint8Array[] }
  | { type: 'sent'; id: number; error?: string }
  | { type: 'log'; text: string };

export type MainToWorker = { type: 'send'; id: number; frames: Uint8Array[] } | { type: 'close' };

export interface ControlChannel {
  /** Slots shared with the worker: TASK_RUNNING is set by the router while a cell or comm handler runs. */
  readonly shared: Int32Array;
  send(frames: Buffer[]): Promise<void>;
  listen(onFrames: (frames: Buffer[]) => void): void;
  close(): Promise<void>;
}

export async function startControlWorker(workerUrl: URL, data: Omit<ControlWorkerData, 'shared'>, log: (text: string) => void): Promise<ControlChannel> {
  const shared = new SharedArrayBuffer(SHARED_SLOTS * Int32Array.BYTES_PER_ELEMENT);
  const slots = new Int32Array(shared);
  const worker = new Worker(workerUrl, { workerData: { ...data, shared } satisfies ControlWorkerData });
  const pending = new Map<number, { resolve(): void; reject(err: Error): void }>();
  let nextId = 0;
  let onFrames: ((frames: Buffer[]) => void) | undefined;
  const early: Buffer[][] = [];
  let exited = false;

  await new Promise<void>((resolve, reject) => {
    const onMessage = (message: WorkerToMain) => {
      if (message.type === 'ready') resolve();
      else if (message.type === 'failed') reject(new Error(`control socket: ${message.message}`));
    };
    worker.once('message', onMessage);
    worker.once('error', reject);
  });

  worker.on('message', (message: WorkerToMain) => {
    switch (message.type) {
      case 'frames': {
        Atomics.add(slots, CONTROL_PROCESSED, 1);
        const frames = message.frames.map((f) => Buffer.from(f.buffer, f.byteOffset, f.byteLength));
        if (onFrames) onFrames(frames);
        else early.push(frames);
        break;
      }
      case 'sent': {
        const waiter = pending.get(message.id);
        pending.delete(message.id);
        if (message.error) waiter?.reject(new Error(message.error));
        else waiter?.resolve();
        break;
      }
      case 'log':
        log(message.text);
        break;
      default:
        break;
    }
  });
  worker.on('error', (err) => log(`control worker failed: ${String(err)}`));
  const exitedPromise = new Promise<void>((resolve) =>
    worker.once('exit', () => {
      exited = true;
      for (const waiter of pending.values()) waiter.reject(new Error('control worker exited'));
      pending.clear();
      resolve();
    }),
  );

  return {
    shared: slots,
    send(frames) {
      if (exited) return Promise.reject(new Error('control worker exited'));
      const id = ++nextId;
      return new Promise<void>((resolve, reject) => {
        pending.set(id, { resolve, reject });
        worker.postMessage({ type: 'send', id, frames } satisfies MainToWorker);
      });
    },
    listen(handler) {
      onFrames = handler;
      for (const frames of early.splice(0)) handler(frames);
    },
    async close() {
      if (exited) return;
      worker.postMessage({ type: 'close' } satisfies MainToWorker);
      const timer = setTimeout(() => void worker.terminate(), 1500);
      await exitedPromise;
      clearTimeout(timer);
    },
  };
}
