/**
 * Rotation matrices of a J multiplet (Wigner D matrices) and the conversion of 3×3 rotation matrices to z-y-z
 * Euler angles.
 *
 * D^J_{m'm}(α, β, γ) = ⟨J m'| e^{−iαJz} e^{−iβJy} e^{−iγJz} |J m⟩ = e^{−im'α} d^J_{m'm}(β) e^{−imγ}, with Wigner's
 * formula for d^J (Edmonds 1957 ch. 4; Sakurai ch. 3):
 *   d^J_{m'm}(β) = Σ_k (−1)^{k−m+m'} sqrt((J+m')!(J−m')!(J+m)!(J−m)!) / [(J+m−k)! k! (J−k−m')! (k−m+m')!]
 *                 × cos(β/2)^{2J−2k+m−m'} sin(β/2)^{2k−m+m'}.
 * The Euler angles describe the active rotation A = Rz(α) Ry(β) Rz(γ) of 3-space, and D(A)† J_i D(A) = Σ_j A_ij J_j.
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';
import { checkJ } from './angularMomentum';

/** z-y-z Euler angles in radians of the active rotation Rz(α) Ry(β) Rz(γ). */
export interface EulerAngles {
  alpha: number;
  beta: number;
  gamma: number;
}

function logFactorial(n: number): number {
  let s = 0;
  for (let i = 2; i <= n; i++) s += Math.log(i);
  return s;
}

/**
 * Wigner's small d^J(β) as a real (2J+1)×(2J+1) matrix, row-major, in the basis k ↔ m = J − k.
 * @example wignerSmallD(0.5, Math.PI)  // [[0, −1], [1, 0]]
 */
export function wignerSmallD(J: number, beta: number): Float64Array {
  const n = checkJ(J);
  if (!Number.isFinite(beta)) throw new InputError('beta', beta, 'a finite angle in radians');
  const d = new Float64Array(n * n);
  const c = Math.cos(beta / 2), s = Math.sin(beta / 2);
  for (let r = 0; r < n; r++) {
    const mp = J - r;
    for (let col = 0; col < n; col++) {
      const m = J - col;
      const jpm = Math.round(J + mp), jmm = Math.round(J - mp), jpn = Math.round(J + m), jmn = Math.round(J - m);
      const logPre = 0.5 * (logFactorial(jpm) + logFactorial(jmm) + logFactorial(jpn) + logFactorial(jmn));
      let sum = 0;
      for (let k = Math.max(0, Math.round(m - mp)); k <= Math.min(jpn, jmm); k++) {
        const logDen = logFactorial(jpn - k) + logFactorial(k) + logFactorial(jmm - k) + logFactorial(Math.round(k - m + mp));
        const pc = Math.round(2 * J - 2 * k + m - mp), ps = Math.round(2 * k - m + mp);
        const sign = Math.round(k - m + mp) % 2 === 0 ? 1 : -1;
        sum += sign * Math.exp(logPre - logDen) * c ** pc * s ** ps;
      }
      d[r * n + col] = sum;
    }
  }
  return d;
}

/**
 * The rotation operator D^J(α, β, γ) = e^{−iαJz} e^{−iβJy} e^{−iγJz} in the |J, m⟩ basis.
 * @example wignerD(1, { alpha: 0, beta: Math.PI / 2, gamma: 0 })
 * See also: rotateCefParameters, eulerAnglesFromMatrix
 */
export function wignerD(J: number, angles: EulerAngles): ComplexMatrix {
  const n = checkJ(J);
  const { alpha, beta, gamma } = angles;
  const d = wignerSmallD(J, beta);
  const out = zeros(n);
  for (let r = 0; r < n; r++)
    for (let c = 0; c < n; c++) {
      const phase = -((J - r) * alpha + (J - c) * gamma);
      out.re[r * n + c] = d[r * n + c] * Math.cos(phase);
      out.im[r * n + c] = d[r * n + c] * Math.sin(phase);
    }
  return out;
}

/** Rz(α) Ry(β) Rz(γ) as a 3×3 array (active rotation). */
export function rotationMatrixFromEuler({ alpha, beta, gamma }: EulerAngles): number[][] {
  const rz = (t: number) => [[Math.cos(t), -Math.sin(t), 0], [Math.sin(t), Math.cos(t), 0], [0, 0, 1]];
  const ry = (t: number) => [[Math.cos(t), 0, Math.sin(t)], [0, 1, 0], [-Math.sin(t), 0, Math.cos(t)]];
  const mul = (a: number[][], b: number[][]) => a.map((row) => [0, 1, 2].map((j) => row.reduce((s, v, k) => s + v * b[k][j], 0)));
  return mul(mul(rz(alpha), ry(beta)), rz(gamma));
}

/** Check a proper rotation matrix (orthogonal to 1e-6, determinant +1). */
export function checkRotationMatrix(rotation: unknown, field = 'rotation'): number[][] {
  const expected = 'a 3×3 proper rotation matrix (orthogonal, determinant +1) or Euler angles {alpha, beta, gamma} in radians';
  if (!Array.isArray(rotation) || rotation.length !== 3 || !rotation.every((row) => Array.isArray(row) && row.length === 3 && row.every((v) => typeof v === 'number' && Number.isFinite(v))))
    throw new InputError(field, rotation, expected);
  const r = rotation as number[][];
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) {
      const dot = r[i][0] * r[j][0] + r[i][1] * r[j][1] + r[i][2] * r[j][2];
      if (Math.abs(dot - (i === j ? 1 : 0)) > 1e-6) throw new InputError(field, rotation, expected, 'rows are not orthonormal');
    }
  const det =
    r[0][0] * (r[1][1] * r[2][2] - r[1][2] * r[2][1]) - r[0][1] * (r[1][0] * r[2][2] - r[1][2] * r[2][0]) + r[0][2] * (r[1][0] * r[2][1] - r[1][1] * r[2][0]);
  if (det < 0) throw new InputError(field, rotation, expected, 'determinant −1: an improper rotation');
  return r;
}

/**
 * z-y-z Euler angles (radians) of an active rotation matrix A = Rz(α) Ry(β) Rz(γ).
 * @example eulerAnglesFromMatrix([[0, -1, 0], [1, 0, 0], [0, 0, 1]]) // { alpha: π/2, beta: 0, gamma: 0 }
 */
export function eulerAnglesFromMatrix(a: number[][]): EulerAngles {
  checkRotationMatrix(a);
  const cb = Math.min(1, Math.max(-1, a[2][2]));
  const sb = Math.hypot(a[0][2], a[1][2]);
  if (sb > 1e-12) {
    return { alpha: Math.atan2(a[1][2], a[0][2]), beta: Math.atan2(sb, cb), gamma: Math.atan2(a[2][1], -a[2][0]) };
  }
  // β = 0: A = Rz(α + γ); β = π: A = Rz(α) Ry(π) Rz(γ) = Rz(α − γ) Ry(π) (take γ = 0)
  if (cb > 0) return { alpha: Math.atan2(a[1][0], a[0][0]), beta: 0, gamma: 0 };
  return { alpha: Math.atan2(-a[1][0], -a[0][0]), beta: Math.PI, gamma: 0 };
}
