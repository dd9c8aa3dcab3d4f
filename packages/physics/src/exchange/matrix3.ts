/**
 * Small real 3-vector / 3×3 helpers for the exchange module (row-major number[][]; plain arrays because these
 * objects go straight into JSON results).
 */
import type { Vector3 } from '../lattice/pyrochlore';

export type Matrix3 = number[][];

/** a·b. */
export function dot3(a: Vector3, b: Vector3): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/** a × b. */
export function cross3(a: Vector3, b: Vector3): Vector3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

/** |a|. */
export function norm3(a: Vector3): number {
  return Math.sqrt(dot3(a, a));
}

/** s·a. */
export function scale3(a: Vector3, s: number): Vector3 {
  return [a[0] * s, a[1] * s, a[2] * s];
}

/** a − b. */
export function sub3(a: Vector3, b: Vector3): Vector3 {
  return [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
}

/** A new 3×3 zero matrix. */
export function zeros3(): Matrix3 {
  return [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
}

/**
 * Rows of the local frame as a matrix R with R[a] = local axis a in global coordinates (a local vector v_loc is
 * R v_glob; a global one is Rᵀ v_loc).
 * @example frameRows(pyrochloreLocalFrames()[0])[2] // ẑ_0 = (1,1,1)/√3
 * See also: toLocalFrames
 */
export function frameRows(frame: { x: Vector3; y: Vector3; z: Vector3 }): Matrix3 {
  return [Array.from(frame.x), Array.from(frame.y), Array.from(frame.z)];
}

/**
 * K_local[a][b] = ê_a^(i) · K ê_b^(j): a global coupling matrix (H = J_iᵀ K J_j) seen in the two local frames.
 * Units unchanged (meV in, meV out).
 * @example toLocalFrames(identity, rowsI, rowsJ)[2][2] // ẑ_i·ẑ_j
 * See also: toGlobalFrame, frameRows
 */
export function toLocalFrames(kGlobal: Matrix3, rowsI: Matrix3, rowsJ: Matrix3): Matrix3 {
  const out = zeros3();
  for (let a = 0; a < 3; a++)
    for (let b = 0; b < 3; b++) {
      let s = 0;
      for (let p = 0; p < 3; p++) for (let q = 0; q < 3; q++) s += rowsI[a][p] * kGlobal[p][q] * rowsJ[b][q];
      out[a][b] = s;
    }
  return out;
}

/**
 * K_global = R_iᵀ K_local R_j (inverse of toLocalFrames). Units unchanged.
 * See also: toLocalFrames
 */
export function toGlobalFrame(kLocal: Matrix3, rowsI: Matrix3, rowsJ: Matrix3): Matrix3 {
  const out = zeros3();
  for (let p = 0; p < 3; p++)
    for (let q = 0; q < 3; q++) {
      let s = 0;
      for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) s += rowsI[a][p] * kLocal[a][b] * rowsJ[b][q];
      out[p][q] = s;
    }
  return out;
}

/** Frobenius norm sqrt(Σ a_ij²). */
export function frobenius3(a: Matrix3): number {
  let s = 0;
  for (const row of a) for (const x of row) s += x * x;
  return Math.sqrt(s);
}
