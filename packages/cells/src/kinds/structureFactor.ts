/**
 * `[structure-factor] name` — magnetic diffuse neutron scattering of a `spin-ice-mc` run in absolute units
 * (barn/sr per magnetic ion): the Blech–Averbach powder average at every simulated temperature, the difference
 * I(T) − I(T_ref) that experiments report, optionally a single-crystal (h h l) map with the perpendicular
 * projection, and measured data put on the same scale from the paramagnetic scattering; from
 * @multiplet/physics/scattering.
 *
 *   [structure-factor] sqA
 *   run: mcA
 *   Q: 0.2 angstrom^-1 .. 3 angstrom^-1 / 120
 *   ion: Ho3+
 *   paramagnet: hot          # data at high T (Q, I, σ) → absolute scale
 *   data: cold               # data at dataTemperature, shown in barn/sr per ion with the model
 *   dataTemperature: 0.3 K
 */
import { pyrochloreSupercell } from '@multiplet/physics/lattice/supercell';
import { pairTable, pairCorrelationShells } from '@multiplet/physics/scattering/pairCorrelationShells';
import { powderIntensity } from '@multiplet/physics/scattering/powderIntensity';
import { singleCrystalIntensity, hhlPlaneWavevectors } from '@multiplet/physics/scattering/singleCrystalIntensity';
import { normalizeToParamagnet } from '@multiplet/physics/scattering/normalizeToParamagnet';
import { magneticFormFactor } from '@multiplet/physics/neutron';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';
import { defineKind, type DatasetResult } from './types';
import { formatNumber, htmlTable, textTable } from '../render/format';
import { VEGA_LITE_SCHEMA, dataColumn } from './thermoShared';
import { decodeSpins } from './spinIceShared';
import type { SpinIceMcCellResult } from './spinIceMc';

interface StructureFactorInput {
  run: string;
  Q: number[];
  ion?: string;
  referenceTemperature?: number;
  plane: boolean;
  planeTemperature?: number;
  planeRange: number;
  planePoints: number;
  paramagnet?: string;
  data?: string;
  dataTemperature?: number;
}

export interface StructureFactorCellResult {
  QInvAngstrom: number[];
  temperaturesK: number[];
  ion: string | null;
  momentMuB: number;
  referenceTemperatureK: number;
  intensityBarnPerSrPerIon: number[][];
  differenceBarnPerSrPerIon: number[][];
  paramagnetBarnPerSrPerIon: number[];
  plane: { h: number[]; l: number[]; temperatureK: number; intensityBarnPerSrPerIon: number[][] } | null;
  normalization: {
    scaleBarnPerSrPerIonPerUnit: number;
    scaleError: number;
    reducedChiSquare: number;
    data: { QInvAngstrom: number[]; intensityBarnPerSrPerIon: number[]; errorBarnPerSrPerIon: number[] | null; temperatureK: number | null } | null;
  } | null;
}

function nearest(list: number[], t: number): number {
  let best = 0;
  list.forEach((v, k) => {
    if (Math.abs(v - t) < Math.abs(list[best] - t)) best = k;
  });
  return best;
}

