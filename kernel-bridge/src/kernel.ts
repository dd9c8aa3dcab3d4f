/**
 * A running kernel: sockets bound from a connection file, a router driving one cells session.
 */
import type { CellSession } from '@multiplet/cells/protocol';
import type { ConnectionInfo } from './connection';
import { createMessageFactory } from './messageFactory';
import { KernelRouter } from './router';
import { createSigner } from './signing';
import { bindSockets, type KernelSockets } from './sockets';
import type { KernelIdentity } from './handlers/context';
import packageJson from '../package.json';

export const KERNEL_IDENTITY: KernelIdentity = {
  implementation: 'multiplet',
  implementationVersion: packageJson.version,
  helpLinks: [
    { text: 'Jupyter messaging protocol', url: 'https://jupyter-client.readthedocs.io/en/stable/messaging.html' },
    { text: 'YAML 1.2 (cell body syntax)', url: 'https://yaml.org/spec/1.2.2/' },
  ],
};

export interface RunningKernel {
  readonly router: KernelRouter;
  readonly sockets: KernelSockets;
  /** Close the sockets; the session is left to the caller. */
  stop(): Promise<void>;
}

export interface StartKernelOptions {
  connection: ConnectionInfo;
  session: CellSession;
  log?: (text: string) => void;
  /** Serve control from this bundled worker (controlChannel.worker.js); in-thread when absent. */
  controlWorker?: URL;
  /** After a shutdown_request is answered; the default stops the sockets. */
  onShutdown?: (restart: boolean, kernel: RunningKernel) => void;
}

export async function startKernel(options: StartKernelOptions): Promise<RunningKernel> {
  const log = options.log ?? ((text: string) => process.stderr.write(`[multiplet kernel] ${text}\n`));
  const signer = createSigner(options.connection.key, options.connection.signature_scheme);
  if (!signer.enabled) log('the connection file has an empty key: message signing is disabled, as the protocol specifies');
  const sockets = await bindSockets(options.connection, log, options.controlWorker ? { controlWorker: options.controlWorker } : {});
  let kernel: RunningKernel | undefined;
  const router = new KernelRouter({
    session: options.session,
    signer,
    factory: createMessageFactory(),
    identity: KERNEL_IDENTITY,
    send: (socket, frames) => sockets.send(socket, frames),
    log,
    ...(sockets.taskState ? { taskState: sockets.taskState } : {}),
    onShutdown: (restart) => {
      if (!kernel) return;
      if (options.onShutdown) options.onShutdown(restart, kernel);
      else void kernel.stop();
    },
  });
  kernel = {
    router,
    sockets,
    stop: async () => {
      await router.drained().catch(() => undefined);
      await sockets.close();
    },
  };
  sockets.listen((socket, frames) => router.receive(socket, frames));
  return kernel;
}
