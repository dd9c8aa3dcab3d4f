/**
 * `multiplet compute cef-fit`: fit Stevens parameters to neutron peak lists (and/or spectra), with a global search
 * reporting every distinct minimum and, on request, posterior sampling.
 *
 * Input (JSON object):
 *   ion, symmetry                                                                            required
 *   start       {B20: …} starting and fixed parameters, in `unit` (default meV)              required
 *   unit        energy unit of start and bounds (default meV)
 *   free        keys varied (default: all the symmetry allows)
 *   bounds      {B20: [lower, upper]} in `unit`
 *   peaks       [{energyMeV, errorMeV, intensity?, intensityError?, temperatureK, incidentEnergyMeV?, qInvAngstrom?,
 *                 transition?: {fromLevel, toLevel}}]
 *   spectra     [{temperatureK, energiesMeV, intensity, error, incidentEnergyMeV?, qInvAngstrom?, resolution?, lineShape?,
 *                 intrinsicFwhmMeV?, weight?}]
 *   susceptibility [{temperaturesK, chiEmuPerMol, errorEmuPerMol, direction? ('powder' | [x,y,z]), sites?, meanFieldMolPerEmu?,
 *                 fitScale?, weight?}]   fitIntrinsicWidth (one Lorentzian FWHM for all spectra), intrinsicWidthStartMeV
 *   magnetization [{temperatureK, fieldsT, momentMuB, errorMuB, direction?, …}] (joint fits)
 *   seed (default 0), starts (random starts besides `start`, default 0), chi2Margin (default 1),
 *   errorScaling ('data' default | 'residual'), mcmc {steps, walkers?, burnIn?, thin?, seed?} (optional)
 * Output: best {B (meV), errors (meV, 1σ), chi2, chi2Reduced, degreesOfFreedom, correlation, freeKeys, levelsMeV, peaks,
 * chi2ByDataset, residualsByDataset, peakScales, spectrumScales}, minima [{B, errors, chi2, chi2Reduced, hits, levelsMeV}],
 * hamiltonianEvaluations, startsRun, distinctMinimaFound, warnings, posterior (with mcmc).
 */
import { InputError } from '@multiplet/physics/errors';
import { normalizeCefParameters } from '@multiplet/physics/cef';
import { energyToMeV, parseEnergyUnit, ACCEPTED_ENERGY_UNITS } from '@multiplet/physics/units';
import { fitCef, type CefFitSolution, type CefFitSpec } from '@multiplet/physics/fit/fitCef';
import { sampleCefPosterior } from '@multiplet/physics/fit/sampleCefPosterior';
import type { ComputeKind } from './index';
import { checkFields, optionalInteger } from './inputs';

const FIELDS = ['ion', 'symmetry', 'start', 'unit', 'free', 'bounds', 'peaks', 'spectra', 'susceptibility', 'magnetization', 'fitIntrinsicWidth', 'intrinsicWidthStartMeV', 'seed', 'starts', 'chi2Margin', 'errorScaling', 'mcmc'];

function solutionJson(s: CefFitSolution) {
  return {
    B: s.parametersMeV,
    errors: s.errorsMeV,
    chi2: s.chi2,
    chi2Reduced: s.chi2Reduced,
    degreesOfFreedom: s.degreesOfFreedom,
    hits: s.hits,
    levelsMeV: s.levelsMeV,
  };
}

