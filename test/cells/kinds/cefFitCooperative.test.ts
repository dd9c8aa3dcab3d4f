/**
 * The [cef-fit] cell runs the fit cooperatively: progress updates go out while it runs (a timer on the same thread
 * sees them arrive), a cancel flag set by a timer stops it within a second with nothing committed, and the result is
 * the synchronous fitCef's.
 */
import { describe, it, expect } from 'vitest';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';
import type { CellOutput } from '@multiplet/cells';
import { fitCef } from '@multiplet/physics/fit';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';

const MULTIPLET_MIME = 'application/vnd.multiplet.result+json';
const ER_SAMPLE = SAMPLE_CELL.replace('Dy3+', 'Er3+');
const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };
const START_CEF = `[crystal-field] cefStart\nB:\n${Object.entries(START).map(([k, v]) => `  ${k}: ${v} meV`).join('\n')}\n`;
const PEAKS = [5, 60].flatMap((T) =>
  cefTransitions('Er3+', TRUTH, T).transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5)
    .map((v) => ({ energyMeV: v.energyMeV, errorMeV: 0.1, intensity: v.weight, intensityError: 0.05 * v.weight + 0.01, temperatureK: T })),
);
const peakLines = PEAKS.map((p) => `  - { energy: ${p.energyMeV} meV, error: 0.1 meV, intensity: ${p.intensity}, intensityError: ${p.intensityError}, temperature: ${p.temperatureK} K }`).join('\n');

describe('[cef-fit] cooperative run', () => {
  it('progress updates arrive while the fit runs; the result equals the synchronous fitCef', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    const outputs: CellOutput[] = [];
    const seenDuringRun: number[] = [];
    const timer = setInterval(() => seenDuringRun.push(outputs.filter((o) => o.type === 'update_display_data').length), 5);
    const outcome = await session.execute(`[cef-fit] fitA\nstart: cefStart\nstarts: 40\nseed: 5\npeaks:\n${peakLines}\n`, { emit: (o) => outputs.push(o) });
    clearInterval(timer);
    expect(outcome.status).toBe('ok');
    const updates = outputs.filter((o) => o.type === 'update_display_data').length;
    // a timer tick saw some progress updates but not yet the last one ("fitA: done")
    expect(seenDuringRun.some((n) => n > 0 && n < updates)).toBe(true);
    const result = (outcome as { result: { data: Record<string, { result: { best: { B: Record<string, number>; chi2: number } } }> } }).result.data[MULTIPLET_MIME]!.result;
    const sync = fitCef({ ion: 'Er3+', symmetry: 'D3d', start: START, peaks: PEAKS }, { starts: 40, seed: 5 });
    expect(result.best.B).toEqual(sync.best.parametersMeV);
    expect(result.best.chi2).toBe(sync.best.chi2);
  });

  it('a cancel flag set by a timer on the same thread stops the fit within a second, nothing committed', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    const before = session.state.serialize();
    const flag = new Int32Array(new SharedArrayBuffer(4));
    const started = performance.now();
    setTimeout(() => Atomics.store(flag, 0, 1), 150);
    const r = await run(session, `[cef-fit] fitLong\nstart: cefStart\nstarts: 10000\nmcmcSteps: 100000\npeaks:\n${peakLines}\n`, flag);
    expect(performance.now() - started).toBeLessThan(1150);
    expect(errorOf(r).ename).toBe('CellInterrupted');
    expect(session.state.serialize()).toBe(before);
  });
});
