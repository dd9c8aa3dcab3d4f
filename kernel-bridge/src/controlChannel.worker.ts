/**
 * Worker side of controlChannel.ts: binds the control ROUTER, forwards messages to the main thread, sends what the
 * main thread answers (one pending send at a time), and raises SIGINT when a valid interrupt_request finds the
 * main thread blocked in a running cell.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { Router } from 'zeromq';
import { createSigner, ReplayGuard } from './signing';
import { decodeMessage } from './wire';
import { SendQueue } from './sendQueue';
import { CANCEL_REQUESTED, CONTROL_PROCESSED, INTERRUPT_GRACE_MS, SIGINT_TARGET, TASK_GENERATION, TASK_RUNNING, type ControlWorkerData, type MainToWorker, type WorkerToMain } from './controlChannel';

const data = workerData as ControlWorkerData;
const port = parentPort!;
const post = (message: WorkerToMain, transfer: ArrayBuffer[] = []) => port.postMessage(message, transfer);
const slots = new Int32Array(data.shared);
const signer = createSigner(data.key, data.signatureScheme);
const replays = new ReplayGuard(4096);
const socket = new Router({ linger: 0 });
const queue = new SendQueue((frames) => socket.send(frames));
let forwarded = 0;
let closed = false;

function watchInterrupt(frames: Buffer[], sequence: number): void {
  const decoded = decodeMessage(frames, signer);
  if (!decoded.ok || decoded.value.header.msg_type !== 'interrupt_request') return;
  if (signer.enabled && !replays.accept(decoded.value.signature)) return;
  if (Atomics.load(slots, TASK_RUNNING) !== 1) return;
  const generation = Atomics.load(slots, TASK_GENERATION);
  Atomics.store(slots, CANCEL_REQUESTED, 1);
  setTimeout(() => {
    const blocked =
      Atomics.load(slots, CONTROL_PROCESSED) < sequence && Atomics.load(slots, TASK_RUNNING) === 1 && Atomics.load(slots, TASK_GENERATION) === generation;
    if (blocked) {
      post({ type: 'log', text: 'interrupt_request: the main thread is busy in a running cell; raising SIGINT' });
      Atomics.store(slots, SIGINT_TARGET, generation);
      process.kill(process.pid, 'SIGINT');
    }
  }, INTERRUPT_GRACE_MS);
}

port.on('message', (message: MainToWorker) => {
  if (message.type === 'send') {
    const frames = message.frames.map((f) => Buffer.from(f.buffer, f.byteOffset, f.byteLength));
    queue.send(frames).then(
      () => post({ type: 'sent', id: message.id }),
      (err: unknown) => post({ type: 'sent', id: message.id, error: String(err) }),
    );
  } else if (message.type === 'close') {
    void (async () => {
      let timer: NodeJS.Timeout | undefined;
      await Promise.race([queue.flushed(), new Promise((resolve) => (timer = setTimeout(resolve, 1000)))]);
      clearTimeout(timer);
      closed = true;
      socket.close();
      port.close();
    })();
  }
});

let bound = false;
try {
  await socket.bind(data.endpoint);
  bound = true;
  post({ type: 'ready' });
} catch (err) {
  post({ type: 'failed', message: err instanceof Error ? err.message : String(err) });
  socket.close();
  port.close();
}

if (bound) try {
  for await (const frames of socket) {
    const sequence = ++forwarded;
    // Copies, so that the frames stay valid here for the interrupt check after being handed over.
    post({ type: 'frames', frames: frames.map((f) => new Uint8Array(f)) });
    watchInterrupt(frames, sequence);
  }
} catch (err) {
  if (!closed) post({ type: 'log', text: `control receive loop stopped: ${String(err)}` });
}
