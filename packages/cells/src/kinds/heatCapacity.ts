/**
 * `[heat-capacity] name` — the crystal-field (Schottky) heat capacity and entropy predicted by a crystal-field
 * result, per mole of ions and per formula unit (@multiplet/physics/thermo cefHeatCapacity).
 *
 *   [heat-capacity] cA
 *   cef: cefA
 *   temperatures: 0.5 K .. 300 K / 80 log
 */
import { cefHeatCapacity, R_LN2_J_PER_MOL_K } from '@multiplet/physics/thermo';
import { defineKind } from './types';
import { escapeHtml, formatNumber, htmlTable, textTable } from '../render/format';
import { ionOfCef, VEGA_LITE_SCHEMA } from './thermoShared';

interface HeatCapacityInput {
  cef: string;
  temperatures: number[];
  field?: number[];
}

export interface HeatCapacityCellResult {
  ion: string;
  ionsPerFormulaUnit: number;
  temperaturesK: number[];
  levelsMeV: number[];
  heatCapacityJPerMolK: number[];
  entropyJPerMolK: number[];
  totalEntropyJPerMolK: number[];
  heatCapacityJPerMolFormulaUnitK: number[];
  entropyJPerMolFormulaUnitK: number[];
  rLn2JPerMolK: number;
}

export const heatCapacityKind = defineKind<HeatCapacityInput, HeatCapacityCellResult>({
  kind: 'heat-capacity',
  summary: 'CEF Schottky heat capacity C(T) and entropy S(T) in J/(mol K) per mole of ions and per formula unit',
  fields: {
    cef: { type: 'reference', kinds: ['crystal-field'], required: true, doc: 'The crystal-field result.' },
    temperatures: { type: 'range', unit: 'K', min: 0, required: true, doc: 'Temperatures (> 0), e.g. "0.5 K .. 300 K / 80 log".' },
    field: { type: 'list', of: { type: 'number', doc: 'Component in tesla, local (CEF) frame.' }, minItems: 3, maxItems: 3, doc: 'Applied field [Bx, By, Bz] in T in the local frame (default none).' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  run(input, ctx) {
    const { ion, single } = ionOfCef(ctx, input.cef);
    const ions = ctx.sampleIfDefined()?.ionsPerFormulaUnit ?? 1;
    const r = cefHeatCapacity(single, { temperaturesK: input.temperatures, fieldTesla: input.field as [number, number, number] | undefined, ionsPerFormulaUnit: ions });
    return {
      ion,
      ionsPerFormulaUnit: ions,
      temperaturesK: [...input.temperatures],
      levelsMeV: Array.from(r.levelsMeV),
      heatCapacityJPerMolK: Array.from(r.heatCapacityJPerMolK),
      entropyJPerMolK: Array.from(r.entropyJPerMolK),
      totalEntropyJPerMolK: Array.from(r.totalEntropyJPerMolK),
      heatCapacityJPerMolFormulaUnitK: Array.from(r.heatCapacityJPerMolFormulaUnitK),
      entropyJPerMolFormulaUnitK: Array.from(r.entropyJPerMolFormulaUnitK),
      rLn2JPerMolK: R_LN2_J_PER_MOL_K,
    };
  },
  render(r, info) {
    const columns = [{ name: 'T', unit: 'K' }, { name: 'C', unit: 'J/(mol K) ion' }, { name: 'S − S(0)', unit: 'J/(mol K) ion' }, { name: 'C', unit: 'J/(mol K) f.u.' }];
    const rows = r.temperaturesK.map((t, i) => [t, r.heatCapacityJPerMolK[i]!, r.entropyJPerMolK[i]!, r.heatCapacityJPerMolFormulaUnitK[i]!]);
    const head = `CEF heat capacity ${info.name}: ${r.ion}, levels ${r.levelsMeV.map((e) => formatNumber(e, 4)).join(', ')} meV`;
    const values = r.temperaturesK.flatMap((t, i) => [
      { temperatureK: t, value: r.heatCapacityJPerMolK[i], quantity: 'C (J/(mol K))' },
      { temperatureK: t, value: r.entropyJPerMolK[i], quantity: 'S − S(0) (J/(mol K))' },
    ]);
    return {
      text: `${head}\n${textTable(columns, rows, 20)}`,
      html: `<div class="multiplet-heat-capacity"><p>${escapeHtml(head)}</p>${htmlTable('Schottky heat capacity and entropy per ion', columns, rows)}</div>`,
      vegaLite: {
        $schema: VEGA_LITE_SCHEMA,
        description: head,
        width: 420,
        height: 260,
        layer: [
          {
            data: { values },
            mark: 'line',
            encoding: {
              x: { field: 'temperatureK', type: 'quantitative', scale: { type: 'log' }, title: 'T (K)' },
              y: { field: 'value', type: 'quantitative', title: 'C, S per mole of ions (J/(mol K))' },
              color: { field: 'quantity', type: 'nominal', title: '' },
            },
          },
          { data: { values: [{ y: r.rLn2JPerMolK, label: 'R ln 2' }] }, mark: { type: 'rule', strokeDash: [4, 4] }, encoding: { y: { field: 'y', type: 'quantitative' } } },
        ],
      },
    };
  },
});
