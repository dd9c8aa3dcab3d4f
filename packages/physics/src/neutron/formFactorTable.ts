/**
 * Coefficients of the analytic approximation to ⟨j0⟩ and ⟨j2⟩ for the 4f shell of the trivalent rare-earth ions:
 * P. J. Brown, International Tables for Crystallography Vol. C (2006), §4.4.5, Tables 4.4.5.3 (⟨j0⟩) and the
 * corresponding ⟨j2⟩ table, with s = sin θ/λ = Q/4π in Å⁻¹:
 *   ⟨j0(s)⟩ = A e^{−a s²} + B e^{−b s²} + C e^{−c s²} + D,     ⟨j2(s)⟩ = s² (A e^{−a s²} + B e^{−b s²} + C e^{−c s²} + D).
 * Transcribed from a public machine-readable copy of Brown's tables (columns A a B b C c D).
 *
 * The tables have no Ce3+ or Pm3+ entry and no Pr3+ ⟨j2⟩. Approximations used there, flagged in `approximation`:
 * Ce3+ takes the Ce2+ coefficients (4f² radial function: slightly too extended for 4f¹); Pr3+ ⟨j2⟩ takes Ce2+
 * (isoelectronic 4f²); Pm3+ takes Nd3+ (its neighbour). Common practice when no table exists.
 */

/** Seven coefficients A, a, B, b, C, c, D. */
export type FormFactorCoefficients = readonly [number, number, number, number, number, number, number];

export interface FormFactorEntry {
  readonly j0: FormFactorCoefficients;
  readonly j2: FormFactorCoefficients;
  /** Set when the entry borrows another ion's coefficients. */
  readonly approximation?: string;
}

const CE2_J0: FormFactorCoefficients = [0.2953, 17.6846, 0.2923, 6.7329, 0.4313, 5.3827, -0.0194];
const CE2_J2: FormFactorCoefficients = [0.9809, 18.063, 1.8413, 7.769, 0.9905, 2.845, 0.012];
const ND3_J0: FormFactorCoefficients = [0.054, 25.0293, 0.3101, 12.102, 0.6575, 4.7223, -0.0216];
const ND3_J2: FormFactorCoefficients = [0.6751, 18.342, 1.6272, 7.26, 0.9644, 2.602, 0.015];

/** Keyed by ion name as in `@multiplet/physics/ions` ('Er3+'). */
export const FORM_FACTOR_TABLE: Readonly<Record<string, FormFactorEntry>> = {
  'Ce3+': { j0: CE2_J0, j2: CE2_J2, approximation: 'Ce2+ coefficients (no Ce3+ entry in the tables)' },
  'Pr3+': {
    j0: [0.0504, 24.9989, 0.2572, 12.0377, 0.7142, 5.0039, -0.0219],
    j2: CE2_J2,
    approximation: '<j2> from Ce2+ (isoelectronic 4f2; no Pr3+ <j2> entry in the tables)',
  },
  'Nd3+': { j0: ND3_J0, j2: ND3_J2 },
  'Pm3+': { j0: ND3_J0, j2: ND3_J2, approximation: 'Nd3+ coefficients (no Pm3+ entry in the tables)' },
  'Sm3+': { j0: [0.0288, 25.2068, 0.2973, 11.8311, 0.6954, 4.2117, -0.0213], j2: [0.4707, 18.43, 1.4261, 7.034, 0.9574, 2.439, 0.0182] },
  'Eu3+': { j0: [0.0204, 25.3078, 0.301, 11.4744, 0.7005, 3.942, -0.022], j2: [0.3985, 18.451, 1.3307, 6.956, 0.9603, 2.378, 0.0197] },
  'Gd3+': { j0: [0.0186, 25.3867, 0.2895, 11.1421, 0.7135, 3.752, -0.0217], j2: [0.3347, 18.476, 1.2465, 6.877, 0.9537, 2.318, 0.0217] },
  'Tb3+': { j0: [0.0177, 25.5095, 0.2921, 10.5769, 0.7133, 3.5122, -0.0231], j2: [0.2892, 18.497, 1.1678, 6.797, 0.9437, 2.257, 0.0232] },
  'Dy3+': { j0: [0.1157, 15.0732, 0.327, 6.7991, 0.5821, 3.0202, -0.0249], j2: [0.2523, 18.517, 1.0914, 6.736, 0.9345, 2.208, 0.025] },
  'Ho3+': { j0: [0.0566, 18.3176, 0.3365, 7.688, 0.6317, 2.9427, -0.0248], j2: [0.2188, 18.516, 1.024, 6.707, 0.9251, 2.161, 0.0268] },
  'Er3+': { j0: [0.0586, 17.9802, 0.354, 7.0964, 0.6126, 2.7482, -0.0251], j2: [0.171, 18.534, 0.9879, 6.625, 0.9044, 2.1, 0.0278] },
  'Tm3+': { j0: [0.0581, 15.0922, 0.2787, 7.8015, 0.6854, 2.7931, -0.0224], j2: [0.176, 18.542, 0.9105, 6.579, 0.897, 2.062, 0.0294] },
  'Yb3+': { j0: [0.0416, 16.0949, 0.2849, 7.8341, 0.6961, 2.6725, -0.0229], j2: [0.157, 18.555, 0.8484, 6.54, 0.888, 2.037, 0.0318] },
};
