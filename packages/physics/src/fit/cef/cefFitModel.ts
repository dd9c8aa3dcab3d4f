/**
 * The crystal-field fit model behind fitCef and sampleCefPosterior: validation of the fit specification, the scaled
 * parameter space, and the weighted residuals of peak lists (with automatic, optimal peak assignment) and measured
 * spectra (with profiled scale factors and backgrounds).
 *
 * Scaled parameters: x_k = B_k · ‖O_k‖, where ‖O_k‖ is the largest |eigenvalue| of the Stevens operator for the ion's
 * J. A unit change of x_k moves levels by at most ~1 meV, so B20 (~0.1 meV) and B66 (~1e-5 meV) become comparable,
 * which is what the finite differences, the random starts and the LM scaling need.
 *
 * Assignment (common practice in CEF analyses, made optimal here): within each (temperature, incident energy) group
 * the observed peaks are matched to distinct visible computed transitions by minimising Σ ((E_obs − E_calc)/σ)² with
 * the Hungarian method (solveAssignment); pinned peaks keep their (from, to) levels. The same transition may appear
 * in several groups (e.g. one line measured with two incident energies at one temperature). While a Jacobian is taken the assignment is frozen,
 * so that finite differences see a smooth function.
 *
 * Intensity scales are profiled out in closed form (variable projection: Golub & Pereyra, SIAM J. Numer. Anal. 10,
 * 413 (1973)) — one per (temperature, incident energy) group of peaks, and a scale plus a flat background per
 * spectrum — and are counted in the degrees of freedom.
 */
import { InputError } from '../../errors';
import { getIon, type Ion } from '../../ions';
import { allowedParameters, CUBIC_SYMMETRIES, normalizeCefParameters, type CefParameters } from '../../cef';
import { stevensOperator } from '../../cef/stevensOperator';
import { parseParameterKey, parameterKey } from '../../cef/parameterKeys';
import { EigenWorkspace, hermitianEigen } from '../../linalg/hermitianEigen';
import { levelPopulations, levelStrengths, levelStrengthsAlong, type LevelStrengths } from '../../neutron/cefTransitions';
import { magneticFormFactor } from '../../neutron/magneticFormFactor';
import { checkSpectrumOptions, spectrumFromTransitions, type NeutronSpectrumOptions } from '../../neutron/neutronSpectrum';
import { thermalTransitions } from '../../neutron/cefTransitions';
import { LINE_SHAPES, type LineShapeKind } from '../../neutron/lineShape';
import { solveAssignment } from '../solveAssignment';
import { magnetization as thermoMagnetization, vanVleckSusceptibility, type SiteFrameName } from '../../thermo';

/** One observed peak. */
export interface PeakObservation {
  readonly energyMeV: number;
  readonly errorMeV: number;
  /** Integrated intensity (any consistent unit within a temperature/incident-energy group). */
  readonly intensity?: number;
  readonly intensityError?: number;
  readonly temperatureK: number;
  readonly incidentEnergyMeV?: number;
  readonly qInvAngstrom?: number;
  /** Pin this peak to the transition between two levels (0 = ground level), instead of automatic assignment. */
  readonly transition?: { readonly fromLevel: number; readonly toLevel: number };
}

/** One measured spectrum: intensity ± error on an energy grid. */
export interface SpectrumObservation {
  readonly temperatureK: number;
  readonly energiesMeV: readonly number[];
  readonly intensity: readonly number[];
  readonly error: readonly number[];
  readonly incidentEnergyMeV?: number;
  readonly qInvAngstrom?: number;
  readonly resolution?: { readonly fwhmPolynomialMeV: readonly number[] };
  readonly lineShape?: LineShapeKind;
  readonly intrinsicFwhmMeV?: number;
  /** Single crystal: Q direction [x, y, z] in the CEF frame (default: powder average). */
  readonly qDirection?: readonly [number, number, number];
  /** Relative weight of this dataset in χ² (default 1). */
  readonly weight?: number;
}

/** A susceptibility dataset χ(T) for joint fits (per mole of rare-earth ions, CGS emu/mol). */
export interface SusceptibilityObservation {
  readonly temperaturesK: readonly number[];
  readonly chiEmuPerMol: readonly number[];
  readonly errorEmuPerMol: readonly number[];
  /** Field direction in the crystal frame, or 'powder' (default). */
  readonly direction?: readonly [number, number, number] | 'powder';
  /** Site frames as in thermo/siteFrames (default 'single'). */
  readonly sites?: SiteFrameName;
  /** Molecular-field constant λ (mol/emu): 1/χ = 1/χ_CEF − λ. Default 0. */
  readonly meanFieldMolPerEmu?: number;
  /** Fit a scale factor for this dataset (profiled). Default false. */
  readonly fitScale?: boolean;
  readonly weight?: number;
}

