/**
 * `[heat-capacity-reduction] name` — measured heat capacity reduced to the magnetic part and its entropy: subtract a
 * lattice (Debye/Einstein, given or fitted, or a nonmagnetic analogue rescaled by the Debye-temperature ratio),
 * nuclear Schottky terms and an impurity phase, then integrate S = ∫C/T dT per mole of rare-earth ions with an
 * optional power-law extrapolation below the data (@multiplet/physics/thermo reduceHeatCapacity). The plot shows
 * the magnetic entropy with the lines R ln 2 and R[ln 2 − ½ ln(3/2)] (spin ice with Pauling's residual entropy).
 *
 *   [heat-capacity-reduction] smag
 *   data: cp
 *   debye: { atoms: 11 }
 *   fitRange: [30 K, 60 K]
 *   nuclear: [{ hyperfine: 0.0025 meV, spin: 2.5, abundance: 0.189 }]
 *   extrapolation: power-law
 */
import { reduceHeatCapacity, R_LN2_J_PER_MOL_K, SPIN_ICE_ENTROPY_J_PER_MOL_K, PAULING_ENTROPY_J_PER_MOL_K, type PhononModel } from '@multiplet/physics/thermo';
import { defineKind } from './types';
import { escapeHtml, formatNumber, htmlTable, textTable } from '../render/format';
import { dataColumn, VEGA_LITE_SCHEMA } from './thermoShared';

interface PhononTermInput {
  atoms: number;
  temperature?: number;
}

interface ReductionInput {
  data: string;
  temperatureColumn?: string;
  heatCapacityColumn?: string;
  errorColumn?: string;
  debye?: PhononTermInput;
  einstein?: PhononTermInput[];
  fitRange?: number[];
  analogue?: string;
  analogueMolarMass?: number;
  molarMass?: number;
  analogueMolarVolume?: number;
  molarVolume?: number;
  nuclear?: { hyperfine: number; spin: number; abundance: number; quadrupole: number }[];
  impurityFraction: number;
  impurityData?: string;
  impurityLevels?: number[];
  extrapolation: 'none' | 'power-law';
  lowPoints: number;
}

export interface HeatCapacityReductionCellResult {
  ionsPerFormulaUnit: number;
  temperaturesK: number[];
  measuredJPerMolK: number[];
  latticeJPerMolK: number[];
  nuclearJPerMolK: number[];
  impurityJPerMolK: number[];
  magneticJPerMolFuK: number[];
  magneticJPerMolIonK: number[];
  entropyJPerMolK: number[];
  entropyUncertaintyJPerMolK: number[];
  extrapolation: { kind: string; prefactorJPerMolKPerKn: number; exponent: number; entropyBelowJPerMolK: number; uncertaintyJPerMolK: number };
  phononModel: PhononModel | null;
  rLn2JPerMolK: number;
  spinIceJPerMolK: number;
  paulingJPerMolK: number;
}

const phononTerm = (what: string) => ({
  type: 'record' as const,
  fields: {
    atoms: { type: 'number' as const, min: 0, required: true, doc: `Atoms per formula unit in this ${what} term (3 modes each).` },
    temperature: { type: 'quantity' as const, unit: 'K', min: 0, doc: `${what} temperature; leave out to fit it in fitRange.` },
  },
  doc: `A ${what} term { atoms, temperature? }.`,
});

