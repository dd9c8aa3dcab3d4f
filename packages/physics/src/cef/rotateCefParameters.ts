/**
 * Rotate a set of Stevens parameters to another coordinate frame.
 *
 * Method: the crystal field is a scalar function of the ion's angular momentum. Written in the new frame, whose
 * axes e'_i = A e_i are the old ones actively rotated by A, the Hamiltonian is H'(J) = H(A J) = D(A)† H(J) D(A)
 * (Wigner D matrices, cef/wignerRotation.ts). The new parameters follow from trace orthogonality of the Stevens
 * operators: B'_n^m = Tr(H' O_n^m) / Tr(O_n^m O_n^m). Rotations do not mix ranks, and the coefficients of a rotated
 * operator equivalent do not depend on J (operator equivalents intertwine rotations), so the projection is done in
 * an auxiliary J = 6 multiplet where every O_n^m with n ≤ 6 is non-zero; the result is exact for every J.
 */
import { InputError } from '../errors';
import { multiply, adjoint, type ComplexMatrix } from '../linalg/complexMatrix';
import { checkJ } from './angularMomentum';
import { cefHamiltonian, type CefParameters } from './cefHamiltonian';
import { CEF_PARAMETER_KEYS, CEF_RANKS, parseParameterKey } from './parameterKeys';
import { stevensOperatorShared } from './stevensOperator';
import { checkRotationMatrix, eulerAnglesFromMatrix, wignerD, type EulerAngles } from './wignerRotation';

const AUXILIARY_J = 6;

/** Size, relative to the largest parameter of the same rank, below which a rotated parameter is round-off and is dropped. */
const ROUND_OFF = 1e-13;

function traceProductReal(a: ComplexMatrix, b: ComplexMatrix): number {
  // Tr(A B) = Σ_ij A_ij B_ji; for Hermitian A, B it is real.
  const n = a.n;
  let s = 0;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) s += a.re[i * n + j] * b.re[j * n + i] - a.im[i * n + j] * b.im[j * n + i];
  return s;
}

/**
 * The parameters of the same crystal field in a new frame. `rotation` is either
 * - a 3×3 matrix whose rows are the new x', y', z' axes written in the old frame (so v_new = R v_old), or
 * - z-y-z Euler angles {alpha, beta, gamma} (radians) of the active rotation that carries the old axes onto the new.
 * Parameters in meV (any energy unit works: the map is linear). J is validated only: the result does not depend on it.
 *
 * @example rotateCefParameters({ B40: 1, B44: 5 }, 2.5, [[1/√6, 1/√6, −2/√6], [−1/√2, 1/√2, 0], [1/√3, 1/√3, 1/√3]])
 *          // cubic field with z ∥ [111]: B40' = −2/3, B43' = ±(40√2/3)·…
 * See also: cubicToTrigonal, wignerD, eulerAnglesFromMatrix
 */
export function rotateCefParameters(parametersMeV: CefParameters, J: number, rotation: number[][] | EulerAngles): CefParameters {
  checkJ(J);
  let angles: EulerAngles;
  if (Array.isArray(rotation)) {
    const r = checkRotationMatrix(rotation);
    const a = [0, 1, 2].map((i) => [0, 1, 2].map((j) => r[j][i])); // A = Rᵀ
    angles = eulerAnglesFromMatrix(a);
  } else if (rotation && typeof rotation === 'object' && ['alpha', 'beta', 'gamma'].every((k) => Number.isFinite((rotation as unknown as Record<string, unknown>)[k]))) {
    angles = rotation;
  } else {
    throw new InputError('rotation', rotation, 'a 3×3 proper rotation matrix or Euler angles {alpha, beta, gamma} in radians');
  }
  cefHamiltonian(AUXILIARY_J, parametersMeV); // validates keys and values
  const d = wignerD(AUXILIARY_J, angles);
  const dAdjoint = adjoint(d);
  const out: Record<string, number> = {};
  // Rank by rank (rotations do not mix ranks), so that round-off is relative to each rank's own size.
  for (const rank of CEF_RANKS) {
    const ofRank = Object.fromEntries(Object.entries(parametersMeV).filter(([key]) => parseParameterKey(key)!.n === rank));
    if (!Object.values(ofRank).some((v) => v !== 0)) continue;
    const rotated = multiply(multiply(dAdjoint, cefHamiltonian(AUXILIARY_J, ofRank)), d);
    const keys = CEF_PARAMETER_KEYS.filter((key) => parseParameterKey(key)!.n === rank);
    const values = keys.map((key) => {
      const { n, m } = parseParameterKey(key)!;
      const op = stevensOperatorShared(AUXILIARY_J, n, m);
      return traceProductReal(rotated, op) / traceProductReal(op, op);
    });
    const largest = Math.max(...values.map(Math.abs));
    keys.forEach((key, i) => {
      if (Math.abs(values[i]) > ROUND_OFF * largest) out[key] = values[i];
    });
  }
  return Object.freeze(out);
}
