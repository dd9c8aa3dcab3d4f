/**
 * A readable view of a CefSolution: each level's states as lists of |J, m⟩ components, with ⟨J⟩ and the moment.
 */
import { InputError } from '../errors';
import { angularMomentumMatrices } from './angularMomentum';
import { matrixElement } from './groundDoubletGTensor';
import type { CefSolution } from './solveCef';

/** One |J, m⟩ component of a state: amplitude c_m = re + i·im and weight |c_m|². */
export interface StateComponent {
  m: number;
  re: number;
  im: number;
  weight: number;
}

/** One eigenstate of a level. */
export interface DescribedState {
  /** Column index in CefSolution.eigenvectors. */
  index: number;
  /** ⟨Jx⟩, ⟨Jy⟩, ⟨Jz⟩ in this state (dimensionless). */
  expectationJ: [number, number, number];
  /** Moment g_J μB ⟨J⟩ in μB (DEVELOPERS.md § Conventions: along ⟨J⟩ for g_J > 0). */
  momentMuB: [number, number, number];
  /** Components with weight ≥ threshold, largest first. */
  components: StateComponent[];
  /** The components written out, e.g. "0.987|15/2⟩ + 0.160|3/2⟩ − 0.01|−9/2⟩". */
  ket: string;
}

/** A level with its states. */
export interface DescribedLevel {
  energyMeV: number;
  degeneracy: number;
  states: DescribedState[];
}

/**
 * An angular-momentum quantum number as written in the trade: whole numbers plain, half-integers as fractions.
 * @example formatAngularMomentum(7.5) // "15/2"; formatAngularMomentum(-1.5) // "−3/2"
 */
export function formatAngularMomentum(m: number): string {
  const twice = Math.round(2 * m);
  const sign = twice < 0 ? '−' : '';
  return twice % 2 === 0 ? `${sign}${Math.abs(twice / 2)}` : `${sign}${Math.abs(twice)}/2`;
}

function formatAmplitude(re: number, im: number): string {
  const digits = 3;
  if (Math.abs(im) < 5e-4) return re.toFixed(digits);
  if (Math.abs(re) < 5e-4) return `${im.toFixed(digits)}i`;
  return `(${re.toFixed(digits)}${im < 0 ? '−' : '+'}${Math.abs(im).toFixed(digits)}i)`;
}

/**
 * Each level of a solution with its eigenstates as |J, m⟩ components (weights ≥ `weightThreshold`, default 0.001),
 * ⟨J⟩ and the moment g_J ⟨J⟩ in μB. Inside a degenerate level the states are those of solveCef (Jz diagonal).
 *
 * @example describeLevels(solveCef(getIon('Dy3+'), B))[0].states[0].ket // "0.98|15/2⟩ + …"
 * See also: solveCef
 */
export function describeLevels(solution: CefSolution, weightThreshold = 1e-3): DescribedLevel[] {
  if (typeof weightThreshold !== 'number' || !(weightThreshold >= 0 && weightThreshold <= 1))
    throw new InputError('weightThreshold', weightThreshold, 'a number between 0 and 1');
  const { J, eigenvectors: v } = solution;
  const n = v.n;
  const jm = angularMomentumMatrices(J);
  const gJ = solution.ion.gJ;
  return solution.levels.map((level) => ({
    energyMeV: level.energyMeV,
    degeneracy: level.degeneracy,
    states: level.stateIndices.map((index) => {
      const expectationJ = [jm.Jx, jm.Jy, jm.Jz].map((op) => matrixElement(v, index, op, index)[0]) as [number, number, number];
      const components: StateComponent[] = [];
      for (let k = 0; k < n; k++) {
        const re = v.re[k * n + index], im = v.im[k * n + index];
        const weight = re * re + im * im;
        if (weight >= weightThreshold) components.push({ m: J - k, re, im, weight });
      }
      components.sort((x, y) => y.weight - x.weight || y.m - x.m);
      const ket = components
        .map((c, i) => {
          const amp = formatAmplitude(c.re, c.im);
          const text = `${amp}|${formatAngularMomentum(c.m)}⟩`;
          if (i === 0) return text;
          return amp.startsWith('-') ? ` − ${text.slice(1)}` : ` + ${text}`;
        })
        .join('');
      return {
        index,
        expectationJ,
        momentMuB: expectationJ.map((x) => gJ * x) as [number, number, number],
        components,
        ket,
      };
    }),
  }));
}
