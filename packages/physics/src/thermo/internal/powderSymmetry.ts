// Symmetry reduction of a powder grid for one crystal-field site.
//
// If a proper rotation R leaves H_CEF invariant, D(R) H_CEF D(R)† = H_CEF with D(R) = exp(−iθ n̂·J), then
// H(R n̂) = D H(n̂) D† for the Zeeman term along n̂, so the spectrum and M∥ are the same along n̂ and R n̂. Time
// reversal adds M∥(−n̂) = M∥(n̂). A Lebedev–Laikov grid is invariant under the 24 proper rotations of the cube (and
// inversion); we try it in two orientations — cube axes along the local axes (cubic, tetragonal, orthorhombic sites)
// and cube [111] along local z with the cube two-fold [0,−1,1] along local y (trigonal sites, e.g. D3d with the
// B43 convention of the pyrochlore frames) — keep the rotations of the oriented grid that leave H_CEF invariant,
// and merge each orbit of grid points into one representative carrying the orbit's total weight.
// Group theory: e.g. Tinkham, "Group Theory and Quantum Mechanics", ch. 5 (rotation operators D(R) in a J multiplet).
import { hermitianEigen, type ComplexMatrix } from '../../linalg';
import type { SphereGrid } from '../../quadrature';
import { siteFrames, type Rotation3 } from '../siteFrames';
import type { PreparedIon } from './singleIon';

export interface ReducedGrid {
  grid: SphereGrid;
  /** Number of proper rotations of the oriented grid that leave H_CEF invariant (1, 2, 3, 4, 6, 8, 12 or 24). */
  rotations: number;
  orientation: 'cube axes' | 'cube [111] along z';
}

type Matrix3 = number[][];

/** The 24 proper rotations of the cube: signed permutation matrices with determinant +1. */
function cubeRotations(): Matrix3[] {
  const perms = [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]];
  const out: Matrix3[] = [];
  for (const p of perms)
    for (let s = 0; s < 8; s++) {
      const m = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
      for (let i = 0; i < 3; i++) m[i][p[i]] = s & (1 << i) ? -1 : 1;
      if (Math.abs(det(m) - 1) < 1e-12) out.push(m);
    }
  return out;
}

function det(m: Matrix3): number {
  return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
}

const mul = (a: Matrix3, b: Matrix3): Matrix3 => a.map((row) => [0, 1, 2].map((j) => row[0] * b[0][j] + row[1] * b[1][j] + row[2] * b[2][j]));
const transpose = (a: Matrix3 | Rotation3): Matrix3 => [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[j][i]));

/** Does D(R) H D(R)† = H for the rotation R (local frame)? */
function leavesInvariant(ion: PreparedIon, r: Matrix3): boolean {
  const n = ion.dim;
  const cos = Math.max(-1, Math.min(1, (r[0][0] + r[1][1] + r[2][2] - 1) / 2));
  const angle = Math.acos(cos);
  if (angle < 1e-12) return true;
  let axis: number[];
  if (Math.PI - angle > 1e-6) {
    axis = [r[2][1] - r[1][2], r[0][2] - r[2][0], r[1][0] - r[0][1]];
  } else {
    // θ = π: R = 2 n nᵀ − 1, take the largest column of (R + 1)/2.
    const k = [0, 1, 2].reduce((best, i) => (r[i][i] > r[best][best] ? i : best), 0);
    axis = [0, 1, 2].map((i) => (r[i][k] + (i === k ? 1 : 0)) / 2);
  }
  const norm = Math.hypot(axis[0], axis[1], axis[2]);
  axis = axis.map((x) => x / norm);
  // D = exp(−iθ n̂·J) = V diag(e^{−iθ λ_k}) V†, from the eigen-decomposition of n̂·J.
  const nj = { n, re: new Float64Array(n * n), im: new Float64Array(n * n) } as ComplexMatrix;
  for (let k = 0; k < n * n; k++) {
    nj.re[k] = axis[0] * ion.jx.re[k] + axis[1] * ion.jy.re[k] + axis[2] * ion.jz.re[k];
    nj.im[k] = axis[0] * ion.jx.im[k] + axis[1] * ion.jy.im[k] + axis[2] * ion.jz.im[k];
  }
  const { values, vectors: v } = hermitianEigen(nj, { vectors: true });
  const dRe = new Float64Array(n * n), dIm = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let sr = 0, si = 0;
      for (let k = 0; k < n; k++) {
        const pr = Math.cos(angle * values[k]), pi = -Math.sin(angle * values[k]);
        // v_ik · phase · conj(v_jk)
        const ar = v.re[i * n + k] * pr - v.im[i * n + k] * pi;
        const ai = v.re[i * n + k] * pi + v.im[i * n + k] * pr;
        sr += ar * v.re[j * n + k] + ai * v.im[j * n + k];
        si += ai * v.re[j * n + k] - ar * v.im[j * n + k];
      }
      dRe[i * n + j] = sr;
      dIm[i * n + j] = si;
    }
  // Invariance ⇔ D H = H D (D unitary).
  const h = ion.hCef;
  let scale = 1e-300, worst = 0;
  for (let k = 0; k < n * n; k++) scale = Math.max(scale, Math.hypot(h.re[k], h.im[k]));
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let xr = 0, xi = 0;
      for (let k = 0; k < n; k++) {
        const a = i * n + k, b = k * n + j;
        xr += dRe[a] * h.re[b] - dIm[a] * h.im[b] - (h.re[a] * dRe[b] - h.im[a] * dIm[b]);
        xi += dRe[a] * h.im[b] + dIm[a] * h.re[b] - (h.re[a] * dIm[b] + h.im[a] * dRe[b]);
      }
      worst = Math.max(worst, Math.hypot(xr, xi));
    }
  return worst <= 1e-9 * scale;
}