/** A magnetization dataset M(B) at one temperature for joint fits (μB per rare-earth ion). */
export interface MagnetizationObservation {
  readonly temperatureK: number;
  readonly fieldsT: readonly number[];
  readonly momentMuB: readonly number[];
  readonly errorMuB: readonly number[];
  readonly direction?: readonly [number, number, number] | 'powder';
  readonly sites?: SiteFrameName;
  readonly meanFieldMolPerEmu?: number;
  readonly fitScale?: boolean;
  readonly weight?: number;
}

/** What to fit. Parameters in meV (convert at the edges with normalizeCefParameters). */
export interface CefFitSpec {
  readonly ion: string | Ion;
  readonly symmetry: string;
  /** Starting (and fixed) parameters, meV. */
  readonly start: Readonly<Record<string, number>>;
  /** Keys varied by the fit (default: every parameter the symmetry allows with rank n ≤ 2J). */
  readonly free?: readonly string[];
  /** Bounds per free key, [lower, upper] meV. */
  readonly bounds?: Readonly<Record<string, readonly [number, number]>>;
  readonly peaks?: readonly PeakObservation[];
  readonly spectra?: readonly SpectrumObservation[];
  /**
   * Fit one intrinsic (Lorentzian) FWHM shared by all spectra, starting from `intrinsicWidthStartMeV`
   * (default 0.2 meV), bounded to [0, 20] meV; it replaces the spectra's own intrinsicFwhmMeV.
   */
  readonly fitIntrinsicWidth?: boolean;
  readonly intrinsicWidthStartMeV?: number;
  /** Bulk data for joint fits (thermo module: Van Vleck χ and M(B) from the same crystal field). */
  readonly susceptibility?: readonly SusceptibilityObservation[];
  readonly magnetization?: readonly MagnetizationObservation[];
}

interface PreparedPeak {
  readonly index: number;
  readonly energyMeV: number;
  readonly errorMeV: number;
  readonly intensity?: number;
  readonly intensityError?: number;
  readonly temperatureK: number;
  readonly group: number;
  /** f(Q)² k_f/k_i at the observed energy. */
  readonly factor: number;
  readonly pin?: { readonly fromLevel: number; readonly toLevel: number };
}

/** Where one peak ended up at a given parameter set. */
export interface PeakAssignment {
  readonly fromLevel: number;
  readonly toLevel: number;
  readonly computedMeV: number;
  /** Computed intensity × the group's profiled scale (undefined without an observed intensity). */
  readonly computedIntensity?: number;
  /** True when no visible transition was left for this peak (residual against the nearest transition of any strength). */
  readonly unassigned: boolean;
}

/** Evaluation of the model at one parameter set. */
export interface CefModelEvaluation {
  readonly residuals: Float64Array;
  readonly assignments: PeakAssignment[];
  /** Profiled scale per peak group. */
  readonly peakScales: number[];
  /** Profiled [scale, background] per spectrum. */
  readonly spectrumScales: [number, number][];
  readonly peakChi2: number;
  readonly spectrumChi2: number[];
  /** χ² and profiled scale (1 unless fitted) per susceptibility and magnetization dataset. */
  readonly bulkChi2: { susceptibility: number[]; magnetization: number[] };
  readonly bulkScales: { susceptibility: number[]; magnetization: number[] };
  readonly levels: LevelStrengths;
}

const MIN_RELATIVE_POPULATION = 1e-4;
const MIN_RELATIVE_WEIGHT = 1e-3;
const UNASSIGNED_COST = 1e12;

function finiteNumber(value: unknown, field: string, expected: string, test: (v: number) => boolean = () => true): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || !test(value)) throw new InputError(field, value, expected);
  return value;
}

/** The validated, prepared fit problem. */
export class CefFitModel {
  readonly ion: Ion;
  readonly symmetry: string;
  readonly freeKeys: string[];
  readonly fixed: Record<string, number>;
  /** ‖O_k‖ per free key. */
  readonly norms: Float64Array;
  /** Parameters tied to another one by the site symmetry: key → [source key, factor] (cubic B44, B64). */
  readonly ties: Record<string, [string, number]>;
  /** Index of the shared intrinsic width in the parameter vector (after the B's), or −1 when not fitted. */
  readonly widthIndex: number;
  /** Length of the parameter vector: free B's plus the width if fitted. */
  readonly parameterCount: number;
  /** Scaled start, lower and upper bounds (finite: a user bound or the default search box). */
  readonly startScaled: Float64Array;
  readonly lowerScaled: Float64Array;
  readonly upperScaled: Float64Array;
  readonly peaks: PreparedPeak[];
  readonly peakGroups: { temperatureK: number; incidentEnergyMeV?: number; hasIntensity: boolean }[];
  readonly spectra: SpectrumObservation[];
  readonly susceptibility: SusceptibilityObservation[];
  readonly magnetization: MagnetizationObservation[];
  readonly residualCount: number;
  /** Profiled linear parameters (scales and backgrounds), for the degrees of freedom. */
  readonly profiledCount: number;
  hamiltonianEvaluations = 0;
  private frozen: PeakAssignment[] | undefined;
  private workspace: EigenWorkspace | undefined;
  /** Populations per temperature for the levels being evaluated (reset by evaluate). */
  private populationCache = new Map<number, Float64Array>();

