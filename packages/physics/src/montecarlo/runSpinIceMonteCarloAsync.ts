/**
 * Run the spin-ice Monte Carlo off the calling thread: in a Node worker_thread (the bundled
 * `spinIce.worker.js`) with a SharedArrayBuffer cancel flag set through Atomics and progress messages; where no
 * worker is available (no worker_threads, or the worker file is not built, as under the test runner) the same
 * steps run in-thread with a yield to the event loop every ~20 ms so that an interrupt can be served.
 * Both paths give identical numbers for the same options (same seed, same step order).
 */
import { createSpinIceSimulation, type SpinIceRunOptions } from './spinIceSimulation';
import { summarizeSpinIceRun, type SpinIceRunResult } from './summarizeSpinIceRun';
import { spinIceRunData, type SpinIceRunData } from './spinIceRunData';
import { CancelledError, InputError } from '../errors';

/** Options of the asynchronous run. */
export interface AsyncRunOptions {
  /** Progress callback (steps done, total steps, 'thermalize' | 'measure'). */
  onProgress?: (done: number, total: number, phase?: string) => void;
  /** URL or path of the bundled worker; default `spinIce.worker.js` next to the running bundle. */
  workerUrl?: string | URL;
  /** 'auto' (default): worker if available; 'worker' insists; 'in-thread' never starts one. */
  mode?: 'auto' | 'worker' | 'in-thread';
}

/** A running job: its promise, a cancel switch and how it runs. */
export interface SpinIceJob {
  promise: Promise<{ result: SpinIceRunResult; data: SpinIceRunData }>;
  /** Request cancellation: the promise rejects with CancelledError within about one replica sweep. */
  cancel(): void;
  /** The shared cancel flag (index 0; non-zero = cancel), for a kernel's interrupt handler. */
  readonly cancelFlag: Int32Array;
  /** Where it runs, known once started. */
  readonly where: Promise<'worker' | 'in-thread'>;
}

/**
 * Start a run. The promise resolves with the summary and the transferable run data.
 * @example const job = runSpinIceMonteCarloAsync(options, { onProgress: (d, t) => bar(d / t) });
 *          interruptButton.onclick = () => job.cancel(); const { result } = await job.promise;
 * See also: runSpinIceMonteCarlo
 */
export function runSpinIceMonteCarloAsync(options: SpinIceRunOptions, async: AsyncRunOptions = {}): SpinIceJob {
  const cancelFlag = new Int32Array(new SharedArrayBuffer(4));
  let resolveWhere!: (w: 'worker' | 'in-thread') => void;
  const where = new Promise<'worker' | 'in-thread'>((r) => (resolveWhere = r));
  const promise = (async () => {
    const mode = async.mode ?? 'auto';
    const worker = mode === 'in-thread' ? undefined : await startWorker(async.workerUrl);
    if (!worker) {
      if (mode === 'worker') throw new InputError('mode', mode, 'a built spinIce.worker.js (run the build) or mode "auto"');
      resolveWhere('in-thread');
      return runInThread(options, cancelFlag, async.onProgress);
    }
    resolveWhere('worker');
    return runInWorker(worker, options, cancelFlag, async.onProgress);
  })();
  return {
    promise,
    where,
    cancelFlag,
    cancel() {
      Atomics.store(cancelFlag, 0, 1);
    },
  };
}

type WorkerCtor = new (url: URL | string, opts: { workerData: unknown }) => {
  on(ev: string, cb: (m: any) => void): void;
  terminate(): Promise<number>;
};

async function startWorker(workerUrl?: string | URL): Promise<{ Worker: WorkerCtor; url: URL } | undefined> {
  try {
    const wt = (await import('node:worker_threads')) as unknown as { Worker: WorkerCtor };
    const fs = await import('node:fs');
    const urlMod = await import('node:url');
    const url = workerUrl === undefined ? new URL('./spinIce.worker.js', import.meta.url) : workerUrl instanceof URL ? workerUrl : urlMod.pathToFileURL(workerUrl);
    if (url.protocol !== 'file:' || !fs.existsSync(urlMod.fileURLToPath(url))) return undefined;
    return { Worker: wt.Worker, url };
  } catch {
    return undefined;
  }
}

function runInWorker(
  w: { Worker: WorkerCtor; url: URL },
  options: SpinIceRunOptions,
  cancelFlag: Int32Array,
  onProgress?: (done: number, total: number, phase?: string) => void,
): Promise<{ result: SpinIceRunResult; data: SpinIceRunData }> {
  return new Promise((resolve, reject) => {
    if (Atomics.load(cancelFlag, 0) !== 0) {
      reject(new CancelledError());
      return;
    }
    const worker = new w.Worker(w.url, { workerData: { options, cancelFlag: cancelFlag.buffer } });
    let settled = false;
    const finish = (fn: () => void) => {
      if (settled) return;
      settled = true;
      clearInterval(poll);
      fn();
      void worker.terminate();
    };
    // The worker reads the flag between steps only, and its set-up (the dipolar sums at L = 4) takes seconds: watch
    // the flag here as well and end the worker at once, so that a cancel is prompt in every phase.
    const poll = setInterval(() => {
      if (Atomics.load(cancelFlag, 0) !== 0) finish(() => reject(new CancelledError()));
    }, 25);
    worker.on('message', (m) => {
      if (m.type === 'progress') onProgress?.(m.done, m.total, m.phase);
      else if (m.type === 'result') finish(() => resolve({ result: m.result, data: m.data }));
      else if (m.type === 'cancelled') finish(() => reject(new CancelledError()));
      else if (m.type === 'error') finish(() => reject(m.name === 'InputError' ? new InputError(m.field, m.value, m.expected) : new Error(m.message)));
    });
    worker.on('error', (e) => finish(() => reject(e)));
    worker.on('exit', (code) => finish(() => reject(new CancelledError(`worker exited with code ${code}`))));
  });
}

async function runInThread(
  options: SpinIceRunOptions,
  cancelFlag: Int32Array,
  onProgress?: (done: number, total: number, phase?: string) => void,
): Promise<{ result: SpinIceRunResult; data: SpinIceRunData }> {
  const sim = createSpinIceSimulation(options);
  const therm = sim.totalSteps - options.sweeps;
  const check = () => {
    if (Atomics.load(cancelFlag, 0) !== 0) throw new CancelledError();
  };
  let sliceStart = Date.now();
  while (sim.stepsDone < sim.totalSteps) {
    check();
    sim.step(check);
    if (Date.now() - sliceStart > 20 || sim.stepsDone === sim.totalSteps) {
      onProgress?.(sim.stepsDone, sim.totalSteps, sim.stepsDone <= therm ? 'thermalize' : 'measure');
      await new Promise<void>((r) => setTimeout(r, 0));
      sliceStart = Date.now();
    }
  }
  const raw = sim.raw();
  return { result: summarizeSpinIceRun(raw), data: spinIceRunData(raw) };
}
