/**
 * Eigenvalues and eigenvectors of dense complex Hermitian matrices.
 *
 * Why hand-written: the crystal-field, thermodynamics, fitting and exchange code diagonalise many small matrices
 * (dimension 2J+1 ≤ 17, or (2J+1)² on a two-site space), and the general-purpose `mathjs.eigs` is far too slow
 * for that (see bench/eigen.bench.ts for the figures). mathjs remains the reference in the tests.
 *
 * Algorithm (the classic three-stage scheme; Wilkinson & Reinsch, "Handbook for Automatic Computation II" (1971),
 * routines tred2/tql2, and their complex-Hermitian extension in EISPACK, Smith et al. (1976); Golub & Van Loan,
 * "Matrix Computations", 4th ed., §8.3):
 *  1. complex Householder reflections H_k = I − v v†/h reduce A to a Hermitian tridiagonal T = Q† A Q;
 *  2. a diagonal unitary D removes the phases of T's off-diagonal, leaving a real symmetric tridiagonal D† T D;
 *  3. implicit QL iterations with Wilkinson shifts diagonalise the real tridiagonal (rotations accumulated in Z);
 *  4. eigenvectors of A are the columns of Q D Z.
 * Everything runs on preallocated Float64Arrays held in an `EigenWorkspace`, so the batch form allocates only
 * its outputs.
 *
 * See also: hermitianEigenBatch (linalg/hermitianEigenBatch.ts), ComplexMatrix (linalg/complexMatrix.ts).
 */
import { InputError } from '../errors';
import type { ComplexMatrix } from './complexMatrix';

/** Result of a diagonalisation with eigenvectors. */
export interface HermitianEigenResult {
  /** Eigenvalues, ascending (same unit as the matrix elements). */
  values: Float64Array;
  /** Unitary matrix whose column k is the normalised eigenvector of values[k]. */
  vectors: ComplexMatrix;
}

/** Result of a diagonalisation without eigenvectors. */
export interface HermitianEigenValuesResult {
  values: Float64Array;
  vectors: null;
}

export interface HermitianEigenOptions {
  /** Compute eigenvectors (default true). Without them the solver is several times faster. */
  vectors?: boolean;
  /**
   * Largest tolerated |a_ij − conj(a_ji)| relative to max(1, largest |Re a_ij| + |Im a_ij|) (default 1e-9).
   * The matrix actually diagonalised is the Hermitian part (A + A†)/2.
   */
  hermitianTolerance?: number;
  /** Field path used in error messages (default 'matrix'). */
  field?: string;
}

/** Maximum QL iterations per eigenvalue before giving up (30 is the customary figure; we allow more). */
const MAX_ITERATIONS = 60;

/**
 * Preallocated scratch space for diagonalising n×n matrices. Create one per dimension and reuse it for many
 * matrices (hermitianEigenBatch does this for you). Not shared between concurrent computations.
 */
export class EigenWorkspace {
  readonly n: number;
  /** Working copy of the matrix (full storage, row-major). */
  readonly ar: Float64Array;
  readonly ai: Float64Array;
  /** Householder vectors: row k holds v_k (support k+1..n-1). */
  readonly vr: Float64Array;
  readonly vi: Float64Array;
  /** h_k = v_k† v_k / 2 (0 when the reflection was skipped). */
  readonly h: Float64Array;
  /** Diagonal and sub-diagonal of the real tridiagonal matrix. */
  readonly d: Float64Array;
  readonly e: Float64Array;
  /** Phases of the diagonal unitary D. */
  readonly pr: Float64Array;
  readonly pi: Float64Array;
  /** Eigenvectors of the real tridiagonal, stored as rows (row k = vector k). */
  readonly z: Float64Array;
  /** Complex eigenvectors as rows during back-transformation. */
  readonly wr: Float64Array;
  readonly wi: Float64Array;
  /** Scratch vectors of length n. */
  readonly tr: Float64Array;
  readonly ti: Float64Array;
  readonly order: Int32Array;

  constructor(n: number) {
    if (!Number.isInteger(n) || n < 1) throw new InputError('n', n, 'a positive integer dimension');
    this.n = n;
    const nn = n * n;
    this.ar = new Float64Array(nn);
    this.ai = new Float64Array(nn);
    this.vr = new Float64Array(nn);
    this.vi = new Float64Array(nn);
    this.h = new Float64Array(n);
    this.d = new Float64Array(n);
    this.e = new Float64Array(n);
    this.pr = new Float64Array(n);
    this.pi = new Float64Array(n);
    this.z = new Float64Array(nn);
    this.wr = new Float64Array(nn);
    this.wi = new Float64Array(nn);
    this.tr = new Float64Array(n);
    this.ti = new Float64Array(n);
    this.order = new Int32Array(n);
  }
}