/** Merge the grid (full, cube-symmetric) into orbits of the H_CEF symmetry group × time reversal. */
export function reducePowderGrid(ion: PreparedIon, grid: SphereGrid): ReducedGrid {
  const cube = cubeRotations();
  const trigonal = transpose(siteFrames('pyrochlore')[0]); // cube frame → local frame of pyrochlore site 0
  const identity = [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
  let best: { q: Matrix3; group: Matrix3[]; orientation: ReducedGrid['orientation'] } | undefined;
  for (const [q, orientation] of [[identity, 'cube axes'], [trigonal, 'cube [111] along z']] as const) {
    const group = cube.map((g) => mul(mul(q, g), transpose(q))).filter((r) => leavesInvariant(ion, r));
    if (!best || group.length > best.group.length) best = { q, group, orientation };
  }
  const { q, group, orientation } = best!;
  const count = grid.count;
  const local = new Float64Array(3 * count);
  const key = (x: number, y: number, z: number) => `${Math.round(x * 1e9)},${Math.round(y * 1e9)},${Math.round(z * 1e9)}`;
  const index = new Map<string, number>();
  for (let k = 0; k < count; k++) {
    const v = [grid.directions[3 * k], grid.directions[3 * k + 1], grid.directions[3 * k + 2]];
    for (let i = 0; i < 3; i++) local[3 * k + i] = q[i][0] * v[0] + q[i][1] * v[1] + q[i][2] * v[2];
    index.set(key(local[3 * k], local[3 * k + 1], local[3 * k + 2]), k);
  }
  const assigned = new Int8Array(count);
  const directions: number[] = [], weights: number[] = [];
  for (let k = 0; k < count; k++) {
    if (assigned[k]) continue;
    const v = [local[3 * k], local[3 * k + 1], local[3 * k + 2]];
    let weight = 0;
    for (const r of group)
      for (const sign of [1, -1]) {
        const x = sign * (r[0][0] * v[0] + r[0][1] * v[1] + r[0][2] * v[2]);
        const y = sign * (r[1][0] * v[0] + r[1][1] * v[1] + r[1][2] * v[2]);
        const z = sign * (r[2][0] * v[0] + r[2][1] * v[1] + r[2][2] * v[2]);
        const image = index.get(key(x, y, z));
        // Every image must be a grid point (the group is a symmetry of the grid); a miss means rounding trouble.
        if (image === undefined) return { grid, rotations: 1, orientation: 'cube axes' };
        if (!assigned[image]) {
          assigned[image] = 1;
          weight += grid.weights[image];
        }
      }
    directions.push(v[0], v[1], v[2]);
    weights.push(weight);
  }
  return {
    grid: { name: `${grid.name}, reduced by ${2 * group.length} symmetries`, degree: grid.degree, count: weights.length, directions: Float64Array.from(directions), weights: Float64Array.from(weights) },
    rotations: group.length,
    orientation,
  };
}
