/**
 * `[point-charge] name` — a point-charge estimate of the Stevens parameters from ligand positions and charges
 * (Hutchings 1964; @multiplet/physics/cef pointChargeParameters), with optional shielding factors, and the levels it
 * gives. A starting point for a fit (signs and ratios), not a prediction.
 *
 *   [point-charge] pcA
 *   ligands:
 *     - { x: 0 angstrom, y: 0 angstrom, z: 2.2 angstrom, charge: -2 }
 *     - { x: 0 angstrom, y: 0 angstrom, z: -2.2 angstrom, charge: -2 }
 *   shielding: { sigma2: 0.5 }
 */
import { pointChargeParameters, solveCef, allowedParameters, SITE_SYMMETRIES } from '@multiplet/physics/cef';
import { ION_NAMES } from '@multiplet/physics/ions';
import { defineKind } from './types';
import { checkIonName, requireIon } from './ionField';
import { escapeHtml, formatNumber, htmlKeyValue, htmlTable, textTable } from '../render/format';

interface Ligand { x: number; y: number; z: number; charge: number }
interface PointChargeInput {
  ion?: string;
  symmetry?: string;
  ligands: Ligand[];
  shielding: { sigma2: number; sigma4: number; sigma6: number };
}

export interface PointChargeCellResult {
  ion: string;
  /** Point-charge B_n^m, meV (all symmetry-allowed terms, plus any other non-negligible term). */
  parametersMeV: Record<string, number>;
  levelsMeV: number[];
  degeneracies: number[];
  summary: string;
  warnings: string[];
}

const lengthField = (axis: string) => ({ type: 'quantity' as const, unit: 'angstrom', required: true, doc: `${axis} of the ligand relative to the magnetic ion, CEF frame (z along the principal axis).` });

export const pointChargeKind = defineKind<PointChargeInput, PointChargeCellResult>({
  kind: 'point-charge',
  summary: 'point-charge estimate of B_n^m from ligand positions and charges (with shielding), and its levels',
  fields: {
    ion: { type: 'string', maxLength: 10, suggestions: ION_NAMES, doc: "The ion; default: the sample's ion." },
    symmetry: { type: 'choice', values: SITE_SYMMETRIES, doc: "Site symmetry whose allowed parameters are expected (terms it forbids that come out larger than 1e-6 of the largest are reported as a warning); default: the sample's." },
    ligands: {
      type: 'list',
      minItems: 1,
      required: true,
      of: {
        type: 'record',
        doc: 'One ligand: position and charge.',
        fields: {
          x: lengthField('x'),
          y: lengthField('y'),
          z: lengthField('z'),
          charge: { type: 'number', required: true, doc: 'Charge in units of e (e.g. -2 for O²⁻).' },
        },
      },
      doc: 'Ligands as {x, y, z, charge}, positions relative to the magnetic ion in Å.',
    },
    shielding: {
      type: 'record',
      default: {},
      doc: 'Sternheimer shielding factors σ_n: B_n^m is multiplied by (1 − σ_n).',
      fields: {
        sigma2: { type: 'number', default: 0, doc: 'σ_2 (often ≈ 0.5 for rare earths).' },
        sigma4: { type: 'number', default: 0, doc: 'σ_4.' },
        sigma6: { type: 'number', default: 0, doc: 'σ_6.' },
      },
    },
  },
  reads: ['sample'],
  writes: 'result',
  check(input, ctx) {
    checkIonName(input.ion, ctx);
  },
  run(input, ctx) {
    const sample = ctx.sampleIfDefined();
    const ionName = input.ion ?? sample?.ion;
    const ion = requireIon(ionName, ctx);
    const symmetry = input.symmetry ?? sample?.siteSymmetry;
    const shielding = input.shielding ?? { sigma2: 0, sigma4: 0, sigma6: 0 };
    const parameters = pointChargeParameters(
      ion,
      input.ligands.map((l) => ({ positionAngstrom: [l.x, l.y, l.z] as [number, number, number], charge: l.charge })),
      { shielding },
    );
    const warnings: string[] = [];
    if (symmetry !== undefined && symmetry !== 'none') {
      const allowed = allowedParameters(symmetry);
      const largest = Math.max(0, ...Object.values(parameters).map(Math.abs));
      const forbidden = Object.entries(parameters).filter(([k, v]) => !allowed.includes(k) && Math.abs(v) > 1e-6 * largest);
      if (forbidden.length) warnings.push(`the ligands break ${symmetry} symmetry in this frame: ${forbidden.map(([k]) => k).join(', ')} are not zero`);
      for (const [k, v] of Object.entries(parameters)) if (!allowed.includes(k) && Math.abs(v) <= 1e-6 * largest) delete (parameters as Record<string, number>)[k];
    }
    const solution = solveCef(ion, parameters);
    return {
      ion: ion.name,
      parametersMeV: { ...parameters },
      levelsMeV: solution.levels.map((l) => l.energyMeV),
      degeneracies: solution.levels.map((l) => l.degeneracy),
      summary: solution.summary,
      warnings: [...warnings, ...solution.warnings],
    };
  },
  render(r, info) {
    const params = Object.entries(r.parametersMeV).map(([k, v]): [string, string] => [k, `${formatNumber(v)} meV`]);
    const columns = [{ name: 'E', unit: 'meV' }, { name: 'degeneracy' }];
    const rows = r.levelsMeV.map((e, i) => [Math.abs(e) < 1e-9 ? 0 : e, String(r.degeneracies[i])]);
    const text = [`point charge ${info.name}: ${r.ion}: ${r.summary}`, ...params.map(([k, v]) => `  ${k} = ${v}`), textTable(columns, rows, 20), ...r.warnings.map((w) => `warning: ${w}`)].join('\n');
    const html = [
      `<div class="multiplet-point-charge"><p><b>${escapeHtml(info.name)}</b>: ${escapeHtml(r.ion)} — ${escapeHtml(r.summary)}</p>`,
      htmlKeyValue('point-charge Stevens parameters', params),
      htmlTable('levels', columns, rows),
      r.warnings.length ? `<ul class="multiplet-warnings">${r.warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join('')}</ul>` : '',
      '</div>',
    ].join('');
    return { text, html };
  },
});