/**
 * Diagonalise a complex Hermitian matrix: A v_k = λ_k v_k with λ ascending and v_k orthonormal.
 *
 * Units: the eigenvalues carry the unit of the matrix elements (meV for a Hamiltonian in meV).
 * Phase convention: each eigenvector is scaled so that its component of largest modulus (the first one, on ties
 * within 1e-12) is real and positive. Within a degenerate eigenspace the basis is whatever the algorithm produces;
 * compare spectral projectors, not individual vectors, there.
 *
 * @example
 *   const { values, vectors } = hermitianEigen(fromArrays([[2, [0, 1]], [[0, -1], 3]]));
 *   // values ≈ [1.382, 3.618]; column 0 of vectors is the eigenvector of 1.382
 * @throws InputError when the matrix is not square, holds a non-finite number, or is not Hermitian.
 * See also: hermitianEigenBatch, EigenWorkspace.
 */
export function hermitianEigen(a: ComplexMatrix, options?: HermitianEigenOptions & { vectors?: true }): HermitianEigenResult;
export function hermitianEigen(a: ComplexMatrix, options: HermitianEigenOptions & { vectors: false }): HermitianEigenValuesResult;
export function hermitianEigen(
  a: ComplexMatrix,
  options?: HermitianEigenOptions,
): HermitianEigenResult | HermitianEigenValuesResult;
export function hermitianEigen(
  a: ComplexMatrix,
  options: HermitianEigenOptions = {},
): HermitianEigenResult | HermitianEigenValuesResult {
  const n = checkShape(a, options.field ?? 'matrix');
  return solveInto(new EigenWorkspace(n), a, options);
}

/**
 * Check that `a` is a ComplexMatrix with n² real and imaginary entries; returns n.
 * @throws InputError naming `field` otherwise.
 */
export function checkShape(a: ComplexMatrix, field: string): number {
  if (a === null || typeof a !== 'object' || !(a.re instanceof Float64Array) || !(a.im instanceof Float64Array))
    throw new InputError(field, a, 'a ComplexMatrix {n, re, im} with Float64Array parts');
  const n = a.n;
  if (!Number.isInteger(n) || n < 1) throw new InputError(`${field}.n`, n, 'a positive integer dimension');
  if (a.re.length !== n * n || a.im.length !== n * n)
    throw new InputError(field, `${a.re.length} real and ${a.im.length} imaginary entries for n = ${n}`, `a square matrix with n² = ${n * n} entries`);
  return n;
}

/**
 * Diagonalise `a` using the scratch space `ws` (ws.n must equal a.n). Used by hermitianEigen and the batch form.
 * See hermitianEigen for the conventions.
 */
export function solveInto(
  ws: EigenWorkspace,
  a: ComplexMatrix,
  options: HermitianEigenOptions = {},
): HermitianEigenResult | HermitianEigenValuesResult {
  const field = options.field ?? 'matrix';
  const n = a.n;
  if (ws.n !== n) throw new InputError(`${field}.n`, n, `dimension ${ws.n} (the workspace's)`);
  const wantVectors = options.vectors !== false;
  const scale = loadHermitianPart(ws, a, field, options.hermitianTolerance ?? 1e-9);
  tridiagonalize(ws);
  if (wantVectors) {
    ws.z.fill(0);
    for (let i = 0; i < n; i++) ws.z[i * n + i] = 1;
  }
  tridiagonalQL(ws, wantVectors, field);

  // Sort ascending (insertion sort on an index array: n is small and the QL output is nearly sorted).
  const order = ws.order;
  const d = ws.d;
  for (let i = 0; i < n; i++) order[i] = i;
  for (let i = 1; i < n; i++) {
    const oi = order[i];
    const di = d[oi];
    let j = i - 1;
    while (j >= 0 && d[order[j]] > di) {
      order[j + 1] = order[j];
      j--;
    }
    order[j + 1] = oi;
  }
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) values[i] = d[order[i]] * scale;
  if (!wantVectors) return { values, vectors: null };

  backTransform(ws);
  const outRe = new Float64Array(n * n);
  const outIm = new Float64Array(n * n);
  const wr = ws.wr, wi = ws.wi;
  for (let k = 0; k < n; k++) {
    const row = order[k] * n;
    // Phase: largest-modulus component real and positive; also renormalise (guards rounding drift).
    let best = 0, bestIndex = 0, norm2 = 0;
    for (let r = 0; r < n; r++) {
      const m2 = wr[row + r] * wr[row + r] + wi[row + r] * wi[row + r];
      norm2 += m2;
      if (m2 > best * (1 + 1e-12)) {
        best = m2;
        bestIndex = r;
      }
    }
    const mod = Math.sqrt(best);
    const factor = 1 / (mod * Math.sqrt(norm2));
    // multiply by conj(w_best)/|w_best| / ‖w‖
    const cr = wr[row + bestIndex] * factor, ci = -wi[row + bestIndex] * factor;
    for (let r = 0; r < n; r++) {
      const xr = wr[row + r], xi = wi[row + r];
      outRe[r * n + k] = xr * cr - xi * ci;
      outIm[r * n + k] = xr * ci + xi * cr;
    }
    outIm[bestIndex * n + k] = 0;
  }
  return { values, vectors: { n, re: outRe, im: outIm } };
}

