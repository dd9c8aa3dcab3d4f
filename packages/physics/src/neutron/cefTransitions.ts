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
import { hermitianEigen } from '../linalg/hermitianEigen';
import type { ComplexMatrix } from '../linalg/complexMatrix';
import { BOLTZMANN_MEV_PER_K } from '../units';
import { transitionStrengths } from './transitionStrengths';

export interface CefLevel {
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
  readonly levels: readonly CefLevel[];
  /** Transitions between different levels whose initial level has a population above `minimumPopulation`. */
  readonly transitions: readonly CefTransition[];
  /** Σ_a populationPerState(a) × (strength a → a): the magnetic quasi-elastic weight at E = 0. */
  readonly elasticWeight: number;
}

export interface CefTransitionsOptions {
  /** Single-crystal Q direction in the CEF frame; default: powder average. */
  readonly qDirection?: readonly [number, number, number];
  /** Eigenvalues closer than this are one level. Default 1e-6 meV. */
  readonly degeneracyToleranceMeV?: number;
  /** Initial levels with a smaller population per state are skipped. Default 1e-9. */
  readonly minimumPopulation?: number;
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
  const h = cefHamiltonian(ion.J, parametersMeV);
  const { values, vectors } = hermitianEigen(h);
  const n = values.length;
  const ground = values[0];
  const energiesMeV = Float64Array.from(values, (v) => v - ground);
  const tolerance = options.degeneracyToleranceMeV ?? 1e-6;

  const groups: number[][] = [];
  for (let k = 0; k < n; k++) {
    const last = groups[groups.length - 1];
    if (last && energiesMeV[k] - energiesMeV[last[0]] <= tolerance) last.push(k);
    else groups.push([k]);
  }
  // Boltzmann weights per state (T = 0: the ground level only, shared equally).
  const weights = new Float64Array(n);
  if (temperatureK === 0) for (const k of groups[0]) weights[k] = 1;
  else for (let k = 0; k < n; k++) weights[k] = Math.exp(-energiesMeV[k] / (BOLTZMANN_MEV_PER_K * temperatureK));
  const z = weights.reduce((s, w) => s + w, 0);
  const levels: CefLevel[] = groups.map((g) => ({
    energyMeV: g.reduce((s, k) => s + energiesMeV[k], 0) / g.length,
    degeneracy: g.length,
    stateIndices: g,
    populationPerState: g.reduce((s, k) => s + weights[k], 0) / g.length / z,
  }));

  const { strengths } = transitionStrengths(ion.J, vectors, { qDirection: options.qDirection });
  const minimumPopulation = options.minimumPopulation ?? 1e-9;
  const transitions: CefTransition[] = [];
  let elasticWeight = 0;
  levels.forEach((from, a) => {
    if (from.populationPerState < minimumPopulation) return;
    levels.forEach((to, b) => {
      let strength = 0;
      for (const i of from.stateIndices) for (const j of to.stateIndices) strength += strengths[j * n + i];
      if (a === b) {
        elasticWeight += from.populationPerState * strength;
        return;
      }
      transitions.push({
        fromLevel: a,
        toLevel: b,
        fromMeV: from.energyMeV,
        toMeV: to.energyMeV,
        energyMeV: to.energyMeV - from.energyMeV,
        strength,
        weight: from.populationPerState * strength,
      });
    });
  });
  return { ion, energiesMeV, eigenvectors: vectors, levels, transitions, elasticWeight };
}
