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
import { angularMomentumMatrices } from '../cef/angularMomentum';
import type { ComplexMatrix } from '../linalg/complexMatrix';

export interface TransitionStrengths {
  readonly n: number;
  /** n×n, element [j * n + i]: strength of i → j (powder average, or ⊥ Q for a single crystal). */
  readonly strengths: Float64Array;
  /** n×n, element [j * n + i]: Σ_α |⟨j|J_α|i⟩|² (no orientation factor), for sum rules. */
  readonly totalSquares: Float64Array;
}

/** V† A V for Hermitian A and unitary V (columns = eigenvectors). */
function transform(a: ComplexMatrix, v: ComplexMatrix): ComplexMatrix {
  const n = a.n;
  // T = A V
  const tr = new Float64Array(n * n), ti = new Float64Array(n * n);
  for (let r = 0; r < n; r++)
    for (let k = 0; k < n; k++) {
      const ar = a.re[r * n + k], ai = a.im[r * n + k];
      if (ar === 0 && ai === 0) continue;
      for (let c = 0; c < n; c++) {
        const vr = v.re[k * n + c], vi = v.im[k * n + c];
        tr[r * n + c] += ar * vr - ai * vi;
        ti[r * n + c] += ar * vi + ai * vr;
      }
    }
  // V† T
  const re = new Float64Array(n * n), im = new Float64Array(n * n);
  for (let r = 0; r < n; r++)
    for (let k = 0; k < n; k++) {
      const vr = v.re[k * n + r], vi = -v.im[k * n + r];
      for (let c = 0; c < n; c++) {
        re[r * n + c] += vr * tr[k * n + c] - vi * ti[k * n + c];
        im[r * n + c] += vr * ti[k * n + c] + vi * tr[k * n + c];
      }
    }
  return { n, re, im };
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
  const { Jx, Jy, Jz } = angularMomentumMatrices(J);
  const n = Jx.n;
  if (eigenvectors.n !== n) throw new InputError('eigenvectors', eigenvectors.n, `a ${n}×${n} matrix for J = ${J}`);
  const m = [transform(Jx, eigenvectors), transform(Jy, eigenvectors), transform(Jz, eigenvectors)];
  let q: [number, number, number] | undefined;
  if (options.qDirection) {
    const [a, b, c] = options.qDirection;
    const norm = Math.hypot(a, b, c);
    if (!(norm > 0) || !Number.isFinite(norm)) throw new InputError('qDirection', options.qDirection, 'a non-zero finite 3-vector');
    q = [a / norm, b / norm, c / norm];
  }
  const strengths = new Float64Array(n * n);
  const totalSquares = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) {
    let total = 0;
    for (let a = 0; a < 3; a++) total += m[a].re[k] ** 2 + m[a].im[k] ** 2;
    totalSquares[k] = total;
    if (q) {
      const pr = q[0] * m[0].re[k] + q[1] * m[1].re[k] + q[2] * m[2].re[k];
      const pi = q[0] * m[0].im[k] + q[1] * m[1].im[k] + q[2] * m[2].im[k];
      strengths[k] = Math.max(0, total - pr * pr - pi * pi);
    } else {
      strengths[k] = (2 / 3) * total;
    }
  }
  return { n, strengths, totalSquares };
}
