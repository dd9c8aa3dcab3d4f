import { describe, it, expect } from 'vitest';
import { runSpinIceMonteCarloAsync } from '@multiplet/physics/montecarlo/runSpinIceMonteCarloAsync';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo/runSpinIceMonteCarlo';
import { CancelledError } from '@multiplet/physics/errors';

const model = { L: 1, latticeConstantAngstrom: 10, momentMuB: 1, exchangeK: { J1: -3 }, dipolar: false };

describe('runSpinIceMonteCarloAsync (in-thread fallback)', () => {
  it('gives the same numbers as the synchronous run and reports progress', async () => {
    const options = { model, temperaturesK: [2, 0.5], sweeps: 80, seed: 17 };
    const progress: number[] = [];
    const job = runSpinIceMonteCarloAsync(options, { mode: 'in-thread', onProgress: (d) => progress.push(d) });
    expect(await job.where).toBe('in-thread');
    const { result } = await job.promise;
    expect(result).toEqual(runSpinIceMonteCarlo(options).result);
    expect(progress[progress.length - 1]).toBe(120);
  });

  it('stops within a second after cancel, leaving the event loop free meanwhile', async () => {
    const job = runSpinIceMonteCarloAsync({ model: { ...model, L: 3 }, temperaturesK: [3, 2, 1, 0.5], sweeps: 1_000_000, seed: 1 }, { mode: 'in-thread' });
    await new Promise((r) => setTimeout(r, 150));
    const t0 = Date.now();
    job.cancel();
    await expect(job.promise).rejects.toBeInstanceOf(CancelledError);
    expect(Date.now() - t0).toBeLessThan(1000);
  });
});
