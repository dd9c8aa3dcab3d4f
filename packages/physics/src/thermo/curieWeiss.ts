import { InputError } from '../errors';
import { CURIE_PREFACTOR_EMU_K_PER_MOL } from '../units';
import { goldenSection } from './internal/minimize';
import { finiteNumber, numberArray, requireSameLength, temperatureArray } from './internal/validate';

export interface CurieWeissOptions {
  /** Fit only points with rangeK[0] ≤ T ≤ rangeK[1] (K). Default: all points. */
  rangeK?: readonly [number, number];
  /** Fit a temperature-independent term χ0 as well (default false: χ0 = 0). */
  withChi0?: boolean;
  /** Standard uncertainties of χ in emu/mol; default: 1 % of χ (a fit of relative deviations). */
  uncertaintyEmuPerMol?: ArrayLike<number>;
}

export interface CurieWeissResult {
  /** Curie constant C in emu K/mol (per mole of whatever the data are per). */
  curieConstantEmuKPerMol: number;
  /** Weiss temperature θ_CW in K (negative: antiferromagnetic). */
  weissTemperatureK: number;
  /** Temperature-independent term χ0 in emu/mol (0 unless fitted). */
  chi0EmuPerMol: number;
  /** Effective moment μ_eff = √(3 k_B C / (N_A μB²)) ≈ √(8C) in μB. */
  effectiveMomentMuB: number;
  /** One-standard-deviation uncertainties (from the fit covariance, scaled by the reduced χ² when no σ is given). */
  uncertainty: { curieConstantEmuKPerMol: number; weissTemperatureK: number; chi0EmuPerMol: number; effectiveMomentMuB: number };
  /** Number of points in the fit range and the reduced χ² of the fit. */
  pointsUsed: number;
  reducedChiSquared: number;
}

/**
 * Curie–Weiss fit of a susceptibility χ(T) = C/(T − θ_CW) + χ0 over a chosen temperature range.
 *
 * Weighted least squares in χ (weights 1/σ²). For fixed θ the model is linear in C and χ0, which are solved
 * exactly; θ is then found by a scan and golden-section search over θ < T_min (variable projection, Golub & Pereyra,
 * SIAM J. Numer. Anal. 10, 413 (1973)). μ_eff from C with the Curie prefactor N_A μB²/(3k_B) ≈ 0.12505 emu K/mol
 * (textbook Curie law, e.g. Kittel ch. 14; constant from `units`).
 *
 * Units: T in K, χ in emu/mol (per mole of ions gives μ_eff per ion).
 *
 * @example curieWeissFit([10, 20, 40], [0.5, 0.25, 0.125]).curieConstantEmuKPerMol // 5, θ = 0
 * @throws InputError for fewer points than parameters + 1 in range, T ≤ 0, mismatched lengths, non-finite χ.
 * See also: vanVleckSusceptibility (thermo/susceptibility.ts).
 */
