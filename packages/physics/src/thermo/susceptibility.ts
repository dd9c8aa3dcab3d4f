import { InputError } from '../errors';
import { hermitianEigen, type ComplexMatrix } from '../linalg';
import { BOLTZMANN_MEV_PER_K, CURIE_PREFACTOR_EMU_K_PER_MOL, EMU_PER_MOL_IN_M3_PER_MOL } from '../units';
import { PreparedIon, unitVector, type SingleIonInput } from './internal/singleIon';
import { totalMeanFieldMolPerEmu, type Demagnetization } from './internal/meanField';
import { positiveNumber, temperatureArray } from './internal/validate';
import { siteFrames, type Rotation3, type SiteFrameName } from './siteFrames';

export interface SusceptibilityOptions {
  temperaturesK: ArrayLike<number>;
  /** Field direction in the global frame, or 'powder' (trace/3 of the crystal tensor). */
  direction: readonly [number, number, number] | 'powder';
  sites?: SiteFrameName | readonly Rotation3[];
  /** Rare-earth ions per formula unit (default 1), for the per-formula-unit values. */
  ionsPerFormulaUnit?: number;
  /** Molecular-field constant λ in mol/emu per mole of ions: 1/χ = 1/χ₀ − λ (default 0). */
  meanFieldMolPerEmu?: number;
  demagnetization?: Demagnetization;
}

export interface SusceptibilityResult {
  temperaturesK: Float64Array;
  /** χ in emu/mol per mole of rare-earth ions (CGS), and its inverse in mol/emu. */
  chiEmuPerMol: Float64Array;
  inverseChiMolPerEmu: Float64Array;
  /** χ in m³/mol per mole of ions (SI: × 4π·10⁻⁶). */
  chiM3PerMol: Float64Array;
  /** Per mole of formula units (× ionsPerFormulaUnit). */
  chiEmuPerMolFormulaUnit: Float64Array;
  chiM3PerMolFormulaUnit: Float64Array;
  /** The single-site tensor χ_αβ in its local frame (emu/mol, no corrections), one 3×3 per temperature. */
  localTensorEmuPerMol: number[][][];
}

/**
 * DC susceptibility in the zero-field limit from the crystal-field eigenstates (Van Vleck's formula), per site and
 * for a crystal or a powder, in emu/mol and m³/mol, per mole of ions and per formula unit.
 *
 * χ_αβ = N_A μB² g_J² Σ_{n,m} W_nm Re(⟨n|J_α|m⟩⟨m|J_β|n⟩), with W_nm = (p_n − p_m)/(E_m − E_n) for E_n ≠ E_m and
 * W_nm = p_n/k_BT within a degenerate level (J. H. Van Vleck, "The Theory of Electric and Magnetic
 * Susceptibilities" (1932), ch. 7; this is the Curie term Σ p_n |⟨n|J_α|n′⟩|²/kT plus the Van Vleck term
 * 2 Σ_{n≠m} p_n |⟨n|J_α|m⟩|²/(E_m − E_n) written symmetrically). W is evaluated as p_n(1 − e^{−x})/(x k_BT),
 * x = (E_m − E_n)/k_BT, which is continuous through degeneracies — no degeneracy threshold, no finite difference.
 * Crystal: χ = (1/S) Σ_s R_s χ_local R_sᵀ over the site frames. Corrections (off by default): χ → (1 − λ_tot χ)⁻¹ χ
 * with λ_tot = λ − 4πN/V_m (mean field; demagnetisation). Along n̂: n̂·χ·n̂; powder: trace/3.
 * Check (Van Vleck's theorem): T·χ → N_A μB² g_J² J(J+1)/(3k_B) ≈ 0.12505 g_J² J(J+1) emu K/mol at high T.
 *
 * @example vanVleckSusceptibility({ J: 7.5, gJ: 4 / 3, parametersMeV: {} }, { temperaturesK: [300], direction: 'powder' })
 * @throws InputError for T ≤ 0, a bad direction or sites, a bad ionsPerFormulaUnit.
 * See also: magnetization, curieWeissFit, siteFrames.
 */