  constructor(spec: CefFitSpec) {
    if (spec === null || typeof spec !== 'object') throw new InputError('spec', spec, 'a fit specification object');
    this.ion = typeof spec.ion === 'string' ? getIon(spec.ion) : spec.ion;
    if (typeof spec.symmetry !== 'string') throw new InputError('symmetry', spec.symmetry, 'a site symmetry such as D3d');
    const allowedAll = allowedParameters(spec.symmetry);
    this.symmetry = spec.symmetry;
    // Cubic sites: B44 = 5 B40 and B64 = −21 B60 (Hutchings 1964 eq. 6.2) are tied, not free.
    const cubic = CUBIC_SYMMETRIES.some((c) => c.toLowerCase() === String(spec.symmetry).trim().toLowerCase());
    this.ties = cubic ? { B44: ['B40', 5], B64: ['B60', -21] } : {};
    const allowed = allowedAll.filter((key) => !(key in this.ties));
    const start = normalizeCefParameters((spec.start ?? {}) as Record<string, unknown>, { symmetry: spec.symmetry, field: 'start' });
    // Default: every parameter the symmetry allows that acts on this J (rank n ≤ 2J).
    const defaultFree = allowed.filter((key) => parseParameterKey(key)!.n <= 2 * this.ion.J);
    const free = (spec.free ?? defaultFree).map((key, k) => {
      const index = typeof key === 'string' ? parseParameterKey(key) : undefined;
      if (!index) throw new InputError(`free[${k}]`, key, 'a Stevens parameter name such as B20 or B43');
      const canonical = parameterKey(index.n, index.m);
      if (canonical in this.ties)
        throw new InputError(`free[${k}]`, key, `a free parameter of ${spec.symmetry} symmetry (${canonical} is tied: ${canonical} = ${this.ties[canonical][1]}·${this.ties[canonical][0]})`);
      if (!allowed.includes(canonical))
        throw new InputError(`free[${k}]`, key, `a parameter allowed by ${spec.symmetry} site symmetry (${allowed.join(', ')})`);
      return canonical;
    });
    if (new Set(free).size !== free.length) throw new InputError('free', spec.free, 'each parameter at most once');
    if (free.length === 0) throw new InputError('free', spec.free, 'at least one free parameter');
    this.freeKeys = free;
    this.fixed = {};
    for (const [key, value] of Object.entries(start)) if (!free.includes(key)) this.fixed[key] = value;

    this.norms = Float64Array.from(free, (key, k) => {
      const { n, m } = parseParameterKey(key)!;
      const values = hermitianEigen(stevensOperator(this.ion.J, n, m), { vectors: false }).values;
      const norm = Math.max(Math.abs(values[0]), Math.abs(values[values.length - 1]));
      if (!(norm > 0)) throw new InputError(`free[${k}]`, key, `a parameter that acts on J = ${this.ion.J} (rank ${n} > 2J vanishes)`);
      return norm;
    });

    // Data.
    const peaksIn = spec.peaks ?? [];
    const spectraIn = spec.spectra ?? [];
    if (!Array.isArray(peaksIn)) throw new InputError('peaks', peaksIn, 'a list of peaks');
    if (!Array.isArray(spectraIn)) throw new InputError('spectra', spectraIn, 'a list of spectra');
    const groupKeys = new Map<string, number>();
    this.peakGroups = [];
    this.peaks = peaksIn.map((peak, i) => {
      const f = `peaks[${i}]`;
      if (peak === null || typeof peak !== 'object') throw new InputError(f, peak, 'a peak {energyMeV, errorMeV, temperatureK, …}');
      const energyMeV = finiteNumber(peak.energyMeV, `${f}.energyMeV`, 'a finite energy in meV');
      const errorMeV = finiteNumber(peak.errorMeV, `${f}.errorMeV`, 'a positive error in meV', (v) => v > 0);
      const temperatureK = finiteNumber(peak.temperatureK, `${f}.temperatureK`, 'a temperature ≥ 0 K', (v) => v >= 0);
      let intensity: number | undefined;
      let intensityError: number | undefined;
      if (peak.intensity !== undefined || peak.intensityError !== undefined) {
        intensity = finiteNumber(peak.intensity, `${f}.intensity`, 'a finite intensity (given together with intensityError)');
        intensityError = finiteNumber(peak.intensityError, `${f}.intensityError`, 'a positive intensity error', (v) => v > 0);
      }
      const ei = peak.incidentEnergyMeV === undefined ? undefined : finiteNumber(peak.incidentEnergyMeV, `${f}.incidentEnergyMeV`, 'a positive energy in meV', (v) => v > 0);
      if (ei !== undefined && energyMeV >= ei) throw new InputError(`${f}.energyMeV`, energyMeV, `an energy transfer below the incident energy ${ei} meV`);
      const q = peak.qInvAngstrom === undefined ? undefined : finiteNumber(peak.qInvAngstrom, `${f}.qInvAngstrom`, 'Q ≥ 0 in Å⁻¹', (v) => v >= 0);
      let pin: PreparedPeak['pin'];
      if (peak.transition !== undefined) {
        const from = peak.transition?.fromLevel;
        const to = peak.transition?.toLevel;
        if (!Number.isInteger(from) || !Number.isInteger(to) || from < 0 || to < 0 || from === to)
          throw new InputError(`${f}.transition`, peak.transition, 'level indices {fromLevel, toLevel}, distinct integers ≥ 0 (0 = ground level)');
        pin = { fromLevel: from, toLevel: to };
      }
      const key = `${temperatureK}|${ei ?? ''}`;
      let group = groupKeys.get(key);
      if (group === undefined) {
        group = this.peakGroups.length;
        groupKeys.set(key, group);
        this.peakGroups.push({ temperatureK, incidentEnergyMeV: ei, hasIntensity: false });
      }
      if (intensity !== undefined) this.peakGroups[group].hasIntensity = true;
      const ff = q === undefined ? 1 : magneticFormFactor(this.ion.name, q) ** 2;
      const kfki = ei === undefined ? 1 : Math.sqrt(1 - energyMeV / ei);
      return { index: i, energyMeV, errorMeV, intensity, intensityError, temperatureK, group, factor: ff * kfki, pin };
    });
    const pinKeys = new Set<string>();
    this.peaks.forEach((p) => {
      if (!p.pin) return;
      const key = `${p.group}|${p.pin.fromLevel}|${p.pin.toLevel}`;
      if (pinKeys.has(key)) throw new InputError(`peaks[${p.index}].transition`, p.pin, 'a transition not pinned by another peak at the same temperature and incident energy');
      pinKeys.add(key);
    });
    this.spectra = spectraIn.map((s, k) => {
      const f = `spectra[${k}]`;
      if (s === null || typeof s !== 'object') throw new InputError(f, s, 'a spectrum {temperatureK, energiesMeV, intensity, error}');
      checkSpectrumOptions({ temperatureK: s.temperatureK, energiesMeV: s.energiesMeV, qInvAngstrom: s.qInvAngstrom, incidentEnergyMeV: s.incidentEnergyMeV, resolution: s.resolution, lineShape: s.lineShape, intrinsicFwhmMeV: s.intrinsicFwhmMeV }, f);
      const n = s.energiesMeV.length;
      if (!Array.isArray(s.intensity) || s.intensity.length !== n) throw new InputError(`${f}.intensity`, s.intensity, `${n} intensities, one per energy`);
      if (!Array.isArray(s.error) || s.error.length !== n) throw new InputError(`${f}.error`, s.error, `${n} errors, one per energy`);
      (s.intensity as readonly number[]).forEach((v: number, i: number) => finiteNumber(v, `${f}.intensity[${i}]`, 'a finite intensity'));
      (s.error as readonly number[]).forEach((v: number, i: number) => finiteNumber(v, `${f}.error[${i}]`, 'a positive error', (e) => e > 0));
      if (s.weight !== undefined) finiteNumber(s.weight, `${f}.weight`, 'a positive weight', (v) => v > 0);
      if (s.lineShape !== undefined && !LINE_SHAPES.includes(s.lineShape)) throw new InputError(`${f}.lineShape`, s.lineShape, LINE_SHAPES.join(', '));
      if (s.qDirection !== undefined) {
        const q = s.qDirection as unknown;
        if (!Array.isArray(q) || q.length !== 3 || !q.every((v) => typeof v === 'number' && Number.isFinite(v)) || Math.hypot(...(q as number[])) === 0)
          throw new InputError(`${f}.qDirection`, q, 'a non-zero [x, y, z] in the CEF frame');
      }
      return s;
    });
    const sameLength = (f: string, values: unknown, n: number, what: string, test: (v: number) => boolean = () => true) => {
      if (!Array.isArray(values) || values.length !== n) throw new InputError(f, values, `${n} values (${what}), one per point`);
      values.forEach((v, i) => finiteNumber(v, `${f}[${i}]`, what, test));
    };
    const checkBulkCommon = (f: string, d: { direction?: unknown; weight?: unknown; meanFieldMolPerEmu?: unknown }) => {
      if (d.direction !== undefined && d.direction !== 'powder' && !(Array.isArray(d.direction) && d.direction.length === 3 && d.direction.every((v) => typeof v === 'number' && Number.isFinite(v)) && Math.hypot(...(d.direction as number[])) > 0))
        throw new InputError(`${f}.direction`, d.direction, "'powder' or a non-zero [x, y, z]");
      if (d.weight !== undefined) finiteNumber(d.weight, `${f}.weight`, 'a positive weight', (v) => v > 0);
      if (d.meanFieldMolPerEmu !== undefined) finiteNumber(d.meanFieldMolPerEmu, `${f}.meanFieldMolPerEmu`, 'a finite λ in mol/emu');
    };
    const susceptibilityIn = spec.susceptibility ?? [];
    const magnetizationIn = spec.magnetization ?? [];
    if (!Array.isArray(susceptibilityIn)) throw new InputError('susceptibility', susceptibilityIn, 'a list of χ(T) datasets');
    if (!Array.isArray(magnetizationIn)) throw new InputError('magnetization', magnetizationIn, 'a list of M(B) datasets');
    this.susceptibility = susceptibilityIn.map((d, k) => {
      const f = `susceptibility[${k}]`;
      if (d === null || typeof d !== 'object') throw new InputError(f, d, 'a dataset {temperaturesK, chiEmuPerMol, errorEmuPerMol}');
      const n = Array.isArray(d.temperaturesK) ? d.temperaturesK.length : 0;
      if (n === 0) throw new InputError(`${f}.temperaturesK`, d.temperaturesK, 'a non-empty list of temperatures in K');
      sameLength(`${f}.temperaturesK`, d.temperaturesK, n, 'a temperature > 0 K', (v) => v > 0);
      sameLength(`${f}.chiEmuPerMol`, d.chiEmuPerMol, n, 'a finite χ in emu/mol');
      sameLength(`${f}.errorEmuPerMol`, d.errorEmuPerMol, n, 'a positive error in emu/mol', (v) => v > 0);
      checkBulkCommon(f, d);
      return d;
    });
    this.magnetization = magnetizationIn.map((d, k) => {
      const f = `magnetization[${k}]`;
      if (d === null || typeof d !== 'object') throw new InputError(f, d, 'a dataset {temperatureK, fieldsT, momentMuB, errorMuB}');
      finiteNumber(d.temperatureK, `${f}.temperatureK`, 'a temperature > 0 K', (v) => v > 0);
      const n = Array.isArray(d.fieldsT) ? d.fieldsT.length : 0;
      if (n === 0) throw new InputError(`${f}.fieldsT`, d.fieldsT, 'a non-empty list of fields in T');
      sameLength(`${f}.fieldsT`, d.fieldsT, n, 'a finite field in T');
      sameLength(`${f}.momentMuB`, d.momentMuB, n, 'a finite moment in μB per ion');
      sameLength(`${f}.errorMuB`, d.errorMuB, n, 'a positive error in μB', (v) => v > 0);
      checkBulkCommon(f, d);
      return d;
    });
    if (peaksIn.length === 0 && spectraIn.length === 0 && this.susceptibility.length === 0 && this.magnetization.length === 0)
      throw new InputError('peaks', peaksIn, 'at least one observed peak, spectrum or bulk dataset (no data to fit)');
    this.residualCount =
      this.peaks.reduce((s, p) => s + (p.intensity === undefined ? 1 : 2), 0) +
      this.spectra.reduce((s, sp) => s + sp.energiesMeV.length, 0) +
      this.susceptibility.reduce((s, d) => s + d.temperaturesK.length, 0) +
      this.magnetization.reduce((s, d) => s + d.fieldsT.length, 0);
    this.profiledCount =
      this.peakGroups.filter((g) => g.hasIntensity).length + 2 * this.spectra.length +
      [...this.susceptibility, ...this.magnetization].filter((d) => d.fitScale).length;

    // Search box: a user bound, else |B_k| ‖O_k‖ ≤ 1.5 × (largest observed energy, at least 5 meV).
    const largestEnergy = Math.max(5, ...this.peaks.map((p) => Math.abs(p.energyMeV)), ...this.spectra.map((s) => Math.max(...s.energiesMeV.map(Math.abs))));
    const box = 1.5 * largestEnergy;
    const bounds = spec.bounds ?? {};
    if (bounds === null || typeof bounds !== 'object') throw new InputError('bounds', bounds, 'an object {B20: [lower, upper], …} in meV');
    for (const key of Object.keys(bounds)) {
      const index = parseParameterKey(key);
      if (!index || !free.includes(parameterKey(index.n, index.m))) throw new InputError(`bounds.${key}`, bounds[key], `bounds for a free parameter (${free.join(', ')})`);
    }
    const boundOf = (key: string): readonly [number, number] | undefined =>
      Object.entries(bounds).find(([k]) => {
        const index = parseParameterKey(k);
        return index !== undefined && parameterKey(index.n, index.m) === key;
      })?.[1];
    if (spec.fitIntrinsicWidth !== undefined && typeof spec.fitIntrinsicWidth !== 'boolean') throw new InputError('fitIntrinsicWidth', spec.fitIntrinsicWidth, 'true or false');
    const fitWidth = spec.fitIntrinsicWidth === true;
    if (fitWidth && this.spectra.length === 0) throw new InputError('fitIntrinsicWidth', true, 'spectra to fit a line width to');
    const widthStart = spec.intrinsicWidthStartMeV ?? 0.2;
    if (fitWidth) finiteNumber(widthStart, 'intrinsicWidthStartMeV', 'a width in [0, 20] meV', (v) => v >= 0 && v <= 20);
    this.widthIndex = fitWidth ? free.length : -1;
    this.parameterCount = free.length + (fitWidth ? 1 : 0);
    this.startScaled = new Float64Array(this.parameterCount);
    this.lowerScaled = new Float64Array(this.parameterCount);
    this.upperScaled = new Float64Array(this.parameterCount);
    if (fitWidth) {
      this.startScaled[this.widthIndex] = widthStart;
      this.lowerScaled[this.widthIndex] = 0;
      this.upperScaled[this.widthIndex] = 20;
    }
    free.forEach((key, k) => {
      const startMeV = start[key] ?? 0;
      const x = startMeV * this.norms[k];
      this.startScaled[k] = x;
      const b = boundOf(key);
      if (b) {
        if (!Array.isArray(b) || b.length !== 2 || !b.every((v) => typeof v === 'number' && !Number.isNaN(v)) || !(b[0] < b[1]))
          throw new InputError(`bounds.${key}`, b, '[lower, upper] in meV with lower < upper');
        if (startMeV < b[0] || startMeV > b[1]) throw new InputError(`bounds.${key}`, b, `bounds that contain the start value ${startMeV} meV`);
        this.lowerScaled[k] = Number.isFinite(b[0]) ? b[0] * this.norms[k] : Math.min(-box, x);
        this.upperScaled[k] = Number.isFinite(b[1]) ? b[1] * this.norms[k] : Math.max(box, x);
      } else {
        this.lowerScaled[k] = Math.min(-box, x);
        this.upperScaled[k] = Math.max(box, x);
      }
    });
  }

