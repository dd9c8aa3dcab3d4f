/**
 * The `exchange` cell kind: after a crystal-field cell, the couplings to first and second order with the two-site
 * check, a scan against the gap as a vega-lite plot, and positioned errors.
 */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';

const MULTIPLET_MIME = 'application/vnd.multiplet.result+json';
const VEGA_MIME = 'application/vnd.vegalite.v5+json';

// A |±15/2⟩ Dy3+ doublet (B20 < 0 only) on the DyQ-1 sample (a = 10.12 Å).
const DY_CEF = `[crystal-field] cefIsing
B:
  B20: -0.1 meV
`;

describe('[exchange] cell', () => {
  it('reads a crystal-field result: J_zz = 4J²(−1/3)J_ex + 4·(5/3)D at first order for a pure |±J⟩ doublet; scan plot compiles', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, SAMPLE_CELL);
    await runOk(session, DY_CEF);
    const r = await runOk(session, `[exchange] exA\ncef: cefIsing\nisotropic: 0.001 meV\ndipolar: true\ncefScale: 0.5 .. 2 / 3 log\nfurtherNeighbours: true\n`);
    const payload = r.data[MULTIPLET_MIME] as { result: Record<string, any> };
    const result = payload.result;
    // Derivations: test/physics/exchange/effectiveExchange.test.ts (exact |±J⟩ limit and D_nn = 5D/3).
    const rnn = (10.12 * Math.SQRT2) / 4;
    // μ0 μB²/(4π Å³) in meV from CODATA 2018 values (from memory): μB = 9.2740100783e-24 J/T, μ0/4π = 1e-7 T m/A
    // (to 1e-10), 1 meV = 1.602176634e-22 J (exact).
    const muB2PerA3MeV = (9.2740100783e-24 ** 2 * 1e-7) / 1e-30 / 1.602176634e-22;
    const D = (muB2PerA3MeV * 100) / rnn ** 3; // μ = g_J J = 10 μB
    expect(result.first.Jzz).toBeCloseTo(4 * 56.25 * (-1 / 3) * 0.001 + 4 * (5 / 3) * D, 5);
    expect(Math.abs(result.first.Jpm)).toBeLessThan(1e-14);
    expect(result.second.Jzz).toBeDefined();
    expect(result.twoSiteCheckMeV).toBeLessThan(1e-6);
    expect(result.scanCefScale).toHaveLength(3);
    expect(result.furtherNeighbours.map((c: { shell: string }) => c.shell)).toEqual(['J1', 'J2', 'J3a', 'J3b']);
    expect(result.interpretation).toMatch(/Ising limit/);
    const text = r.data['text/plain'] as string;
    expect(text).toMatch(/J_zz/);
    const spec = r.data[VEGA_MIME] as Record<string, unknown>;
    expect(() => compile(spec as never)).not.toThrow();
  });

  it('a Kramers XY-like doublet gives transverse couplings; θ_CW sets J_ex (mean field); the bar plot compiles', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, SAMPLE_CELL.replace('Dy3+', 'Yb3+'));
    await runOk(session, `[crystal-field] cefYb\nB:\n  B20: 0.4 meV\n  B40: 0.02 meV\n  B43: 0.15 meV\n`);
    const r = await runOk(session, `[exchange] exYb\ncef: cefYb\nthetaCW: 0.5 K\ntwoSiteCheck: false\n`);
    const result = (r.data[MULTIPLET_MIME] as { result: Record<string, any> }).result;
    expect(result.isotropicFromThetaCW.thetaCWK).toBe(0.5);
    // The first-order model reproduces the requested θ; the reported model θ includes the second order.
    expect(Math.abs(result.thetaCWModelK - 0.5)).toBeLessThan(0.05);
    expect(Math.abs(result.first.Jpm)).toBeGreaterThan(0);
    expect(result.twoSiteCheckMeV).toBeNull();
    expect(() => compile(r.data[VEGA_MIME] as never)).not.toThrow();
  });

  it('moves one Stevens parameter: first order follows the states, the gap moves; two scans give two panels', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, SAMPLE_CELL.replace('Dy3+', 'Yb3+'));
    await runOk(session, `[crystal-field] cefYb\nB:\n  B20: 0.4 meV\n  B40: 0.02 meV\n  B43: 0.15 meV\n`);
    const r = await runOk(
      session,
      `[exchange] exScan\ncef: cefYb\nisotropic: 0.005 meV\ntwoSiteCheck: false\nscanParameter: B40\nscanValues: 0.015 meV .. 0.025 meV / 3\nexchangeScale: [0.5, 1]\n`,
    );
    const result = (r.data[MULTIPLET_MIME] as { result: Record<string, any> }).result;
    expect(result.scanParameter.key).toBe('B40');
    const rows = result.scanParameter.rows;
    expect(rows.map((row: { value: number }) => row.value)).toEqual([0.015, 0.02, 0.025]);
    // The middle point is the crystal-field result itself: identical to the unscanned couplings.
    expect(rows[1].second.Jzz).toBeCloseTo(result.second.Jzz, 14);
    expect(rows[0].gapMeV).not.toBeCloseTo(rows[2].gapMeV, 3);
    const spec = r.data[VEGA_MIME] as { vconcat: unknown[] };
    expect(spec.vconcat).toHaveLength(2);
    expect(() => compile(spec as never)).not.toThrow();
    expect(r.data['text/plain']).toMatch(/scan of B40/);
  });

  it('takes J_ex from the J1 of a Monte Carlo model: J_ex = J1/J² for a pure |±J⟩ doublet (J_nn = −J1/3 = J_zz/4)', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, SAMPLE_CELL);
    await runOk(session, DY_CEF);
    await runOk(session, `[spin-ice-mc] mc\ntemperatures: [2 K]\nJ1: 3.2 K\nL: 1\nsweeps: 40\nthermalizationSweeps: 0\nsnapshots: 0\n`);
    const r = await runOk(session, `[exchange] exMc\ncef: cefIsing\nfromMonteCarlo: mc\ndipolar: false\norder: 1\ntwoSiteCheck: false\n`);
    const result = (r.data[MULTIPLET_MIME] as { result: Record<string, any> }).result;
    expect(result.isotropicFromMonteCarlo).toEqual({ result: 'mc', J1K: 3.2 });
    const K = 1.380649e-23 / 1.602176634e-22; // k_B in meV/K (CODATA 2018 exact values, from memory)
    expect(result.isotropicMeV).toBeCloseTo((3.2 * K) / 56.25, 10);
    expect(result.first.Jzz / 4 / K).toBeCloseTo(-3.2 / 3, 8);
  });

  it('errors: a crystal field without a doublet ground state; isotropic together with thetaCW', async () => {
    const session = createCellSession({ notebookDir: '.' });
    await runOk(session, SAMPLE_CELL.replace('Dy3+', 'Pr3+'));
    await runOk(session, `[crystal-field] cefPr\nB:\n  B20: 0.3 meV\n`);
    const e1 = errorOf(await run(session, `[exchange] exPr\ncef: cefPr\nisotropic: 0.01 meV\n`));
    expect(e1.evalue).toMatch(/doublet ground state/);
    const e2 = errorOf(await run(session, `[exchange] exPr\ncef: cefPr\nisotropic: 0.01 meV\nthetaCW: 1 K\n`));
    expect(e2.evalue).toMatch(/line 4/);
    expect(e2.evalue).toMatch(/thetaCW/);
    const e3 = errorOf(await run(session, `[exchange] exPr\ncef: cefPr\nisotropic: 0.01 meV\nscanValues: [0.1 meV]\n`));
    expect(e3.evalue).toMatch(/scanParameter/);
    await runOk(session, `[crystal-field] cefPrDoublet\nB:\n  B20: -0.5 meV\n  B43: 0.08 meV\n`);
    const e4 = errorOf(await run(session, `[exchange] exPr\ncef: cefPrDoublet\nmatrix: [[1 meV, 0 meV], [0 meV, 1 meV]]\n`));
    expect(e4.evalue).toMatch(/line 3/);
    expect(e4.evalue).toMatch(/matrix/);
    const e5 = errorOf(await run(session, `[exchange] exPr\ncef: cefPrDoublet\nisotropic: 0.01 meV\nlatticeConstant: 0 angstrom\n`));
    expect(e5.evalue).toMatch(/latticeConstant/);
  });
});
