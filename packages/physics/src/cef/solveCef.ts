/**
 * Diagonalise the crystal-field Hamiltonian of an ion and describe the result the way an experimentalist reads it:
 * energies from the ground state, levels with their degeneracies, eigenvectors as |J, m⟩ amplitudes, the ground
 * doublet's g-tensor and moment, an anisotropy classification and warnings.
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';
import { hermitianEigen } from '../linalg/hermitianEigen';
import type { Ion } from '../ions';
import { angularMomentumMatrices, type AngularMomentumMatrices } from './angularMomentum';
import { cefHamiltonian, type CefParameters } from './cefHamiltonian';
import { doubletGTensor, matrixElement } from './groundDoubletGTensor';
import { requireParameterKey } from './parameterKeys';

/** One energy level: a group of eigenstates degenerate within the tolerance. */
export interface CefLevel {
  /** Mean energy of the group above the ground state, meV. */
  energyMeV: number;
  degeneracy: number;
  /** Column indices of the level's states in CefSolution.eigenvectors (and energiesMeV). */
  stateIndices: number[];
}

/** The ground doublet as an effective spin 1/2. */
export interface GroundDoublet {
  /** Effective g along the CEF z axis. */
  gParallel: number;
  /** Effective g in the CEF xy plane (root mean square over in-plane directions). */
  gPerpendicular: number;
  /** sqrt(G Gᵀ), 3×3 symmetric, CEF (local) frame; principal axes are its eigenvectors. */
  gTensor: number[][];
  /** Principal g values, ascending. */
  gPrincipalValues: number[];
  /** Principal axes (unit vectors, CEF frame) in the order of gPrincipalValues. */
  gPrincipalAxes: number[][];
  /** Saturated moment along z of the doublet's |+⟩ state, g∥/2 in μB. */
  momentParallelMuB: number;
  /** Kramers doublet (odd 4f count: protected by time reversal) or non-Kramers (accidental or symmetry doublet). */
  kramers: boolean;
  /** Gap to the next level, meV (Infinity when there is none). */
  gapMeV: number;
}

/** Result of solveCef. Energies in meV. */
export interface CefSolution {
  ion: Ion;
  J: number;
  /** All 2J+1 eigenvalues, ascending, ground state at 0, meV. */
  energiesMeV: Float64Array;
  /** The absolute lowest eigenvalue of H_CEF that was subtracted, meV. */
  groundEnergyMeV: number;
  /** Eigenvectors as columns, in |J, m⟩ amplitudes (basis k ↔ m = J − k). Inside each degenerate level the states
   *  are chosen to diagonalise Jz, ordered by ⟨Jz⟩ descending, each with its largest amplitude real and positive. */
  eigenvectors: ComplexMatrix;
  levels: CefLevel[];
  /** Null unless the ground level is exactly two-fold degenerate. */
  groundDoublet: GroundDoublet | null;
  /** 'Ising' | 'XY' | 'Heisenberg' | 'intermediate' | 'nonmagnetic' (ground doublets), 'singlet', 'triplet', 'quartet',
   *  'multiplet' (other ground degeneracies). */
  classification: string;
  /** One-line human summary, e.g. "Ising Kramers doublet, g∥ = 19.8, g⊥ = 0.00; next level at 22.1 meV". */
  summary: string;
  warnings: string[];
}

/** Options of solveCef. */
export interface SolveCefOptions {
  /** Eigenvalues closer than this are one level (default 1e-4 meV = 0.1 μeV, far below any instrument resolution). */
  degeneracyToleranceMeV?: number;
  /**
   * Warn when the first excited level lies within this energy of the ground doublet (default 5 meV ≈ 58 K: below
   * about 5 K its thermal population is under 1e-5 and it is far above typical exchange energies of ~0.1 meV, the
   * usual conditions for a pseudospin-1/2 description; common practice).
   */
  isolationWarningMeV?: number;
}

/**
 * Anisotropy classes from the ratio ρ = g∥/g⊥ of a doublet (our own thresholds, stated here once):
 * Ising ρ ≥ 2 (including g⊥ = 0), XY ρ ≤ 1/2, Heisenberg 0.8 ≤ ρ ≤ 1.25, otherwise intermediate; 'nonmagnetic' when
 * both g values vanish (below 1e-9).
 * With these, nearly pure |±J⟩ Dy/Ho-type doublets are Ising, and Er/Yb-type doublets with ρ ≈ 0.4 are XY.
 */
