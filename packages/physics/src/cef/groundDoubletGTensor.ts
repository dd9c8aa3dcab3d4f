/**
 * The g-tensor of an effective spin-1/2 (a doublet) from the matrix elements of g_J J inside it.
 *
 * Within the doublet {|a⟩, |b⟩}, g_J μB J_α = μB Σ_β g_αβ S_β (S = σ/2, up to a multiple of the identity), so
 *   g_αβ = g_J Tr(P J_α P σ_β)      (effective-spin Hamiltonian, Abragam & Bleaney 1970, chapter 3; common practice).
 * The matrix G depends on the choice of basis inside the doublet, G Gᵀ does not: the Zeeman splitting for a field
 * along the unit vector n is μB B sqrt(nᵀ G Gᵀ n), and the principal g values are the square roots of the
 * eigenvalues of G Gᵀ. For an axial doublet this gives g∥ = 2 g_J |⟨+|Jz|+⟩| and g⊥ = 2 g_J |⟨+|Jx|−⟩|.
 */
import { InputError } from '../errors';
import { zeros, type ComplexMatrix } from '../linalg/complexMatrix';
import { hermitianEigen } from '../linalg/hermitianEigen';
import type { AngularMomentumMatrices } from './angularMomentum';

/** The g-tensor of a doublet in the CEF frame. */
export interface DoubletGTensor {
  /** sqrt(G Gᵀ): symmetric 3×3 in the CEF (local) frame; its eigenvectors are the principal axes. */
  gTensor: number[][];
  /** Principal g values, ascending. */
  principalValues: number[];
  /** Principal axes (unit vectors in the CEF frame), in the order of principalValues. */
  principalAxes: number[][];
  /** Effective g along the CEF z axis: sqrt((G Gᵀ)_zz). */
  gParallel: number;
  /** Root-mean-square effective g in the CEF xy plane: sqrt(((G Gᵀ)_xx + (G Gᵀ)_yy)/2). */
  gPerpendicular: number;
}

/** ⟨u| A |v⟩ for column vectors u, v of the column-major eigenvector matrix. */
export function matrixElement(vectors: ComplexMatrix, u: number, a: ComplexMatrix, v: number): [number, number] {
  const n = a.n;
  let re = 0, im = 0;
  for (let i = 0; i < n; i++) {
    const ur = vectors.re[i * n + u], ui = -vectors.im[i * n + u]; // conj(u_i)
    if (ur === 0 && ui === 0) continue;
    let sr = 0, si = 0;
    for (let j = 0; j < n; j++) {
      const ar = a.re[i * n + j], ai = a.im[i * n + j];
      if (ar === 0 && ai === 0) continue;
      const vr = vectors.re[j * n + v], vi = vectors.im[j * n + v];
      sr += ar * vr - ai * vi;
      si += ar * vi + ai * vr;
    }
    re += ur * sr - ui * si;
    im += ur * si + ui * sr;
  }
  return [re, im];
}

/**
 * Row α of the effective-spin g matrix, g_αβ = g_J Tr(M_α σ_β), from the 2×2 block M_α of J_α inside the doublet
 * {|a⟩, |b⟩}: M_aa = ⟨a|J_α|a⟩, M_bb = ⟨b|J_α|b⟩, M_ab = ⟨a|J_α|b⟩ = abRe + i abIm (dimensionless).
 * With σ_y = [[0, −i], [i, 0]]: Tr(M σ_x) = 2 Re M_ab, Tr(M σ_y) = i M_ab − i M_ba = −2 Im M_ab, Tr(M σ_z) = M_aa − M_bb.
 * The one place of this convention: doubletGTensor and the pseudospin g of exchange/pseudospinSite both use it.
 *
 * @example doubletGRow(4 / 3, 7.5, -7.5, 0, 0) // [0, 0, 20]: g∥ of a pure |±15/2⟩ doublet
 * See also: doubletGTensor
 */
export function doubletGRow(gJ: number, aa: number, bb: number, abRe: number, abIm: number): [number, number, number] {
  return [2 * gJ * abRe, -2 * gJ * abIm, gJ * (aa - bb)];
}

/**
 * g-tensor of the doublet spanned by columns `a` and `b` of `vectors` (dimensionless).
 *
 * @example doubletGTensor(solution.eigenvectors, 0, 1, angularMomentumMatrices(7.5), 4 / 3)
 * See also: solveCef
 */
export function doubletGTensor(vectors: ComplexMatrix, a: number, b: number, J: AngularMomentumMatrices, gJ: number): DoubletGTensor {
  if (a === b) throw new InputError('b', b, 'a second state of the doublet, different from a');
  const ops = [J.Jx, J.Jy, J.Jz];
  // G[α][β] = g_J Tr(M_α σ_β), M_α = [[⟨a|Jα|a⟩, ⟨a|Jα|b⟩], [⟨b|Jα|a⟩, ⟨b|Jα|b⟩]]
  const G = ops.map((op) => {
    const [aa] = matrixElement(vectors, a, op, a);
    const [bb] = matrixElement(vectors, b, op, b);
    const [abr, abi] = matrixElement(vectors, a, op, b);
    return doubletGRow(gJ, aa, bb, abr, abi);
  });
  const ggt = zeros(3);
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) ggt.re[i * 3 + j] = G[i][0] * G[j][0] + G[i][1] * G[j][1] + G[i][2] * G[j][2];
  const eig = hermitianEigen(ggt);
  const principalValues = Array.from(eig.values, (v) => Math.sqrt(Math.max(0, v)));
  // G Gᵀ is real symmetric: remove the arbitrary complex phase of each eigenvector to get real axes.
  const principalAxes = [0, 1, 2].map((k) => {
    const comps = [0, 1, 2].map((i) => [eig.vectors.re[i * 3 + k], eig.vectors.im[i * 3 + k]]);
    const big = comps.reduce((best, c) => (Math.hypot(c[0], c[1]) > Math.hypot(best[0], best[1]) ? c : best));
    const norm = Math.hypot(big[0], big[1]);
    const [pr, pi] = [big[0] / norm, -big[1] / norm];
    return comps.map(([re, im]) => re * pr - im * pi);
  });
  const gTensor = [0, 1, 2].map((i) =>
    [0, 1, 2].map((j) => principalAxes.reduce((s, axis, k) => s + axis[i] * principalValues[k] * axis[j], 0)),
  );
  return {
    gTensor,
    principalValues,
    principalAxes,
    gParallel: Math.sqrt(Math.max(0, ggt.re[8])),
    gPerpendicular: Math.sqrt(Math.max(0, (ggt.re[0] + ggt.re[4]) / 2)),
  };
}
