/** The `cef-fit` cell kind: peaks from a known D3d field are fitted back; a spectrum from a data cell; errors. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { neutronSpectrum } from '@multiplet/physics/neutron/neutronSpectrum';

const MULTIPLET_MIME = 'application/vnd.multiplet.result+json';
const ER_SAMPLE = SAMPLE_CELL.replace('DyQ-1', 'ErQ-3').replace('Dy3+', 'Er3+');
const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START_CEF = `[crystal-field] cefStart
B:
  B20: -0.03 meV
  B40: 1e-3 meV
  B43: -0.009 meV
  B60: 1e-5 meV
  B63: -5e-5 meV
  B66: 1e-4 meV
`;

function peakLines(): string {
  const lines: string[] = [];
  for (const T of [5, 60]) {
    const t = cefTransitions('Er3+', TRUTH, T);
    for (const v of t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5))
      lines.push(`  - { energy: ${v.energyMeV} meV, error: 0.1 meV, intensity: ${v.weight}, intensityError: ${0.05 * v.weight + 0.01}, temperature: ${T} K }`);
  }
  return lines.join('\n');
}

describe('[cef-fit] cell', () => {
  it('fits peak energies and intensities at two temperatures back to the known parameters, seeded; plot compiles', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    const r = await runOk(session, `[cef-fit] fitA\nstart: cefStart\nstarts: 2\nseed: 5\npeaks:\n${peakLines()}\n`);
    const result = (r.data[MULTIPLET_MIME] as { result: { best: { B: Record<string, number>; chi2Reduced: number; errors: Record<string, number> }; minima: unknown[]; startsRun: number } }).result;
    expect(result.best.chi2Reduced).toBeLessThan(1e-8);
    for (const [key, value] of Object.entries(TRUTH)) expect(result.best.B[key]).toBeCloseTo(value, 7);
    expect(result.startsRun).toBe(3);
    expect(r.data['text/plain']).toMatch(/χ²_red/);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
  });

  it('samples the posterior when mcmcSteps > 0 (derived g-factors and levels in the result)', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    const r = await runOk(session, `[cef-fit] fitM\nstart: cefStart\nmcmcSteps: 12\nmcmcWalkers: 14\npeaks:\n${peakLines()}\n`);
    const posterior = (r.data[MULTIPLET_MIME] as { result: { posterior: { derived: Record<string, { mean: number }>; sampleCount: number } } }).result.posterior;
    expect(posterior.sampleCount).toBe(12 * 14);
    expect(posterior.derived.gParallel!.mean).toBeGreaterThan(0);
    expect(posterior.derived.level1MeV!.mean).toBeCloseTo(3.68, 1);
    expect(r.data['text/plain']).toMatch(/χ²_red/);
  });

  it('fits a measured spectrum from a data cell (scale and background profiled)', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    // the truth with B20 and B43 moved; the other (fixed) parameters are the truth's
    await runOk(session, `[crystal-field] cefStart\nB:\n  B20: -0.038 meV\n  B40: 1.2e-3 meV\n  B43: -0.0105 meV\n  B60: 8e-6 meV\n  B63: -7e-5 meV\n  B66: 9e-5 meV\n`);
    const energies = Array.from({ length: 101 }, (_, k) => 2 + k * 0.5);
    const s = neutronSpectrum('Er3+', TRUTH, { temperatureK: 5, energiesMeV: energies, resolution: { fwhmPolynomialMeV: [1] } }).intensity;
    const table = ['E (meV), I, dI', ...energies.map((e, i) => `${e}, ${2 * s[i]! + 1}, ${0.01 * (2 * s[i]! + 1) + 0.01}`)].join('\n    ');
    await runOk(session, `[data] ins5K\ntable: |\n    ${table}\n`);
    const r = await runOk(session, `[cef-fit] fitS\nstart: cefStart\nfree: [B20, B43]\nspectra:\n  - { data: ins5K, temperature: 5 K, resolution: [1] }\n`);
    const result = (r.data[MULTIPLET_MIME] as { result: { best: { B: Record<string, number>; spectrumScales: number[][] } } }).result;
    expect(result.best.spectrumScales[0]![0]).toBeCloseTo(2, 6);
    expect(result.best.spectrumScales[0]![1]).toBeCloseTo(1, 6);
    expect(result.best.B.B20).toBeCloseTo(TRUTH.B20, 8);
    expect(result.best.B.B43).toBeCloseTo(TRUTH.B43, 8);
  });

  it('under-determined (Dy3+ D3d, three energy-only peaks, six free parameters, starts 0): best B, null errors, warning', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, SAMPLE_CELL);
    await runOk(session, `[crystal-field] cefDy\nB:\n  B20: -0.25 meV\n  B40: -3e-3 meV\n  B43: 2e-2 meV\n  B60: -1e-5 meV\n  B63: -1e-4 meV\n  B66: -1e-4 meV\n`);
    const peaks = [20, 30, 40].map((e) => `  - { energy: ${e} meV, error: 0.2 meV, temperature: 5 K }`).join('\n');
    const r = await runOk(session, `[cef-fit] fitU\nstart: cefDy\nstarts: 0\npeaks:\n${peaks}\n`);
    const result = (r.data[MULTIPLET_MIME] as { result: { best: { B: Record<string, number>; errors: Record<string, number | null>; degreesOfFreedom: number }; warnings: string[] } }).result;
    expect(result.best.degreesOfFreedom).toBe(-3);
    expect(Object.values(result.best.errors)).toEqual([null, null, null, null, null, null]);
    for (const v of Object.values(result.best.B)) expect(Number.isFinite(v)).toBe(true);
    expect(result.warnings.join('\n')).toMatch(/under-determined: 3 data for 6 free parameters/);
    expect(r.data['text/plain']).toMatch(/∞ \(undetermined\)/);
  });

  it('positioned errors: zero peak error, forbidden free parameter, bounds excluding the start, no data', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    const zero = errorOf(await run(session, `[cef-fit] f1\nstart: cefStart\npeaks:\n  - { energy: 5 meV, error: 0 meV, temperature: 5 K }\n`));
    expect(zero.evalue).toMatch(/errorMeV|error/);
    const forbidden = errorOf(await run(session, `[cef-fit] f2\nstart: cefStart\nfree: [B20, B22]\npeaks:\n  - { energy: 5 meV, error: 0.1 meV, temperature: 5 K }\n`));
    expect(forbidden.evalue).toMatch(/B22/);
    const bounds = errorOf(await run(session, `[cef-fit] f3\nstart: cefStart\nfree: [B20]\nbounds:\n  B20: [0 meV, 1 meV]\npeaks:\n  - { energy: 5 meV, error: 0.1 meV, temperature: 5 K }\n`));
    expect(bounds.evalue).toMatch(/bounds\.B20/);
    const none = errorOf(await run(session, `[cef-fit] f4\nstart: cefStart\n`));
    expect(none.evalue).toMatch(/no data/);
  });
});