/**
 * Copy (A + A†)/(2s) into the workspace, checking finiteness and Hermiticity; s = max_ij(|Re a_ij| + |Im a_ij|)
 * (1 for the zero matrix) is returned. Working on A/s keeps the thresholds of the reduction and of the QL
 * iteration meaningful for matrices of any magnitude (1e-200 or 1e200).
 */
function loadHermitianPart(ws: EigenWorkspace, a: ComplexMatrix, field: string, tolerance: number): number {
  const n = ws.n;
  const are = a.re, aim = a.im, wr = ws.ar, wi = ws.ai;
  let scale = 0, worst = 0, worstI = 0, worstJ = 0;
  for (let k = 0; k < n * n; k++) {
    const x = are[k], y = aim[k];
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      const i = Math.floor(k / n);
      throw new InputError(`${field}[${i}][${k - i * n}]`, Number.isFinite(x) ? y : x, 'a finite number');
    }
    const m = Math.abs(x) + Math.abs(y);
    if (m > scale) scale = m;
  }
  if (scale === 0) scale = 1;
  const inv = 1 / scale;
  for (let i = 0; i < n; i++) {
    const ii = i * n + i;
    wr[ii] = are[ii] * inv;
    wi[ii] = 0;
    const dev = Math.abs(aim[ii]);
    if (dev > worst) {
      worst = dev; worstI = i; worstJ = i;
    }
    for (let j = 0; j < i; j++) {
      const ij = i * n + j, ji = j * n + i;
      const dr = are[ij] - are[ji], di = aim[ij] + aim[ji];
      const dev2 = Math.abs(dr) + Math.abs(di);
      if (dev2 > worst) {
        worst = dev2; worstI = i; worstJ = j;
      }
      const sr = 0.5 * inv * (are[ij] + are[ji]);
      const si = 0.5 * inv * (aim[ij] - aim[ji]);
      wr[ij] = sr; wi[ij] = si;
      wr[ji] = sr; wi[ji] = -si;
    }
  }
  // Tolerance relative to max(1, largest entry): rounding noise in a matrix that is zero up to rounding (a
  // projection of a vanishing operator, say) must not be refused.
  if (worst > tolerance * Math.max(1, scale))
    throw new InputError(
      `${field}[${worstI}][${worstJ}]`,
      worstI === worstJ ? [are[worstI * n + worstI], aim[worstI * n + worstI]] : [are[worstI * n + worstJ], aim[worstI * n + worstJ]],
      worstI === worstJ
        ? 'a real diagonal element (the matrix must be Hermitian)'
        : `the complex conjugate of element [${worstJ}][${worstI}] = [${are[worstJ * n + worstI]}, ${aim[worstJ * n + worstI]}] (the matrix must be Hermitian)`,
    );
  return scale;
}

/**
 * Stage 1 and 2: Householder reduction of the Hermitian working matrix to tridiagonal form, then the diagonal
 * phases that make the off-diagonal real and non-negative. Fills d, e (e[i] couples i and i+1), v, h, p.
 *
 * Reflection k acts on indices k+1..n-1: with x = A[k+1.., k], α = ‖x‖ and φ = x_0/|x_0|, v = x + φ α e_1 and
 * h = v†v/2 = α² + α|x_0| give H x = −φ α e_1 (Golub & Van Loan §5.1.13 for the complex Householder vector).
 * The update A ← H A H is the rank-2 form A − v q† − q v† with p = A v / h, q = p − (v†p / 2h) v
 * (Golub & Van Loan §8.3.1).
 */
