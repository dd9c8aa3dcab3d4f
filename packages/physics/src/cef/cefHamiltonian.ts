/**
 * The crystal-field Hamiltonian H_CEF = Σ_{n,m} B_n^m O_n^m in the |J, m⟩ basis (Stevens 1952; Hutchings 1964).
 * Parameters in meV with the Stevens factors already included (DEVELOPERS.md § Conventions).
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';
import { checkJ } from './angularMomentum';
import { requireParameterKey } from './parameterKeys';
import { stevensOperatorShared } from './stevensOperator';

/** Stevens parameters in meV keyed 'B20', 'B43', 'B4-3', … (DEVELOPERS.md § Conventions). */
export type CefParameters = Readonly<Record<string, number>>;

/**
 * H_CEF = Σ B_n^m O_n^m as a Hermitian (2J+1)×(2J+1) matrix in meV. Keys must be Stevens parameter names
 * ('B4m3' accepted for 'B4-3'); values finite numbers in meV. Terms with n > 2J vanish.
 * The Stevens operators are built once per (J, n, m) and reused, so calling this in a fit loop is cheap.
 *
 * @example cefHamiltonian(2.5, { B40: 0.01, B44: 0.05 }) // Ce3+ in a cubic field
 * See also: normalizeCefParameters (units, site symmetry), solveCef, stevensOperator
 */
export function cefHamiltonian(J: number, parametersMeV: CefParameters, field = 'B'): ComplexMatrix {
  const dim = checkJ(J);
  if (parametersMeV === null || typeof parametersMeV !== 'object' || Array.isArray(parametersMeV))
    throw new InputError(field, parametersMeV, 'an object of Stevens parameters in meV, e.g. {"B20": -0.2}');
  const h = zeros(dim);
  for (const [key, value] of Object.entries(parametersMeV)) {
    const { n, m } = requireParameterKey(key, field);
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new InputError(`${field}.${key}`, value, 'a finite number (meV)');
    if (value === 0) continue;
    const op = stevensOperatorShared(J, n, m);
    for (let k = 0; k < h.re.length; k++) {
      h.re[k] += value * op.re[k];
      h.im[k] += value * op.im[k];
    }
  }
  return h;
}
