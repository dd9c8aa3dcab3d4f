/**
 * Crystal-field levels and the neutron transitions between them at a temperature: diagonalise H_CEF, group
 * degenerate eigenstates into levels, Boltzmann-populate them, and sum the dipole strengths over the degenerate
 * states of each pair of levels. Energy transfer of i → j is E_j − E_i (positive: neutron energy loss; negative:
 * energy gain from a populated excited level), so detailed balance S(−E) = e^{−E/k_BT} S(E) holds by construction
 * (Squires 1978, eq. 4.72 for the principle).
 *
 * @example const t = cefTransitions('Er3+', { B20: -0.05, B40: 1e-3 }, 10);
 *          t.transitions.filter((x) => x.fromLevel === 0)
 * See also: transitionStrengths, neutronSpectrum, fitCefToPeaks
 */
import { InputError } from '../errors';
import { getIon, type Ion } from '../ions';
import { cefHamiltonian, type CefParameters } from '../cef/cefHamiltonian';
import { hermitianEigen, solveInto, type EigenWorkspace, type HermitianEigenResult } from '../linalg/hermitianEigen';
import type { ComplexMatrix } from '../linalg/complexMatrix';
import { BOLTZMANN_MEV_PER_K } from '../units';
import { transitionStrengths } from './transitionStrengths';

export interface PopulatedLevel {
  /** Energy above the ground state, meV (mean over the level's states). */
  readonly energyMeV: number;
  readonly degeneracy: number;
  readonly stateIndices: readonly number[];
  /** Boltzmann population of each single state of the level (all states of a level share it). */
  readonly populationPerState: number;
}

export interface CefTransition {
  readonly fromLevel: number;
  readonly toLevel: number;
  readonly fromMeV: number;
  readonly toMeV: number;
  /** Energy transfer E_to − E_from in meV (negative for energy gain). */
  readonly energyMeV: number;
  /** Σ over the states i of `from` and j of `to` of the (powder or ⊥Q) strength |⟨j|J⊥|i⟩|². */
  readonly strength: number;
  /** populationPerState(from) × strength: the thermal weight of the line (dimensionless). */
  readonly weight: number;
}

export interface CefTransitionsResult {
  readonly ion: Ion;
  /** Eigenvalues with the ground state at 0, meV (ascending). */
  readonly energiesMeV: Float64Array;
  readonly eigenvectors: ComplexMatrix;
  readonly levels: readonly PopulatedLevel[];
  /** Transitions between different levels whose initial level has a population above `minimumPopulation`. */
  readonly transitions: readonly CefTransition[];
  /** Σ_a populationPerState(a) × (strength a → a): the magnetic quasi-elastic weight at E = 0. */
  readonly elasticWeight: number;
}

export interface CefTransitionsOptions {
  /** Single-crystal Q direction in the CEF frame; default: powder average. */
  readonly qDirection?: readonly [number, number, number];
  /** Eigenvalues closer than this are one level. Default 1e-4 meV (as solveCef). */
  readonly degeneracyToleranceMeV?: number;
  /** Initial levels with a smaller population per state are skipped. Default 1e-9. */
  readonly minimumPopulation?: number;
}

/** Temperature-independent part: levels and Σ-over-degenerate-states strengths between every pair of levels. */
export interface LevelStrengths {
  readonly ion: Ion;
  readonly energiesMeV: Float64Array;
  readonly eigenvectors: ComplexMatrix;
  /** Degenerate groups of state indices, ascending energy. */
  readonly groups: readonly (readonly number[])[];
  readonly levelEnergiesMeV: Float64Array;
  /** L×L, element [b * L + a]: Σ_{i∈a, j∈b} strength(i → j). */
  readonly pairStrengths: Float64Array;
}

/**
 * Diagonalise H_CEF once and sum the dipole strengths over degenerate states for every pair of levels.
 * @example const ls = levelStrengths(getIon('Er3+'), B); thermalTransitions(ls, 10)
 */
export function levelStrengths(
  ion: Ion,
  parametersMeV: CefParameters,
  options: { qDirection?: readonly [number, number, number]; degeneracyToleranceMeV?: number; workspace?: EigenWorkspace } = {},
): LevelStrengths {
  const h = cefHamiltonian(ion.J, parametersMeV);
  // A caller that diagonalises many times (a fit) passes its own scratch space to avoid reallocating it.
  const { values, vectors } = options.workspace && options.workspace.n === h.n ? (solveInto(options.workspace, h) as HermitianEigenResult) : hermitianEigen(h);
  const n = values.length;
  const ground = values[0];
  const energiesMeV = Float64Array.from(values, (v) => v - ground);
  const tolerance = options.degeneracyToleranceMeV ?? 1e-4;
  const groups: number[][] = [];
  for (let k = 0; k < n; k++) {
    const last = groups[groups.length - 1];
    if (last && energiesMeV[k] - energiesMeV[last[0]] <= tolerance) last.push(k);
    else groups.push([k]);
  }
  const levelEnergiesMeV = Float64Array.from(groups, (g) => g.reduce((s, k) => s + energiesMeV[k], 0) / g.length);
  levelEnergiesMeV[0] = 0; // the reference: the ground level's round-off (1e-15 meV) is not an energy
  const { strengths } = transitionStrengths(ion.J, vectors, { qDirection: options.qDirection });
  const L = groups.length;
  const pairStrengths = new Float64Array(L * L);
  for (let a = 0; a < L; a++)
    for (let b = 0; b < L; b++) {
      let s = 0;
      for (const i of groups[a]) for (const j of groups[b]) s += strengths[j * n + i];
      pairStrengths[b * L + a] = s;
    }
  return { ion, energiesMeV, eigenvectors: vectors, groups, levelEnergiesMeV, pairStrengths };
}

