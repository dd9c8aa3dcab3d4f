/**
 * `[spin-ice-mc] name` — classical Monte Carlo of Ising spin ice on the pyrochlore lattice (J1/J2/J3a/J3b, Ewald
 * dipolar sum, field) with loop moves and parallel tempering, run off the kernel thread with a progress display
 * and interrupt; from @multiplet/physics/montecarlo.
 *
 *   [spin-ice-mc] mcA
 *   from: fitA                  # optional: start from the model fitted by an [mc-fit] cell
 *   L: 3
 *   temperatures: 0.1 K .. 10 K / 24 log
 *   J1: 3.72 K
 *   dipolar: true
 *   moment: 10
 *   sweeps: 4000
 *   reweightTemperatures: 0.5 K .. 2 K / 31
 */
import { GAS_CONSTANT_J_PER_MOL_K } from '@multiplet/physics/units';
import { multiHistogramReweighting } from '@multiplet/physics/montecarlo/multiHistogramReweighting';
import { reweightedHeatCapacity } from '@multiplet/physics/montecarlo/reweightedHeatCapacity';
import type { SpinIceModel } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { defineKind } from './types';
import { formatNumber, htmlTable, textTable } from '../render/format';
import { VEGA_LITE_SCHEMA } from './thermoShared';
import { SPIN_ICE_MODEL_FIELDS, encodeSpins, modelFromInput, runSpinIceJob, type SpinIceModelInput } from './spinIceShared';

interface SpinIceMcInput extends SpinIceModelInput {
  from?: string;
  temperatures: number[];
  parallelTempering: boolean;
  snapshots: number;
  reweightTemperatures?: number[];
}

/** The result of a `spin-ice-mc` cell (read by `structure-factor`). */
export interface SpinIceMcCellResult {
  model: { L: number; latticeConstantAngstrom: number; momentMuB: number; exchangeK: Record<string, number>; dipolar: boolean; fieldTesla: number[] };
  numberOfSpins: number;
  dipolarDK: number;
  temperaturesK: number[];
  energyKPerSpin: number[];
  heatCapacityJPerMolK: number[];
  heatCapacityErrorJPerMolK: number[];
  entropyJPerMolK: number[];
  magnetizationMuBPerSpin: number[];
  magnetizationErrorMuBPerSpin: number[];
  orderParameter001: number[];
  acceptance: { singleFlip: number[]; loop: number[]; swap: number[] };
  reweighted: { temperaturesK: number[]; energyKPerSpin: number[]; heatCapacityJPerMolK: number[]; converged: boolean } | null;
  /** Configurations per temperature, ±1 spins packed 8 per byte, base64. */
  snapshots: string[][];
  rLn2JPerMolK: number;
}