export function classifyDoublet(gParallel: number, gPerpendicular: number): 'Ising' | 'XY' | 'Heisenberg' | 'intermediate' | 'nonmagnetic' {
  if (Math.max(gParallel, gPerpendicular) < 1e-9) return 'nonmagnetic';
  if (gPerpendicular <= 0.5 * gParallel) return 'Ising';
  if (gParallel <= 0.5 * gPerpendicular) return 'XY';
  const ratio = gParallel / gPerpendicular;
  if (ratio >= 0.8 && ratio <= 1.25) return 'Heisenberg';
  return 'intermediate';
}

function checkPositive(value: unknown, field: string, fallback: number): number {
  if (value === undefined) return fallback;
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) throw new InputError(field, value, 'a positive energy in meV');
  return value;
}

/** Rotate the columns `cols` of `vectors` (in place) to the eigenbasis of P Jz P, ⟨Jz⟩ descending. */
function diagonaliseJzInside(vectors: ComplexMatrix, cols: number[], Jz: ComplexMatrix): void {
  const d = cols.length, n = vectors.n;
  const projected = zeros(d);
  for (let i = 0; i < d; i++)
    for (let j = 0; j < d; j++) {
      const [re, im] = matrixElement(vectors, cols[i], Jz, cols[j]);
      projected.re[i * d + j] = -re; // negate so that ascending eigenvalues give ⟨Jz⟩ descending
      projected.im[i * d + j] = -im;
    }
  const { vectors: w } = hermitianEigen(projected, { hermitianTolerance: 1e-6 });
  const oldRe = cols.map((c) => Array.from({ length: n }, (_, r) => vectors.re[r * n + c]));
  const oldIm = cols.map((c) => Array.from({ length: n }, (_, r) => vectors.im[r * n + c]));
  cols.forEach((c, k) => {
    for (let r = 0; r < n; r++) {
      let re = 0, im = 0;
      for (let i = 0; i < d; i++) {
        const wr = w.re[i * d + k], wi = w.im[i * d + k];
        re += oldRe[i][r] * wr - oldIm[i][r] * wi;
        im += oldRe[i][r] * wi + oldIm[i][r] * wr;
      }
      vectors.re[r * n + c] = re;
      vectors.im[r * n + c] = im;
    }
  });
}

/** Multiply each column by a phase so that its largest amplitude is real and positive. */
function fixPhases(vectors: ComplexMatrix): void {
  const n = vectors.n;
  for (let c = 0; c < n; c++) {
    let best = -1, br = 0, bi = 0;
    for (let r = 0; r < n; r++) {
      const re = vectors.re[r * n + c], im = vectors.im[r * n + c];
      const mod = Math.hypot(re, im);
      if (mod > best + 1e-12) [best, br, bi] = [mod, re, im];
    }
    const pr = br / best, pi = -bi / best;
    for (let r = 0; r < n; r++) {
      const re = vectors.re[r * n + c], im = vectors.im[r * n + c];
      vectors.re[r * n + c] = re * pr - im * pi;
      vectors.im[r * n + c] = re * pi + im * pr;
    }
  }
}

/** Group ascending energies into levels within `tolerance`. */
export function groupLevels(energiesMeV: ArrayLike<number>, toleranceMeV: number): CefLevel[] {
  const levels: CefLevel[] = [];
  for (let i = 0; i < energiesMeV.length; i++) {
    const last = levels[levels.length - 1];
    if (last && energiesMeV[i] - energiesMeV[last.stateIndices[last.stateIndices.length - 1]] <= toleranceMeV) last.stateIndices.push(i);
    else levels.push({ energyMeV: 0, degeneracy: 0, stateIndices: [i] });
  }
  for (const level of levels) {
    level.degeneracy = level.stateIndices.length;
    level.energyMeV = level.stateIndices.reduce((s, i) => s + energiesMeV[i], 0) / level.degeneracy;
  }
  return levels;
}

const DEGENERACY_NAMES: Record<number, string> = { 1: 'singlet', 3: 'triplet', 4: 'quartet' };

