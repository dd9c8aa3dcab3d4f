/**
 * `[magnetization] name` — M(B, T) in μB per rare-earth ion from a crystal-field result, along a direction of the
 * crystal or powder-averaged (Lebedev–Laikov), for one site frame or the four ⟨111⟩ pyrochlore frames
 * (@multiplet/physics/thermo magnetization).
 *
 *   [magnetization] mPowder
 *   cef: cefA
 *   temperatures: [2 K, 5 K, 20 K]
 *   fields: 0 T .. 7 T / 36
 *   sites: pyrochlore
 */
import { magnetization } from '@multiplet/physics/thermo';
import { defineKind } from './types';
import { escapeHtml, formatNumber, htmlTable, textTable } from '../render/format';
import { ionOfCef, VEGA_LITE_SCHEMA } from './thermoShared';

interface MagnetizationInput {
  cef: string;
  temperatures: number[];
  fields: number[];
  direction?: number[];
  sites: 'single' | 'pyrochlore';
  powderDegree?: number;
  powderTolerance: number;
  meanField: number;
  demagnetizationFactor: number;
  molarVolume?: number;
}

export interface MagnetizationCellResult {
  ion: string;
  direction: number[] | 'powder';
  sites: string;
  temperaturesK: number[];
  fieldsT: number[];
  /** μB per ion: one array per temperature, one value per field. */
  magnetizationMuB: number[][];
  powder: { grid: string; degree: number; directionsComputed: number; symmetryOperations: number; relativeChange: number; converged: boolean } | null;
  diagonalisations: number;
}

export const magnetizationKind = defineKind<MagnetizationInput, MagnetizationCellResult>({
  kind: 'magnetization',
  summary: 'M(B, T) in μB per ion from a crystal field: along a direction or powder (Lebedev–Laikov), single site or pyrochlore ⟨111⟩ frames',
  fields: {
    cef: { type: 'reference', kinds: ['crystal-field'], required: true, doc: 'The crystal-field result (ion and Stevens parameters in the local frame).' },
    temperatures: { type: 'range', unit: 'K', min: 0, required: true, doc: 'Temperatures (> 0), e.g. "[2 K, 5 K]" or "2 K .. 20 K / 4".' },
    fields: { type: 'range', unit: 'T', required: true, doc: 'Applied fields μ0H, e.g. "0 T .. 7 T / 36".' },
    direction: {
      type: 'list', of: { type: 'number', doc: 'Component in the crystal (global) frame.' }, minItems: 3, maxItems: 3,
      doc: 'Field direction [x, y, z] in the crystal frame; leave out for a powder average.',
    },
    sites: { type: 'choice', values: ['single', 'pyrochlore'], default: 'single', doc: 'Site frames: one site (local = crystal frame) or the four ⟨111⟩ frames of the pyrochlore lattice.' },
    powderDegree: { type: 'integer', min: 3, max: 131, doc: 'Powder: a fixed Lebedev–Laikov degree (3 … 131) instead of the tolerance search.' },
    powderTolerance: { type: 'number', min: 1e-12, default: 1e-4, doc: 'Powder: relative tolerance reached by successive Lebedev–Laikov degrees.' },
    meanField: { type: 'number', default: 0, doc: 'Molecular-field constant λ in mol/emu per mole of ions (B_eff = B + λM; negative: antiferromagnetic).' },
    demagnetizationFactor: { type: 'number', min: 0, max: 1, default: 0, doc: 'SI demagnetising factor N of the sample shape (needs molarVolume).' },
    molarVolume: { type: 'quantity', unit: 'cm^3/mol', min: 0, doc: 'Molar volume per mole of rare-earth ions, for the demagnetising correction.' },
  },
  reads: ['references'],
  writes: 'result',
  check(input, ctx) {
    if (input.demagnetizationFactor > 0 && input.molarVolume === undefined) ctx.fail('molarVolume', undefined, 'a molar volume (cm^3/mol) when demagnetizationFactor > 0');
    if (input.direction !== undefined && input.powderDegree !== undefined) ctx.fail('powderDegree', input.powderDegree, 'no powder degree with a direction');
  },
  run(input, ctx) {
    const { ion, single } = ionOfCef(ctx, input.cef);
    const direction = input.direction ? (input.direction as [number, number, number]) : 'powder';
    const r = magnetization(single, {
      temperaturesK: input.temperatures,
      fieldsT: input.fields,
      direction,
      sites: input.sites,
      powder: direction === 'powder' ? (input.powderDegree !== undefined ? { degree: input.powderDegree } : { tolerance: input.powderTolerance }) : undefined,
      meanFieldMolPerEmu: input.meanField,
      demagnetization: input.demagnetizationFactor > 0 ? { factor: input.demagnetizationFactor, molarVolumeCm3PerMol: input.molarVolume! } : undefined,
      task: ctx.task,
    });
    return {
      ion,
      direction: direction === 'powder' ? 'powder' : [...direction],
      sites: input.sites,
      temperaturesK: [...input.temperatures],
      fieldsT: [...input.fields],
      magnetizationMuB: r.magnetizationMuB.map((row) => Array.from(row)),
      powder: r.powder ?? null,
      diagonalisations: r.diagonalisations,
    };
  },
  render(r, info) {
    const columns = [{ name: 'B', unit: 'T' }, ...r.temperaturesK.map((t) => ({ name: `M(${formatNumber(t)} K)`, unit: 'μB/ion' }))];
    const rows = r.fieldsT.map((b, j) => [b, ...r.magnetizationMuB.map((row) => row[j]!)]);
    const where = r.direction === 'powder' ? `powder (${r.powder?.grid ?? ''})` : `B ∥ [${r.direction.join(', ')}]`;
    const head = `magnetization ${info.name}: ${r.ion}, ${where}, sites ${r.sites}`;
    return {
      text: `${head}\n${textTable(columns, rows, 20)}`,
      html: `<div class="multiplet-magnetization"><p>${escapeHtml(head)}</p>${htmlTable('M along the field', columns, rows)}</div>`,
      vegaLite: {
        $schema: VEGA_LITE_SCHEMA,
        description: head,
        width: 420,
        height: 260,
        data: { values: r.temperaturesK.flatMap((t, i) => r.fieldsT.map((b, j) => ({ fieldT: b, magnetizationMuB: r.magnetizationMuB[i]![j], temperature: `${formatNumber(t)} K` }))) },
        mark: 'line',
        encoding: {
          x: { field: 'fieldT', type: 'quantitative', title: 'μ0H (T)' },
          y: { field: 'magnetizationMuB', type: 'quantitative', title: 'M (μB per ion)' },
          color: { field: 'temperature', type: 'nominal', title: 'T' },
        },
      },
    };
  },
});