export const spinIceMcKind = defineKind<SpinIceMcInput, SpinIceMcCellResult>({
  kind: 'spin-ice-mc',
  summary: 'Monte Carlo of Ising spin ice (J1/J2/J3a/J3b, dipolar, field): E, C, S, M per temperature, reweighted C(T), snapshots',
  fields: {
    from: { type: 'reference', kinds: ['mc-fit'], doc: 'An [mc-fit] result whose fitted model (L, J’s, dipolar, moment, lattice constant) is the default here.' },
    temperatures: { type: 'range', unit: 'K', min: 0, required: true, doc: 'Simulated temperatures, e.g. "0.1 K .. 10 K / 24 log" (parallel tempering across them).' },
    ...SPIN_ICE_MODEL_FIELDS,
    parallelTempering: { type: 'boolean', default: true, doc: 'Replica exchange between neighbouring temperatures.' },
    snapshots: { type: 'integer', min: 0, max: 200, default: 20, doc: 'Configurations kept per temperature (for [structure-factor]).' },
    reweightTemperatures: { type: 'range', unit: 'K', min: 0, doc: 'Temperatures for Ferrenberg–Swendsen reweighted C(T) and E(T) between the simulated ones.' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  async run(input, ctx) {
    let model: SpinIceModel = modelFromInput(input, ctx);
    if (input.from) {
      const fitted = ctx.result<{ model: SpinIceMcCellResult['model'] }>(input.from).model;
      // A field written in this cell overrides the fitted model; absent fields take the fitted values.
      const given = (key: string) => new RegExp(`^${key}\\s*:`, 'm').test(ctx.source);
      model = {
        ...model,
        L: given('L') ? model.L : fitted.L,
        latticeConstantAngstrom: given('latticeConstant') ? model.latticeConstantAngstrom : fitted.latticeConstantAngstrom,
        momentMuB: given('moment') ? model.momentMuB : fitted.momentMuB,
        dipolar: given('dipolar') ? model.dipolar : fitted.dipolar,
        exchangeK: Object.fromEntries(['J1', 'J2', 'J3a', 'J3b'].map((k) => [k, given(k) ? (model.exchangeK ?? {})[k as 'J1'] ?? 0 : fitted.exchangeK[k] ?? 0])),
      };
    }
    if (new Set(input.temperatures).size !== input.temperatures.length || input.temperatures.some((t) => !(t > 0))) {
      ctx.fail('temperatures', input.temperatures, 'distinct positive temperatures');
    }
    const snapshotEvery = input.snapshots > 0 ? Math.max(1, Math.floor(input.sweeps / input.snapshots)) : 0;
    const { result, data } = await runSpinIceJob(
      {
        model,
        temperaturesK: input.temperatures,
        sweeps: input.sweeps,
        thermalizationSweeps: input.thermalizationSweeps,
        loopMovesPerSweep: input.loopMovesPerSweep,
        parallelTempering: input.parallelTempering,
        snapshotEvery,
        seed: ctx.seed,
      },
      ctx,
    );
    let reweighted: SpinIceMcCellResult['reweighted'] = null;
    if (input.reweightTemperatures) {
      const mh = multiHistogramReweighting(data.series.energyK, data.temperaturesK);
      const rw = reweightedHeatCapacity(mh, input.reweightTemperatures, data.numberOfSites);
      reweighted = { ...rw, converged: mh.converged };
    }
    return {
      model: {
        L: model.L,
        latticeConstantAngstrom: model.latticeConstantAngstrom,
        momentMuB: model.momentMuB,
        exchangeK: { J1: 0, J2: 0, J3a: 0, J3b: 0, ...(model.exchangeK as Record<string, number>) },
        dipolar: model.dipolar,
        fieldTesla: [...(model.fieldTesla ?? [0, 0, 0])],
      },
      numberOfSpins: data.numberOfSites,
      dipolarDK: data.dipolarDK,
      temperaturesK: result.temperaturesK,
      energyKPerSpin: result.energyKPerSpin,
      heatCapacityJPerMolK: result.heatCapacityJPerMolK,
      heatCapacityErrorJPerMolK: result.heatCapacityErrorJPerMolK,
      entropyJPerMolK: result.entropyJPerMolK,
      magnetizationMuBPerSpin: result.magnetizationMuBPerSpin,
      magnetizationErrorMuBPerSpin: result.magnetizationErrorMuBPerSpin,
      orderParameter001: result.orderParameter001,
      acceptance: result.acceptance,
      reweighted,
      snapshots: data.snapshots.map((list) => list.map(encodeSpins)),
      rLn2JPerMolK: GAS_CONSTANT_J_PER_MOL_K * Math.log(2),
    };
  },
  render(r, info) {
    const columns = [
      { name: 'T', unit: 'K' }, { name: 'E', unit: 'K/spin' }, { name: 'C', unit: 'J/(mol K)' }, { name: 'σC', unit: 'J/(mol K)' },
      { name: 'S', unit: 'J/(mol K)' }, { name: 'M', unit: 'μB/spin' }, { name: 'ψ(001)', unit: '' },
    ];
    const rows = r.temperaturesK.map((t, k) => [t, r.energyKPerSpin[k], r.heatCapacityJPerMolK[k], r.heatCapacityErrorJPerMolK[k], r.entropyJPerMolK[k], r.magnetizationMuBPerSpin[k], r.orderParameter001[k]]);
    const values = r.temperaturesK.flatMap((t, k) => [
      { T: t, quantity: 'C (J/mol K)', value: r.heatCapacityJPerMolK[k], lo: r.heatCapacityJPerMolK[k] - r.heatCapacityErrorJPerMolK[k], hi: r.heatCapacityJPerMolK[k] + r.heatCapacityErrorJPerMolK[k] },
      { T: t, quantity: 'S (J/mol K)', value: r.entropyJPerMolK[k], lo: r.entropyJPerMolK[k], hi: r.entropyJPerMolK[k] },
    ]);
    const rw = (r.reweighted?.temperaturesK ?? []).map((t, k) => ({ T: t, quantity: 'C (J/mol K)', value: r.reweighted!.heatCapacityJPerMolK[k] }));
    const x = { field: 'T', type: 'quantitative', title: 'T (K)', scale: { type: 'log' } };
    return {
      text: `${info.name}: spin-ice Monte Carlo, N = ${r.numberOfSpins} spins, ${r.temperaturesK.length} temperatures${r.model.dipolar ? `, dipolar D = ${formatNumber(r.dipolarDK)} K` : ''}\n${textTable(columns, rows, 6)}`,
      html: htmlTable(info.name, columns, rows),
      vegaLite: {
        $schema: VEGA_LITE_SCHEMA,
        facet: { row: { field: 'quantity', type: 'nominal', title: null } },
        data: { values: [...values, ...rw.map((v) => ({ ...v, reweighted: true }))] },
        spec: {
          layer: [
            { transform: [{ filter: 'datum.reweighted' }], mark: 'line', encoding: { x, y: { field: 'value', type: 'quantitative', title: null } } },
            { transform: [{ filter: '!datum.reweighted' }], mark: 'point', encoding: { x, y: { field: 'value', type: 'quantitative', title: null } } },
            { transform: [{ filter: '!datum.reweighted' }], mark: 'rule', encoding: { x, y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' } } },
          ],
        },
        resolve: { scale: { y: 'independent' } },
      },
    };
  },
});
