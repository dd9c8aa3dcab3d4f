/** `[cef-fit]` joint fits: χ(T) and M(B) datasets from data cells next to neutron peaks; residuals per dataset. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';
import { cefTransitions } from '@multiplet/physics/neutron/cefTransitions';
import { neutronSpectrum } from '@multiplet/physics/neutron/neutronSpectrum';
import { vanVleckSusceptibility, magnetization } from '@multiplet/physics/thermo';
import { getIon } from '@multiplet/physics/ions';

const MULTIPLET_MIME = 'application/vnd.multiplet.result+json';
const ER_SAMPLE = SAMPLE_CELL.replace('DyQ-1', 'ErQ-3').replace('Dy3+', 'Er3+'); // 2 ions per formula unit
const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START_CEF = `[crystal-field] cefStart
B:
  B20: -0.035 meV
  B40: 1.1e-3 meV
  B43: -0.0095 meV
  B60: 9e-6 meV
  B63: -6e-5 meV
  B66: 1e-4 meV
`;
const er = getIon('Er3+');
const single = { J: er.J, gJ: er.gJ, parametersMeV: TRUTH };

/** Synthetic, noise-free data: powder χ(T) per mole of formula units (2 Er) × 1.1 (a mass error), M(B) ∥ z at 2 K. */
function dataCells(): string[] {
  const temperatures = Array.from({ length: 12 }, (_, k) => 5 * 1.4 ** k);
  const chi = vanVleckSusceptibility(single, { temperaturesK: temperatures, direction: 'powder' }).chiEmuPerMol;
  const chiRows = temperatures.map((T, i) => `${T}, ${2 * 1.1 * chi[i]!}, ${2 * 0.011 * chi[i]!}`);
  const fields = [0.5, 1, 2, 4, 7];
  const m = magnetization(single, { temperaturesK: [2], fieldsT: fields, direction: [0, 0, 1] }).magnetizationMuB[0]!;
  const mRows = fields.map((B, i) => `${B}, ${m[i]}, 0.01`);
  return [
    `[data] chiData\ntable: |\n    T (K), chi (emu/mol), dchi (emu/mol)\n    ${chiRows.join('\n    ')}\n`,
    `[data] m2K\ntable: |\n    B (T), M (muB), dM (muB)\n    ${mRows.join('\n    ')}\n`,
  ];
}

function peakLines(): string {
  const t = cefTransitions('Er3+', TRUTH, 5);
  return t.transitions.filter((x) => x.fromLevel === 0 && x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 4)
    .map((v) => `  - { energy: ${v.energyMeV} meV, error: 0.1 meV, temperature: 5 K }`).join('\n');
}

type Best = {
  B: Record<string, number>; chi2: number; degreesOfFreedom: number;
  chi2ByDataset: { peaks: number; spectra: number[]; susceptibility: number[]; magnetization: number[] };
  bulkScales: { susceptibility: number[]; magnetization: number[] };
  residuals: { spectra: { temperatureK: number; energiesMeV: number[]; values: number[] }[]; susceptibility: { values: number[] }[]; magnetization: { values: number[] }[] };
};

