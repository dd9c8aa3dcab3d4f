/**
 * `[cef-fit] name` — fit the Stevens parameters of a crystal-field result to neutron peak lists and/or measured
 * spectra (from `data` cells), with a multi-start global search that reports every distinct minimum, Jacobian
 * errors and correlations, and optional posterior sampling (ensemble MCMC). From @multiplet/physics/fit (fitCefAsync,
 * sampleCefPosteriorAsync: the synchronous fit's code, pausing so that progress shows live in the kernel). Seeded:
 * the cell's seed drives the random starts and the sampler.
 *
 *   [cef-fit] fitA
 *   start: cefA
 *   free: [B20, B40, B43, B60, B63, B66]
 *   starts: 32
 *   peaks:
 *     - { energy: 7.9 meV, error: 0.1 meV, intensity: 1.0, intensityError: 0.05, temperature: 5 K }
 *     - { energy: 12.6 meV, error: 0.2 meV, temperature: 5 K }
 *   susceptibility:
 *     - { data: chiData, temperatureColumn: T, chiColumn: chi, errorColumn: dchi, fitScale: true }
 *   magnetization:
 *     - { data: m2K, temperature: 2 K, direction: [0, 0, 1] }
 */
import {
  fitCefAsync, sampleCefPosteriorAsync, type CefFitSolution, type CefFitSpec, type MagnetizationObservation, type PeakObservation, type SpectrumObservation,
  type SusceptibilityObservation,
} from '@multiplet/physics/fit';
import { LINE_SHAPES } from '@multiplet/physics/neutron';
import { CEF_PARAMETER_KEYS, parseParameterKey, parameterKey } from '@multiplet/physics/cef';
import { defineKind, type DatasetResult } from './types';
import { convertValue } from '../syntax/quantity';
import { escapeHtml, formatNumber, htmlKeyValue, htmlTable, textTable } from '../render/format';
import { dataColumn, susceptibilityToEmuPerMol } from './thermoShared';

interface PeakInput {
  energy: number; error: number; intensity?: number; intensityError?: number; temperature: number;
  incidentEnergy?: number; Q?: number; from?: number; to?: number;
}
interface SpectrumInput {
  data: string; energyColumn?: string; intensityColumn?: string; errorColumn?: string; temperature: number;
  incidentEnergy?: number; Q?: number; resolution: number[]; lineShape: 'gaussian' | 'lorentzian' | 'pseudo-voigt'; intrinsicWidth: number; weight: number;
  qDirection?: number[];
}
interface BulkInput {
  data: string; errorColumn?: string; direction?: number[]; sites: 'single' | 'pyrochlore'; meanField: number;
  fitScale: boolean; weight: number; perFormulaUnit: boolean;
}
interface SusceptibilityInput extends BulkInput { temperatureColumn?: string; chiColumn?: string }
interface MagnetizationInput extends BulkInput { temperature: number; fieldColumn?: string; momentColumn?: string }
interface CefFitInput {
  start: string;
  free?: string[];
  bounds?: Record<string, number[]>;
  peaks?: PeakInput[];
  spectra?: SpectrumInput[];
  susceptibility?: SusceptibilityInput[];
  magnetization?: MagnetizationInput[];
  fitWidth: boolean;
  widthStart: number;
  starts: number;
  chi2Margin: number;
  errorScaling: 'data' | 'residual';
  mcmcSteps: number;
  mcmcWalkers?: number;
}

interface SolutionJson {
  B: Record<string, number>;
  errors: Record<string, number | null>;
  chi2: number;
  chi2Reduced: number;
  degreesOfFreedom: number;
  hits: number;
  levelsMeV: number[];
}