export const cefFit: ComputeKind = {
  summary: 'Fit B_n^m to neutron peaks/spectra: LM + multi-start minima, errors, correlations, optional ensemble MCMC',
  run(input) {
    checkFields(input, FIELDS);
    if (typeof input.symmetry !== 'string') throw new InputError('symmetry', input.symmetry, 'a site symmetry such as "D3d"');
    const unitName = input.unit === undefined ? 'meV' : input.unit;
    const unit = typeof unitName === 'string' ? parseEnergyUnit(unitName) : undefined;
    if (!unit) throw new InputError('unit', unitName, `an energy unit, one of ${ACCEPTED_ENERGY_UNITS.join(', ')}`);
    const startIn = input.start;
    if (startIn === null || typeof startIn !== 'object' || Array.isArray(startIn)) throw new InputError('start', startIn, 'an object of starting Stevens parameters');
    const start = normalizeCefParameters(startIn as Record<string, unknown>, { unit: unitName as string, symmetry: input.symmetry, field: 'start' });
    if (input.free !== undefined && !Array.isArray(input.free)) throw new InputError('free', input.free, 'a list of parameter names');
    let bounds: Record<string, [number, number]> | undefined;
    if (input.bounds !== undefined) {
      if (input.bounds === null || typeof input.bounds !== 'object' || Array.isArray(input.bounds)) throw new InputError('bounds', input.bounds, 'an object {B20: [lower, upper]}');
      bounds = {};
      for (const [key, value] of Object.entries(input.bounds as Record<string, unknown>)) {
        if (!Array.isArray(value) || value.length !== 2 || !value.every((v) => typeof v === 'number'))
          throw new InputError(`bounds.${key}`, value, `[lower, upper] in ${unitName}`);
        bounds[key] = [energyToMeV(value[0], unit), energyToMeV(value[1], unit)];
      }
    }
    if (input.peaks !== undefined && !Array.isArray(input.peaks)) throw new InputError('peaks', input.peaks, 'a list of peaks');
    if (input.spectra !== undefined && !Array.isArray(input.spectra)) throw new InputError('spectra', input.spectra, 'a list of spectra');
    if (input.susceptibility !== undefined && !Array.isArray(input.susceptibility)) throw new InputError('susceptibility', input.susceptibility, 'a list of χ(T) datasets');
    if (input.magnetization !== undefined && !Array.isArray(input.magnetization)) throw new InputError('magnetization', input.magnetization, 'a list of M(B) datasets');
    if (input.errorScaling !== undefined && input.errorScaling !== 'data' && input.errorScaling !== 'residual')
      throw new InputError('errorScaling', input.errorScaling, "'data' or 'residual'");
    if (input.chi2Margin !== undefined && (typeof input.chi2Margin !== 'number' || !(input.chi2Margin >= 0)))
      throw new InputError('chi2Margin', input.chi2Margin, 'a number ≥ 0');
    const spec: CefFitSpec = {
      ion: input.ion as string,
      symmetry: input.symmetry,
      start,
      free: input.free as string[] | undefined,
      bounds,
      peaks: input.peaks as CefFitSpec['peaks'],
      spectra: input.spectra as CefFitSpec['spectra'],
      susceptibility: input.susceptibility as CefFitSpec['susceptibility'],
      magnetization: input.magnetization as CefFitSpec['magnetization'],
      fitIntrinsicWidth: input.fitIntrinsicWidth as boolean | undefined,
      intrinsicWidthStartMeV: input.intrinsicWidthStartMeV as number | undefined,
    };
    const seed = optionalInteger(input, 'seed', 0) ?? 0;
    const report = fitCef(spec, {
      seed,
      starts: optionalInteger(input, 'starts', 0) ?? 0,
      chi2Margin: input.chi2Margin as number | undefined,
      errorScaling: input.errorScaling as 'data' | 'residual' | undefined,
    });
    let posterior: unknown;
    if (input.mcmc !== undefined) {
      const m = input.mcmc;
      if (m === null || typeof m !== 'object' || Array.isArray(m)) throw new InputError('mcmc', m, 'an object {steps, walkers?, burnIn?, thin?, seed?}');
      const mc = m as Record<string, unknown>;
      for (const key of Object.keys(mc)) if (!['steps', 'walkers', 'burnIn', 'thin', 'seed'].includes(key)) throw new InputError(`mcmc.${key}`, mc[key], 'one of steps, walkers, burnIn, thin, seed');
      const int = (key: string, min: number) => optionalInteger(mc, key, min, `mcmc.${key}`);
      const result = sampleCefPosterior(spec, report.best, {
        steps: int('steps', 1),
        walkers: int('walkers', 2),
        burnIn: int('burnIn', 0),
        thin: int('thin', 1),
        seed: int('seed', 0) ?? seed,
      });
      posterior = {
        parameters: result.parameters,
        correlation: result.correlation,
        derived: result.derived,
        acceptanceFraction: result.acceptanceFraction,
        autocorrelationSteps: result.autocorrelationSteps,
        sampleCount: result.sampleCount,
      };
    }
    const best = report.best;
    return {
      energyUnit: 'meV',
      best: {
        ...solutionJson(best),
        freeKeys: best.freeKeys,
        correlation: best.correlation,
        chi2ByDataset: best.chi2ByDataset,
        residualsByDataset: best.residualsByDataset,
        peaks: best.peakAssignments.map((a, i) => ({ ...a, energyResidual: best.peakEnergyResiduals[i] })),
        peakScales: best.peakScales,
        spectrumScales: best.spectrumScales,
        bulkScales: best.bulkScales,
        intrinsicWidth: best.intrinsicWidth ?? null,
      },
      minima: report.minima.map(solutionJson),
      startsRun: report.startsRun,
      distinctMinimaFound: report.distinctMinimaFound,
      hamiltonianEvaluations: report.hamiltonianEvaluations,
      twinFlippedKeys: report.twinFlippedKeys,
      warnings: report.warnings,
      ...(posterior ? { posterior } : {}),
    };
  },
};
