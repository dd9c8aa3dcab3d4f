// A long kind that yields (ctx.yieldNow) is stopped by the host's cancel flag within a second, with progress shown
// as one updating display and nothing committed.
import { describe, expect, it } from 'vitest';
import { registerKind, defineKind } from '@multiplet/cells';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from './helpers';

registerKind(
  defineKind<{ sweeps: number }, { mean: number }>({
    kind: 'test-long',
    summary: 'test kind: random sums over many sweeps',
    fields: { sweeps: { type: 'integer', min: 1, required: true, doc: 'Number of sweeps.' } },
    reads: [],
    writes: 'result',
    async run(input, ctx) {
      let sum = 0;
      for (let sweep = 0; sweep < input.sweeps; sweep++) {
        for (let i = 0; i < 1000; i++) sum += ctx.random.next();
        ctx.task.report(sweep + 1, input.sweeps);
        if (sweep % 20 === 0) await ctx.yieldNow();
      }
      return { mean: sum / (1000 * input.sweeps) };
    },
    render: (r) => ({ text: `mean ${r.mean}`, html: `<p>${r.mean}</p>` }),
  }),
);

describe('interrupting long work', () => {
  it('stops within a second and commits nothing', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const before = s.state.serialize();
    const flag = new Int32Array(new SharedArrayBuffer(4));
    const started = performance.now();
    setTimeout(() => Atomics.store(flag, 0, 1), 100);
    const r = await run(s, '[test-long] long\nsweeps: 100000000\n', flag);
    expect(performance.now() - started).toBeLessThan(1100);
    expect(errorOf(r).ename).toBe('CellInterrupted');
    expect(s.state.serialize()).toBe(before);
    expect(r.outputs[0]).toMatchObject({ type: 'display_data', displayId: expect.stringMatching(/^multiplet-progress-/) });
  });

  it('the same seeded cell gives the same result twice', async () => {
    const s = createCellSession();
    const a = await runOk(s, '[test-long] a\nsweeps: 30\nseed: 5\n');
    const b = await runOk(s, '[test-long] b\nsweeps: 30\nseed: 5\n');
    expect(a.data['text/plain']).toBe(b.data['text/plain']);
    const last = a.outputs.filter((o) => o.type === 'update_display_data').at(-1);
    expect(last).toMatchObject({ data: { 'text/plain': 'a: done' } });
  });
});
