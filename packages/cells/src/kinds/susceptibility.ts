/**
 * `[susceptibility] name` — the zero-field dc susceptibility χ(T) of a crystal-field result (Van Vleck formula) in
 * emu/mol and m³/mol, per mole of rare-earth ions and per formula unit (@multiplet/physics/thermo
 * vanVleckSusceptibility).
 *
 *   [susceptibility] chiA
 *   cef: cefA
 *   temperatures: 2 K .. 300 K / 60
 */
import { vanVleckSusceptibility } from '@multiplet/physics/thermo';
import { defineKind } from './types';
import { escapeHtml, formatNumber, htmlTable, textTable } from '../render/format';
import { ionOfCef, VEGA_LITE_SCHEMA } from './thermoShared';

interface SusceptibilityInput {
  cef: string;
  temperatures: number[];
  direction?: number[];
  sites: 'single' | 'pyrochlore';
  meanField: number;
  demagnetizationFactor: number;
  molarVolume?: number;
}

export interface SusceptibilityCellResult {
  ion: string;
  direction: number[] | 'powder';
  sites: string;
  ionsPerFormulaUnit: number;
  temperaturesK: number[];
  chiEmuPerMol: number[];
  inverseChiMolPerEmu: number[];
  chiM3PerMol: number[];
  chiEmuPerMolFormulaUnit: number[];
  chiM3PerMolFormulaUnit: number[];
}

export const susceptibilityKind = defineKind<SusceptibilityInput, SusceptibilityCellResult>({
  kind: 'susceptibility',
  summary: 'Van Vleck dc susceptibility χ(T) in emu/mol and m³/mol (per mole of ions and per formula unit), direction or powder',
  fields: {
    cef: { type: 'reference', kinds: ['crystal-field'], required: true, doc: 'The crystal-field result (ion and Stevens parameters in the local frame).' },
    temperatures: { type: 'range', unit: 'K', min: 0, required: true, doc: 'Temperatures (> 0), e.g. "2 K .. 300 K / 60".' },
    direction: {
      type: 'list', of: { type: 'number', doc: 'Component in the crystal (global) frame.' }, minItems: 3, maxItems: 3,
      doc: 'Field direction [x, y, z] in the crystal frame; leave out for the powder average (trace/3).',
    },
    sites: { type: 'choice', values: ['single', 'pyrochlore'], default: 'single', doc: 'Site frames: one site, or the four ⟨111⟩ frames of the pyrochlore lattice.' },
    meanField: { type: 'number', default: 0, doc: 'Molecular-field constant λ in mol/emu per mole of ions: 1/χ = 1/χ₀ − λ.', control: { min: -5, max: 5, step: 0.01 } },
    demagnetizationFactor: { type: 'number', min: 0, max: 1, default: 0, doc: 'SI demagnetising factor N of the sample shape (needs molarVolume).' },
    molarVolume: { type: 'quantity', unit: 'cm^3/mol', min: 0, doc: 'Molar volume per mole of rare-earth ions, for the demagnetising correction.' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  check(input, ctx) {
    if (input.demagnetizationFactor > 0 && input.molarVolume === undefined) ctx.fail('molarVolume', undefined, 'a molar volume (cm^3/mol) when demagnetizationFactor > 0');
  },
  run(input, ctx) {
    const { ion, single } = ionOfCef(ctx, input.cef);
    const ions = ctx.sampleIfDefined()?.ionsPerFormulaUnit ?? 1;
    const direction = input.direction ? (input.direction as [number, number, number]) : 'powder';
    const r = vanVleckSusceptibility(single, {
      temperaturesK: input.temperatures,
      direction,
      sites: input.sites,
      ionsPerFormulaUnit: ions,
      meanFieldMolPerEmu: input.meanField,
      demagnetization: input.demagnetizationFactor > 0 ? { factor: input.demagnetizationFactor, molarVolumeCm3PerMol: input.molarVolume! } : undefined,
    });
    return {
      ion,
      direction: direction === 'powder' ? 'powder' : [...direction],
      sites: input.sites,
      ionsPerFormulaUnit: ions,
      temperaturesK: [...input.temperatures],
      chiEmuPerMol: Array.from(r.chiEmuPerMol),
      inverseChiMolPerEmu: Array.from(r.inverseChiMolPerEmu),
      chiM3PerMol: Array.from(r.chiM3PerMol),
      chiEmuPerMolFormulaUnit: Array.from(r.chiEmuPerMolFormulaUnit),
      chiM3PerMolFormulaUnit: Array.from(r.chiM3PerMolFormulaUnit),
    };
  },
  render(r, info) {
    const columns = [{ name: 'T', unit: 'K' }, { name: 'χ', unit: 'emu/mol ion' }, { name: '1/χ', unit: 'mol/emu' }, { name: 'χ', unit: 'm³/mol ion' }, { name: 'χ', unit: 'emu/mol f.u.' }];
    const rows = r.temperaturesK.map((t, i) => [t, r.chiEmuPerMol[i]!, r.inverseChiMolPerEmu[i]!, r.chiM3PerMol[i]!, r.chiEmuPerMolFormulaUnit[i]!]);
    const where = r.direction === 'powder' ? 'powder' : `B ∥ [${r.direction.join(', ')}]`;
    const head = `susceptibility ${info.name}: ${r.ion}, ${where}, sites ${r.sites}, ${formatNumber(r.ionsPerFormulaUnit)} ions per formula unit`;
    return {
      text: `${head}\n${textTable(columns, rows, 20)}`,
      html: `<div class="multiplet-susceptibility"><p>${escapeHtml(head)}</p>${htmlTable('Van Vleck susceptibility', columns, rows)}</div>`,
      vegaLite: {
        $schema: VEGA_LITE_SCHEMA,
        description: head,
        data: { values: r.temperaturesK.map((t, i) => ({ temperatureK: t, chi: r.chiEmuPerMol[i], inverseChi: r.inverseChiMolPerEmu[i] })) },
        hconcat: [
          { width: 260, height: 220, mark: 'line', encoding: { x: { field: 'temperatureK', type: 'quantitative', title: 'T (K)' }, y: { field: 'chi', type: 'quantitative', title: 'χ (emu/mol ion)' } } },
          { width: 260, height: 220, mark: 'line', encoding: { x: { field: 'temperatureK', type: 'quantitative', title: 'T (K)' }, y: { field: 'inverseChi', type: 'quantitative', title: '1/χ (mol/emu)' } } },
        ],
      },
    };
  },
});
