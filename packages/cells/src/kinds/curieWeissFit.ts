/**
 * `[curie-weiss-fit] name` — Curie–Weiss fit χ = C/(T − θ_CW) + χ0 of measured susceptibility data over a chosen
 * range, giving C, θ_CW, χ0 and μ_eff with uncertainties (@multiplet/physics/thermo curieWeissFit). Named
 * `curie-weiss-fit` because `curie-weiss` is the cells README's example kind.
 *
 *   [curie-weiss-fit] cw
 *   data: chiData
 *   range: [10 K, 300 K]
 *   withChi0: true
 */
import { curieWeissFit, type CurieWeissResult } from '@multiplet/physics/thermo';
import { defineKind } from './types';
import { escapeHtml, formatNumber, htmlKeyValue } from '../render/format';
import { dataColumn, susceptibilityToEmuPerMol, VEGA_LITE_SCHEMA } from './thermoShared';

interface CurieWeissInput {
  data: string;
  temperatureColumn?: string;
  chiColumn?: string;
  errorColumn?: string;
  range?: number[];
  withChi0: boolean;
  perFormulaUnit: boolean;
}

/** The physics fit result plus what the cell shows: the range used and the data points. */
export interface CurieWeissCellResult extends CurieWeissResult {
  rangeK: number[] | null;
  temperaturesK: number[];
  chiEmuPerMol: number[];
}

export const curieWeissFitKind = defineKind<CurieWeissInput, CurieWeissCellResult>({
  kind: 'curie-weiss-fit',
  summary: 'Curie–Weiss fit of measured χ(T) over a range: C (emu K/mol), θ_CW (K), χ0 (emu/mol), μ_eff (μB)',
  fields: {
    data: { type: 'reference', kinds: ['data'], required: true, doc: 'Susceptibility data: T and χ columns (χ in emu/mol, cm^3/mol or m^3/mol).' },
    temperatureColumn: { type: 'string', doc: 'Name of the temperature column (default: the first).' },
    chiColumn: { type: 'string', doc: 'Name of the χ column (default: the second).' },
    errorColumn: { type: 'string', doc: 'Name of a column of standard uncertainties of χ (default: 1 % of χ).' },
    range: { type: 'list', of: { type: 'quantity', unit: 'K', min: 0, doc: 'Temperature.' }, minItems: 2, maxItems: 2, doc: 'Fit range [T_min, T_max] (default: all points).' },
    withChi0: { type: 'boolean', default: false, doc: 'Fit a temperature-independent χ0 as well.' },
    perFormulaUnit: { type: 'boolean', default: false, doc: 'The data are per mole of formula units: divide by the sample’s ions per formula unit so that μ_eff is per ion.' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  run(input, ctx) {
    const t = dataColumn(ctx, input.data, input.temperatureColumn, 0, 'temperatureColumn', 'K');
    const scale = input.perFormulaUnit ? 1 / (ctx.sampleIfDefined()?.ionsPerFormulaUnit ?? 1) : 1;
    const chi = dataColumn(ctx, input.data, input.chiColumn, 1, 'chiColumn', 'emu/mol', susceptibilityToEmuPerMol).map((x) => x * scale);
    const sigma = input.errorColumn === undefined ? undefined : dataColumn(ctx, input.data, input.errorColumn, 2, 'errorColumn', 'emu/mol', susceptibilityToEmuPerMol).map((x) => x * scale);
    const r = curieWeissFit(t, chi, { rangeK: input.range as [number, number] | undefined, withChi0: input.withChi0, uncertaintyEmuPerMol: sigma });
    return { ...r, uncertainty: { ...r.uncertainty }, rangeK: input.range ? [...input.range] : null, temperaturesK: t, chiEmuPerMol: chi };
  },
  render(r, info) {
    const entries: [string, string][] = [
      ['C', `${formatNumber(r.curieConstantEmuKPerMol, 5)} ± ${formatNumber(r.uncertainty.curieConstantEmuKPerMol, 2)} emu K/mol`],
      ['θ_CW', `${formatNumber(r.weissTemperatureK, 5)} ± ${formatNumber(r.uncertainty.weissTemperatureK, 2)} K`],
      ['χ0', `${formatNumber(r.chi0EmuPerMol, 4)} ± ${formatNumber(r.uncertainty.chi0EmuPerMol, 2)} emu/mol`],
      ['μ_eff', `${formatNumber(r.effectiveMomentMuB, 5)} ± ${formatNumber(r.uncertainty.effectiveMomentMuB, 2)} μB`],
      ['points, χ²_red', `${r.pointsUsed}, ${formatNumber(r.reducedChiSquared, 3)}`],
    ];
    const inRange = (t: number) => !r.rangeK || (t >= r.rangeK[0]! && t <= r.rangeK[1]!);
    const fitT = r.temperaturesK.filter(inRange);
    return {
      text: `Curie–Weiss fit ${info.name}:\n${entries.map(([k, v]) => `  ${k}: ${v}`).join('\n')}`,
      html: `<div class="multiplet-curie-weiss-fit">${htmlKeyValue(`Curie–Weiss fit ${escapeHtml(info.name)}`, entries)}</div>`,
      vegaLite: {
        $schema: VEGA_LITE_SCHEMA,
        description: `Curie–Weiss fit ${info.name}`,
        width: 420,
        height: 260,
        layer: [
          {
            data: { values: r.temperaturesK.map((t, i) => ({ temperatureK: t, inverseChi: 1 / r.chiEmuPerMol[i]! })) },
            mark: { type: 'point', filled: true, size: 20 },
            encoding: { x: { field: 'temperatureK', type: 'quantitative', title: 'T (K)' }, y: { field: 'inverseChi', type: 'quantitative', title: '1/χ (mol/emu)' } },
          },
          {
            data: { values: fitT.map((t) => ({ temperatureK: t, inverseChi: 1 / (r.curieConstantEmuKPerMol / (t - r.weissTemperatureK) + r.chi0EmuPerMol) })) },
            mark: { type: 'line', color: 'firebrick' },
            encoding: { x: { field: 'temperatureK', type: 'quantitative' }, y: { field: 'inverseChi', type: 'quantitative' } },
          },
        ],
      },
    };
  },
});