/**
 * Diagonalise H_CEF = Σ B_n^m O_n^m (parameters in meV, Stevens factors included) for an ion's ground multiplet.
 *
 * @example solveCef(getIon('Ce3+'), { B40: 0.01, B44: 0.05 }).levels // Γ8 quartet at 3.6 meV above the Γ7 doublet
 * See also: cefHamiltonian, normalizeCefParameters, describeLevels, doubletGTensor
 */
export function solveCef(ion: Ion, parametersMeV: CefParameters, options: SolveCefOptions = {}): CefSolution {
  if (ion === null || typeof ion !== 'object' || typeof ion.J !== 'number') throw new InputError('ion', ion, 'an Ion from getIon');
  const tolerance = checkPositive(options.degeneracyToleranceMeV, 'degeneracyToleranceMeV', 1e-4);
  const isolation = checkPositive(options.isolationWarningMeV, 'isolationWarningMeV', 5);
  const J = ion.J;
  const h = cefHamiltonian(J, parametersMeV);
  const { values, vectors } = hermitianEigen(h, { field: 'H_CEF' });
  const groundEnergyMeV = values[0];
  const energiesMeV = Float64Array.from(values, (v) => v - groundEnergyMeV);
  const levels = groupLevels(energiesMeV, tolerance);
  // Level energies are measured from the ground level's mean, so the ground level sits at exactly 0.
  const groundLevelMeV = levels[0].energyMeV;
  for (const level of levels) level.energyMeV -= groundLevelMeV;
  const jm: AngularMomentumMatrices = angularMomentumMatrices(J);
  for (const level of levels) if (level.degeneracy > 1) diagonaliseJzInside(vectors, level.stateIndices, jm.Jz);
  fixPhases(vectors);

  const warnings: string[] = [];
  for (const key of Object.keys(parametersMeV)) {
    const { n } = requireParameterKey(key, 'B');
    if (n > 2 * J && parametersMeV[key] !== 0) warnings.push(`${key} has no effect for J = ${J} (rank ${n} > 2J)`);
  }
  const ground = levels[0];
  const gap = levels.length > 1 ? levels[1].energyMeV : Infinity;
  let groundDoublet: GroundDoublet | null = null;
  let classification: string;
  let summary: string;
  if (ground.degeneracy === 2) {
    const [a, b] = ground.stateIndices;
    const g = doubletGTensor(vectors, a, b, jm, ion.gJ);
    groundDoublet = {
      gParallel: g.gParallel,
      gPerpendicular: g.gPerpendicular,
      gTensor: g.gTensor,
      gPrincipalValues: g.principalValues,
      gPrincipalAxes: g.principalAxes,
      momentParallelMuB: g.gParallel / 2,
      kramers: ion.kramers,
      gapMeV: gap,
    };
    classification = classifyDoublet(g.gParallel, g.gPerpendicular);
    summary = `${classification} ${ion.kramers ? 'Kramers' : 'non-Kramers'} doublet, g∥ = ${g.gParallel.toFixed(3)}, g⊥ = ${g.gPerpendicular.toFixed(3)}`;
    if (gap < isolation)
      warnings.push(
        `the first excited level lies ${gap.toFixed(3)} meV above the ground doublet, within ${isolation} meV: the doublet is not well isolated ` +
          `(its pseudospin-1/2 description fails once k_B T or the exchange approaches this gap)`,
      );
  } else {
    classification = DEGENERACY_NAMES[ground.degeneracy] ?? 'multiplet';
    summary = `ground ${classification}${ground.degeneracy > 4 ? ` (${ground.degeneracy}-fold)` : ''}`;
    if (ground.degeneracy > 2) warnings.push(`the ground level is ${ground.degeneracy}-fold degenerate: no ground doublet and no pseudospin-1/2 g-tensor`);
    if (ground.degeneracy === 1 && gap < 0.1 * isolation)
      warnings.push(`the ground singlet and the next level are only ${gap.toFixed(4)} meV apart: a quasi-doublet`);
  }
  if (levels.length > 1) summary += `; next level at ${gap.toFixed(3)} meV`;
  return { ion, J, energiesMeV, groundEnergyMeV, eigenvectors: vectors, levels, groundDoublet, classification, summary, warnings };
}