describe('[cef-fit] joint fits with χ(T) and M(B) from data cells', () => {
  it('fits peaks + χ(T) (per formula unit, fitted scale) + M(B) back to the known parameters, with χ² and residuals per dataset', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    for (const cell of dataCells()) await runOk(session, cell);
    const r = await runOk(session, `[cef-fit] joint
start: cefStart
peaks:
${peakLines()}
susceptibility:
  - { data: chiData, temperatureColumn: T, chiColumn: chi, errorColumn: dchi, perFormulaUnit: true, fitScale: true }
magnetization:
  - { data: m2K, temperature: 2 K, direction: [0, 0, 1], weight: 2 }
`);
    const best = (r.data[MULTIPLET_MIME] as { result: { best: Best } }).result.best;
    expect(best.chi2).toBeLessThan(1e-6);
    for (const [key, value] of Object.entries(TRUTH)) expect(best.B[key]).toBeCloseTo(value, 7);
    expect(best.bulkScales.susceptibility[0]).toBeCloseTo(1.1, 6);
    expect(best.bulkScales.magnetization[0]).toBe(1);
    expect(best.degreesOfFreedom).toBe(4 + 12 + 5 - 6 - 1);
    expect(best.residuals.susceptibility[0]!.values).toHaveLength(12);
    expect(best.residuals.magnetization[0]!.values).toHaveLength(5);
    expect(r.data['text/plain']).toMatch(/χ² \(χ\(T\) 0\)/);
    expect(r.data['text/plain']).toMatch(/χ² \(M\(B\) 0, 2 K\)/);
  });

  it('without perFormulaUnit and without a scale, χ per formula unit is twice too large: the fit is visibly worse', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    for (const cell of dataCells()) await runOk(session, cell);
    const r = await runOk(session, `[cef-fit] wrong\nstart: cefStart\npeaks:\n${peakLines()}\nsusceptibility:\n  - { data: chiData }\n`);
    const best = (r.data[MULTIPLET_MIME] as { result: { best: Best } }).result.best;
    expect(best.chi2ByDataset.susceptibility[0]).toBeGreaterThan(100);
  });

  it('reports the residuals of each spectrum point by point and plots them per dataset', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, `[crystal-field] cefStart\nB:\n  B20: -0.038 meV\n  B40: 1.3e-3 meV\n  B43: -0.0105 meV\n  B60: 8e-6 meV\n  B63: -7e-5 meV\n  B66: 9e-5 meV\n`);
    const energies = Array.from({ length: 61 }, (_, k) => 2 + k * 0.75);
    for (const T of [5, 60]) {
      const s = neutronSpectrum('Er3+', TRUTH, { temperatureK: T, energiesMeV: energies, resolution: { fwhmPolynomialMeV: [1] } }).intensity;
      const table = ['E (meV), I, dI', ...energies.map((e, i) => `${e}, ${2 * s[i]! + 1}, ${0.01 * (2 * s[i]! + 1) + 0.01}`)].join('\n    ');
      await runOk(session, `[data] ins${T}K\ntable: |\n    ${table}\n`);
    }
    // B40 stays fixed at a wrong value, so the residuals are not zero
    const r = await runOk(session, `[cef-fit] fitS\nstart: cefStart\nfree: [B20, B43]\nspectra:\n  - { data: ins5K, temperature: 5 K, resolution: [1] }\n  - { data: ins60K, temperature: 60 K, resolution: [1] }\n`);
    const best = (r.data[MULTIPLET_MIME] as { result: { best: Best } }).result.best;
    expect(best.residuals.spectra).toHaveLength(2);
    best.residuals.spectra.forEach((sp, k) => {
      sp.energiesMeV.forEach((e, i) => expect(e).toBeCloseTo(energies[i]!, 12));
      expect(sp.values).toHaveLength(energies.length);
      expect(sp.values.reduce((a, v) => a + v * v, 0)).toBeCloseTo(best.chi2ByDataset.spectra[k]!, 6);
    });
    expect(best.residuals.spectra[1]!.temperatureK).toBe(60);
    expect(best.chi2ByDataset.spectra[0]).toBeGreaterThan(1);
    expect(r.data['text/plain']).toMatch(/spectrum 1, 60 K\).*rms residual/);
    const spec = r.data['application/vnd.vegalite.v5+json'] as { vconcat?: unknown[]; data?: { values: unknown[] } };
    expect(spec.data!.values).toHaveLength(2 * energies.length);
    expect(() => compile(spec as never)).not.toThrow();
  });

  it('positioned errors: a χ column with a temperature unit, a missing column, M(B) at 0 K; bulk data alone are enough', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, START_CEF);
    for (const cell of dataCells()) await runOk(session, cell);
    const unit = errorOf(await run(session, `[cef-fit] e1\nstart: cefStart\nsusceptibility:\n  - { data: chiData, chiColumn: T }\n`));
    expect(unit.evalue).toMatch(/susceptibility\.0\.chiColumn/);
    const missing = errorOf(await run(session, `[cef-fit] e2\nstart: cefStart\nmagnetization:\n  - { data: m2K, temperature: 2 K, momentColumn: nope }\n`));
    expect(missing.evalue).toMatch(/magnetization\.0\.momentColumn/);
    const zero = errorOf(await run(session, `[cef-fit] e3\nstart: cefStart\nmagnetization:\n  - { data: m2K, temperature: 0 K }\n`));
    expect(zero.evalue).toMatch(/magnetization\.0\.temperature/);
    await runOk(session, `[cef-fit] bulkOnly\nstart: cefStart\nfree: [B20]\nmagnetization:\n  - { data: m2K, temperature: 2 K, direction: [0, 0, 1] }\n`);
  });
});
