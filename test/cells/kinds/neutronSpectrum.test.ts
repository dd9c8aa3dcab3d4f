/** The `neutron-spectrum` cell kind: a spectrum from a crystal-field result, units, plot, positioned errors. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';
import { getIon } from '@multiplet/physics/ions';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';

const MULTIPLET_MIME = 'application/vnd.multiplet.result+json';
const ER_SAMPLE = SAMPLE_CELL.replace('DyQ-1', 'ErQ-3').replace('Dy3+', 'Er3+');
const ER_CEF = `[crystal-field] cefEr
B:
  B20: -0.04 meV
  B40: 1.2e-3 meV
  B43: -1.1e-2 meV
  B60: 8e-6 meV
  B63: -7e-5 meV
  B66: 9e-5 meV
`;

describe('[neutron-spectrum] cell', () => {
  it('gives one intensity per grid energy in mb/sr/meV whose integral obeys the total-moment sum rule; plot compiles', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, ER_CEF);
    const r = await runOk(session, `[neutron-spectrum] insA\ncef: cefEr\ntemperature: 20 K\nenergies: -100 meV .. 100 meV / 8001\nQ: 0 angstrom^-1\nresolution: [0.8, -0.004]\nlineShape: gaussian\n`);
    const result = (r.data[MULTIPLET_MIME] as { result: { intensity: number[]; energiesMeV: number[]; formFactor: number; transitions: unknown[] } }).result;
    expect(result.intensity).toHaveLength(8001);
    const step = result.energiesMeV[1]! - result.energiesMeV[0]!;
    const integral = result.intensity.reduce((s, v) => s + v * step, 0);
    const ion = getIon('Er3+');
    // Σ_i p_i Σ_j |⟨j|J⊥|i⟩|² = (2/3) J(J+1) (powder), times (γr0/2)² g_J² f²
    expect(integral / (MAGNETIC_PREFACTOR_MB * ion.gJ ** 2 * result.formFactor ** 2 * (2 / 3) * ion.J * (ion.J + 1))).toBeCloseTo(1, 3);
    expect(r.data['text/plain']).toMatch(/energy-loss transitions/);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
  });

  it('points at the field of a bad resolution polynomial and refuses a missing temperature', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, ER_SAMPLE);
    await runOk(session, ER_CEF);
    const e1 = errorOf(await run(session, `[neutron-spectrum] insB\ncef: cefEr\ntemperature: 5 K\nenergies: 1 meV .. 10 meV / 10\nresolution: [-1]\n`));
    expect(e1.evalue).toMatch(/resolution/);
    const e2 = errorOf(await run(session, `[neutron-spectrum] insC\ncef: cefEr\nenergies: 1 meV .. 10 meV / 10\n`));
    expect(e2.evalue).toMatch(/temperature/);
  });
});