function tridiagonalize(ws: EigenWorkspace): void {
  const n = ws.n;
  const ar = ws.ar, ai = ws.ai, vr = ws.vr, vi = ws.vi, h = ws.h, tr = ws.tr, ti = ws.ti;
  // Complex sub-diagonal before phase removal: (offR[i], offI[i]) = T[i+1][i]; kept in pr/pi temporarily.
  const offR = ws.pr, offI = ws.pi;
  for (let k = 0; k < n - 1; k++) {
    const s = k + 1; // first index of the reflection's support
    h[k] = 0;
    if (k < n - 2) {
      let tail2 = 0;
      for (let i = s + 1; i < n; i++) {
        const x = ar[i * n + k], y = ai[i * n + k];
        tail2 += x * x + y * y;
      }
      const x0r = ar[s * n + k], x0i = ai[s * n + k];
      const x0 = fastHypot(x0r, x0i);
      const alpha2 = tail2 + x0 * x0;
      // Skip when the column below the sub-diagonal is already zero (the matrix is scaled to max entry 1, so
      // squares underflow only for entries below ~1e-154 of the largest, which are negligible).
      if (tail2 > 0) {
        const alpha = Math.sqrt(alpha2);
        let phr = 1, phi = 0;
        if (x0 > 0) {
          phr = x0r / x0;
          phi = x0i / x0;
        }
        const vk = k * n;
        for (let i = 0; i < s; i++) {
          vr[vk + i] = 0;
          vi[vk + i] = 0;
        }
        vr[vk + s] = x0r + phr * alpha;
        vi[vk + s] = x0i + phi * alpha;
        for (let i = s + 1; i < n; i++) {
          vr[vk + i] = ar[i * n + k];
          vi[vk + i] = ai[i * n + k];
        }
        const hk = alpha2 + alpha * x0;
        h[k] = hk;
        const invH = 1 / hk;
        // p = A v / h on the trailing block (rows/cols s..n-1); also v†p.
        let vpR = 0;
        for (let i = s; i < n; i++) {
          const row = i * n;
          let sr = 0, si = 0;
          for (let j = s; j < n; j++) {
            const a_r = ar[row + j], a_i = ai[row + j];
            const v_r = vr[vk + j], v_i = vi[vk + j];
            sr += a_r * v_r - a_i * v_i;
            si += a_r * v_i + a_i * v_r;
          }
          sr *= invH;
          si *= invH;
          tr[i] = sr;
          ti[i] = si;
          // Re(conj(v_i) p_i); v†p is real because A is Hermitian.
          vpR += vr[vk + i] * sr + vi[vk + i] * si;
        }
        const K = 0.5 * vpR * invH;
        for (let i = s; i < n; i++) {
          tr[i] -= K * vr[vk + i];
          ti[i] -= K * vi[vk + i];
        }
        // A ← A − v q† − q v† on the trailing block: lower triangle computed, upper mirrored (Hermitian).
        for (let i = s; i < n; i++) {
          const row = i * n;
          const v_r = vr[vk + i], v_i = vi[vk + i], q_r = tr[i], q_i = ti[i];
          for (let j = s; j < i; j++) {
            const qj_r = tr[j], qj_i = ti[j];
            const vj_r = vr[vk + j], vj_i = vi[vk + j];
            // v_i conj(q_j) + q_i conj(v_j)
            const dr = v_r * qj_r + v_i * qj_i + q_r * vj_r + q_i * vj_i;
            const di = v_i * qj_r - v_r * qj_i + q_i * vj_r - q_r * vj_i;
            const xr = ar[row + j] - dr, xi = ai[row + j] - di;
            ar[row + j] = xr;
            ai[row + j] = xi;
            ar[j * n + i] = xr;
            ai[j * n + i] = -xi;
          }
          ar[row + i] -= 2 * (v_r * q_r + v_i * q_i);
          ai[row + i] = 0;
        }
        // Column k now holds −φ α at row s and zeros below.
        ar[s * n + k] = -phr * alpha;
        ai[s * n + k] = -phi * alpha;
        for (let i = s + 1; i < n; i++) {
          ar[i * n + k] = 0;
          ai[i * n + k] = 0;
        }
      }
    }
    offR[k] = ar[s * n + k];
    offI[k] = ai[s * n + k];
  }
  // Diagonal and phases: d_{k+1} = d_k · t_{k+1,k}/|t_{k+1,k}| makes D† T D real with e_k = |t_{k+1,k}|.
  const d = ws.d, e = ws.e;
  for (let i = 0; i < n; i++) d[i] = ar[i * n + i];
  let phaseR = 1, phaseI = 0;
  for (let k = 0; k < n - 1; k++) {
    const tr_ = offR[k], ti_ = offI[k];
    const m = fastHypot(tr_, ti_);
    e[k] = m;
    // store phase of index k before overwriting offR[k]/offI[k] (they share storage with pr/pi)
    offR[k] = phaseR;
    offI[k] = phaseI;
    if (m > 0) {
      const ur = tr_ / m, ui = ti_ / m;
      const nr = phaseR * ur - phaseI * ui;
      phaseI = phaseR * ui + phaseI * ur;
      phaseR = nr;
    }
  }
  offR[n - 1] = phaseR;
  offI[n - 1] = phaseI;
  e[n - 1] = 0;
}

