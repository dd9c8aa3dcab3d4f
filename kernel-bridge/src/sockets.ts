/**
 * The five kernel sockets (Jupyter messaging specification, "Introduction"): shell and control ROUTER, iopub PUB,
 * stdin ROUTER, heartbeat REP echoing every message. Each socket has its own send queue (sendQueue.ts).
 */
import { Publisher, Reply, Router } from 'zeromq';
import { endpoint, type ConnectionInfo } from './connection';
import { SendQueue } from './sendQueue';
import { startControlWorker, type ControlChannel } from './controlChannel';
import type { SocketName } from './router';

export interface KernelSockets {
  send(socket: SocketName, frames: Buffer[]): Promise<void>;
  /** Start the receive loops; `onMessage` must not throw. */
  listen(onMessage: (socket: Exclude<SocketName, 'iopub'>, frames: Buffer[]) => void): void;
  /** Wait for queued sends (bounded), then close every socket. */
  close(): Promise<void>;
  /** With the control worker: slots shared with it (the router marks running tasks in TASK_RUNNING). */
  readonly taskState?: Int32Array;
}

export interface BindOptions {
  /** URL of the bundled controlChannel.worker.js: serve control from a worker thread (see controlChannel.ts). */
  controlWorker?: URL;
}

export async function bindSockets(info: ConnectionInfo, log: (text: string) => void, options: BindOptions = {}): Promise<KernelSockets> {
  let controlWorker: ControlChannel | undefined;
  if (options.controlWorker) {
    controlWorker = await startControlWorker(
      options.controlWorker,
      { endpoint: endpoint(info, info.control_port), key: info.key, signatureScheme: info.signature_scheme },
      log,
    );
  }
  const shell = new Router({ linger: 0 });
  const control = new Router({ linger: 0 });
  const stdin = new Router({ linger: 0 });
  const iopub = new Publisher({ linger: 0 });
  const heartbeat = new Reply({ linger: 0 });
  const all = [shell, control, stdin, iopub, heartbeat];
  try {
    await shell.bind(endpoint(info, info.shell_port));
    if (!controlWorker) await control.bind(endpoint(info, info.control_port));
    await stdin.bind(endpoint(info, info.stdin_port));
    await iopub.bind(endpoint(info, info.iopub_port));
    await heartbeat.bind(endpoint(info, info.hb_port));
  } catch (err) {
    for (const s of all) s.close();
    await controlWorker?.close();
    throw err;
  }
  const queues: Record<SocketName, SendQueue> = {
    shell: new SendQueue((f) => shell.send(f)),
    control: new SendQueue((f) => (controlWorker ? controlWorker.send(f) : control.send(f))),
    stdin: new SendQueue((f) => stdin.send(f)),
    iopub: new SendQueue((f) => iopub.send(f)),
  };
  let closed = false;

  const loop = async (name: string, socket: Router, onFrames: (frames: Buffer[]) => void) => {
    try {
      for await (const frames of socket) onFrames(frames);
    } catch (err) {
      if (!closed) log(`${name} receive loop stopped: ${String(err)}`);
    }
  };

  return {
    ...(controlWorker ? { taskState: controlWorker.shared } : {}),
    send: (socket, frames) => (closed ? Promise.resolve() : queues[socket].send(frames)),
    listen(onMessage) {
      void loop('shell', shell, (f) => onMessage('shell', f));
      if (controlWorker) controlWorker.listen((f) => onMessage('control', f));
      else void loop('control', control, (f) => onMessage('control', f));
      void loop('stdin', stdin, (f) => onMessage('stdin', f));
      void (async () => {
        try {
          for await (const frames of heartbeat) await heartbeat.send(frames);
        } catch (err) {
          if (!closed) log(`heartbeat stopped: ${String(err)}`);
        }
      })();
    },
    async close() {
      if (closed) return;
      const flushed = Promise.all(Object.values(queues).map((q) => q.flushed()));
      await Promise.race([flushed, new Promise((resolve) => setTimeout(resolve, 1000).unref())]);
      closed = true;
      for (const s of all) s.close();
      await controlWorker?.close();
    },
  };
}
