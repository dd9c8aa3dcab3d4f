/**
 * Dipole transition strengths between crystal-field eigenstates:
 *   powder:          S_ji = (2/3) Σ_α |⟨j|J_α|i⟩|²                          (orientation average of |⟨j|J⊥|i⟩|²)
 *   single crystal:  S_ji = Σ_αβ (δ_αβ − Q̂_α Q̂_β) ⟨i|J_α|j⟩⟨j|J_β|i⟩ = Σ_α |M_α|² − |Q̂·M|²,  M_α = ⟨j|J_α|i⟩
 * (Squires, Introduction to the Theory of Thermal Neutron Scattering (1978), §7.6; Furrer, Mesot & Strässle,
 * Neutron Scattering in Condensed Matter Physics (2009), ch. 10). Sum rule: Σ_j Σ_α |⟨j|J_α|i⟩|² = J(J+1).
 *
 * @example const s = transitionStrengths(7.5, eigenvectors); s.strengths[j * n + i]
 * See also: cefTransitions, neutronSpectrum
 */
import { InputError } from '../errors';
import { checkJ } from '../cef/angularMomentum';
import type { ComplexMatrix } from '../linalg/complexMatrix';

export interface TransitionStrengths {
  readonly n: number;
  /** n×n, element [j * n + i]: strength of i → j (powder average, or ⊥ Q for a single crystal). */
  readonly strengths: Float64Array;
  /** n×n, element [j * n + i]: Σ_α |⟨j|J_α|i⟩|² (no orientation factor), for sum rules. */
  readonly totalSquares: Float64Array;
}

/**
 * V† J+ V and V† Jz V using the sparsity of J+ (one superdiagonal) and Jz (diagonal): 2n³ complex operations instead
 * of the 6n³ of dense products. Basis order m = J − k (DEVELOPERS.md § Conventions): J+|m⟩ ∝ |m+1⟩, index k → k − 1.
 */
function projectedOperators(J: number, v: ComplexMatrix): { plus: ComplexMatrix; z: ComplexMatrix } {
  const n = v.n;
  const x = J * (J + 1);
  // W = J+ V and Z = Jz V (row-major n×n)
  const wr = new Float64Array(n * n), wi = new Float64Array(n * n);
  const zr = new Float64Array(n * n), zi = new Float64Array(n * n);
  for (let r = 0; r < n; r++) {
    const m = J - r;
    for (let c = 0; c < n; c++) {
      zr[r * n + c] = m * v.re[r * n + c];
      zi[r * n + c] = m * v.im[r * n + c];
    }
    if (r + 1 < n) {
      const mBelow = J - (r + 1);
      const coefficient = Math.sqrt(x - mBelow * (mBelow + 1)); // ⟨m+1|J+|m⟩ with m = mBelow
      for (let c = 0; c < n; c++) {
        wr[r * n + c] = coefficient * v.re[(r + 1) * n + c];
        wi[r * n + c] = coefficient * v.im[(r + 1) * n + c];
      }
    }
  }
  const project = (tr: Float64Array, ti: Float64Array): ComplexMatrix => {
    const re = new Float64Array(n * n), im = new Float64Array(n * n);
    for (let k = 0; k < n; k++)
      for (let r = 0; r < n; r++) {
        const vr = v.re[k * n + r], vi = -v.im[k * n + r];
        if (vr === 0 && vi === 0) continue;
        const row = r * n, src = k * n;
        for (let c = 0; c < n; c++) {
          re[row + c] += vr * tr[src + c] - vi * ti[src + c];
          im[row + c] += vr * ti[src + c] + vi * tr[src + c];
        }
      }
    return { n, re, im };
  };
  return { plus: project(wr, wi), z: project(zr, zi) };
}

/**
 * Transition strengths between all pairs of eigenstates (columns of `eigenvectors`) of a J multiplet.
 * Without `qDirection` the powder average; with it (any non-zero vector, in the crystal-field frame) the
 * single-crystal strength for Q along that direction.
 */
export function transitionStrengths(
  J: number,
  eigenvectors: ComplexMatrix,
  options: { qDirection?: readonly [number, number, number] } = {},
): TransitionStrengths {
  const n = checkJ(J);
  if (eigenvectors.n !== n) throw new InputError('eigenvectors', eigenvectors.n, `a ${n}×${n} matrix for J = ${J}`);
  const { plus, z } = projectedOperators(J, eigenvectors);
  let q: [number, number, number] | undefined;
  if (options.qDirection) {
    const [a, b, c] = options.qDirection;
    const norm = Math.hypot(a, b, c);
    if (!(norm > 0) || !Number.isFinite(norm)) throw new InputError('qDirection', options.qDirection, 'a non-zero finite 3-vector');
    q = [a / norm, b / norm, c / norm];
  }
  const strengths = new Float64Array(n * n);
  const totalSquares = new Float64Array(n * n);
  for (let j = 0; j < n; j++)
    for (let i = 0; i < n; i++) {
      const k = j * n + i;
      const t = i * n + j;
      // ⟨j|J+|i⟩ = P, ⟨j|J−|i⟩ = conj(⟨i|J+|j⟩) = M; Jx = (J+ + J−)/2, Jy = (J+ − J−)/(2i).
      const pr = plus.re[k], pi = plus.im[k];
      const mr = plus.re[t], mi = -plus.im[t];
      const xr = 0.5 * (pr + mr), xi = 0.5 * (pi + mi);
      const yr = 0.5 * (pi - mi), yi = -0.5 * (pr - mr);
      const zr = z.re[k], zi = z.im[k];
      const total = xr * xr + xi * xi + yr * yr + yi * yi + zr * zr + zi * zi;
      totalSquares[k] = total;
      if (q) {
        const dr = q[0] * xr + q[1] * yr + q[2] * zr;
        const di = q[0] * xi + q[1] * yi + q[2] * zi;
        strengths[k] = Math.max(0, total - dr * dr - di * di);
      } else {
        strengths[k] = (2 / 3) * total;
      }
    }
  return { n, strengths, totalSquares };
}
