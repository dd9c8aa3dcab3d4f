/** The `susceptibility` cell kind: Van Vleck theorem, per formula unit from the sample, plot. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, runOk, SAMPLE_CELL, CEF_CELL } from '../helpers';
import { CURIE_PREFACTOR_EMU_K_PER_MOL } from '@multiplet/physics/units';
import { resultOf } from './thermoHelpers';

describe('[susceptibility] cell', () => {
  it("T·χ → free-ion Curie constant (Van Vleck's theorem; Dy3+ 14.17 emu K/mol), per formula unit ×2 from the sample", async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const r = await runOk(s, '[susceptibility] chi\ncef: cefA\ntemperatures: [2 K, 1000000 K]\n');
    const result = resultOf<{ chiEmuPerMol: number[]; chiEmuPerMolFormulaUnit: number[]; chiM3PerMol: number[]; ionsPerFormulaUnit: number }>(r.data);
    const curie = (CURIE_PREFACTOR_EMU_K_PER_MOL * 340) / 3; // (4/3)² · (15/2)(17/2) = 340/3
    expect((1e6 * result.chiEmuPerMol[1]!) / curie).toBeCloseTo(1, 4);
    expect(curie).toBeCloseTo(14.17, 2); // handbook value for Dy3+ (from memory: μ_eff 10.65 μB)
    expect(result.ionsPerFormulaUnit).toBe(2);
    expect(result.chiEmuPerMolFormulaUnit[0]).toBeCloseTo(2 * result.chiEmuPerMol[0]!, 10);
    expect(result.chiM3PerMol[0]).toBeCloseTo(4 * Math.PI * 1e-6 * result.chiEmuPerMol[0]!, 14);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
  });
});
