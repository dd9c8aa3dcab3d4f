/**
 * The trivalent rare-earth ions Ce3+ … Yb3+ (4f^1 … 4f^13): one table, the one source of truth for ion constants.
 *
 * Computed here (not typed in): S, L, J by Hund's rules (ions/hundsRules.ts) and g_J by the Landé formula
 * (ions/landeG.ts). Typed in, with their sources:
 * - Stevens factors α_J = θ_2, β_J = θ_4, γ_J = θ_6 as exact fractions: K. W. H. Stevens, Proc. Phys. Soc. A 65,
 *   209 (1952) and M. T. Hutchings, Solid State Physics 16, 227 (1964), Stevens-factor table. From memory: these fractions are
 *   recalled, and checked in test/physics/ions/ionTable.test.ts against an independent computation from the
 *   Hund's-rule Slater determinant (Clebsch–Gordan recoupling), which they must match exactly.
 * - Radial integrals ⟨r^2⟩, ⟨r^4⟩, ⟨r^6⟩ in bohr^n: A. J. Freeman and J. P. Desclaux, J. Magn. Magn. Mater. 12,
 *   11 (1979), relativistic Dirac–Fock values. From memory: recalled to the digits given, good to about 1 %.
 */
import { InputError } from '../errors';
import { hundsRuleTerm } from './hundsRules';
import { landeG } from './landeG';

/** A trivalent rare-earth ion in its Hund's-rule ground multiplet. */
export interface Ion {
  /** Canonical name, e.g. 'Dy3+'. */
  name: string;
  /** Element symbol, e.g. 'Dy'. */
  element: string;
  /** Number of 4f electrons. */
  nf: number;
  S: number;
  L: number;
  J: number;
  /** Landé factor (dimensionless). */
  gJ: number;
  /** Stevens factors θ_2 = α_J, θ_4 = β_J, θ_6 = γ_J (dimensionless). */
  stevens: { alpha: number; beta: number; gamma: number };
  /** ⟨r^n⟩ of the 4f shell in bohr^n (Freeman & Desclaux 1979). */
  radial: { r2: number; r4: number; r6: number };
  /** Odd number of electrons: every level is at least doubly degenerate in zero field (Kramers theorem). */
  kramers: boolean;
}

interface IonConstants {
  element: string;
  nf: number;
  /** [α_J, β_J, γ_J] (Stevens 1952; Hutchings 1964, Stevens-factor table; from memory). */
  stevens: readonly [number, number, number];
  /** [⟨r²⟩, ⟨r⁴⟩, ⟨r⁶⟩] in bohr^n (Freeman & Desclaux 1979; from memory). */
  radial: readonly [number, number, number];
}

const CONSTANTS: readonly IonConstants[] = [
  { element: 'Ce', nf: 1, stevens: [-2 / 35, 2 / 315, 0], radial: [1.309, 3.964, 23.31] },
  { element: 'Pr', nf: 2, stevens: [-52 / 2475, -4 / 5445, 272 / 4459455], radial: [1.1963, 3.3335, 18.353] },
  { element: 'Nd', nf: 3, stevens: [-7 / 1089, -136 / 467181, -1615 / 42513471], radial: [1.114, 2.910, 15.03] },
  // Pm3+ γ_J: the recalled denominator was wrong; 2584/42513471 is the value the independent computation gives.
  { element: 'Pm', nf: 4, stevens: [14 / 1815, 952 / 2335905, 2584 / 42513471], radial: [1.0353, 2.5390, 12.546] },
  { element: 'Sm', nf: 5, stevens: [13 / 315, 26 / 10395, 0], radial: [0.9743, 2.260, 10.55] },
  // J = 0 (Eu3+) and L = 0 (Gd3+): the crystal field does not split the ground multiplet in first order.
  { element: 'Eu', nf: 6, stevens: [0, 0, 0], radial: [0.9175, 2.020, 9.039] },
  { element: 'Gd', nf: 7, stevens: [0, 0, 0], radial: [0.8671, 1.820, 7.831] },
  { element: 'Tb', nf: 8, stevens: [-1 / 99, 2 / 16335, -1 / 891891], radial: [0.8220, 1.651, 6.852] },
  { element: 'Dy', nf: 9, stevens: [-2 / 315, -8 / 135135, 4 / 3864861], radial: [0.7814, 1.505, 6.048] },
  { element: 'Ho', nf: 10, stevens: [-1 / 450, -1 / 30030, -5 / 3864861], radial: [0.7446, 1.379, 5.379] },
  { element: 'Er', nf: 11, stevens: [4 / 1575, 2 / 45045, 8 / 3864861], radial: [0.7111, 1.270, 4.816] },
  { element: 'Tm', nf: 12, stevens: [1 / 99, 8 / 49005, -5 / 891891], radial: [0.6804, 1.174, 4.340] },
  { element: 'Yb', nf: 13, stevens: [2 / 63, -2 / 1155, 4 / 27027], radial: [0.6522, 1.089, 3.932] },
];

function buildIon(c: IonConstants): Ion {
  const { S, L, J } = hundsRuleTerm(c.nf);
  return Object.freeze({
    name: `${c.element}3+`,
    element: c.element,
    nf: c.nf,
    S,
    L,
    J,
    gJ: landeG(S, L, J),
    stevens: Object.freeze({ alpha: c.stevens[0], beta: c.stevens[1], gamma: c.stevens[2] }),
    radial: Object.freeze({ r2: c.radial[0], r4: c.radial[1], r6: c.radial[2] }),
    kramers: c.nf % 2 === 1,
  });
}

const IONS: readonly Ion[] = CONSTANTS.map(buildIon);

/** Canonical names of the supported ions, 'Ce3+' … 'Yb3+' (13 ions, Pm3+ included). */
export const ION_NAMES: readonly string[] = Object.freeze(IONS.map((ion) => ion.name));

/**
 * Look up a trivalent rare-earth ion. Accepts 'Dy3+', 'Dy', 'dy3+', 'DY' (case-insensitive, '3+' optional).
 *
 * @example getIon('Dy3+').gJ // 4/3
 * @throws InputError('ion', name, 'one of Ce3+, …, Yb3+') for anything else
 * See also: ION_NAMES
 */
export function getIon(name: string): Ion {
  if (typeof name === 'string') {
    const key = name.trim().toLowerCase().replace(/3\+$/, '');
    const ion = IONS.find((i) => i.element.toLowerCase() === key);
    if (ion) return ion;
  }
  throw new InputError('ion', name, `one of ${ION_NAMES.join(', ')}`);
}

/**
 * The Stevens factor θ_n (n = 2, 4, 6) of an ion: α_J, β_J or γ_J.
 * @example stevensFactor(getIon('Ce3+'), 2) // −2/35
 */
export function stevensFactor(ion: Ion, n: number): number {
  if (n === 2) return ion.stevens.alpha;
  if (n === 4) return ion.stevens.beta;
  if (n === 6) return ion.stevens.gamma;
  throw new InputError('n', n, '2, 4 or 6');
}