export function curieWeissFit(temperaturesK: ArrayLike<number>, chiEmuPerMol: ArrayLike<number>, options: CurieWeissOptions = {}): CurieWeissResult {
  const tAll = temperatureArray(temperaturesK);
  const chiAll = numberArray(chiEmuPerMol, 'chiEmuPerMol', 'susceptibilities in emu/mol');
  requireSameLength(tAll, chiAll, 'temperaturesK', 'chiEmuPerMol');
  let sigmaAll: Float64Array | undefined;
  if (options.uncertaintyEmuPerMol !== undefined) {
    sigmaAll = numberArray(options.uncertaintyEmuPerMol, 'uncertaintyEmuPerMol', 'uncertainties in emu/mol');
    requireSameLength(tAll, sigmaAll, 'temperaturesK', 'uncertaintyEmuPerMol');
    sigmaAll.forEach((s, i) => {
      if (!(s > 0)) throw new InputError(`uncertaintyEmuPerMol[${i}]`, s, 'an uncertainty > 0');
    });
  }
  let low = -Infinity, high = Infinity;
  if (options.rangeK !== undefined) {
    if (!Array.isArray(options.rangeK) || options.rangeK.length !== 2) throw new InputError('rangeK', options.rangeK, '[T_min, T_max] in K');
    low = finiteNumber(options.rangeK[0], 'rangeK[0]', 'a temperature in K');
    high = finiteNumber(options.rangeK[1], 'rangeK[1]', 'a temperature in K');
    if (!(high > low)) throw new InputError('rangeK', options.rangeK, 'T_min < T_max');
  }
  const withChi0 = options.withChi0 === true;
  const t: number[] = [], chi: number[] = [], w: number[] = [];
  tAll.forEach((ti, i) => {
    if (ti < low || ti > high) return;
    t.push(ti);
    chi.push(chiAll[i]);
    const s = sigmaAll ? sigmaAll[i] : 0.01 * Math.abs(chiAll[i]) || 1e-12;
    w.push(1 / (s * s));
  });
  const parameters = withChi0 ? 3 : 2;
  if (t.length < parameters + 1)
    throw new InputError('rangeK', options.rangeK ?? 'all', `a range holding at least ${parameters + 1} points`, `${t.length} in range`);
  const tMin = Math.min(...t), tMax = Math.max(...t);

  // For fixed θ: χ ≈ C·f + χ0 with f = 1/(T − θ); weighted normal equations, solved in closed form.
  const linear = (theta: number) => {
    let sw = 0, sf = 0, sff = 0, sy = 0, sfy = 0;
    for (let i = 0; i < t.length; i++) {
      const f = 1 / (t[i] - theta);
      sw += w[i]; sf += w[i] * f; sff += w[i] * f * f; sy += w[i] * chi[i]; sfy += w[i] * f * chi[i];
    }
    let c: number, chi0: number;
    if (withChi0) {
      const det = sff * sw - sf * sf;
      c = (sfy * sw - sf * sy) / det;
      chi0 = (sff * sy - sf * sfy) / det;
    } else {
      c = sfy / sff;
      chi0 = 0;
    }
    let chi2 = 0;
    for (let i = 0; i < t.length; i++) chi2 += w[i] * (chi[i] - c / (t[i] - theta) - chi0) ** 2;
    return { c, chi0, chi2 };
  };
  // θ = T_min − e^u; scan u over a wide range, then refine around the best scan point.
  const uLow = Math.log(1e-4 * tMin), uHigh = Math.log(tMin + 100 * tMax);
  const steps = 400;
  let bestK = 0, bestChi2 = Infinity;
  for (let k = 0; k <= steps; k++) {
    const chi2 = linear(tMin - Math.exp(uLow + ((uHigh - uLow) * k) / steps)).chi2;
    if (chi2 < bestChi2) { bestChi2 = chi2; bestK = k; }
  }
  const du = (uHigh - uLow) / steps;
  const refined = goldenSection((u) => linear(tMin - Math.exp(u)).chi2, uLow + (bestK - 1) * du, uLow + (bestK + 1) * du, 1e-14);
  const theta = tMin - Math.exp(refined.x);
  const { c, chi0, chi2 } = linear(theta);
  if (!(c > 0)) throw new InputError('chiEmuPerMol', 'the data in range', 'a paramagnetic χ(T) (fitted Curie constant > 0)', `C = ${c}`);

  // Covariance from the Jacobian of the model in (C, θ, χ0): (JᵀWJ)⁻¹, scaled by χ²_red without given σ.
  const dof = t.length - parameters;
  const reduced = chi2 / dof;
  const jtj = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  for (let i = 0; i < t.length; i++) {
    const d = t[i] - theta;
    const g = [1 / d, c / (d * d), 1];
    for (let a = 0; a < parameters; a++) for (let b = 0; b < parameters; b++) jtj[a][b] += w[i] * g[a] * g[b];
  }
  const cov = invertSmall(jtj, parameters).map((row) => row.map((x) => x * (sigmaAll ? 1 : reduced)));
  const sC = Math.sqrt(Math.max(0, cov[0][0]));
  const mu = Math.sqrt(c / CURIE_PREFACTOR_EMU_K_PER_MOL);
  return {
    curieConstantEmuKPerMol: c,
    weissTemperatureK: theta,
    chi0EmuPerMol: chi0,
    effectiveMomentMuB: mu,
    uncertainty: {
      curieConstantEmuKPerMol: sC,
      weissTemperatureK: Math.sqrt(Math.max(0, cov[1][1])),
      chi0EmuPerMol: withChi0 ? Math.sqrt(Math.max(0, cov[2][2])) : 0,
      effectiveMomentMuB: (mu * sC) / (2 * c),
    },
    pointsUsed: t.length,
    reducedChiSquared: reduced,
  };
}

/** Inverse of the leading n×n block (n = 2 or 3) by cofactors. */
function invertSmall(m: number[][], n: number): number[][] {
  if (n === 2) {
    const det = m[0][0] * m[1][1] - m[0][1] * m[1][0];
    return [[m[1][1] / det, -m[0][1] / det, 0], [-m[1][0] / det, m[0][0] / det, 0], [0, 0, 0]];
  }
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  const A = e * i - f * h, B = -(d * i - f * g), C = d * h - e * g;
  const det = a * A + b * B + c * C;
  return [
    [A / det, -(b * i - c * h) / det, (b * f - c * e) / det],
    [B / det, (a * i - c * g) / det, -(a * f - c * d) / det],
    [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
}
