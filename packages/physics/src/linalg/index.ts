/**
 * Dense complex linear algebra for Multiplet: the ComplexMatrix type and helpers, and the Hermitian eigensolver.
 * Conventions: DEVELOPERS.md § Conventions (eigenvectors are columns, eigenvalues ascending).
 */
export * from './complexMatrix';
export {
  hermitianEigen,
  EigenWorkspace,
  solveInto,
  type HermitianEigenResult,
  type HermitianEigenValuesResult,
  type HermitianEigenOptions,
} from './hermitianEigen';
export { hermitianEigenBatch } from './hermitianEigenBatch';
