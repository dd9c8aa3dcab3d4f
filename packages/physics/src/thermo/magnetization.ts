import { InputError } from '../errors';
import { NO_TASK, type LongTask } from '../progress';
import { inversionHalf, lebedevGrid, type SphereGrid } from '../quadrature';
import { reducePowderGrid } from './internal/powderSymmetry';
import { PreparedIon, thermalMoment, unitVector, type SingleIonInput } from './internal/singleIon';
import { teslaPerMuB, totalMeanFieldMolPerEmu, type Demagnetization } from './internal/meanField';
import { numberArray, temperatureArray } from './internal/validate';
import { siteFrames, toLocal, type Rotation3, type SiteFrameName } from './siteFrames';

export type { SingleIonInput } from './internal/singleIon';

/** Powder-average settings: a fixed Lebedev–Laikov degree, or a relative tolerance reached by successive degrees. */
export interface PowderOptions {
  /** Use this Lebedev–Laikov degree (the smallest stored one ≥ it). */
  degree?: number;
  /**
   * Otherwise: increase the degree along POWDER_DEGREE_SEQUENCE until max|ΔM| ≤ tolerance·max|M| per temperature
   * between successive degrees (default 1e-4), judged on 12 fields spread over the list (ends included); the whole
   * curve is then computed at the degree reached. The change estimates the error of the coarser grid, so the result
   * is usually well inside the tolerance.
   */
  tolerance?: number;
  /** Or any grid of unit vectors with weights adding up to 1 (its inversion half is used when it has one). */
  grid?: SphereGrid;
}

export interface MagnetizationOptions {
  temperaturesK: ArrayLike<number>;
  fieldsT: ArrayLike<number>;
  /** Field direction in the global (crystal) frame, or 'powder'. */
  direction: readonly [number, number, number] | 'powder';
  /** Site frames (default 'single'); see siteFrames. */
  sites?: SiteFrameName | readonly Rotation3[];
  powder?: PowderOptions;
  /** Molecular-field constant λ in mol/emu per mole of ions (B_eff = B + λM); default 0. */
  meanFieldMolPerEmu?: number;
  /** Demagnetising correction (applied field → internal field); default none. */
  demagnetization?: Demagnetization;
  task?: LongTask;
}

export interface MagnetizationResult {
  /** M along the field in μB per rare-earth ion: one array per temperature, one value per field. */
  magnetizationMuB: Float64Array[];
  temperaturesK: Float64Array;
  fieldsT: Float64Array;
  /** Powder only: the grid used (full-grid name and degree), the directions computed (all grids, after symmetry
   *  reduction), and the last change between successive degrees relative to max|M| (0 for a fixed degree or grid). */
  powder?: {
    grid: string;
    degree: number;
    directionsComputed: number;
    /** Symmetry operations merged (2 = time reversal alone; up to 48 for a cubic site): see the description. */
    symmetryOperations: number;
    relativeChange: number;
    converged: boolean;
  };
  /** Number of Hamiltonians diagonalised. */
  diagonalisations: number;
}

/** Lebedev–Laikov degrees tried, in order, when the powder average is chosen by tolerance (points roughly ×1.6). */
export const POWDER_DEGREE_SEQUENCE: readonly number[] = [11, 17, 23, 29, 35, 41, 53, 65, 83, 101, 131];

/** Number of fields (spread over the list) on which the tolerance search compares successive degrees. */
const SEARCH_FIELDS = 12;