export interface CefFitCellResult {
  ion: string;
  symmetry: string;
  best: SolutionJson & {
    freeKeys: string[];
    correlation: number[][];
    chi2ByDataset: { peaks: number; spectra: number[]; susceptibility: number[]; magnetization: number[] };
    /** √weight·(model − data)/σ per point, per dataset. */
    residuals: {
      peaks: { energy: number[]; intensity: (number | null)[] };
      spectra: { temperatureK: number; incidentEnergyMeV: number | null; energiesMeV: number[]; values: number[] }[];
      susceptibility: { temperaturesK: number[]; values: number[] }[];
      magnetization: { temperatureK: number; fieldsT: number[]; values: number[] }[];
    };
    bulkScales: { susceptibility: number[]; magnetization: number[] };
    peaks: { fromLevel: number; toLevel: number; computedMeV: number; computedIntensity: number | null; unassigned: boolean; energyResidual: number }[];
    spectrumScales: number[][];
    intrinsicWidth: { valueMeV: number; errorMeV: number | null } | null;
  };
  minima: SolutionJson[];
  startsRun: number;
  distinctMinimaFound: number;
  hamiltonianEvaluations: number;
  twinFlippedKeys: string[];
  warnings: string[];
  posterior: {
    parameters: Record<string, { mean: number; standardDeviation: number }>;
    derived: Record<string, { mean: number; standardDeviation: number }>;
    acceptanceFraction: number;
    autocorrelationSteps: Record<string, number>;
    sampleCount: number;
  } | null;
}

const finiteOrNull = (x: number) => (Number.isFinite(x) ? x : null);
const levelsClean = (levels: readonly number[]) => levels.map((e) => (Math.abs(e) < 1e-9 ? 0 : e));

function solutionJson(s: CefFitSolution): SolutionJson {
  return {
    B: { ...s.parametersMeV },
    errors: Object.fromEntries(Object.entries(s.errorsMeV).map(([k, v]) => [k, finiteOrNull(v)])),
    chi2: s.chi2,
    chi2Reduced: s.chi2Reduced,
    degreesOfFreedom: s.degreesOfFreedom,
    hits: s.hits,
    levelsMeV: levelsClean(s.levelsMeV),
  };
}

const stevensKey = (key: string) => {
  const index = parseParameterKey(key);
  return index ? parameterKey(index.n, index.m) : undefined;
};

/** Fields shared by the χ(T) and M(B) datasets of a joint fit. */
const BULK_DATASET_FIELDS = {
  errorColumn: { type: 'string', doc: 'Error column (default: the third); same unit as the values.' },
  direction: { type: 'list', of: { type: 'number', doc: 'Component.' }, minItems: 3, maxItems: 3, doc: 'Field direction [x, y, z] in the crystal frame (default: powder).' },
  sites: { type: 'choice', values: ['single', 'pyrochlore'], default: 'single', doc: 'Site frames: one site, or the four ⟨111⟩ frames of the pyrochlore lattice.' },
  meanField: { type: 'number', default: 0, doc: 'Molecular-field constant λ (mol/emu per mole of ions): 1/χ = 1/χ_CEF − λ.' },
  fitScale: { type: 'boolean', default: false, doc: 'Fit a scale factor for this dataset (e.g. an uncertain sample mass).' },
  weight: { type: 'number', min: 0, default: 1, doc: 'Relative weight of this dataset in χ².' },
  perFormulaUnit: { type: 'boolean', default: false, doc: 'The data are per mole of formula units: divided by the sample’s ions per formula unit.' },
} as const;

