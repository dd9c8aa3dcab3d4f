/** The `heat-capacity-reduction` cell kind: subtract lattice and nuclear parts, integrate R ln 2, plot, errors. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';
import { schottkyHeatCapacity, debyeHeatCapacity, nuclearSchottkyHeatCapacity, R_LN2_J_PER_MOL_K } from '@multiplet/physics/thermo';
import { dataCell, resultOf } from './thermoHelpers';

describe('[heat-capacity-reduction] cell', () => {
  // Synthetic data per formula unit (2 ions): a doublet split by 0.2 meV per ion, Debye lattice θ_D = 320 K with
  // 11 atoms, a nuclear term; the reduction must give back R ln 2 per ion (two-level Schottky entropy).
  const t = Array.from({ length: 120 }, (_, i) => 0.1 * (80 / 0.1) ** (i / 119));
  const magnetic = schottkyHeatCapacity([0, 0.2], t).heatCapacityJPerMolK;
  const lattice = debyeHeatCapacity(t, 320, 11);
  const nuclear = nuclearSchottkyHeatCapacity(t, { hyperfineMeV: 0.003, nuclearSpin: 2.5, abundance: 0.2 }).heatCapacityJPerMolK;
  const rows = t.map((x, i) => [x, 2 * magnetic[i]! + lattice[i]! + 2 * nuclear[i]!, 0.01]);

  it('recovers the magnetic entropy R ln 2 per ion and draws the R ln 2 and spin-ice lines', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, dataCell('cp', 'T (K), C (J/mol/K), dC (J/mol/K)', rows));
    const r = await runOk(s, '[heat-capacity-reduction] smag\ndata: cp\nerrorColumn: dC\ndebye: { atoms: 11, temperature: 320 K }\nnuclear: [{ hyperfine: 0.003 meV, spin: 2.5, abundance: 0.2 }]\n');
    const result = resultOf<{ entropyJPerMolK: number[]; entropyUncertaintyJPerMolK: number[]; rLn2JPerMolK: number; spinIceJPerMolK: number }>(r.data);
    const last = result.entropyJPerMolK.length - 1;
    expect(Math.abs(result.entropyJPerMolK[last]! / R_LN2_J_PER_MOL_K - 1)).toBeLessThan(0.005);
    expect(result.entropyUncertaintyJPerMolK[last]).toBeGreaterThan(0);
    expect(result.spinIceJPerMolK).toBeCloseTo(4.078, 3); // R[ln 2 − ½ ln(3/2)], Pauling 1935
    expect(r.data['text/plain']).toMatch(/R ln 2 = 5\.763/);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
  });

  it('fits θ_D in a range, and refuses two lattice sources', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, dataCell('cp', 'T (K), C (J/mol/K)', t.map((x, i) => [x, 2 * magnetic[i]! + lattice[i]!])));
    const r = await runOk(s, '[heat-capacity-reduction] fitted\ndata: cp\ndebye: { atoms: 11 }\nfitRange: [20 K, 80 K]\n');
    expect(resultOf<{ phononModel: { debye: { temperatureK: number } } }>(r.data).phononModel.debye.temperatureK).toBeCloseTo(320, 0);
    const e = errorOf(await run(s, '[heat-capacity-reduction] bad\ndata: cp\ndebye: { atoms: 11, temperature: 300 K }\nanalogue: cp\nanalogueMolarMass: 500 g/mol\n'));
    expect(e.evalue).toMatch(/analogue/);
  });
});