export const structureFactorKind = defineKind<StructureFactorInput, StructureFactorCellResult>({
  kind: 'structure-factor',
  summary: 'powder (Blech–Averbach) and (hhl) magnetic diffuse scattering of a spin-ice MC run in barn/sr per ion; I(T) − I(T_ref); data normalised from the paramagnet',
  fields: {
    run: { type: 'reference', kinds: ['spin-ice-mc'], required: true, doc: 'The [spin-ice-mc] result (its snapshots, moment and lattice).' },
    Q: { type: 'range', unit: 'angstrom^-1', min: 0, required: true, doc: 'Momentum transfers |Q|, e.g. "0.2 angstrom^-1 .. 3 angstrom^-1 / 120".' },
    ion: { type: 'string', doc: 'Ion for the dipole form factor (default: the sample’s ion; "none" for f = 1).' },
    referenceTemperature: { type: 'quantity', unit: 'K', min: 0, doc: 'T_ref of the difference I(T) − I(T_ref) (default: the highest simulated; the nearest simulated one is used).' },
    plane: { type: 'boolean', default: false, doc: 'Also compute the single-crystal (h h l) map.' },
    planeTemperature: { type: 'quantity', unit: 'K', min: 0, doc: 'Temperature of the (h h l) map (default: the lowest simulated).' },
    planeRange: { type: 'number', min: 0, default: 3, doc: 'The map covers h, l in [−range, range] (r.l.u.).' },
    planePoints: { type: 'integer', min: 2, max: 201, default: 41, doc: 'Points along h and along l.' },
    paramagnet: { type: 'reference', kinds: ['data'], doc: 'Powder data at high temperature: columns Q (angstrom^-1), intensity (no unit or any), optional σ; sets the absolute scale.' },
    data: { type: 'reference', kinds: ['data'], doc: 'Powder data to show on the absolute scale: Q, I, optional σ (needs paramagnet).' },
    dataTemperature: { type: 'quantity', unit: 'K', min: 0, doc: 'Temperature of `data` (the model curve at the nearest simulated temperature is plotted with it).' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  check(input, ctx) {
    if (input.data !== undefined && input.paramagnet === undefined) ctx.fail('data', input.data, 'a paramagnet data set as well, for the absolute scale');
  },
  async run(input, ctx) {
    const run = ctx.result<SpinIceMcCellResult>(input.run);
    const N = run.numberOfSpins;
    if (run.snapshots.some((s) => s.length === 0)) ctx.fail('run', input.run, 'a spin-ice-mc result with snapshots at every temperature (snapshots > 0)');
    const ionName = input.ion ?? ctx.sampleIfDefined()?.ion;
    const useIon = ionName !== undefined && ionName !== 'none';
    let formFactor = (_q: number) => 1;
    if (useIon) {
      try {
        magneticFormFactor(ionName!, 1);
      } catch {
        ctx.fail('ion', ionName, 'a rare-earth ion with a tabulated form factor (e.g. "Ho3+"), or "none"');
      }
      formFactor = (q: number) => magneticFormFactor(ionName!, q);
    }
    const cell = pyrochloreSupercell(run.model.L, run.model.latticeConstantAngstrom);
    const table = pairTable(cell);
    const mu = run.model.momentMuB;
    const Q = input.Q;
    if (Q.some((q) => !(q > 0))) ctx.fail('Q', Q, 'positive momentum transfers');
    const intensity: number[][] = [];
    for (const list of run.snapshots) {
      await ctx.yieldNow();
      const configs = list.map((s) => decodeSpins(s, N));
      intensity.push(powderIntensity(pairCorrelationShells(table, configs), Q, mu, formFactor));
    }
    const temps = run.temperaturesK;
    const refIndex = input.referenceTemperature === undefined ? temps.indexOf(Math.max(...temps)) : nearest(temps, input.referenceTemperature);
    const paramagnet = Q.map((q) => (2 / 3) * (MAGNETIC_PREFACTOR_MB / 1000) * mu * mu * formFactor(q) ** 2);
    let plane: StructureFactorCellResult['plane'] = null;
    if (input.plane) {
      const k = input.planeTemperature === undefined ? temps.indexOf(Math.min(...temps)) : nearest(temps, input.planeTemperature);
      const grid = hhlPlaneWavevectors(run.model.latticeConstantAngstrom, input.planeRange, input.planeRange, input.planePoints);
      const configs = run.snapshots[k].map((s) => decodeSpins(s, N));
      const values = singleCrystalIntensity(cell, configs, grid.q, mu, formFactor);
      const rows: number[][] = [];
      for (let a = 0; a < grid.h.length; a++) rows.push(Array.from(values.subarray(a * grid.l.length, (a + 1) * grid.l.length)));
      plane = { h: grid.h, l: grid.l, temperatureK: temps[k], intensityBarnPerSrPerIon: rows };
    }
    let normalization: StructureFactorCellResult['normalization'] = null;
    if (input.paramagnet) {
      const read = (name: string, field: string) => {
        const q = dataColumn(ctx, name, undefined, 0, field, 'angstrom^-1');
        const d = ctx.result<DatasetResult>(name);
        const y = d.columns[1]?.values;
        if (!y) ctx.fail(field, name, 'a data set with Q and intensity columns (and optionally σ)');
        return { q, y: [...y], s: d.columns[2] ? [...d.columns[2].values] : undefined };
      };
      const hot = read(input.paramagnet, 'paramagnet');
      const norm = normalizeToParamagnet(hot.q, hot.y, hot.s, mu, formFactor);
      let data: NonNullable<StructureFactorCellResult['normalization']>['data'] = null;
      if (input.data) {
        const cold = read(input.data, 'data');
        data = {
          QInvAngstrom: cold.q,
          intensityBarnPerSrPerIon: cold.y.map((v) => v * norm.scaleBarnPerSrPerIonPerUnit),
          errorBarnPerSrPerIon: cold.s ? cold.s.map((v) => v * norm.scaleBarnPerSrPerIonPerUnit) : null,
          temperatureK: input.dataTemperature ?? null,
        };
      }
      normalization = { scaleBarnPerSrPerIonPerUnit: norm.scaleBarnPerSrPerIonPerUnit, scaleError: norm.scaleError, reducedChiSquare: norm.reducedChiSquare, data };
    }
    return {
      QInvAngstrom: [...Q],
      temperaturesK: [...temps],
      ion: useIon ? ionName! : null,
      momentMuB: mu,
      referenceTemperatureK: temps[refIndex],
      intensityBarnPerSrPerIon: intensity,
      differenceBarnPerSrPerIon: intensity.map((row) => row.map((v, k) => v - intensity[refIndex][k])),
      paramagnetBarnPerSrPerIon: paramagnet,
      plane,
      normalization,
    };
  },
  render(r, info) {
    const columns = [{ name: 'Q', unit: 'Å⁻¹' }, ...r.temperaturesK.map((t) => ({ name: `I(${formatNumber(t, 3)} K)`, unit: 'b/sr/ion' }))];
    const rows = r.QInvAngstrom.map((q, k) => [q, ...r.intensityBarnPerSrPerIon.map((row) => row[k])]);
    const curves = r.temperaturesK.flatMap((t, m) =>
      r.QInvAngstrom.map((q, k) => ({ Q: q, T: `${formatNumber(t, 3)} K`, I: r.intensityBarnPerSrPerIon[m][k], dI: r.differenceBarnPerSrPerIon[m][k] })),
    );
    const points = r.normalization?.data
      ? r.normalization.data.QInvAngstrom.map((q, k) => ({ Q: q, I: r.normalization!.data!.intensityBarnPerSrPerIon[k] }))
      : [];
    const x = { field: 'Q', type: 'quantitative', title: 'Q (Å⁻¹)' };
    const panels: Record<string, unknown>[] = [
      {
        title: 'I(Q) (barn/sr per ion)',
        layer: [
          { data: { values: curves }, mark: 'line', encoding: { x, y: { field: 'I', type: 'quantitative', title: 'I (b/sr/ion)' }, color: { field: 'T', type: 'nominal' } } },
          ...(points.length ? [{ data: { values: points }, mark: 'point', encoding: { x, y: { field: 'I', type: 'quantitative' } } }] : []),
        ],
      },
      {
        title: `I(T) − I(${formatNumber(r.referenceTemperatureK, 3)} K)`,
        data: { values: curves },
        mark: 'line',
        encoding: { x, y: { field: 'dI', type: 'quantitative', title: 'ΔI (b/sr/ion)' }, color: { field: 'T', type: 'nominal' } },
      },
    ];
    if (r.plane) {
      const cellsValues = r.plane.h.flatMap((h, a) => r.plane!.l.map((l, b) => ({ h, l, I: r.plane!.intensityBarnPerSrPerIon[a][b] })));
      panels.push({
        title: `(h h l) at ${formatNumber(r.plane.temperatureK, 3)} K (b/sr/ion)`,
        data: { values: cellsValues },
        mark: 'rect',
        encoding: {
          x: { field: 'h', type: 'quantitative', bin: { maxbins: r.plane.h.length }, title: '(h h 0)' },
          y: { field: 'l', type: 'quantitative', bin: { maxbins: r.plane.l.length }, title: '(0 0 l)' },
          color: { field: 'I', type: 'quantitative', aggregate: 'mean' },
        },
      });
    }
    const norm = r.normalization ? `\nabsolute scale from the paramagnet: ${formatNumber(r.normalization.scaleBarnPerSrPerIonPerUnit)} b/sr/ion per data unit (±${formatNumber(r.normalization.scaleError)}), χ²_red ${formatNumber(r.normalization.reducedChiSquare, 3)}` : '';
    return {
      text: `${info.name}: powder magnetic diffuse scattering, barn/sr per ion${r.ion ? ` (form factor ${r.ion})` : ''}${norm}\n${textTable(columns, rows, 12)}`,
      html: htmlTable(info.name, columns, rows),
      vegaLite: { $schema: VEGA_LITE_SCHEMA, vconcat: panels },
    };
  },
});
