/** The `magnetization` cell kind: Ising geometry on the pyrochlore frames, powder, plot, errors. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';
import { resultOf } from './thermoHelpers';

// |±15/2⟩ Ising doublet far below the rest (B20 = −1 eV): saturated moment m = g_J J = 10 μB.
const ISING_CEF = '[crystal-field] ising\nB:\n  B20: -1000 meV\n';

describe('[magnetization] cell', () => {
  it('gives m/2 along [111] and m/√3 along [001] for a saturated Ising moment on the four ⟨111⟩ frames (common practice)', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, ISING_CEF);
    const along111 = await runOk(s, '[magnetization] m111\ncef: ising\ntemperatures: [0.5 K]\nfields: [3 T]\ndirection: [1, 1, 1]\nsites: pyrochlore\n');
    expect(resultOf<{ magnetizationMuB: number[][] }>(along111.data).magnetizationMuB[0]![0]).toBeCloseTo(5, 3);
    const along001 = await runOk(s, '[magnetization] m001\ncef: ising\ntemperatures: [0.5 K]\nfields: [3 T]\ndirection: [0, 0, 1]\nsites: pyrochlore\n');
    expect(resultOf<{ magnetizationMuB: number[][] }>(along001.data).magnetizationMuB[0]![0]).toBeCloseTo(10 / Math.sqrt(3), 3);
    expect(() => compile(along001.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
  });

  it('powder-averages with a Lebedev–Laikov degree (saturated Ising powder: m/2) and reports the grid', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, ISING_CEF);
    const r = await runOk(s, '[magnetization] mp\ncef: ising\ntemperatures: [0.5 K, 2 K]\nfields: 10 T .. 20 T / 2\npowderDegree: 131\n');
    const result = resultOf<{ magnetizationMuB: number[][]; powder: { degree: number } }>(r.data);
    expect(result.powder.degree).toBe(131);
    expect(result.magnetizationMuB[0]![1]! / 10).toBeCloseTo(0.5, 3);
    expect(r.data['text/plain']).toMatch(/powder \(Lebedev–Laikov degree 131/);
  });

  it('refuses a zero temperature and a demagnetising factor without molar volume', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, ISING_CEF);
    expect(errorOf(await run(s, '[magnetization] bad\ncef: ising\ntemperatures: [0 K]\nfields: [1 T]\n')).evalue).toMatch(/temperature/);
    expect(errorOf(await run(s, '[magnetization] bad2\ncef: ising\ntemperatures: [1 K]\nfields: [1 T]\ndemagnetizationFactor: 0.3\n')).evalue).toMatch(/molarVolume/);
  });
});
