/**
 * `[mc-fit] name` — fit J1, J2, J3a, J3b (and D if asked) of the spin-ice model to a measured magnetic heat
 * capacity with the Monte Carlo as the model: each iteration is one parallel-tempering run (off the kernel
 * thread), Levenberg–Marquardt moves the couplings with C(T) from Ferrenberg–Swendsen reweighting in temperature
 * and couplings; reports χ², the parameter uncertainties and the fitted model, which a later `[spin-ice-mc]`
 * cell takes with `from: <name>`; from @multiplet/physics/montecarlo (fitHeatCapacityAsync).
 *
 *   [mc-fit] fitA
 *   data: cmag                 # T (K), C (J/mol/K) per mole of magnetic ions, optional σ
 *   free: [J2, J3a]
 *   J1: 3.72 K
 *   dipolar: true
 *   L: 2
 *   sweeps: 3000
 */
import { fitHeatCapacityAsync, type FitParameter } from '@multiplet/physics/montecarlo/fitHeatCapacity';
import { defineKind } from './types';
import { formatNumber, htmlTable, textTable } from '../render/format';
import { VEGA_LITE_SCHEMA, dataColumn } from './thermoShared';
import { SPIN_ICE_MODEL_FIELDS, modelFromInput, runSpinIceJob, type SpinIceModelInput } from './spinIceShared';
import type { SpinIceMcCellResult } from './spinIceMc';

interface McFitInput extends SpinIceModelInput {
  data: string;
  temperatureColumn?: string;
  heatCapacityColumn?: string;
  errorColumn?: string;
  perFormulaUnit: boolean;
  range?: number[];
  free: string[];
  simulationTemperatures?: number[];
  maxSimulations: number;
  trust?: number;
}

export interface McFitCellResult {
  parametersK: Record<string, number>;
  /** 1σ: data errors and the model's Monte Carlo noise together. */
  uncertaintiesK: Record<string, number>;
  uncertaintiesDataOnlyK: Record<string, number>;
  uncertaintiesModelNoiseK: Record<string, number>;
  chiSquare: number;
  reducedChiSquare: number;
  degreesOfFreedom: number;
  converged: boolean;
  history: { parametersK: Record<string, number>; chiSquare: number }[];
  temperaturesK: number[];
  dataJPerMolK: number[];
  errorJPerMolK: number[];
  modelJPerMolK: number[];
  model: SpinIceMcCellResult['model'];
}

const FREE = ['J1', 'J2', 'J3a', 'J3b', 'D'];