export function vanVleckSusceptibility(ion: SingleIonInput, options: SusceptibilityOptions): SusceptibilityResult {
  if (options === null || typeof options !== 'object') throw new InputError('options', options, 'an object { temperaturesK, direction }');
  const prepared = new PreparedIon(ion);
  const temperatures = temperatureArray(options.temperaturesK);
  const frames = siteFrames(options.sites ?? 'single');
  const direction = options.direction === 'powder' ? 'powder' : unitVector(options.direction, 'direction');
  const ions = options.ionsPerFormulaUnit === undefined ? 1 : positiveNumber(options.ionsPerFormulaUnit, 'ionsPerFormulaUnit', 'a number of ions > 0');
  const lambda = totalMeanFieldMolPerEmu(options.meanFieldMolPerEmu, options.demagnetization);

  const { values, vectors } = hermitianEigen(prepared.hCef, { vectors: true });
  const elements = [prepared.jx, prepared.jy, prepared.jz].map((op) => inEigenbasis(op, vectors));
  const n = prepared.dim;
  // 3 × (N_A μB²/3k_B) × k_B[meV/K] = N_A μB²/meV in emu/mol: multiplies g_J² × S (S in 1/meV).
  const prefactor = 3 * CURIE_PREFACTOR_EMU_K_PER_MOL * BOLTZMANN_MEV_PER_K * prepared.gJ ** 2;

  const count = temperatures.length;
  const result: SusceptibilityResult = {
    temperaturesK: temperatures,
    chiEmuPerMol: new Float64Array(count),
    inverseChiMolPerEmu: new Float64Array(count),
    chiM3PerMol: new Float64Array(count),
    chiEmuPerMolFormulaUnit: new Float64Array(count),
    chiM3PerMolFormulaUnit: new Float64Array(count),
    localTensorEmuPerMol: [],
  };
  const p = new Float64Array(n);
  for (let t = 0; t < count; t++) {
    const kT = BOLTZMANN_MEV_PER_K * temperatures[t];
    let z = 0;
    for (let k = 0; k < n; k++) z += p[k] = Math.exp(-(values[k] - values[0]) / kT);
    for (let k = 0; k < n; k++) p[k] /= z;
    const local = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
    for (let a = 0; a < n; a++)
      for (let b = 0; b < n; b++) {
        const x = (values[b] - values[a]) / kT;
        const w = Math.abs(x) < 1e-8 ? (p[a] / kT) * (1 - x / 2) : (p[a] - p[b]) / (values[b] - values[a]);
        if (w === 0) continue;
        const ab = a * n + b, ba = b * n + a;
        for (let i = 0; i < 3; i++)
          for (let j = i; j < 3; j++) {
            const u = elements[i], v = elements[j];
            // Re(⟨a|J_i|b⟩⟨b|J_j|a⟩)
            local[i][j] += w * (u.re[ab] * v.re[ba] - u.im[ab] * v.im[ba]);
          }
      }
    for (let i = 0; i < 3; i++)
      for (let j = i; j < 3; j++) {
        local[i][j] *= prefactor;
        local[j][i] = local[i][j];
      }
    result.localTensorEmuPerMol.push(local);
    const crystal = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
    for (const r of frames)
      for (let i = 0; i < 3; i++)
        for (let j = 0; j < 3; j++) {
          let s = 0;
          for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) s += r[i][a] * local[a][b] * r[j][b];
          crystal[i][j] += s / frames.length;
        }
    const corrected = lambda === 0 ? crystal : meanFieldCorrected(crystal, lambda);
    let chi: number;
    if (direction === 'powder') chi = (corrected[0][0] + corrected[1][1] + corrected[2][2]) / 3;
    else {
      chi = 0;
      for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) chi += direction[i] * corrected[i][j] * direction[j];
    }
    result.chiEmuPerMol[t] = chi;
    result.inverseChiMolPerEmu[t] = 1 / chi;
    result.chiM3PerMol[t] = chi * EMU_PER_MOL_IN_M3_PER_MOL;
    result.chiEmuPerMolFormulaUnit[t] = chi * ions;
    result.chiM3PerMolFormulaUnit[t] = chi * ions * EMU_PER_MOL_IN_M3_PER_MOL;
  }
  if (result.chiEmuPerMol.some((x) => !Number.isFinite(x) || x === 0))
    throw new InputError('meanFieldMolPerEmu', options.meanFieldMolPerEmu, 'a molecular field below the ordering instability (1 − λχ > 0)');
  return result;
}

/** U† A U for Hermitian A and unitary U (columns = eigenvectors): the matrix elements ⟨n|A|m⟩. */
function inEigenbasis(a: ComplexMatrix, u: ComplexMatrix): { re: Float64Array; im: Float64Array } {
  const n = a.n;
  const tr = new Float64Array(n * n), ti = new Float64Array(n * n);
  // T = A U
  for (let i = 0; i < n; i++)
    for (let k = 0; k < n; k++) {
      const ar = a.re[i * n + k], ai = a.im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < n; j++) {
        tr[i * n + j] += ar * u.re[k * n + j] - ai * u.im[k * n + j];
        ti[i * n + j] += ar * u.im[k * n + j] + ai * u.re[k * n + j];
      }
    }
  const re = new Float64Array(n * n), im = new Float64Array(n * n);
  // (U† T)_nm = Σ_k conj(U_kn) T_km
  for (let r = 0; r < n; r++)
    for (let k = 0; k < n; k++) {
      const ur = u.re[k * n + r], ui = -u.im[k * n + r];
      for (let c = 0; c < n; c++) {
        re[r * n + c] += ur * tr[k * n + c] - ui * ti[k * n + c];
        im[r * n + c] += ur * ti[k * n + c] + ui * tr[k * n + c];
      }
    }
  return { re, im };
}

/** (1 − λχ)⁻¹ χ for a symmetric 3×3 χ; InputError-free: a singular 1 − λχ yields Infinity, caught by the caller. */
function meanFieldCorrected(chi: number[][], lambda: number): number[][] {
  const m = chi.map((row, i) => row.map((x, j) => (i === j ? 1 : 0) - lambda * x));
  const [[a, b, c], [d, e, f], [g, h, k]] = m;
  const det = a * (e * k - f * h) - b * (d * k - f * g) + c * (d * h - e * g);
  if (!(det > 0)) return [[Infinity, 0, 0], [0, Infinity, 0], [0, 0, Infinity]];
  const inv = [
    [(e * k - f * h) / det, -(b * k - c * h) / det, (b * f - c * e) / det],
    [-(d * k - f * g) / det, (a * k - c * g) / det, -(a * f - c * d) / det],
    [(d * h - e * g) / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
  return inv.map((row) => [0, 1, 2].map((j) => row[0] * chi[0][j] + row[1] * chi[1][j] + row[2] * chi[2][j]));
}