/**
 * Magnetization M(B, T) of a rare-earth ion in its crystal field, in μB per ion, along the applied field.
 *
 * At each field the single-ion Hamiltonian H = H_CEF − g_J μB B·J (DEVELOPERS.md § Conventions) is diagonalised
 * exactly and M = g_J Σ_k p_k ⟨k|B̂·J|k⟩ with Boltzmann populations p_k (the moment's component along the field;
 * e.g. Jensen & Mackintosh, "Rare Earth Magnetism", ch. 1). With several site frames (e.g. the four ⟨111⟩ frames of
 * the pyrochlore lattice) the field is rotated into each local frame, B_local = R_sᵀ B, and M is the site average.
 * Powder: the spherical mean of M(B n̂) over a Lebedev–Laikov grid. M∥(−n̂) = M∥(n̂) since M(−B) = −M(B) (time
 * reversal; H_CEF is even in J), and M∥(R n̂) = M∥(n̂) for every rotation R with D(R) H_CEF D(R)† = H_CEF; the grid
 * (oriented with its cube axes, or its cube [111], along the local axes) is reduced to one direction per orbit of
 * these operations, with the orbit's weight — 2 operations for a triclinic site, 12 for D3d, 48 for a cubic one.
 * Without a molecular field the powder mean is the same for any set of site frames (rotation invariance of the
 * sphere), so a single site is used; with one and several sites only the inversion half is used.
 * Optional corrections (off by default): molecular field λ and demagnetisation, B_eff = B + (λ − 4πN/V_m) M,
 * solved self-consistently along the field for each field, temperature and direction (mean-field approximation).
 *
 * Units: fields in T (the applied μ0H), temperatures in K (> 0), M in μB per rare-earth ion.
 *
 * @example magnetization({ J: 7.5, gJ: 4 / 3, parametersMeV: { B20: -0.05 } }, { temperaturesK: [2], fieldsT: [1, 5], direction: 'powder' })
 * @throws InputError for T ≤ 0, an empty field list, an unknown direction, bad powder options or bad sites.
 * See also: vanVleckSusceptibility, siteFrames, lebedevGrid, POWDER_DEGREE_SEQUENCE.
 */
export function magnetization(ion: SingleIonInput, options: MagnetizationOptions): MagnetizationResult {
  if (options === null || typeof options !== 'object') throw new InputError('options', options, 'an object { temperaturesK, fieldsT, direction }');
  const prepared = new PreparedIon(ion);
  const temperatures = temperatureArray(options.temperaturesK);
  const fields = numberArray(options.fieldsT, 'fieldsT', 'fields in T');
  const frames = siteFrames(options.sites ?? 'single');
  const lambda = teslaPerMuB(totalMeanFieldMolPerEmu(options.meanFieldMolPerEmu, options.demagnetization));
  const task = options.task ?? NO_TASK;

  if (options.direction !== 'powder') {
    if (options.powder !== undefined) throw new InputError('powder', options.powder, 'no powder options unless direction is "powder"');
    const n = unitVector(options.direction, 'direction');
    const m = crystalCurve(prepared, frames, n, temperatures, fields, lambda, task);
    return { magnetizationMuB: m, temperaturesK: temperatures, fieldsT: fields, diagonalisations: prepared.diagonalisations };
  }

  const powder = options.powder ?? {};
  if (powder === null || typeof powder !== 'object') throw new InputError('powder', powder, 'an object { degree } or { tolerance }');
  if ([powder.degree, powder.tolerance, powder.grid].filter((x) => x !== undefined).length > 1)
    throw new InputError('powder', powder, 'one of degree, tolerance or grid');
  // One site (or no molecular field, when every site gives the same powder mean): the single-site function M∥(n̂)
  // in the local frame, whose symmetry group reduces the grid. Several coupled sites: the inversion half only.
  const singleSite = lambda === 0 || frames.length === 1;
  const effectiveFrames = singleSite ? [IDENTITY] : frames;
  let symmetryOperations = 2;
  const reduce = (grid: SphereGrid): SphereGrid => {
    if (!singleSite) return inversionHalf(grid);
    const reduced = reducePowderGrid(prepared, grid);
    symmetryOperations = 2 * reduced.rotations;
    return reduced.grid;
  };
  const mean = (grid: SphereGrid, fieldsT = fields) => powderCurve(prepared, effectiveFrames, grid, temperatures, fieldsT, lambda, task);

  if (powder.grid !== undefined) {
    const grid = checkGrid(powder.grid);
    let used: SphereGrid;
    try {
      used = inversionHalf(grid);
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      used = grid;
    }
    const m = powderCurve(prepared, effectiveFrames, used, temperatures, fields, lambda, task);
    return {
      magnetizationMuB: m, temperaturesK: temperatures, fieldsT: fields, diagonalisations: prepared.diagonalisations,
      powder: { grid: grid.name, degree: grid.degree, directionsComputed: used.count, symmetryOperations: used === grid ? 1 : 2, relativeChange: 0, converged: true },
    };
  }

  if (powder.degree !== undefined) {
    const grid = lebedevGrid(powder.degree);
    const used = reduce(grid);
    const m = mean(used);
    return {
      magnetizationMuB: m, temperaturesK: temperatures, fieldsT: fields, diagonalisations: prepared.diagonalisations,
      powder: { grid: grid.name, degree: grid.degree, directionsComputed: used.count, symmetryOperations, relativeChange: 0, converged: true },
    };
  }
  const tolerance = powder.tolerance ?? 1e-4;
  if (typeof tolerance !== 'number' || !(tolerance > 0) || !Number.isFinite(tolerance)) throw new InputError('powder.tolerance', tolerance, 'a relative tolerance > 0');
  // The degree is searched on a subset of at most SEARCH_FIELDS fields spread over the list (ends included), then the
  // whole curve is computed once at the degree found: the search costs a fraction of one full curve.
  const searchFields =
    fields.length <= SEARCH_FIELDS ? fields : Float64Array.from({ length: SEARCH_FIELDS }, (_, i) => fields[Math.round((i * (fields.length - 1)) / (SEARCH_FIELDS - 1))]);
  let previous: Float64Array[] | undefined;
  let grid = lebedevGrid(POWDER_DEGREE_SEQUENCE[0]);
  let used = reduce(grid);
  let current = mean(used, searchFields);
  let change = Infinity;
  let computed = used.count;
  for (let k = 1; k < POWDER_DEGREE_SEQUENCE.length; k++) {
    previous = current;
    grid = lebedevGrid(POWDER_DEGREE_SEQUENCE[k]);
    used = reduce(grid);
    current = mean(used, searchFields);
    computed += used.count;
    change = relativeChange(previous, current);
    if (change <= tolerance) break;
  }
  if (searchFields !== fields) {
    current = mean(used);
    computed += used.count;
  }
  return {
    magnetizationMuB: current, temperaturesK: temperatures, fieldsT: fields, diagonalisations: prepared.diagonalisations,
    powder: { grid: grid.name, degree: grid.degree, directionsComputed: computed, symmetryOperations, relativeChange: change, converged: change <= tolerance },
  };
}

