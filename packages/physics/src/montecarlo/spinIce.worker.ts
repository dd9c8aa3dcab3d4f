/**
 * Worker-thread entry of the spin-ice Monte Carlo (bundled by scripts/build.mjs into
 * packages/cli/dist/spinIce.worker.js). Receives { options, cancelFlag } as workerData; posts
 * { type: 'progress', done, total, phase } at most every 100 ms, then { type: 'result', result, data } or
 * { type: 'cancelled' } or { type: 'error', name, message, field?, expected? }.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { runSpinIceMonteCarlo } from './runSpinIceMonteCarlo';
import { spinIceRunData } from './spinIceRunData';
import { createTask } from '../progress';
import { CancelledError, InputError } from '../errors';

const { options, cancelFlag } = workerData as { options: Parameters<typeof runSpinIceMonteCarlo>[0]; cancelFlag: SharedArrayBuffer };
let last = 0;
const task = createTask((done, total, phase) => {
  const now = Date.now();
  if (now - last >= 100 || done === total) {
    last = now;
    parentPort!.postMessage({ type: 'progress', done, total, phase });
  }
}, new Int32Array(cancelFlag));
try {
  task.checkpoint();
  const run = runSpinIceMonteCarlo(options, task);
  parentPort!.postMessage({ type: 'result', result: run.result, data: spinIceRunData(run.raw) });
} catch (err) {
  if (err instanceof CancelledError) parentPort!.postMessage({ type: 'cancelled' });
  else if (err instanceof InputError) parentPort!.postMessage({ type: 'error', name: 'InputError', message: err.message, field: err.field, value: err.value, expected: err.expected });
  else parentPort!.postMessage({ type: 'error', name: (err as Error).name, message: (err as Error).message });
}
