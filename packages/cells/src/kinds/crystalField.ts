/**
 * `[crystal-field] name` — levels, eigenstates and the ground-doublet g-tensor of the sample's ion in a crystal
 * field given by Stevens parameters (Hutchings convention, DEVELOPERS.md § Conventions), from
 * solveCef/normalizeCefParameters of @multiplet/physics/cef.
 *
 *   [crystal-field] cefA
 *   B:
 *     B20: -0.35 meV
 *     B40: 1.2e-3 meV
 *     B43: 0.01 meV
 *
 * The ion and the site symmetry default to the sample's; parameters the symmetry forbids are an error at their
 * line. Bare numbers in B are in `unit` (default meV).
 */
import { ION_NAMES } from '@multiplet/physics/ions';
import { InputError } from '@multiplet/physics/errors';
import {
  SITE_SYMMETRIES,
  CEF_PARAMETER_KEYS,
  parseParameterKey,
  parameterKey,
  normalizeCefParameters,
  solveCef,
  describeLevels,
  formatAngularMomentum,
  type CefSolution,
  type GroundDoublet,
} from '@multiplet/physics/cef';
import { KELVIN_IN_MEV, INVERSE_CM_IN_MEV } from '@multiplet/physics/units';
import { defineKind } from './types';
import { checkIonName, requireIon } from './ionField';
import { escapeHtml, formatNumber, htmlKeyValue, htmlTable, textTable } from '../render/format';

/**
 * The ground doublet of a CEF solution as JSON (no gap above a lone doublet: gapMeV null, not Infinity); the
 * crystal-field cell and `multiplet compute crystal-field` both report it this way.
 */
export function groundDoubletJson(gd: CefSolution['groundDoublet']) {
  return gd
    ? {
        gParallel: gd.gParallel,
        gPerpendicular: gd.gPerpendicular,
        gTensor: gd.gTensor,
        gPrincipalValues: gd.gPrincipalValues,
        gPrincipalAxes: gd.gPrincipalAxes,
        momentParallelMuB: gd.momentParallelMuB,
        kramers: gd.kramers,
        gapMeV: Number.isFinite(gd.gapMeV) ? gd.gapMeV : null,
      }
    : null;
}

interface CrystalFieldInput {
  base?: string;
  ion?: string;
  symmetry?: string;
  unit: string;
  B?: Record<string, number>;
  degeneracyTolerance: number;
}

export interface CrystalFieldResult {
  ion: string;
  J: number;
  gJ: number;
  symmetry: string;
  /** Canonical keys, meV, zeros dropped (cubic B44/B64 filled in). */
  parametersMeV: Record<string, number>;
  energiesMeV: number[];
  levels: {
    energyMeV: number;
    degeneracy: number;
    states: { index: number; ket: string; expectationJ: number[]; momentMuB: number[] }[];
  }[];
  /** Eigenvector k (column k of the solver) as |J, m⟩ amplitudes, basis index i ↔ m = J − i. */
  eigenvectors: { re: number[]; im: number[] }[];
  /** The solver's ground doublet as JSON: the gap to the next level in meV is null when the doublet is the only level. */
  groundDoublet: (Omit<GroundDoublet, 'gapMeV'> & { gapMeV: number | null }) | null;
  classification: string;
  summary: string;
  warnings: string[];
}

const ENERGY_UNITS = ['meV', 'K', 'cm-1', 'THz', 'ueV'] as const;