const IDENTITY: Rotation3 = [[1, 0, 0], [0, 1, 0], [0, 0, 1]];

function checkGrid(grid: SphereGrid): SphereGrid {
  const ok =
    grid !== null && typeof grid === 'object' && grid.directions instanceof Float64Array && grid.weights instanceof Float64Array &&
    Number.isInteger(grid.count) && grid.count > 0 && grid.directions.length === 3 * grid.count && grid.weights.length === grid.count;
  if (!ok) throw new InputError('powder.grid', grid, 'a SphereGrid { name, degree, count, directions (3·count), weights (count) }');
  const total = grid.weights.reduce((s, w) => s + w, 0);
  if (Math.abs(total - 1) > 1e-9) throw new InputError('powder.grid.weights', total, 'weights adding up to 1');
  return grid;
}

/** max over curves of max|a − b| / max|b| (per temperature curve). */
function relativeChange(a: Float64Array[], b: Float64Array[]): number {
  let worst = 0;
  for (let t = 0; t < a.length; t++) {
    let scale = 0, diff = 0;
    for (let f = 0; f < a[t].length; f++) {
      scale = Math.max(scale, Math.abs(b[t][f]));
      diff = Math.max(diff, Math.abs(a[t][f] - b[t][f]));
    }
    worst = Math.max(worst, scale > 0 ? diff / scale : diff);
  }
  return worst;
}

function powderCurve(
  ion: PreparedIon, frames: readonly Rotation3[], half: SphereGrid, temperatures: Float64Array, fields: Float64Array, lambda: number, task: LongTask,
): Float64Array[] {
  const out = Array.from(temperatures, () => new Float64Array(fields.length));
  for (let d = 0; d < half.count; d++) {
    task.checkpoint();
    const n: [number, number, number] = [half.directions[3 * d], half.directions[3 * d + 1], half.directions[3 * d + 2]];
    const m = crystalCurve(ion, frames, n, temperatures, fields, lambda, task);
    const w = half.weights[d];
    for (let t = 0; t < temperatures.length; t++) for (let f = 0; f < fields.length; f++) out[t][f] += w * m[t][f];
    task.report(d + 1, half.count, 'powder directions');
  }
  return out;
}

