/**
 * Progress reporting and cooperative cancellation for long computations (fits, MCMC, Monte Carlo, powder scans).
 *
 * Physics functions that can run long take an optional `LongTask` argument. They call `task.report(done, total)`
 * now and then and `task.checkpoint()` inside their loops; `checkpoint` throws `CancelledError` once `cancel` fires.
 * Work that must also run cooperatively is written as a generator of pause points (steps.ts): the host injects a
 * `yieldNow` and gets a turn of its event loop between chunks.
 */
import { CancelledError } from '../errors';

export interface LongTask {
  /** Called with work done and total work (any unit, e.g. sweeps), plus an optional short phase label. */
  report(done: number, total: number, phase?: string): void;
  /** Throws CancelledError if cancellation was requested. Cheap: call it often. */
  checkpoint(): void;
  /** True once cancellation was requested. */
  readonly cancelled: boolean;
}

/** A task that never reports and is never cancelled. */
export const NO_TASK: LongTask = {
  report() {},
  checkpoint() {},
  cancelled: false,
};

/**
 * A task whose cancellation flag may live in a SharedArrayBuffer (index 0 of an Int32Array), so that another
 * thread (the kernel's control handler) can set it with Atomics.store while a worker computes.
 */
export function createTask(
  onProgress?: (done: number, total: number, phase?: string) => void,
  cancelFlag: Int32Array = new Int32Array(new SharedArrayBuffer(4)),
): LongTask & { cancel(): void; readonly flag: Int32Array } {
  return {
    flag: cancelFlag,
    report(done, total, phase) {
      onProgress?.(done, total, phase);
    },
    checkpoint() {
      if (Atomics.load(cancelFlag, 0) !== 0) throw new CancelledError();
    },
    get cancelled() {
      return Atomics.load(cancelFlag, 0) !== 0;
    },
    cancel() {
      Atomics.store(cancelFlag, 0, 1);
    },
  };
}