export const crystalFieldKind = defineKind<CrystalFieldInput, CrystalFieldResult>({
  kind: 'crystal-field',
  summary: 'crystal-field levels, eigenstates (|J, m⟩), ground-doublet g-tensor and classification from Stevens parameters',
  fields: {
    base: {
      type: 'reference',
      kinds: ['crystal-field'],
      doc: 'An earlier crystal-field result to start from: its ion, symmetry and parameters, with the B given here replacing or adding single parameters (e.g. to vary B20 only). Rerunning the base marks this result stale.',
    },
    ion: {
      type: 'string',
      maxLength: 10,
      suggestions: ION_NAMES,
      patternText: `a trivalent rare-earth ion (${ION_NAMES.join(', ')})`,
      doc: "The ion; default: the base's ion, else the sample's ion.",
    },
    symmetry: {
      type: 'choice',
      values: SITE_SYMMETRIES,
      doc: "Site symmetry used to check the B parameters (z along the principal axis); default: the base's, else the sample's site symmetry, else none.",
    },
    unit: {
      type: 'choice',
      values: ENERGY_UNITS,
      default: 'meV',
      doc: 'Unit of bare numbers in B (values written with a unit, e.g. "-0.35 meV", "12 cm^-1", carry their own).',
    },
    B: {
      type: 'map',
      of: {
        type: 'quantity',
        unit: 'meV',
        bareUnitField: 'unit',
        control: { relativeSpan: 2, zeroSpan: 0.01 },
        doc: 'A Stevens parameter B_n^m (energy).',
      },
      key: (key) => {
        const index = parseParameterKey(key);
        return index ? parameterKey(index.n, index.m) : undefined;
      },
      keyText: 'a Stevens parameter name: B20, B22, B40, B43, B44, B4-3 (or B4m3), B60, B63, B66, ...',
      keySuggestions: CEF_PARAMETER_KEYS,
      doc: 'Stevens parameters B_n^m (Hutchings convention, θ_n included): H = Σ B_n^m O_n^m. Keys B20 … B66, negative m for sine terms (B4-3 or B4m3). Required unless base is given.',
    },
    degeneracyTolerance: {
      type: 'quantity',
      unit: 'meV',
      min: 1e-12,
      max: 1,
      default: '1e-4 meV',
      doc: 'Eigenvalues closer than this form one level.',
    },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  check(input, ctx) {
    if (input.B === undefined && input.base === undefined) ctx.fail('B', undefined, 'Stevens parameters such as "B20: -0.35 meV" (or a base crystal-field result to start from)');
    checkIonName(input.ion, ctx);
  },
  run(input, ctx) {
    const sample = ctx.sampleIfDefined();
    const base = input.base === undefined ? undefined : ctx.result<CrystalFieldResult>(input.base);
    const ionName = input.ion ?? base?.ion ?? sample?.ion;
    const ion = requireIon(ionName, ctx);
    const symmetry = input.symmetry ?? base?.symmetry ?? sample?.siteSymmetry ?? 'none';
    let parameters: Record<string, number>;
    try {
      // Base parameters (canonical keys, meV) overridden key by key by this cell's B.
      parameters = { ...normalizeCefParameters({ ...(base?.parametersMeV ?? {}), ...(input.B ?? {}) }, { unit: 'meV', symmetry }) };
    } catch (error) {
      // The symmetry came from elsewhere: say so beside the parameter's line.
      if (error instanceof InputError && input.symmetry === undefined && (base || sample)) {
        throw new InputError(error.field, error.value, `${error.expected}; the symmetry is the ${base ? 'base result' : 'sample'}'s`);
      }
      throw error;
    }
    ctx.task.checkpoint();
    const solution = solveCef(ion, parameters, { degeneracyToleranceMeV: input.degeneracyTolerance });
    const described = describeLevels(solution);
    const n = solution.eigenvectors.n;
    const eigenvectors = Array.from({ length: n }, (_, k) => ({
      re: Array.from({ length: n }, (_, i) => solution.eigenvectors.re[i * n + k]!),
      im: Array.from({ length: n }, (_, i) => solution.eigenvectors.im[i * n + k]!),
    }));
    return {
      ion: ion.name,
      J: ion.J,
      gJ: ion.gJ,
      symmetry,
      parametersMeV: parameters,
      energiesMeV: Array.from(solution.energiesMeV),
      levels: described.map((level) => ({
        energyMeV: level.energyMeV,
        degeneracy: level.degeneracy,
        states: level.states.map((s) => ({ index: s.index, ket: s.ket, expectationJ: [...s.expectationJ], momentMuB: [...s.momentMuB] })),
      })),
      eigenvectors,
      groundDoublet: groundDoubletJson(solution.groundDoublet),
      classification: solution.classification,
      summary: solution.summary,
      warnings: solution.warnings,
    };
  },
  render(r, info) {
    const columns = [
      { name: 'E', unit: 'meV' },
      { name: 'E', unit: 'K' },
      { name: 'E', unit: 'cm^-1' },
      { name: 'degeneracy' },
      { name: 'leading state' },
    ];
    // Round-off of the ground level's mean (1e-15 meV) is shown as 0.
    const clean = (x: number) => (Math.abs(x) < 1e-9 ? 0 : x);
    const rows = r.levels.map((level) => [
      clean(level.energyMeV),
      clean(level.energyMeV / KELVIN_IN_MEV),
      clean(level.energyMeV / INVERSE_CM_IN_MEV),
      String(level.degeneracy),
      level.states[0]?.ket ?? '',
    ]);
    const warnings = r.warnings.map((w) => `warning: ${w}`);
    const text = [`crystal field ${info.name}: ${r.ion} (J = ${formatAngularMomentum(r.J)}) in ${r.symmetry}: ${r.summary}`, textTable(columns, rows, 20), ...warnings].join('\n');
    const params = Object.entries(r.parametersMeV).map(([k, v]): [string, string] => [k, `${formatNumber(v)} meV`]);
    const g = r.groundDoublet;
    const gEntries: [string, string][] = g
      ? [
          ['g∥', formatNumber(g.gParallel)],
          ['g⊥', formatNumber(g.gPerpendicular)],
          ['principal g', g.gPrincipalValues.map((x) => formatNumber(x)).join(', ')],
          ['moment ∥', `${formatNumber(g.momentParallelMuB)} μB`],
          ['gap', g.gapMeV === null ? '—' : `${formatNumber(g.gapMeV)} meV`],
          ['Kramers', g.kramers ? 'yes' : 'no'],
        ]
      : [];
    const html = [
      `<div class="multiplet-crystal-field"><p><b>${escapeHtml(info.name)}</b>: ${escapeHtml(r.ion)} (J = ${formatAngularMomentum(r.J)}) in ${escapeHtml(r.symmetry)} — ${escapeHtml(r.summary)}</p>`,
      htmlTable('levels', columns, rows),
      htmlKeyValue('Stevens parameters', params),
      g ? htmlKeyValue(`ground doublet (${r.classification})`, gEntries) : '',
      warnings.length ? `<ul class="multiplet-warnings">${r.warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join('')}</ul>` : '',
      '</div>',
    ].join('');
    const values = r.levels.map((level, i) => ({ level: i, energyMeV: clean(level.energyMeV), degeneracy: level.degeneracy, label: `×${level.degeneracy}` }));
    const vegaLite = {
      $schema: 'https://vega.github.io/schema/vega-lite/v5.json',
      description: `crystal-field levels of ${info.name}`,
      width: 160,
      height: 300,
      data: { values },
      encoding: { y: { field: 'energyMeV', type: 'quantitative', title: 'E (meV)' } },
      layer: [
        { mark: { type: 'tick', thickness: 2, size: 100, orient: 'horizontal' }, encoding: { tooltip: [{ field: 'energyMeV', type: 'quantitative', title: 'E (meV)' }, { field: 'degeneracy', type: 'quantitative' }] } },
        { mark: { type: 'text', align: 'left', dx: 55 }, encoding: { text: { field: 'label', type: 'nominal' } } },
      ],
    };
    return { text, html, vegaLite };
  },
});