/**
 * The same levels with the pair strengths for a single crystal with Q along `qDirection` (CEF frame), reusing the
 * eigenvectors: no second diagonalisation.
 * @example levelStrengthsAlong(levelStrengths(ion, B), [0, 0, 1])
 */
export function levelStrengthsAlong(levels: LevelStrengths, qDirection: readonly [number, number, number]): LevelStrengths {
  const { strengths } = transitionStrengths(levels.ion.J, levels.eigenvectors, { qDirection });
  const n = levels.energiesMeV.length;
  const L = levels.groups.length;
  const pairStrengths = new Float64Array(L * L);
  for (let a = 0; a < L; a++)
    for (let b = 0; b < L; b++) {
      let s = 0;
      for (const i of levels.groups[a]) for (const j of levels.groups[b]) s += strengths[j * n + i];
      pairStrengths[b * L + a] = s;
    }
  return { ...levels, pairStrengths };
}

/** Boltzmann population per state of each level at T (K); T = 0 puts everything in the ground level. */
export function levelPopulations(levels: LevelStrengths, temperatureK: number): Float64Array {
  const L = levels.groups.length;
  const perState = new Float64Array(L);
  if (temperatureK === 0) {
    perState[0] = 1 / levels.groups[0].length;
    return perState;
  }
  let z = 0;
  for (let a = 0; a < L; a++) {
    perState[a] = Math.exp(-levels.levelEnergiesMeV[a] / (BOLTZMANN_MEV_PER_K * temperatureK));
    z += perState[a] * levels.groups[a].length;
  }
  for (let a = 0; a < L; a++) perState[a] /= z;
  return perState;
}

/** Populations and transitions at T from precomputed level strengths. */
export function thermalTransitions(levels: LevelStrengths, temperatureK: number, minimumPopulation = 1e-9): CefTransitionsResult {
  if (typeof temperatureK !== 'number' || !Number.isFinite(temperatureK) || temperatureK < 0)
    throw new InputError('temperatureK', temperatureK, 'a finite temperature ≥ 0 K');
  const L = levels.groups.length;
  const population = levelPopulations(levels, temperatureK);
  const levelList: PopulatedLevel[] = levels.groups.map((g, a) => ({
    energyMeV: levels.levelEnergiesMeV[a],
    degeneracy: g.length,
    stateIndices: g,
    populationPerState: population[a],
  }));
  const transitions: CefTransition[] = [];
  let elasticWeight = 0;
  for (let a = 0; a < L; a++) {
    if (population[a] < minimumPopulation) continue;
    for (let b = 0; b < L; b++) {
      const strength = levels.pairStrengths[b * L + a];
      if (a === b) {
        elasticWeight += population[a] * strength;
        continue;
      }
      transitions.push({
        fromLevel: a,
        toLevel: b,
        fromMeV: levels.levelEnergiesMeV[a],
        toMeV: levels.levelEnergiesMeV[b],
        energyMeV: levels.levelEnergiesMeV[b] - levels.levelEnergiesMeV[a],
        strength,
        weight: population[a] * strength,
      });
    }
  }
  return { ion: levels.ion, energiesMeV: levels.energiesMeV, eigenvectors: levels.eigenvectors, levels: levelList, transitions, elasticWeight };
}

/** Levels, populations and level-to-level neutron transition strengths of an ion in a crystal field at T (K). */
export function cefTransitions(
  ionOrName: Ion | string,
  parametersMeV: CefParameters,
  temperatureK: number,
  options: CefTransitionsOptions = {},
): CefTransitionsResult {
  const ion = typeof ionOrName === 'string' ? getIon(ionOrName) : ionOrName;
  if (typeof temperatureK !== 'number' || !Number.isFinite(temperatureK) || temperatureK < 0)
    throw new InputError('temperatureK', temperatureK, 'a finite temperature ≥ 0 K');
  const levels = levelStrengths(ion, parametersMeV, options);
  return thermalTransitions(levels, temperatureK, options.minimumPopulation);
}