export const heatCapacityReductionKind = defineKind<ReductionInput, HeatCapacityReductionCellResult>({
  kind: 'heat-capacity-reduction',
  summary: 'magnetic heat capacity and entropy from measured C(T): subtract lattice, nuclear and impurity parts, integrate ∫C/T dT',
  fields: {
    data: { type: 'reference', kinds: ['data'], required: true, doc: 'The measured heat capacity (per mole of formula units): T and C columns, optional error column.' },
    temperatureColumn: { type: 'string', doc: 'Name of the temperature column (default: the first).' },
    heatCapacityColumn: { type: 'string', doc: 'Name of the heat-capacity column (default: the second).' },
    errorColumn: { type: 'string', doc: 'Name of the column of standard uncertainties of C (default: none).' },
    debye: { ...phononTerm('Debye') },
    einstein: { type: 'list', of: phononTerm('Einstein'), doc: 'Einstein terms [{ atoms, temperature? }, …].' },
    fitRange: { type: 'list', of: { type: 'quantity', unit: 'K', min: 0, doc: 'Temperature.' }, minItems: 2, maxItems: 2, doc: 'Range [T_min, T_max] where the data are lattice only, to fit missing Debye/Einstein temperatures.' },
    analogue: { type: 'reference', kinds: ['data'], doc: 'Heat capacity of a nonmagnetic analogue (per formula unit), used as the lattice instead of a model.' },
    analogueMolarMass: { type: 'quantity', unit: 'g/mol', min: 0, doc: 'Molar mass of the analogue (per formula unit).' },
    molarMass: { type: 'quantity', unit: 'g/mol', min: 0, doc: "Molar mass of the sample (default: the sample's)." },
    analogueMolarVolume: { type: 'quantity', unit: 'cm^3/mol', min: 0, doc: 'Molar volume of the analogue (with molarVolume: Bouvier et al. 1991 mass-volume scaling).' },
    molarVolume: { type: 'quantity', unit: 'cm^3/mol', min: 0, doc: 'Molar volume of the sample (per formula unit).' },
    nuclear: {
      type: 'list',
      of: {
        type: 'record',
        fields: {
          hyperfine: { type: 'quantity', unit: 'meV', required: true, doc: 'Effective hyperfine splitting A (levels A·m).' },
          spin: { type: 'number', min: 0.5, required: true, doc: 'Nuclear spin I.' },
          abundance: { type: 'number', min: 0, max: 1, default: 1, doc: 'Isotopic abundance.' },
          quadrupole: { type: 'quantity', unit: 'meV', default: '0 meV', doc: 'Quadrupole term P.' },
        },
        doc: 'One isotope.',
      },
      doc: 'Nuclear Schottky terms per rare-earth ion, one per isotope.',
    },
    impurityFraction: { type: 'number', min: 0, max: 0.999, default: 0, doc: 'Molar fraction of a secondary phase.' },
    impurityData: { type: 'reference', kinds: ['data'], doc: 'Heat capacity of the secondary phase (T and C columns, per mole of phase).' },
    impurityLevels: { type: 'list', of: { type: 'quantity', unit: 'meV', doc: 'Level energy.' }, doc: 'Or: the secondary phase as Schottky levels (meV).' },
    extrapolation: { type: 'choice', values: ['none', 'power-law'], default: 'none', doc: 'Entropy below the lowest point: none, or C = a Tⁿ fitted to the lowest points.' },
    lowPoints: { type: 'integer', min: 2, default: 5, doc: 'Points used by the power-law extrapolation.' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  check(input, ctx) {
    if (input.analogue !== undefined && (input.debye !== undefined || input.einstein !== undefined)) ctx.fail('analogue', input.analogue, 'either an analogue or a Debye/Einstein model, not both');
    if (input.analogue !== undefined && input.analogueMolarMass === undefined) ctx.fail('analogueMolarMass', undefined, "the analogue's molar mass (g/mol)");
    if (input.impurityFraction > 0 && (input.impurityData === undefined) === (input.impurityLevels === undefined))
      ctx.fail('impurityFraction', input.impurityFraction, 'exactly one of impurityData or impurityLevels with it');
  },
  run(input, ctx) {
    const sample = ctx.sampleIfDefined();
    const ions = sample?.ionsPerFormulaUnit ?? 1;
    const t = dataColumn(ctx, input.data, input.temperatureColumn, 0, 'temperatureColumn', 'K');
    const c = dataColumn(ctx, input.data, input.heatCapacityColumn, 1, 'heatCapacityColumn', 'J/(mol K)');
    const sigma = input.errorColumn === undefined ? undefined : dataColumn(ctx, input.data, input.errorColumn, 2, 'errorColumn', 'J/(mol K)');
    let analogue: Parameters<typeof reduceHeatCapacity>[0]['analogue'];
    if (input.analogue !== undefined) {
      const molarMass = input.molarMass ?? sample?.molarMassGramPerMol ?? undefined;
      if (molarMass === undefined || molarMass === null) ctx.fail('molarMass', undefined, 'the sample molar mass (here or in the sample cell)');
      analogue = {
        temperaturesK: dataColumn(ctx, input.analogue, undefined, 0, 'analogue', 'K'),
        heatCapacityJPerMolK: dataColumn(ctx, input.analogue, undefined, 1, 'analogue', 'J/(mol K)'),
        molarMassGPerMol: input.analogueMolarMass!,
        molarVolumeCm3PerMol: input.analogueMolarVolume,
        sample: { molarMassGPerMol: molarMass!, molarVolumeCm3PerMol: input.molarVolume },
      };
    }
    const phonon =
      input.debye !== undefined || input.einstein !== undefined
        ? {
            debye: input.debye && { atoms: input.debye.atoms, temperatureK: input.debye.temperature },
            einstein: input.einstein?.map((e) => ({ atoms: e.atoms, temperatureK: e.temperature })),
            fitRangeK: input.fitRange as [number, number] | undefined,
          }
        : undefined;
    const impurity =
      input.impurityFraction > 0
        ? {
            fraction: input.impurityFraction,
            dataset:
              input.impurityData === undefined
                ? undefined
                : {
                    temperaturesK: dataColumn(ctx, input.impurityData, undefined, 0, 'impurityData', 'K'),
                    heatCapacityJPerMolK: dataColumn(ctx, input.impurityData, undefined, 1, 'impurityData', 'J/(mol K)'),
                  },
            levelsMeV: input.impurityLevels,
          }
        : undefined;
    const r = reduceHeatCapacity({
      temperaturesK: t,
      heatCapacityJPerMolK: c,
      uncertaintyJPerMolK: sigma,
      ionsPerFormulaUnit: ions,
      phonon,
      analogue,
      nuclear: input.nuclear?.map((n) => ({ hyperfineMeV: n.hyperfine, nuclearSpin: n.spin, abundance: n.abundance, quadrupoleMeV: n.quadrupole })),
      impurity,
      extrapolation: input.extrapolation,
      lowPoints: input.lowPoints,
    });
    return {
      ionsPerFormulaUnit: ions,
      temperaturesK: t,
      measuredJPerMolK: c,
      latticeJPerMolK: Array.from(r.latticeJPerMolK),
      nuclearJPerMolK: Array.from(r.nuclearJPerMolK),
      impurityJPerMolK: Array.from(r.impurityJPerMolK),
      magneticJPerMolFuK: Array.from(r.magneticJPerMolFuK),
      magneticJPerMolIonK: Array.from(r.magneticJPerMolIonK),
      entropyJPerMolK: Array.from(r.entropy.entropyJPerMolK),
      entropyUncertaintyJPerMolK: Array.from(r.entropy.uncertaintyJPerMolK),
      extrapolation: r.entropy.extrapolation,
      phononModel: r.phononModel ? JSON.parse(JSON.stringify(r.phononModel)) : null,
      rLn2JPerMolK: R_LN2_J_PER_MOL_K,
      spinIceJPerMolK: SPIN_ICE_ENTROPY_J_PER_MOL_K,
      paulingJPerMolK: PAULING_ENTROPY_J_PER_MOL_K,
    };
  },
  render(r, info) {
    const columns = [
      { name: 'T', unit: 'K' }, { name: 'C measured', unit: 'J/(mol K) f.u.' }, { name: 'lattice', unit: 'J/(mol K) f.u.' }, { name: 'nuclear', unit: 'J/(mol K) f.u.' },
      { name: 'C_mag', unit: 'J/(mol K) ion' }, { name: 'S_mag', unit: 'J/(mol K) ion' }, { name: 'σ(S)', unit: 'J/(mol K)' },
    ];
    const rows = r.temperaturesK.map((t, i) => [t, r.measuredJPerMolK[i]!, r.latticeJPerMolK[i]!, r.nuclearJPerMolK[i]!, r.magneticJPerMolIonK[i]!, r.entropyJPerMolK[i]!, r.entropyUncertaintyJPerMolK[i]!]);
    const last = r.entropyJPerMolK.length - 1;
    const phonon = r.phononModel
      ? [r.phononModel.debye ? `θ_D = ${formatNumber(r.phononModel.debye.temperatureK, 5)} K` : '', ...(r.phononModel.einstein ?? []).map((e) => `θ_E = ${formatNumber(e.temperatureK, 5)} K`)].filter(Boolean).join(', ')
      : 'no phonon model';
    const head =
      `heat-capacity reduction ${info.name}: S_mag(${formatNumber(r.temperaturesK[last]!)} K) = ${formatNumber(r.entropyJPerMolK[last]!, 4)} ± ${formatNumber(r.entropyUncertaintyJPerMolK[last]!, 2)} J/(mol K) per ion ` +
      `(R ln 2 = ${formatNumber(r.rLn2JPerMolK, 4)}, R[ln 2 − ½ ln(3/2)] = ${formatNumber(r.spinIceJPerMolK, 4)}); ${phonon}; extrapolation ${r.extrapolation.kind}`;
    const componentValues = r.temperaturesK.flatMap((t, i) => [
      { temperatureK: t, value: r.measuredJPerMolK[i], part: 'measured (f.u.)' },
      { temperatureK: t, value: r.latticeJPerMolK[i], part: 'lattice (f.u.)' },
      { temperatureK: t, value: r.magneticJPerMolFuK[i], part: 'magnetic (f.u.)' },
    ]);
    return {
      text: `${head}\n${textTable(columns, rows, 20)}`,
      html: `<div class="multiplet-heat-capacity-reduction"><p>${escapeHtml(head)}</p>${htmlTable('heat-capacity reduction', columns, rows)}</div>`,
      vegaLite: {
        $schema: VEGA_LITE_SCHEMA,
        description: head,
        hconcat: [
          {
            width: 280, height: 240,
            data: { values: componentValues },
            mark: 'line',
            encoding: {
              x: { field: 'temperatureK', type: 'quantitative', title: 'T (K)' },
              y: { field: 'value', type: 'quantitative', title: 'C (J/(mol K))' },
              color: { field: 'part', type: 'nominal', title: '' },
            },
          },
          {
            width: 280, height: 240,
            layer: [
              {
                data: { values: r.temperaturesK.map((t, i) => ({ temperatureK: t, entropy: r.entropyJPerMolK[i], low: r.entropyJPerMolK[i]! - r.entropyUncertaintyJPerMolK[i]!, high: r.entropyJPerMolK[i]! + r.entropyUncertaintyJPerMolK[i]! })) },
                layer: [
                  { mark: { type: 'area', opacity: 0.25 }, encoding: { x: { field: 'temperatureK', type: 'quantitative', title: 'T (K)' }, y: { field: 'low', type: 'quantitative', title: 'S_mag (J/(mol K) per ion)' }, y2: { field: 'high' } } },
                  { mark: 'line', encoding: { x: { field: 'temperatureK', type: 'quantitative' }, y: { field: 'entropy', type: 'quantitative' } } },
                ],
              },
              {
                data: { values: [{ y: r.rLn2JPerMolK, line: 'R ln 2' }, { y: r.spinIceJPerMolK, line: 'R[ln 2 − ½ ln(3/2)]' }] },
                mark: { type: 'rule', strokeDash: [4, 4] },
                encoding: { y: { field: 'y', type: 'quantitative' }, color: { field: 'line', type: 'nominal', title: '' } },
              },
            ],
          },
        ],
      },
    };
  },
});
