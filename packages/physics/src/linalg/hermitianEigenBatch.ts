/**
 * Batch diagonalisation of many complex Hermitian matrices (powder averages, field scans, fits).
 *
 * See also: hermitianEigen (linalg/hermitianEigen.ts) for the algorithm and conventions.
 */
import { InputError } from '../errors';
import type { ComplexMatrix } from './complexMatrix';
import {
  EigenWorkspace,
  checkShape,
  solveInto,
  type HermitianEigenOptions,
  type HermitianEigenResult,
  type HermitianEigenValuesResult,
} from './hermitianEigen';

/**
 * Diagonalise every matrix of `matrices` (any mix of dimensions), reusing one scratch workspace per dimension.
 * Result i belongs to matrices[i]; conventions as in hermitianEigen (ascending values, vectors as columns).
 *
 * @example
 *   const results = hermitianEigenBatch(hamiltonians, { vectors: false });
 *   const groundEnergies = results.map((r) => r.values[0]);
 * @throws InputError naming `matrices[i]` for a bad matrix.
 * See also: hermitianEigen, EigenWorkspace.
 */
export function hermitianEigenBatch(
  matrices: readonly ComplexMatrix[],
  options?: HermitianEigenOptions & { vectors?: true },
): HermitianEigenResult[];
export function hermitianEigenBatch(
  matrices: readonly ComplexMatrix[],
  options: HermitianEigenOptions & { vectors: false },
): HermitianEigenValuesResult[];
export function hermitianEigenBatch(
  matrices: readonly ComplexMatrix[],
  options?: HermitianEigenOptions,
): Array<HermitianEigenResult | HermitianEigenValuesResult>;
export function hermitianEigenBatch(
  matrices: readonly ComplexMatrix[],
  options: HermitianEigenOptions = {},
): Array<HermitianEigenResult | HermitianEigenValuesResult> {
  if (!Array.isArray(matrices)) throw new InputError('matrices', matrices, 'an array of ComplexMatrix');
  const workspaces = new Map<number, EigenWorkspace>();
  const base = options.field ?? 'matrices';
  return matrices.map((a, i) => {
    const field = `${base}[${i}]`;
    const n = checkShape(a, field);
    let ws = workspaces.get(n);
    if (!ws) {
      ws = new EigenWorkspace(n);
      workspaces.set(n, ws);
    }
    return solveInto(ws, a, { ...options, field });
  });
}
