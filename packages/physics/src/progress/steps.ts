/**
 * Long computations written once as generators of pause points, run either synchronously or cooperatively.
 *
 * A `Steps<T>` generator does its work between `yield`s and returns T. `runSteps` drives it to the end in one go (the
 * synchronous API); `runStepsAsync` awaits an injected `yieldNow` at every pause point, so that a host that shares
 * its thread with the computation (the Jupyter kernel) can flush progress displays and serve messages in between.
 * Both run the same code in the same order, so their results are bit-identical. The physics package stays free of
 * I/O: the host supplies `yieldNow` (and decides how often it really gives the event loop a turn).
 *
 * @example
 *   function* work(): Steps<number> { let s = 0; for (let i = 0; i < 10; i++) { s += i; yield; } return s; }
 *   runSteps(work()); await runStepsAsync(work(), () => new Promise((r) => setImmediate(r)));
 * See also: LongTask (progress/index.ts) for reports and cancellation.
 */

/** A computation that pauses at each `yield` and returns T. */
export type Steps<T> = Generator<void, T, undefined>;

/** Run to the end without pausing. */
export function runSteps<T>(steps: Steps<T>): T {
  for (;;) {
    const next = steps.next();
    if (next.done) return next.value;
  }
}

/** Run to the end, awaiting `yieldNow()` at every pause point (a rejection, e.g. an interrupt, stops the work). */
export async function runStepsAsync<T>(steps: Steps<T>, yieldNow: () => Promise<void>): Promise<T> {
  for (;;) {
    const next = steps.next();
    if (next.done) return next.value;
    try {
      await yieldNow();
    } catch (error) {
      steps.return(undefined as never);
      throw error;
    }
  }
}