  /** Full parameter set in meV for scaled free values x. */
  parametersMeV(x: ArrayLike<number>): Record<string, number> {
    const out: Record<string, number> = { ...this.fixed };
    this.freeKeys.forEach((key, k) => (out[key] = x[k] / this.norms[k]));
    for (const [key, [source, factor]] of Object.entries(this.ties)) if (out[source] !== undefined) out[key] = factor * out[source];
    return out;
  }

  /** Degrees of freedom: residuals − free parameters − profiled scales/backgrounds. */
  get degreesOfFreedom(): number {
    return this.residualCount - this.parameterCount - this.profiledCount;
  }

  /** Residuals only (what the optimiser sees). */
  residuals(x: Float64Array): Float64Array {
    return this.evaluate(x).residuals;
  }

  /** Run `body` with the peak assignment frozen at the one found at x. */
  withFrozenAssignment<T>(x: Float64Array, body: () => T): T {
    this.frozen = this.evaluate(x).assignments;
    try {
      return body();
    } finally {
      this.frozen = undefined;
    }
  }

  /** Per-peak computed (unscaled) intensity for an assignment, and the profiled scale of each peak group. */
  private profileScales(levels: LevelStrengths, assignments: PeakAssignment[]): { scales: number[]; computed: Float64Array } {
    const L = levels.groups.length;
    const sums = this.peakGroups.map(() => ({ num: 0, den: 0 }));
    const computed = new Float64Array(this.peaks.length);
    for (const p of this.peaks) {
      const a = assignments[p.index];
      const population = this.populations(levels, p.temperatureK);
      computed[p.index] = a.fromLevel < L && a.toLevel < L ? population[a.fromLevel] * levels.pairStrengths[a.toLevel * L + a.fromLevel] * p.factor : 0;
      if (p.intensity !== undefined) {
        const w = 1 / (p.intensityError! * p.intensityError!);
        sums[p.group].num += w * p.intensity * computed[p.index];
        sums[p.group].den += w * computed[p.index] * computed[p.index];
      }
    }
    return { scales: sums.map((g) => (g.den > 0 ? g.num / g.den : 0)), computed };
  }