/** M along a global direction n for a crystal with the given site frames (site average), all T and B. */
function crystalCurve(
  ion: PreparedIon, frames: readonly Rotation3[], n: readonly number[], temperatures: Float64Array, fields: Float64Array, lambda: number, task: LongTask,
): Float64Array[] {
  const ops = frames.map((r) => ion.projection(toLocal(r, n)));
  const out = Array.from(temperatures, () => new Float64Array(fields.length));
  if (lambda === 0) {
    for (let f = 0; f < fields.length; f++) {
      for (const op of ops) {
        const { energies, projections } = ion.levelsAlong(op, fields[f]);
        for (let t = 0; t < temperatures.length; t++) out[t][f] += thermalMoment(ion.gJ, energies, projections, temperatures[t]) / ops.length;
      }
    }
    return out;
  }
  const saturation = ion.gJ * ion.J;
  for (let t = 0; t < temperatures.length; t++) {
    const at = (bEff: number) => {
      let m = 0;
      for (const op of ops) {
        const { energies, projections } = ion.levelsAlong(op, bEff);
        m += thermalMoment(ion.gJ, energies, projections, temperatures[t]);
      }
      return m / ops.length;
    };
    for (let f = 0; f < fields.length; f++) {
      task.checkpoint();
      out[t][f] = selfConsistent(at, fields[f], lambda, Math.abs(saturation));
    }
  }
  return out;
}

/**
 * Solve M = f(B + λM) for M along the field. f is non-decreasing (∂M/∂B = χ ≥ 0). λ < 0 (antiferromagnetic or
 * demagnetising): g(M) = M − f(B + λM) increases monotonically, one root, found by the Illinois variant of regula
 * falsi on [−M_sat, M_sat] (Dowell & Jarratt, BIT 11, 168 (1971)). λ > 0 (ferromagnetic): the stable solution is the
 * largest root on the field's side (for B = 0, the spontaneous moment of mean-field theory); iterate M ← f(B + λM)
 * from saturation, which descends monotonically onto it, and when that is slow (near the mean-field T_c) bracket the
 * root by stepping down from saturation until g changes sign, then use the same regula falsi.
 */
function selfConsistent(f: (bEff: number) => number, b: number, lambda: number, saturation: number): number {
  const tolerance = 1e-12 * Math.max(1, saturation);
  const g = (m: number) => m - f(b + lambda * m);
  if (lambda < 0) {
    const lo = -saturation - 1e-9, hi = saturation + 1e-9;
    return illinoisRoot(g, lo, hi, g(lo), g(hi), tolerance);
  }
  // Work on the field's side: for B < 0 solve the mirrored problem (M(−B) = −M(B)).
  const sign = b < 0 ? -1 : 1;
  const h = (m: number) => sign * g(sign * m);
  let m = saturation;
  for (let iter = 0; iter < 60; iter++) {
    const next = sign * f(b + lambda * sign * m);
    if (Math.abs(next - m) <= tolerance) return sign * next;
    m = next;
  }
  // Slow descent: bracket the largest root below the current iterate (h(m) ≥ 0 there) by steps of M_sat/64.
  let upper = m, hUpper = h(upper);
  const step = saturation / 64;
  for (let lower = upper - step; lower >= -saturation - step; lower -= step) {
    const hLower = h(lower);
    if (hLower <= 0) return sign * (hLower === 0 ? lower : illinoisRoot(h, lower, upper, hLower, hUpper, tolerance));
    upper = lower;
    hUpper = hLower;
  }
  return sign * upper;
}

/** Illinois regula falsi for h on [lo, hi] with h(lo) ≤ 0 ≤ h(hi) (both branches of selfConsistent use it). */
function illinoisRoot(h: (m: number) => number, lo: number, hi: number, hlo: number, hhi: number, tolerance: number): number {
  let side = 0;
  for (let iter = 0; iter < 200; iter++) {
    const m = (lo * hhi - hi * hlo) / (hhi - hlo);
    const hm = h(m);
    if (Math.abs(hm) <= tolerance || hi - lo <= tolerance) return m;
    if (hm > 0) {
      hi = m; hhi = hm;
      if (side === 1) hlo /= 2;
      side = 1;
    } else {
      lo = m; hlo = hm;
      if (side === -1) hhi /= 2;
      side = -1;
    }
  }
  return (lo + hi) / 2;
}
