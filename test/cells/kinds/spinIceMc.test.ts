/** The spin-ice cell kinds: `spin-ice-mc`, `structure-factor`, `mc-fit`, and the interrupt of a long run. */
import { describe, it, expect } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from '../helpers';
import { dataCell, resultOf } from './thermoHelpers';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';
import { magneticFormFactor } from '@multiplet/physics/neutron';

const MC = `[spin-ice-mc] mcA
L: 1
temperatures: [0.3 K, 1 K, 3 K, 30 K]
J1: -3 K
moment: 10
sweeps: 100
snapshots: 10
reweightTemperatures: 0.5 K .. 2 K / 4
`;

describe('[spin-ice-mc], [structure-factor], [mc-fit] cells', () => {
  it('spin-ice-mc gives E, C, S, M per temperature, reproducibly, with a compiling plot', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    const r = await runOk(s, MC);
    const res = resultOf<{ temperaturesK: number[]; energyKPerSpin: number[]; heatCapacityJPerMolK: number[]; entropyJPerMolK: number[]; snapshots: string[][]; model: { latticeConstantAngstrom: number }; reweighted: { heatCapacityJPerMolK: number[] } }>(r.data);
    expect(res.temperaturesK).toEqual([0.3, 1, 3, 30]);
    expect(res.energyKPerSpin[0]).toBeCloseTo(-1, 1); // ice states: −J_nn per spin, J_nn = −J1/3 = 1 K
    expect(res.snapshots[0]).toHaveLength(10);
    expect(res.model.latticeConstantAngstrom).toBeCloseTo(10.12, 10); // from the sample
    expect(res.reweighted.heatCapacityJPerMolK).toHaveLength(4);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
    const s2 = createCellSession({ notebookDir: '.' });
    await runOk(s2, SAMPLE_CELL);
    expect(resultOf(await runOk(s2, MC).then((x) => x.data))).toEqual(res);
  });

  it('structure-factor: the 30 K curve is the paramagnet (2/3)(γr0/2)²μ²f², data are put on the absolute scale', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, MC);
    const Q = [0.5, 1, 1.5, 2, 2.5];
    const para = (q: number) => (2 / 3) * (MAGNETIC_PREFACTOR_MB / 1000) * 100 * magneticFormFactor('Dy3+', q) ** 2;
    await runOk(s, dataCell('hot', 'Q (angstrom^-1), I, dI', Q.map((q) => [q, 40 * para(q), 0.4 * para(q)])));
    await runOk(s, dataCell('cold', 'Q (angstrom^-1), I', Q.map((q) => [q, 30 * para(q)])));
    const r = await runOk(s, '[structure-factor] sqA\nrun: mcA\nQ: [0.5 angstrom^-1, 1 angstrom^-1, 1.5 angstrom^-1, 2 angstrom^-1, 2.5 angstrom^-1]\nparamagnet: hot\ndata: cold\nplane: true\nplanePoints: 5\n');
    const res = resultOf<{ intensityBarnPerSrPerIon: number[][]; differenceBarnPerSrPerIon: number[][]; paramagnetBarnPerSrPerIon: number[]; normalization: { scaleBarnPerSrPerIonPerUnit: number; data: { intensityBarnPerSrPerIon: number[] } }; plane: { intensityBarnPerSrPerIon: number[][] } }>(r.data);
    res.paramagnetBarnPerSrPerIon.forEach((p, k) => expect(p).toBeCloseTo(para(Q[k]), 10));
    res.intensityBarnPerSrPerIon[3].forEach((v, k) => expect(Math.abs(v / para(Q[k]) - 1)).toBeLessThan(0.25));
    expect(res.differenceBarnPerSrPerIon[3].every((d) => d === 0)).toBe(true);
    expect(res.normalization.scaleBarnPerSrPerIonPerUnit).toBeCloseTo(1 / 40, 10);
    expect(res.normalization.data.intensityBarnPerSrPerIon[0]).toBeCloseTo(0.75 * para(0.5), 10);
    expect(res.plane.intensityBarnPerSrPerIon).toHaveLength(5);
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
    const bad = await run(s, '[structure-factor] sqB\nrun: mcA\nQ: [1 angstrom^-1]\ndata: cold\n');
    expect(errorOf(bad).evalue).toContain('paramagnet');
  });

  it('mc-fit fits J2 to C(T) data and a later spin-ice-mc takes the fitted model with from:', async () => {
    const s = createCellSession({ notebookDir: '.' });
    await runOk(s, SAMPLE_CELL);
    // Data: an independent run of the model with J2 = 0.3 K.
    const truth = await runOk(s, '[spin-ice-mc] truth\nL: 1\ntemperatures: [0.3 K, 0.45 K, 0.6 K, 0.8 K, 1.1 K, 1.5 K]\nJ1: -3 K\nJ2: 0.3 K\nsweeps: 2000\nsnapshots: 0\nseed: 5\n');
    const t = resultOf<{ temperaturesK: number[]; heatCapacityJPerMolK: number[]; heatCapacityErrorJPerMolK: number[] }>(truth.data);
    await runOk(s, dataCell('cmag', 'T (K), C (J/mol/K), dC (J/mol/K)', t.temperaturesK.map((x, k) => [x, t.heatCapacityJPerMolK[k], Math.hypot(t.heatCapacityErrorJPerMolK[k], 0.05)])));
    const r = await runOk(s, '[mc-fit] fitA\ndata: cmag\nfree: [J2]\nL: 1\nJ1: -3 K\nsweeps: 1000\nmaxSimulations: 3\nsimulationTemperatures: 0.25 K .. 2 K / 12 log\n');
    const fit = resultOf<{ parametersK: { J2: number }; uncertaintiesK: { J2: number }; reducedChiSquare: number; model: { exchangeK: { J2: number } } }>(r.data);
    expect(Math.abs(fit.parametersK.J2 - 0.3)).toBeLessThan(Math.max(3 * fit.uncertaintiesK.J2, 0.1));
    expect(() => compile(r.data['application/vnd.vegalite.v5+json'] as never)).not.toThrow();
    const next = await runOk(s, '[spin-ice-mc] mcFitted\nfrom: fitA\ntemperatures: [1 K, 2 K]\nsweeps: 40\nsnapshots: 0\n');
    expect(resultOf<{ model: { exchangeK: { J2: number; J1: number }; L: number } }>(next.data).model.exchangeK.J2).toBeCloseTo(fit.parametersK.J2, 12);
  });

  it('an interrupt stops a long spin-ice-mc run within a second and commits nothing', async () => {
    const s = createCellSession({ notebookDir: '.' });
    const flag = new Int32Array(new SharedArrayBuffer(4));
    const pending = run(s, '[spin-ice-mc] long\nL: 3\ntemperatures: [0.5 K, 1 K, 2 K]\nJ1: -3 K\nsweeps: 1000000\n', flag);
    await new Promise((r) => setTimeout(r, 400));
    const t0 = Date.now();
    Atomics.store(flag, 0, 1);
    const r = await pending;
    expect(Date.now() - t0).toBeLessThan(1000);
    expect(r.outcome.status).toBe('error');
    expect((await run(s, '[structure-factor] sq\nrun: long\nQ: [1 angstrom^-1]\n')).outcome.status).toBe('error');
  });
});
