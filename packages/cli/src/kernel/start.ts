/**
 * `multiplet kernel start --connection-file FILE`: run the Jupyter kernel on one cells session until a
 * shutdown_request (or SIGTERM). SIGINT interrupts the running cell instead of ending the process.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { readConnectionFile, startKernel } from '@multiplet/kernel-bridge';
import { createCellSession } from '@multiplet/cells/session/session';

export const START_USAGE = 'multiplet kernel start --connection-file FILE';

export function parseStartArgs(args: string[]): { connectionFile: string } | string {
  let connectionFile: string | undefined;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg === '--connection-file' || arg === '-f') connectionFile = args[++i];
    else if (arg.startsWith('--connection-file=')) connectionFile = arg.slice('--connection-file='.length);
    else return `unknown option ${JSON.stringify(arg)}`;
  }
  return connectionFile ? { connectionFile } : 'missing --connection-file FILE';
}

export async function startCommand(args: string[]): Promise<number> {
  const parsed = parseStartArgs(args);
  if (typeof parsed === 'string') {
    process.stderr.write(`multiplet kernel start: ${parsed}\nusage: ${START_USAGE}\n`);
    return 2;
  }
  const log = (text: string) => process.stderr.write(`[multiplet kernel] ${text}\n`);
  let connection;
  try {
    connection = readConnectionFile(parsed.connectionFile);
  } catch (err) {
    process.stderr.write(`multiplet kernel start: ${err instanceof Error ? err.message : String(err)}\n`);
    return 2;
  }
  const session = createCellSession();
  // The build puts kernel-bridge/src/controlChannel.worker.ts beside this bundle (packages/cli/dist/).
  const workerUrl = new URL('./controlChannel.worker.js', import.meta.url);
  const controlWorker = existsSync(fileURLToPath(workerUrl)) ? workerUrl : undefined;
  if (!controlWorker) log('control worker bundle not found: control is served on the main thread (interrupts need cooperative cells)');
  return new Promise<number>((resolve, reject) => {
    let stopping = false;
    const finish = (kernel: { stop(): Promise<void> }) => {
      if (stopping) return;
      stopping = true;
      kernel.stop().then(() => resolve(0), reject);
    };
    startKernel({ connection, session, log, ...(controlWorker ? { controlWorker } : {}), onShutdown: (_restart, kernel) => finish(kernel) }).then((kernel) => {
      // Cell code must not be able to end the kernel: Node's default for these is to exit the process.
      process.on('unhandledRejection', (reason) => log(`a promise in cell code was rejected and nothing handled it: ${describe(reason)}`));
      process.on('uncaughtException', (err) => log(`uncaught exception outside a request (kernel keeps running): ${describe(err)}`));
      // Without a listener Node would exit on SIGINT; the signal is the fallback way to interrupt a cell.
      process.on('SIGINT', () => {
        if (kernel.router.interruptFromSignal()) log('SIGINT: interrupting the running cell');
        else log('SIGINT: ignored (raised for a cell that has finished since)');
      });
      process.on('SIGTERM', () => finish(kernel));
      log(`started on ${connection.transport}://${connection.ip} (shell ${connection.shell_port}), pid ${process.pid}`);
    }, reject);
  });
}

function describe(value: unknown): string {
  return value instanceof Error ? (value.stack ?? `${value.name}: ${value.message}`) : String(value);
}
