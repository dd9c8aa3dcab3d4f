import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { runSpinIceMonteCarloAsync } from '@multiplet/physics/montecarlo/runSpinIceMonteCarloAsync';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo/runSpinIceMonteCarlo';
import { CancelledError } from '@multiplet/physics/errors';

const root = fileURLToPath(new URL('../..', import.meta.url));
const workerUrl = join(root, 'packages/cli/dist/spinIce.worker.js');

describe('spin-ice Monte Carlo in a worker thread (bundled spinIce.worker.js)', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('runs in the worker with progress messages and gives the same numbers as in-thread', async () => {
    const options = { model: { L: 1, latticeConstantAngstrom: 10.124, momentMuB: 10, exchangeK: { J1: 3.72 }, dipolar: true }, temperaturesK: [3, 1], sweeps: 60, seed: 5 };
    const progress: number[] = [];
    const job = runSpinIceMonteCarloAsync(options, { workerUrl, mode: 'worker', onProgress: (d) => progress.push(d) });
    expect(await job.where).toBe('worker');
    const { result, data } = await job.promise;
    expect(result).toEqual(runSpinIceMonteCarlo(options).result);
    expect(data.series.energyK[0]).toBeInstanceOf(Float64Array);
    expect(progress[progress.length - 1]).toBe(90);
  });

  it('the shared cancel flag stops the worker within a second', async () => {
    let started!: () => void;
    const running = new Promise<void>((r) => (started = r));
    const job = runSpinIceMonteCarloAsync(
      { model: { L: 3, latticeConstantAngstrom: 10, momentMuB: 1, exchangeK: { J1: -3 }, dipolar: false }, temperaturesK: [3, 2, 1, 0.5], sweeps: 1_000_000, seed: 1 },
      { workerUrl, mode: 'worker', onProgress: () => started() },
    );
    await running;
    const t0 = Date.now();
    Atomics.store(job.cancelFlag, 0, 1);
    await expect(job.promise).rejects.toBeInstanceOf(CancelledError);
    expect(Date.now() - t0).toBeLessThan(1000);
  });
});
