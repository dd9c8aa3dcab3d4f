// A cancel while the worker is still setting up (dense dipolar sums at L = 4 take seconds, before the first step
// reads the flag) ends the job within a second: the calling side watches the flag and terminates the worker.
import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { runSpinIceMonteCarloAsync } from '@multiplet/physics/montecarlo/runSpinIceMonteCarloAsync';
import { CancelledError } from '@multiplet/physics/errors';

const root = fileURLToPath(new URL('../..', import.meta.url));
const workerUrl = join(root, 'packages/cli/dist/spinIce.worker.js');

describe('spin-ice Monte Carlo worker: cancel during set-up', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('rejects with CancelledError within a second, before any progress', async () => {
    const progress: number[] = [];
    const temperaturesK = Array.from({ length: 16 }, (_, k) => 0.2 * 25 ** (k / 15));
    const job = runSpinIceMonteCarloAsync(
      { model: { L: 4, latticeConstantAngstrom: 10.07, momentMuB: 10, exchangeK: { J1: -3 }, dipolar: true }, temperaturesK, sweeps: 1_000_000, seed: 1 },
      { workerUrl, mode: 'worker', onProgress: (d) => progress.push(d) },
    );
    expect(await job.where).toBe('worker');
    await new Promise((r) => setTimeout(r, 200));
    const t0 = Date.now();
    job.cancel();
    await expect(job.promise).rejects.toBeInstanceOf(CancelledError);
    expect(Date.now() - t0).toBeLessThan(1000);
    expect(progress).toEqual([]);
  });

  it('a flag set before the worker starts rejects at once', async () => {
    const job = runSpinIceMonteCarloAsync(
      { model: { L: 1, latticeConstantAngstrom: 10, momentMuB: 1, exchangeK: { J1: -3 }, dipolar: false }, temperaturesK: [1], sweeps: 10, seed: 1 },
      { workerUrl, mode: 'worker' },
    );
    job.cancel();
    await expect(job.promise).rejects.toBeInstanceOf(CancelledError);
  });
});