  /**
   * Optimal assignment of the peaks of each (temperature, incident energy) group to distinct visible transitions. Cost: ((E_obs − E)/σ_E)²,
   * plus ((s·I − I_obs)/σ_I)² when group scales s are given and the peak has an intensity.
   */
  private assignPeaks(levels: LevelStrengths, scales: number[] | undefined): PeakAssignment[] {
    const L = levels.groups.length;
    const assignments: PeakAssignment[] = new Array(this.peaks.length);
    for (let group = 0; group < this.peakGroups.length; group++) {
      const population = this.populations(levels, this.peakGroups[group].temperatureK);
      const weightOf = (a: number, b: number) => population[a] * levels.pairStrengths[b * L + a];
      const energyOf = (a: number, b: number) => levels.levelEnergiesMeV[b] - levels.levelEnergiesMeV[a];
      const atT = this.peaks.filter((p) => p.group === group);
      const pinned = new Set<string>();
      for (const p of atT) {
        if (!p.pin) continue;
        const { fromLevel, toLevel } = p.pin;
        if (fromLevel >= L || toLevel >= L)
          throw new InputError(`peaks[${p.index}].transition`, p.pin, `level indices below ${L} (this ion has ${L} levels at these parameters)`);
        pinned.add(`${fromLevel}|${toLevel}`);
        assignments[p.index] = { fromLevel, toLevel, computedMeV: energyOf(fromLevel, toLevel), unassigned: false };
      }
      const free = atT.filter((p) => !p.pin);
      if (free.length === 0) continue;
      let reused = false;
      if (this.frozen) {
        reused = free.every((p) => {
          const a = this.frozen![p.index];
          return a && !a.unassigned && a.fromLevel < L && a.toLevel < L;
        });
        if (reused)
          for (const p of free) {
            const a = this.frozen[p.index];
            assignments[p.index] = { fromLevel: a.fromLevel, toLevel: a.toLevel, computedMeV: energyOf(a.fromLevel, a.toLevel), unassigned: false };
          }
      }
      if (reused) continue;
      let maxWeight = 0;
      for (let a = 0; a < L; a++) for (let b = 0; b < L; b++) if (a !== b) maxWeight = Math.max(maxWeight, weightOf(a, b));
      const candidates: [number, number][] = [];
      for (let a = 0; a < L; a++) {
        if (population[a] < MIN_RELATIVE_POPULATION * population[0]) continue;
        for (let b = 0; b < L; b++)
          if (a !== b && !pinned.has(`${a}|${b}`) && weightOf(a, b) >= MIN_RELATIVE_WEIGHT * maxWeight) candidates.push([a, b]);
      }
      const columns = Math.max(candidates.length, free.length);
      const cost = free.map((p) =>
        Array.from({ length: columns }, (_, c) => {
          if (c >= candidates.length) return UNASSIGNED_COST;
          const [a, b] = candidates[c];
          let value = ((p.energyMeV - energyOf(a, b)) / p.errorMeV) ** 2;
          if (scales && p.intensity !== undefined) value += ((scales[p.group] * weightOf(a, b) * p.factor - p.intensity) / p.intensityError!) ** 2;
          return Math.min(value, UNASSIGNED_COST / 2);
        }),
      );
      const chosen = solveAssignment(cost);
      free.forEach((p, r) => {
        const c = chosen[r];
        if (c < candidates.length) {
          const [a, b] = candidates[c];
          assignments[p.index] = { fromLevel: a, toLevel: b, computedMeV: energyOf(a, b), unassigned: false };
        } else {
          // No visible transition left: compare with the nearest transition of any strength (honest large residual).
          let best: [number, number] = [0, Math.min(1, L - 1)];
          let bestDistance = Infinity;
          for (let a = 0; a < L; a++)
            for (let b = 0; b < L; b++) {
              if (a === b) continue;
              const d = Math.abs(energyOf(a, b) - p.energyMeV);
              if (d < bestDistance) {
                bestDistance = d;
                best = [a, b];
              }
            }
          assignments[p.index] = { fromLevel: best[0], toLevel: best[1], computedMeV: L > 1 ? energyOf(...best) : 0, unassigned: true };
        }
      });
    }

    return assignments;
  }