export const mcFitKind = defineKind<McFitInput, McFitCellResult>({
  kind: 'mc-fit',
  summary: 'fit J1/J2/J3a/J3b (and D) of the spin-ice model to magnetic C(T) with Monte Carlo + reweighting; χ², uncertainties, fitted model',
  fields: {
    data: { type: 'reference', kinds: ['data', 'heat-capacity-reduction'], required: true, doc: 'Magnetic heat capacity: a data set (T, C, optional σ columns) or a [heat-capacity-reduction] result.' },
    temperatureColumn: { type: 'string', doc: 'Temperature column of a data set (default: the first).' },
    heatCapacityColumn: { type: 'string', doc: 'Heat-capacity column (J/(mol K); default: the second).' },
    errorColumn: { type: 'string', doc: 'Uncertainty column (default: the third if present, else 3 % of C + 0.01 J/(mol K)).' },
    perFormulaUnit: { type: 'boolean', default: false, doc: 'Data per mole of formula units: divided by the sample’s ions per formula unit (the model is per mole of ions).' },
    range: { type: 'list', of: { type: 'quantity', unit: 'K', min: 0, doc: 'Temperature.' }, minItems: 2, maxItems: 2, doc: 'Fit range [T_min, T_max] (default: all points).' },
    free: { type: 'list', of: { type: 'choice', values: FREE, doc: 'A fitted parameter.' }, minItems: 1, required: true, doc: 'Parameters to fit: J1, J2, J3a, J3b, D.' },
    ...SPIN_ICE_MODEL_FIELDS,
    simulationTemperatures: { type: 'range', unit: 'K', min: 0, doc: 'Simulated temperatures (default: 16 log-spaced from 0.8 × to 1.25 × the data range).' },
    maxSimulations: { type: 'integer', min: 1, max: 20, default: 4, doc: 'At most this many Monte Carlo runs (one per iteration).' },
    trust: { type: 'quantity', unit: 'K', min: 0, doc: 'Half-width of the box the couplings may move per iteration (default max(0.3 K, 30 %)).' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  async run(input, ctx) {
    let T: number[];
    let C: number[];
    let S: number[] | undefined;
    if (ctx.resultKind(input.data) === 'heat-capacity-reduction') {
      const red = ctx.result<{ temperaturesK: number[]; magneticJPerMolIonK: number[] }>(input.data);
      T = [...red.temperaturesK];
      C = [...red.magneticJPerMolIonK];
    } else {
      T = dataColumn(ctx, input.data, input.temperatureColumn, 0, 'temperatureColumn', 'K');
      C = dataColumn(ctx, input.data, input.heatCapacityColumn, 1, 'heatCapacityColumn', 'J/(mol K)');
      const hasError = input.errorColumn !== undefined || ctx.result<{ columns: unknown[] }>(input.data).columns.length > 2;
      S = hasError ? dataColumn(ctx, input.data, input.errorColumn, 2, 'errorColumn', 'J/(mol K)') : undefined;
      if (input.perFormulaUnit) {
        const k = 1 / (ctx.sampleIfDefined()?.ionsPerFormulaUnit ?? 1);
        C = C.map((v) => v * k);
        S = S?.map((v) => v * k);
      }
    }
    let err = S ?? C.map((v) => 0.03 * Math.abs(v) + 0.01);
    if (input.range) {
      const [lo, hi] = input.range;
      const keep = T.map((t) => t >= lo && t <= hi);
      T = T.filter((_, k) => keep[k]);
      C = C.filter((_, k) => keep[k]);
      err = err.filter((_, k) => keep[k]);
    }
    if (T.length <= input.free.length) ctx.fail('range', input.range ?? null, `more data points than free parameters (${input.free.length})`);
    if (err.some((e) => !(e > 0))) ctx.fail('errorColumn', input.errorColumn ?? 'column 3', 'positive uncertainties');
    if (input.free.includes('D') && !input.dipolar) ctx.fail('free', input.free, 'D only with dipolar: true');
    const model = modelFromInput(input, ctx);
    const fit = await fitHeatCapacityAsync(
      {
        model,
        data: { temperaturesK: T, heatCapacityJPerMolK: C, errorJPerMolK: err },
        parameters: input.free as FitParameter[],
        simulationTemperaturesK: input.simulationTemperatures,
        sweeps: input.sweeps,
        seed: ctx.seed,
        maxSimulations: input.maxSimulations,
        trustK: input.trust,
        loopMovesPerSweep: input.loopMovesPerSweep,
      },
      async (runOptions, iteration) => (await runSpinIceJob({ ...runOptions, thermalizationSweeps: input.thermalizationSweeps }, ctx, iteration < input.maxSimulations ? `simulation ${iteration + 1}/${input.maxSimulations}: ` : `noise replicate ${iteration + 1 - input.maxSimulations}: `)).data,
    );
    const m = fit.model;
    return {
      parametersK: fit.parametersK as Record<string, number>,
      uncertaintiesK: fit.uncertaintiesK as Record<string, number>,
      uncertaintiesDataOnlyK: fit.uncertaintiesDataOnlyK as Record<string, number>,
      uncertaintiesModelNoiseK: fit.uncertaintiesModelNoiseK as Record<string, number>,
      chiSquare: fit.chiSquare,
      reducedChiSquare: fit.reducedChiSquare,
      degreesOfFreedom: fit.degreesOfFreedom,
      converged: fit.converged,
      history: fit.history.map((h) => ({ parametersK: h.parametersK as Record<string, number>, chiSquare: h.chiSquare })),
      temperaturesK: T,
      dataJPerMolK: C,
      errorJPerMolK: err,
      modelJPerMolK: fit.modelHeatCapacityJPerMolK,
      model: {
        L: m.L,
        latticeConstantAngstrom: m.latticeConstantAngstrom,
        momentMuB: m.momentMuB,
        exchangeK: { J1: 0, J2: 0, J3a: 0, J3b: 0, ...(m.exchangeK as Record<string, number>) },
        dipolar: m.dipolar,
        fieldTesla: [...(m.fieldTesla ?? [0, 0, 0])],
      },
    };
  },
  render(r, info) {
    const columns = [{ name: 'parameter', unit: '' }, { name: 'value', unit: 'K' }, { name: 'σ', unit: 'K' }, { name: 'σ data', unit: 'K' }, { name: 'σ MC', unit: 'K' }];
    const rows = Object.keys(r.parametersK).map((k) => [k, r.parametersK[k], r.uncertaintiesK[k], r.uncertaintiesDataOnlyK[k], r.uncertaintiesModelNoiseK[k]]);
    const values = r.temperaturesK.flatMap((t, k) => [
      { T: t, C: r.dataJPerMolK[k], lo: r.dataJPerMolK[k] - r.errorJPerMolK[k], hi: r.dataJPerMolK[k] + r.errorJPerMolK[k], what: 'data' },
      { T: t, C: r.modelJPerMolK[k], what: 'Monte Carlo (reweighted)' },
    ]);
    const x = { field: 'T', type: 'quantitative', title: 'T (K)', scale: { type: 'log' } };
    return {
      text: `${info.name}: χ² = ${formatNumber(r.chiSquare, 4)} (${r.degreesOfFreedom} dof, reduced ${formatNumber(r.reducedChiSquare, 3)}), ${r.converged ? 'converged' : 'not converged: raise maxSimulations'}\n${textTable(columns, rows)}`,
      html: htmlTable(`${info.name} (χ²_red = ${formatNumber(r.reducedChiSquare, 3)})`, columns, rows),
      vegaLite: {
        $schema: VEGA_LITE_SCHEMA,
        data: { values },
        layer: [
          { transform: [{ filter: "datum.what === 'data'" }], mark: 'point', encoding: { x, y: { field: 'C', type: 'quantitative', title: 'C (J/mol K)' } } },
          { transform: [{ filter: "datum.what === 'data'" }], mark: 'rule', encoding: { x, y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' } } },
          { transform: [{ filter: "datum.what !== 'data'" }], mark: 'line', encoding: { x, y: { field: 'C', type: 'quantitative' } } },
        ],
      },
    };
  },
});