/**
 * Stage 3: implicit QL with Wilkinson shifts on the real symmetric tridiagonal (d, e), accumulating the plane
 * rotations into the rows of z when wanted (Wilkinson & Reinsch 1971, tql2; Golub & Van Loan §8.3.5).
 */
function tridiagonalQL(ws: EigenWorkspace, wantVectors: boolean, field: string): void {
  const n = ws.n;
  const d = ws.d, e = ws.e, z = ws.z;
  const eps = Number.EPSILON;
  for (let l = 0; l < n; l++) {
    let iterations = 0;
    for (;;) {
      let m = l;
      for (; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) <= eps * dd) break;
      }
      if (m === l) break;
      if (++iterations > MAX_ITERATIONS)
        throw new InputError(field, `no convergence after ${MAX_ITERATIONS} QL iterations`, 'a matrix the QL iteration can diagonalise');
      // Wilkinson shift from the leading 2×2 block.
      let g = (d[l + 1] - d[l]) / (2 * e[l]);
      let r = Math.sqrt(g * g + 1);
      if (!Number.isFinite(r)) r = Math.abs(g);
      g = d[m] - d[l] + e[l] / (g + (g >= 0 ? r : -r));
      let s = 1, c = 1, p = 0;
      let i = m - 1;
      let underflow = false;
      for (; i >= l; i--) {
        const f = s * e[i];
        const b = c * e[i];
        r = fastHypot(f, g);
        e[i + 1] = r;
        if (r === 0) {
          d[i + 1] -= p;
          e[m] = 0;
          underflow = true;
          break;
        }
        s = f / r;
        c = g / r;
        g = d[i + 1] - p;
        r = (d[i] - g) * s + 2 * c * b;
        p = s * r;
        d[i + 1] = g + p;
        g = c * r - b;
        if (wantVectors) {
          const ri = i * n, rj = ri + n;
          for (let k = 0; k < n; k++) {
            const zj = z[rj + k], zi = z[ri + k];
            z[rj + k] = s * zi + c * zj;
            z[ri + k] = c * zi - s * zj;
          }
        }
      }
      if (underflow) continue;
      d[l] -= p;
      e[l] = g;
      e[m] = 0;
    }
  }
}

/**
 * sqrt(x² + y²) without Math.hypot's cost (slow in V8); falls back to Math.hypot when the squares would overflow
 * or underflow.
 */
function fastHypot(x: number, y: number): number {
  const s = x * x + y * y;
  if (s > 1e-290 && s < 1e290) return Math.sqrt(s);
  return Math.hypot(x, y);
}

/**
 * Stage 4: eigenvectors of A as rows of (wr, wi): w = H_0 H_1 … H_{n-3} D z for every tridiagonal eigenvector z.
 */
function backTransform(ws: EigenWorkspace): void {
  const n = ws.n;
  const z = ws.z, wr = ws.wr, wi = ws.wi, pr = ws.pr, pi = ws.pi, vr = ws.vr, vi = ws.vi, h = ws.h;
  for (let k = 0; k < n; k++) {
    const row = k * n;
    for (let r = 0; r < n; r++) {
      const zr = z[row + r];
      wr[row + r] = pr[r] * zr;
      wi[row + r] = pi[r] * zr;
    }
  }
  for (let j = n - 3; j >= 0; j--) {
    const hj = h[j];
    if (hj === 0) continue;
    const invH = 1 / hj;
    const vk = j * n;
    const s = j + 1;
    for (let k = 0; k < n; k++) {
      const row = k * n;
      // c = v† w / h
      let cr = 0, ci = 0;
      for (let r = s; r < n; r++) {
        const v_r = vr[vk + r], v_i = vi[vk + r], w_r = wr[row + r], w_i = wi[row + r];
        cr += v_r * w_r + v_i * w_i;
        ci += v_r * w_i - v_i * w_r;
      }
      cr *= invH;
      ci *= invH;
      for (let r = s; r < n; r++) {
        const v_r = vr[vk + r], v_i = vi[vk + r];
        wr[row + r] -= v_r * cr - v_i * ci;
        wi[row + r] -= v_r * ci + v_i * cr;
      }
    }
  }
}
