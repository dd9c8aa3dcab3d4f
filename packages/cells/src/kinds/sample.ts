/**
 * `[sample] name` — the compound under study: label, magnetic ion, its site symmetry, lattice constant, number
 * of magnetic ions per formula unit and molar mass. The latest sample cell is "the sample" that other kinds read
 * (crystal-field takes its ion and symmetry; thermodynamics kinds its molar quantities).
 *
 *   [sample] host
 *   compound: DyQ-1
 *   ion: Dy3+
 *   siteSymmetry: D3d
 *   latticeConstant: 10.12 angstrom
 *   ionsPerFormulaUnit: 2
 *   molarMass: 532.8 g/mol
 */
import { getIon, ION_NAMES } from '@multiplet/physics/ions';
import { SITE_SYMMETRIES } from '@multiplet/physics/cef';
import { defineKind, type SampleResult } from './types';
import { checkIonName } from './ionField';
import { formatQuantity, htmlKeyValue } from '../render/format';

interface SampleInput {
  compound: string;
  ion: string;
  siteSymmetry: string;
  latticeConstant?: number;
  ionsPerFormulaUnit: number;
  molarMass?: number;
}

export const sampleKind = defineKind<SampleInput, SampleResult>({
  kind: 'sample',
  summary: 'the compound: label, magnetic ion, site symmetry, lattice constant, ions per formula unit, molar mass',
  fields: {
    compound: { type: 'string', required: true, maxLength: 200, doc: 'Compound label as you write it, e.g. DyQ-1.' },
    ion: {
      type: 'string',
      required: true,
      maxLength: 10,
      patternText: `a trivalent rare-earth ion (${ION_NAMES.join(', ')})`,
      suggestions: ION_NAMES,
      doc: 'The magnetic ion, e.g. Dy3+ (the "3+" may be left out; case does not matter).',
    },
    siteSymmetry: {
      type: 'choice',
      values: SITE_SYMMETRIES,
      default: 'none',
      doc: 'Point group of the magnetic site (Schoenflies symbol, e.g. D3d, Oh, D4h; "none" allows all 27 Stevens parameters). It decides which B parameters a crystal-field cell may use.',
    },
    latticeConstant: { type: 'quantity', unit: 'angstrom', min: 1e-3, doc: 'Cubic lattice constant a (or the a axis), e.g. 10.12 angstrom.' },
    ionsPerFormulaUnit: { type: 'integer', min: 1, max: 1000, default: 1, doc: 'Magnetic ions per formula unit (2 for DyQ-1); molar quantities are per mole of formula units.' },
    molarMass: { type: 'quantity', unit: 'g/mol', min: 1e-3, doc: 'Molar mass of one formula unit, e.g. 532.8 g/mol (needed for per-gram conversions).' },
  },
  reads: [],
  writes: 'sample',
  check(input, ctx) {
    checkIonName(input.ion, ctx);
  },
  run(input) {
    return {
      compound: input.compound,
      ion: getIon(input.ion).name,
      siteSymmetry: input.siteSymmetry,
      latticeConstantAngstrom: input.latticeConstant ?? null,
      ionsPerFormulaUnit: input.ionsPerFormulaUnit,
      molarMassGramPerMol: input.molarMass ?? null,
    };
  },
  render(s, info) {
    const ion = getIon(s.ion);
    const entries: [string, string][] = [
      ['compound', s.compound],
      ['ion', `${s.ion} (4f${ion.nf}, J = ${ion.J}, g_J = ${formatQuantity(ion.gJ, '')}${ion.kramers ? ', Kramers' : ''})`],
      ['site symmetry', s.siteSymmetry],
      ['lattice constant', s.latticeConstantAngstrom === null ? '—' : formatQuantity(s.latticeConstantAngstrom, 'Å')],
      ['ions per formula unit', String(s.ionsPerFormulaUnit)],
      ['molar mass', s.molarMassGramPerMol === null ? '—' : formatQuantity(s.molarMassGramPerMol, 'g/mol')],
    ];
    const text = `sample ${info.name}: ${entries.map(([k, v]) => `${k} ${v}`).join('; ')}`;
    const html = `<div class="multiplet-sample">${htmlKeyValue(`sample ${info.name}`, entries)}</div>`;
    return { text, html };
  },
});
