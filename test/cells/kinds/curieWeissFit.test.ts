/** The `curie-weiss-fit` cell kind: recovers C, θ_CW, μ_eff from data in emu/mol and in m³/mol. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, runOk, SAMPLE_CELL } from '../helpers';
import { CURIE_PREFACTOR_EMU_K_PER_MOL } from '@multiplet/physics/units';
import { dataCell, resultOf } from './thermoHelpers';

const DY_CURIE = (CURIE_PREFACTOR_EMU_K_PER_MOL * 340) / 3; // g_J² J(J+1) = 340/3 for Dy3+: 14.17 emu K/mol

describe('[curie-weiss-fit] cell', () => {
  const t = Array.from({ length: 40 }, (_, i) => 5 + 7.5 * i);
  it('recovers C = 14.17 emu K/mol (μ_eff = 10.65 μB, free Dy3+; Kittel table 10.6), θ_CW = −3 K and χ0 in a range', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, dataCell('chi', 'T (K), chi (emu/mol)', t.map((x) => [x, DY_CURIE / (x + 3) + 1e-3])));
    const r = await runOk(s, '[curie-weiss-fit] cw\ndata: chi\nrange: [20 K, 300 K]\nwithChi0: true\n');
    const result = resultOf<{ curieConstantEmuKPerMol: number; weissTemperatureK: number; chi0EmuPerMol: number; effectiveMomentMuB: number; pointsUsed: number }>(r.data);
    expect(result.curieConstantEmuKPerMol).toBeCloseTo(DY_CURIE, 6);
    expect(DY_CURIE).toBeCloseTo(14.17, 2);
    expect(result.weissTemperatureK).toBeCloseTo(-3, 6);
    expect(result.chi0EmuPerMol).toBeCloseTo(1e-3, 8);
    expect(result.effectiveMomentMuB).toBeCloseTo((4 / 3) * Math.sqrt(7.5 * 8.5), 6); // 10.646 μB
    expect(result.pointsUsed).toBe(t.filter((x) => x >= 20 && x <= 300).length);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
  });

  it('reads χ in m³/mol per formula unit and reports per ion', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, dataCell('chiSI', 'T (K), chi (m^3/mol)', t.map((x) => [x, (2 * 14.17 * 4 * Math.PI * 1e-6) / (x + 3)])));
    const r = await runOk(s, '[curie-weiss-fit] cw2\ndata: chiSI\nperFormulaUnit: true\n');
    expect(resultOf<{ curieConstantEmuKPerMol: number }>(r.data).curieConstantEmuKPerMol).toBeCloseTo(14.17, 6);
  });
});