  private populations(levels: LevelStrengths, temperatureK: number): Float64Array {
    let p = this.populationCache.get(temperatureK);
    if (!p) {
      p = levelPopulations(levels, temperatureK);
      this.populationCache.set(temperatureK, p);
    }
    return p;
  }

  /** Full evaluation at scaled parameters x. */
  evaluate(x: ArrayLike<number>): CefModelEvaluation {
    this.hamiltonianEvaluations++;
    const parameters: CefParameters = this.parametersMeV(x);
    this.workspace ??= new EigenWorkspace(Math.round(2 * this.ion.J) + 1);
    const levels = levelStrengths(this.ion, parameters, { workspace: this.workspace });
    this.populationCache.clear();
    const L = levels.groups.length;
    const residuals = new Float64Array(this.residualCount);

    // --- peaks: assignment by energy, then again with the intensities at the scales this gives (two near-coincident
    // lines are then told apart by their intensities), then the final scales.
    let assignments = this.assignPeaks(levels, undefined);
    if (this.peaks.some((p) => p.intensity !== undefined)) assignments = this.assignPeaks(levels, this.profileScales(levels, assignments).scales);
    const { scales: peakScales, computed } = this.profileScales(levels, assignments);

    // --- peak residuals
    let offset = 0;
    let peakChi2 = 0;
    for (const p of this.peaks) {
      const a = assignments[p.index];
      const r = (a.computedMeV - p.energyMeV) / p.errorMeV;
      residuals[offset++] = r;
      peakChi2 += r * r;
      if (p.intensity !== undefined) {
        const model = peakScales[p.group] * computed[p.index];
        assignments[p.index] = { ...a, computedIntensity: model };
        const ri = (model - p.intensity) / p.intensityError!;
        residuals[offset++] = ri;
        peakChi2 += ri * ri;
      }
    }

    // --- spectra: S(E) per dataset, then the best scale s and background c by weighted linear least squares
    const spectrumScales: [number, number][] = [];
    const spectrumChi2: number[] = [];
    for (const s of this.spectra) {
      const options: NeutronSpectrumOptions = {
        temperatureK: s.temperatureK,
        energiesMeV: s.energiesMeV,
        qInvAngstrom: s.qInvAngstrom,
        incidentEnergyMeV: s.incidentEnergyMeV,
        resolution: s.resolution,
        lineShape: s.lineShape,
        intrinsicFwhmMeV: this.widthIndex >= 0 ? x[this.widthIndex] : s.intrinsicFwhmMeV,
      };
      const along = s.qDirection ? levelStrengthsAlong(levels, s.qDirection) : levels;
      const model = spectrumFromTransitions(this.ion, thermalTransitions(along, s.temperatureK), options).intensity;
      const weight = s.weight ?? 1;
      let sw = 0, sm = 0, smm = 0, sy = 0, smy = 0;
      for (let i = 0; i < model.length; i++) {
        const w = 1 / (s.error[i] * s.error[i]);
        sw += w;
        sm += w * model[i];
        smm += w * model[i] * model[i];
        sy += w * s.intensity[i];
        smy += w * model[i] * s.intensity[i];
      }
      const det = smm * sw - sm * sm;
      const scale = det > 0 ? (smy * sw - sm * sy) / det : 0;
      const background = det > 0 ? (smm * sy - sm * smy) / det : sy / sw;
      spectrumScales.push([scale, background]);
      let chi2 = 0;
      for (let i = 0; i < model.length; i++) {
        const r = (Math.sqrt(weight) * (scale * model[i] + background - s.intensity[i])) / s.error[i];
        residuals[offset++] = r;
        chi2 += r * r;
      }
      spectrumChi2.push(chi2);
    }
    // --- bulk data (joint fits): χ(T) and M(B) from the thermo module with the same parameters
    const single = { J: this.ion.J, gJ: this.ion.gJ, parametersMeV: parameters };
    const bulk = (model: ArrayLike<number>, data: readonly number[], errors: readonly number[], fitScale: boolean | undefined, weight: number | undefined) => {
      let scale = 1;
      if (fitScale) {
        let num = 0, den = 0;
        for (let i = 0; i < data.length; i++) {
          const w = 1 / (errors[i] * errors[i]);
          num += w * model[i] * data[i];
          den += w * model[i] * model[i];
        }
        scale = den > 0 ? num / den : 1;
      }
      let chi2 = 0;
      const root = Math.sqrt(weight ?? 1);
      for (let i = 0; i < data.length; i++) {
        const r = (root * (scale * model[i] - data[i])) / errors[i];
        residuals[offset++] = r;
        chi2 += r * r;
      }
      return { chi2, scale };
    };
    const bulkChi2 = { susceptibility: [] as number[], magnetization: [] as number[] };
    const bulkScales = { susceptibility: [] as number[], magnetization: [] as number[] };
    for (const d of this.susceptibility) {
      const chi = vanVleckSusceptibility(single, { temperaturesK: d.temperaturesK, direction: d.direction ?? 'powder', sites: d.sites, meanFieldMolPerEmu: d.meanFieldMolPerEmu }).chiEmuPerMol;
      const { chi2, scale } = bulk(chi, d.chiEmuPerMol, d.errorEmuPerMol, d.fitScale, d.weight);
      bulkChi2.susceptibility.push(chi2);
      bulkScales.susceptibility.push(scale);
    }
    for (const d of this.magnetization) {
      const m = thermoMagnetization(single, { temperaturesK: [d.temperatureK], fieldsT: d.fieldsT, direction: d.direction ?? 'powder', sites: d.sites, meanFieldMolPerEmu: d.meanFieldMolPerEmu }).magnetizationMuB[0];
      const { chi2, scale } = bulk(m, d.momentMuB, d.errorMuB, d.fitScale, d.weight);
      bulkChi2.magnetization.push(chi2);
      bulkScales.magnetization.push(scale);
    }
    return { residuals, assignments, peakScales, spectrumScales, peakChi2, spectrumChi2, bulkChi2, bulkScales, levels };
  }
}
