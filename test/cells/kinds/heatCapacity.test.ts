/** The `heat-capacity` cell kind: CEF Schottky C and S, plot with the R ln 2 line. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL, CEF_CELL } from '../helpers';
import { GAS_CONSTANT_J_PER_MOL_K as R } from '@multiplet/physics/units';
import { resultOf } from './thermoHelpers';

describe('[heat-capacity] cell', () => {
  it('releases R ln 8 per Dy3+ ion above its Kramers ground doublet at high T (S(∞) = R ln(2J+1) − R ln 2)', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const r = await runOk(s, '[heat-capacity] cA\ncef: cefA\ntemperatures: [1 K, 100000 K]\n');
    const result = resultOf<{ entropyJPerMolK: number[]; totalEntropyJPerMolK: number[]; entropyJPerMolFormulaUnitK: number[]; levelsMeV: number[] }>(r.data);
    expect(result.entropyJPerMolK[1]).toBeCloseTo(R * Math.log(8), 2);
    expect(result.totalEntropyJPerMolK[1]).toBeCloseTo(R * Math.log(16), 2);
    expect(result.entropyJPerMolFormulaUnitK[1]).toBeCloseTo(2 * result.entropyJPerMolK[1]!, 10);
    expect(result.levelsMeV).toHaveLength(16);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
    expect(errorOf(await run(s, '[heat-capacity] bad\ncef: cefA\ntemperatures: [-1 K]\n')).evalue).toMatch(/temperature/);
  });
});