export const cefFitKind = defineKind<CefFitInput, CefFitCellResult>({
  kind: 'cef-fit',
  summary: 'fit B_n^m to neutron peaks/spectra: Levenberg–Marquardt + multi-start minima, errors, correlations, optional MCMC',
  fields: {
    start: { type: 'reference', kinds: ['crystal-field'], required: true, doc: 'Crystal-field result giving the ion, the site symmetry and the starting (and fixed) parameters.' },
    free: { type: 'list', of: { type: 'string', maxLength: 6, suggestions: CEF_PARAMETER_KEYS, doc: 'A Stevens parameter name.' }, doc: 'Parameters varied by the fit (default: every parameter the symmetry allows).' },
    bounds: {
      type: 'map',
      of: { type: 'list', of: { type: 'quantity', unit: 'meV', doc: 'Bound.' }, minItems: 2, maxItems: 2, doc: '[lower, upper].' },
      key: stevensKey,
      keyText: 'a Stevens parameter name such as B20',
      keySuggestions: CEF_PARAMETER_KEYS,
      doc: 'Bounds per free parameter, e.g. "B20: [-1 meV, 0 meV]". They must contain the start.',
    },
    peaks: {
      type: 'list',
      doc: 'Observed peaks. The peaks of one (temperature, incident energy) group are assigned to distinct computed transitions automatically (optimal matching; the same transition may appear in several groups); from/to pin a peak to the transition between two levels (0 = ground).',
      of: {
        type: 'record',
        doc: 'One peak.',
        fields: {
          energy: { type: 'quantity', unit: 'meV', required: true, doc: 'Peak energy transfer.' },
          error: { type: 'quantity', unit: 'meV', required: true, doc: 'Error of the peak energy (> 0).' },
          intensity: { type: 'number', doc: 'Integrated intensity (relative; a scale per temperature and incident energy is fitted).' },
          intensityError: { type: 'number', doc: 'Error of the intensity (> 0), required with intensity.' },
          temperature: { type: 'quantity', unit: 'K', min: 0, required: true, doc: 'Temperature of the measurement.' },
          incidentEnergy: { type: 'quantity', unit: 'meV', min: 0, doc: 'Incident energy (k_f/k_i and the scale group).' },
          Q: { type: 'quantity', unit: 'angstrom^-1', min: 0, doc: '|Q| of the intensity (form factor).' },
          from: { type: 'integer', min: 0, doc: 'Pin: initial level index (0 = ground).' },
          to: { type: 'integer', min: 0, doc: 'Pin: final level index.' },
        },
      },
    },
    spectra: {
      type: 'list',
      doc: 'Measured spectra from data cells (energy, intensity and error columns); a scale and a flat background per spectrum are fitted.',
      of: {
        type: 'record',
        doc: 'One spectrum.',
        fields: {
          data: { type: 'reference', kinds: ['data'], required: true, doc: 'A data result with the spectrum.' },
          energyColumn: { type: 'string', doc: 'Energy-transfer column (default: the first); its unit must be an energy.' },
          intensityColumn: { type: 'string', doc: 'Intensity column (default: the second).' },
          errorColumn: { type: 'string', doc: 'Error column (default: the third).' },
          temperature: { type: 'quantity', unit: 'K', min: 0, required: true, doc: 'Temperature of the measurement.' },
          incidentEnergy: { type: 'quantity', unit: 'meV', min: 0, doc: 'Incident energy (k_f/k_i).' },
          Q: { type: 'quantity', unit: 'angstrom^-1', min: 0, doc: '|Q| (form factor).' },
          resolution: { type: 'list', of: { type: 'number', doc: 'Coefficient.' }, minItems: 1, default: [0.1], doc: 'FWHM(E) = c0 + c1 E + … in meV.' },
          lineShape: { type: 'choice', values: LINE_SHAPES, default: 'pseudo-voigt', doc: 'Line shape.' },
          intrinsicWidth: { type: 'quantity', unit: 'meV', min: 0, default: '0 meV', doc: 'Intrinsic Lorentzian FWHM.' },
          weight: { type: 'number', min: 0, default: 1, doc: 'Relative weight of this spectrum in χ².' },
          qDirection: { type: 'list', of: { type: 'number', doc: 'Component in the CEF frame.' }, minItems: 3, maxItems: 3, doc: 'Single crystal: Q direction [x, y, z] in the CEF frame (default: powder).' },
        },
      },
    },
    susceptibility: {
      type: 'list',
      doc: 'χ(T) datasets from data cells for a joint fit (Van Vleck χ from the same crystal field, per mole of rare-earth ions).',
      of: {
        type: 'record',
        doc: 'One χ(T) dataset.',
        fields: {
          data: { type: 'reference', kinds: ['data'], required: true, doc: 'A data result: T, χ and error columns.' },
          temperatureColumn: { type: 'string', doc: 'Temperature column (default: the first; unit K).' },
          chiColumn: { type: 'string', doc: 'χ column (default: the second; emu/mol, cm^3/mol or m^3/mol).' },
          ...BULK_DATASET_FIELDS,
        },
      },
    },
    magnetization: {
      type: 'list',
      doc: 'M(B) datasets from data cells for a joint fit (one temperature each; μB per rare-earth ion).',
      of: {
        type: 'record',
        doc: 'One M(B) dataset.',
        fields: {
          data: { type: 'reference', kinds: ['data'], required: true, doc: 'A data result: B, M and error columns.' },
          temperature: { type: 'quantity', unit: 'K', min: 0, required: true, doc: 'Temperature of the measurement (> 0).' },
          fieldColumn: { type: 'string', doc: 'Field column μ0H (default: the first; T, or Oe).' },
          momentColumn: { type: 'string', doc: 'Moment column (default: the second; muB per ion).' },
          ...BULK_DATASET_FIELDS,
        },
      },
    },
    fitWidth: { type: 'boolean', default: false, doc: 'Fit one intrinsic (Lorentzian) FWHM shared by all spectra (bounded to 0 … 20 meV).' },
    widthStart: { type: 'quantity', unit: 'meV', min: 0, max: 20, default: '0.2 meV', doc: 'Starting intrinsic width when fitWidth is true.' },
    starts: { type: 'integer', min: 0, max: 10000, default: 0, doc: 'Random starts of the global search besides the start parameters (0: a local fit only).' },
    chi2Margin: { type: 'number', min: 0, default: 1, doc: 'Report minima with χ² ≤ χ²_best + max(margin, 0.2 χ²_best).' },
    errorScaling: { type: 'choice', values: ['data', 'residual'], default: 'data', doc: "Parameter errors from the data errors as given ('data') or inflated by χ²_red ('residual')." },
    mcmcSteps: { type: 'integer', min: 0, max: 1000000, default: 0, doc: 'Ensemble MCMC steps per walker after burn-in (0: no sampling).' },
    mcmcWalkers: { type: 'integer', min: 2, max: 1000, doc: 'Number of walkers (default max(2·free + 2, 16)).' },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  check(input, ctx) {
    if ([input.peaks, input.spectra, input.susceptibility, input.magnetization].every((list) => (list ?? []).length === 0))
      ctx.fail('peaks', input.peaks, 'at least one peak, spectrum, susceptibility or magnetization dataset (no data to fit)');
    (input.magnetization ?? []).forEach((d, i) => {
      if (!(d.temperature > 0)) ctx.fail(`magnetization.${i}.temperature`, d.temperature, 'a temperature > 0 K');
    });
    (input.peaks ?? []).forEach((p, i) => {
      if ((p.from === undefined) !== (p.to === undefined)) ctx.fail(`peaks.${i}.from`, p.from, 'both from and to (a pinned transition), or neither');
    });
  },
  async run(input, ctx) {
    const start = ctx.result<{ ion: string; symmetry: string; parametersMeV: Record<string, number> }>(input.start);
    const peaks: PeakObservation[] = (input.peaks ?? []).map((p) => ({
      energyMeV: p.energy,
      errorMeV: p.error,
      intensity: p.intensity,
      intensityError: p.intensityError,
      temperatureK: p.temperature,
      incidentEnergyMeV: p.incidentEnergy,
      qInvAngstrom: p.Q,
      transition: p.from !== undefined && p.to !== undefined ? { fromLevel: p.from, toLevel: p.to } : undefined,
    }));
    const spectra: SpectrumObservation[] = (input.spectra ?? []).map((s, i) => {
      const data = ctx.result<DatasetResult>(s.data);
      const column = (name: string | undefined, fallback: number, field: string) => {
        const c = name === undefined ? data.columns[fallback] : data.columns.find((col) => col.name === name);
        if (!c) ctx.fail(`spectra.${i}.${field}`, name, `a column of ${s.data} (${data.columns.map((col) => col.name).join(', ')})`);
        return c!;
      };
      const energy = column(s.energyColumn, 0, 'energyColumn');
      let energiesMeV: number[];
      try {
        energiesMeV = energy.values.map((v) => convertValue(v, energy.unit, 'meV'));
      } catch {
        ctx.fail(`spectra.${i}.energyColumn`, energy.unit, 'an energy column (e.g. unit meV)');
      }
      return {
        temperatureK: s.temperature,
        energiesMeV: energiesMeV!,
        intensity: [...column(s.intensityColumn, 1, 'intensityColumn').values],
        error: [...column(s.errorColumn, 2, 'errorColumn').values],
        incidentEnergyMeV: s.incidentEnergy,
        qInvAngstrom: s.Q,
        resolution: { fwhmPolynomialMeV: s.resolution },
        lineShape: s.lineShape,
        intrinsicFwhmMeV: s.intrinsicWidth,
        weight: s.weight,
        qDirection: s.qDirection as [number, number, number] | undefined,
      };
    });
    const perIon = (d: BulkInput) => (d.perFormulaUnit ? 1 / (ctx.sampleIfDefined()?.ionsPerFormulaUnit ?? 1) : 1);
    const direction = (d: BulkInput) => (d.direction ? ([...d.direction] as [number, number, number]) : ('powder' as const));
    const susceptibility: SusceptibilityObservation[] = (input.susceptibility ?? []).map((d, i) => {
      const f = `susceptibility.${i}`;
      const scale = perIon(d);
      return {
        temperaturesK: dataColumn(ctx, d.data, d.temperatureColumn, 0, `${f}.temperatureColumn`, 'K'),
        chiEmuPerMol: dataColumn(ctx, d.data, d.chiColumn, 1, `${f}.chiColumn`, 'emu/mol', susceptibilityToEmuPerMol).map((v) => v * scale),
        errorEmuPerMol: dataColumn(ctx, d.data, d.errorColumn, 2, `${f}.errorColumn`, 'emu/mol', susceptibilityToEmuPerMol).map((v) => v * scale),
        direction: direction(d),
        sites: d.sites,
        meanFieldMolPerEmu: d.meanField,
        fitScale: d.fitScale,
        weight: d.weight,
      };
    });
    const magnetization: MagnetizationObservation[] = (input.magnetization ?? []).map((d, i) => {
      const f = `magnetization.${i}`;
      const scale = perIon(d);
      return {
        temperatureK: d.temperature,
        fieldsT: dataColumn(ctx, d.data, d.fieldColumn, 0, `${f}.fieldColumn`, 'T'),
        momentMuB: dataColumn(ctx, d.data, d.momentColumn, 1, `${f}.momentColumn`, 'muB').map((v) => v * scale),
        errorMuB: dataColumn(ctx, d.data, d.errorColumn, 2, `${f}.errorColumn`, 'muB').map((v) => v * scale),
        direction: direction(d),
        sites: d.sites,
        meanFieldMolPerEmu: d.meanField,
        fitScale: d.fitScale,
        weight: d.weight,
      };
    });
    const bounds = input.bounds ? Object.fromEntries(Object.entries(input.bounds).map(([k, v]) => [k, [v[0]!, v[1]!] as [number, number]])) : undefined;
    const spec: CefFitSpec = {
      ion: start.ion, symmetry: start.symmetry, start: start.parametersMeV, free: input.free, bounds, peaks, spectra, susceptibility, magnetization,
      fitIntrinsicWidth: input.fitWidth, intrinsicWidthStartMeV: input.widthStart,
    };
    // The fit pauses before every start, LM iteration and MCMC step; the host's event loop gets a turn about every
    // 50 ms (progress displays go out, interrupts and comms are served), otherwise the pause costs one microtask.
    let lastYield = performance.now();
    const yieldNow = async (): Promise<void> => {
      if (performance.now() - lastYield < 50) return;
      await ctx.yieldNow();
      lastYield = performance.now();
    };
    const report = await fitCefAsync(spec, { starts: input.starts, seed: ctx.seed, chi2Margin: input.chi2Margin, errorScaling: input.errorScaling, task: ctx.task, yieldNow });
    let posterior: CefFitCellResult['posterior'] = null;
    if (input.mcmcSteps > 0) {
      const p = await sampleCefPosteriorAsync(spec, report.best, { steps: input.mcmcSteps, walkers: input.mcmcWalkers, seed: ctx.seed, task: ctx.task, yieldNow });
      posterior = {
        parameters: p.parameters,
        derived: p.derived,
        acceptanceFraction: p.acceptanceFraction,
        autocorrelationSteps: p.autocorrelationSteps,
        sampleCount: p.sampleCount,
      };
    }
    const best = report.best;
    return {
      ion: start.ion,
      symmetry: start.symmetry,
      best: {
        ...solutionJson(best),
        freeKeys: [...best.freeKeys],
        correlation: best.correlation.map((row) => row.map((v) => (Number.isFinite(v) ? v : 0))),
        chi2ByDataset: {
          peaks: best.chi2ByDataset.peaks,
          spectra: [...best.chi2ByDataset.spectra],
          susceptibility: [...best.chi2ByDataset.susceptibility],
          magnetization: [...best.chi2ByDataset.magnetization],
        },
        residuals: {
          peaks: { energy: [...best.residualsByDataset.peaks.energy], intensity: [...best.residualsByDataset.peaks.intensity] },
          spectra: spectra.map((sp, k) => ({
            temperatureK: sp.temperatureK,
            incidentEnergyMeV: sp.incidentEnergyMeV ?? null,
            energiesMeV: [...sp.energiesMeV],
            values: [...best.residualsByDataset.spectra[k]!],
          })),
          susceptibility: susceptibility.map((d, k) => ({ temperaturesK: [...d.temperaturesK], values: [...best.residualsByDataset.susceptibility[k]!] })),
          magnetization: magnetization.map((d, k) => ({ temperatureK: d.temperatureK, fieldsT: [...d.fieldsT], values: [...best.residualsByDataset.magnetization[k]!] })),
        },
        bulkScales: { susceptibility: [...best.bulkScales.susceptibility], magnetization: [...best.bulkScales.magnetization] },
        peaks: best.peakAssignments.map((a, i) => ({
          fromLevel: a.fromLevel,
          toLevel: a.toLevel,
          computedMeV: a.computedMeV,
          computedIntensity: a.computedIntensity ?? null,
          unassigned: a.unassigned,
          energyResidual: best.peakEnergyResiduals[i]!,
        })),
        spectrumScales: best.spectrumScales.map((s) => [...s]),
        intrinsicWidth: best.intrinsicWidth ? { valueMeV: best.intrinsicWidth.valueMeV, errorMeV: finiteOrNull(best.intrinsicWidth.errorMeV) } : null,
      },
      minima: report.minima.map(solutionJson),
      startsRun: report.startsRun,
      distinctMinimaFound: report.distinctMinimaFound,
      hamiltonianEvaluations: report.hamiltonianEvaluations,
      twinFlippedKeys: [...report.twinFlippedKeys],
      warnings: [...report.warnings],
      posterior,
    };
  },
  render(r, info) {
    const b = r.best;
    const paramColumns = [{ name: 'parameter' }, { name: 'value', unit: 'meV' }, { name: '± 1σ', unit: 'meV' }];
    const paramRows = b.freeKeys.map((k) => [k, b.B[k] ?? 0, b.errors[k] === null ? '∞ (undetermined)' : (b.errors[k] as number)]);
    const minimaColumns = [{ name: '#' }, { name: 'χ²_red' }, { name: 'hits' }, ...b.freeKeys.map((k) => ({ name: k, unit: 'meV' }))];
    const minimaRows = r.minima.map((m, i) => [String(i + 1), m.chi2Reduced, String(m.hits), ...b.freeKeys.map((k) => m.B[k] ?? 0)]);
    const summary = `cef fit ${info.name}: ${r.ion} in ${r.symmetry}, χ²_red = ${formatNumber(b.chi2Reduced, 4)} (ν = ${b.degreesOfFreedom}); ${r.minima.length} minimum(a) within the margin of ${r.distinctMinimaFound} found from ${r.startsRun} start(s)`;
    const datasetEntries: [string, string][] = [
      ['χ² (peaks)', formatNumber(b.chi2ByDataset.peaks)],
      ...b.residuals.spectra.map((sp, i): [string, string] => {
        const rms = Math.sqrt(b.chi2ByDataset.spectra[i]! / sp.values.length);
        const worst = sp.values.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
        return [`χ² (spectrum ${i}, ${formatNumber(sp.temperatureK, 4)} K)`, `${formatNumber(b.chi2ByDataset.spectra[i]!)} over ${sp.values.length} points; rms residual ${formatNumber(rms, 3)} σ, largest ${formatNumber(worst, 3)} σ`];
      }),
      ...b.chi2ByDataset.susceptibility.map((c, i): [string, string] => [`χ² (χ(T) ${i})`, `${formatNumber(c)} over ${b.residuals.susceptibility[i]!.values.length} points; scale ${formatNumber(b.bulkScales.susceptibility[i]!, 5)}`]),
      ...b.chi2ByDataset.magnetization.map((c, i): [string, string] => [`χ² (M(B) ${i}, ${formatNumber(b.residuals.magnetization[i]!.temperatureK, 4)} K)`, `${formatNumber(c)} over ${b.residuals.magnetization[i]!.values.length} points; scale ${formatNumber(b.bulkScales.magnetization[i]!, 5)}`]),
    ];
    const text = [
      summary, textTable(paramColumns, paramRows, 30), 'minima:', textTable(minimaColumns, minimaRows, 10),
      ...datasetEntries.map(([k, v]) => `${k}: ${v}`), ...r.warnings.map((w) => `warning: ${w}`),
    ].join('\n');
    const entries: [string, string][] = [
      ['levels', b.levelsMeV.map((e) => formatNumber(e, 4)).join(', ') + ' meV'],
      ...datasetEntries,
      ['H_CEF evaluations', String(r.hamiltonianEvaluations)],
    ];
    if (b.intrinsicWidth) entries.push(['intrinsic FWHM', `${formatNumber(b.intrinsicWidth.valueMeV, 4)} ± ${b.intrinsicWidth.errorMeV === null ? '∞ (undetermined)' : formatNumber(b.intrinsicWidth.errorMeV, 2)} meV`]);
    if (r.posterior)
      for (const [k, v] of Object.entries(r.posterior.derived)) entries.push([`posterior ${k}`, `${formatNumber(v.mean, 5)} ± ${formatNumber(v.standardDeviation, 2)}`]);
    const html = [
      `<div class="multiplet-cef-fit"><p><b>${escapeHtml(info.name)}</b>: ${escapeHtml(summary)}</p>`,
      htmlTable('best fit', paramColumns, paramRows),
      htmlTable('distinct minima', minimaColumns, minimaRows),
      htmlKeyValue('details', entries),
      r.warnings.length ? `<ul class="multiplet-warnings">${r.warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join('')}</ul>` : '',
      '</div>',
    ].join('');
    const values = b.peaks.map((p, i) => ({ peak: i, computedMeV: p.computedMeV, residual: p.energyResidual }));
    const peakPlot = {
      description: `peak residuals of ${info.name}`,
      width: 320,
      height: 200,
      data: { values },
      mark: { type: 'point', filled: true },
      encoding: {
        x: { field: 'computedMeV', type: 'quantitative', title: 'computed E (meV)' },
        y: { field: 'residual', type: 'quantitative', title: '(E_calc − E_obs)/σ' },
        tooltip: [{ field: 'peak', type: 'quantitative' }, { field: 'residual', type: 'quantitative' }],
      },
    };
    // Residuals of each spectrum against energy, one colour per dataset.
    const spectrumValues = b.residuals.spectra.flatMap((sp, k) =>
      sp.energiesMeV.map((e, i) => ({ dataset: `spectrum ${k} (${formatNumber(sp.temperatureK, 4)} K)`, energyMeV: e, residual: sp.values[i] })),
    );
    const spectrumPlot = {
      description: `spectrum residuals of ${info.name}, per dataset`,
      width: 320,
      height: 200,
      data: { values: spectrumValues },
      mark: { type: 'line', point: true },
      encoding: {
        x: { field: 'energyMeV', type: 'quantitative', title: 'E (meV)' },
        y: { field: 'residual', type: 'quantitative', title: '√w (model − data)/σ' },
        color: { field: 'dataset', type: 'nominal' },
      },
    };
    const schema = 'https://vega.github.io/schema/vega-lite/v5.json';
    const plots = [...(values.length ? [peakPlot] : []), ...(spectrumValues.length ? [spectrumPlot] : [])];
    const vegaLite = plots.length > 1 ? { $schema: schema, vconcat: plots } : { $schema: schema, ...(plots[0] ?? peakPlot) };
    return { text, html, vegaLite };
  },
});
