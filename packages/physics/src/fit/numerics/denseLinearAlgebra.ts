/**
 * Small dense real linear algebra for the fit module (p ≤ ~20 parameters, m ≤ a few thousand residuals).
 * Matrices are row-major Float64Arrays with explicit dimensions. Householder QR is used instead of normal equations
 * because the NIST problems (e.g. Thurber) have Jacobians whose JᵀJ loses half the digits
 * (Golub & Van Loan, Matrix Computations, 4th ed., §5.2 and §5.3).
 */

/**
 * Householder QR of an m×p matrix. Returns R (p×p, upper) and the reflectors to apply Qᵀ. With m < p (fewer rows than
 * columns, an under-determined least-squares problem) R is the m×p upper-trapezoidal factor padded with zero rows,
 * i.e. the R of the matrix with p − m zero rows appended, which has the same least-squares solutions.
 */
export interface QrFactorization {
  readonly m: number;
  readonly p: number;
  /** p×p upper-triangular R, row-major. */
  readonly r: Float64Array;
  /** Householder vectors, one per column, each of length m (zeros above the diagonal). */
  readonly reflectors: Float64Array[];
  readonly betas: Float64Array;
}

/** Householder QR factorization A = Q R (Golub & Van Loan Alg. 5.2.1). `a` is m×p row-major and is not modified. */
export function householderQr(a: Float64Array, m: number, p: number): QrFactorization {
  const w = Float64Array.from(a);
  const reflectors: Float64Array[] = [];
  const betas = new Float64Array(p);
  for (let k = 0; k < p; k++) {
    let norm = 0;
    for (let i = k; i < m; i++) norm = Math.hypot(norm, w[i * p + k]);
    const v = new Float64Array(m);
    if (norm === 0) {
      reflectors.push(v);
      betas[k] = 0;
      continue;
    }
    const alpha = w[k * p + k] > 0 ? -norm : norm;
    for (let i = k; i < m; i++) v[i] = w[i * p + k];
    v[k] -= alpha;
    let vv = 0;
    for (let i = k; i < m; i++) vv += v[i] * v[i];
    const beta = vv === 0 ? 0 : 2 / vv;
    betas[k] = beta;
    reflectors.push(v);
    for (let j = k; j < p; j++) {
      let s = 0;
      for (let i = k; i < m; i++) s += v[i] * w[i * p + j];
      s *= beta;
      for (let i = k; i < m; i++) w[i * p + j] -= s * v[i];
    }
  }
  const r = new Float64Array(p * p);
  const rows = Math.min(m, p);
  for (let i = 0; i < rows; i++) for (let j = i; j < p; j++) r[i * p + j] = w[i * p + j];
  return { m, p, r, reflectors, betas };
}

/** Qᵀ b for a QR factorization (b has length m; returns a new vector). */
export function applyQTranspose(qr: QrFactorization, b: Float64Array): Float64Array {
  const out = Float64Array.from(b);
  for (let k = 0; k < qr.p; k++) {
    const v = qr.reflectors[k];
    const beta = qr.betas[k];
    if (beta === 0) continue;
    let s = 0;
    for (let i = k; i < qr.m; i++) s += v[i] * out[i];
    s *= beta;
    for (let i = k; i < qr.m; i++) out[i] -= s * v[i];
  }
  return out;
}

/**
 * Solve the damped least-squares problem min ‖R δ + c‖² + λ ‖D δ‖² for δ, where R is p×p upper triangular
 * (from a QR of the Jacobian) and c = (Qᵀ r)[0..p). This is the Levenberg–Marquardt subproblem written on the
 * small triangular factor (Moré 1978, "The Levenberg–Marquardt algorithm: implementation and theory", §3).
 */
export function solveDampedTriangular(r: Float64Array, c: Float64Array, diag: Float64Array, lambda: number, p: number): Float64Array {
  const a = new Float64Array(2 * p * p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) a[i * p + j] = r[i * p + j];
  const s = Math.sqrt(lambda);
  for (let i = 0; i < p; i++) a[(p + i) * p + i] = s * diag[i];
  const rhs = new Float64Array(2 * p);
  for (let i = 0; i < p; i++) rhs[i] = -c[i];
  const qr = householderQr(a, 2 * p, p);
  const qtb = applyQTranspose(qr, rhs);
  return backSubstitute(qr.r, qtb, p);
}

/** Solve R x = b for upper-triangular R (p×p); zero pivots give zero components (minimum-norm-like fallback). */
export function backSubstitute(r: Float64Array, b: Float64Array, p: number): Float64Array {
  const x = new Float64Array(p);
  for (let i = p - 1; i >= 0; i--) {
    let s = b[i];
    for (let j = i + 1; j < p; j++) s -= r[i * p + j] * x[j];
    const d = r[i * p + i];
    x[i] = d === 0 ? 0 : s / d;
  }
  return x;
}

/** Inverse of an upper-triangular p×p matrix; returns undefined if a diagonal element is zero. */
export function invertUpperTriangular(r: Float64Array, p: number): Float64Array | undefined {
  const inv = new Float64Array(p * p);
  for (let i = 0; i < p; i++) if (r[i * p + i] === 0) return undefined;
  for (let col = 0; col < p; col++) {
    for (let i = p - 1; i >= 0; i--) {
      let s = i === col ? 1 : 0;
      for (let j = i + 1; j < p; j++) s -= r[i * p + j] * inv[j * p + col];
      inv[i * p + col] = s / r[i * p + i];
    }
  }
  return inv;
}

/** Cholesky factor L (lower, row-major) of a symmetric positive-definite p×p matrix, or undefined if not SPD. */
export function cholesky(a: Float64Array, p: number): Float64Array | undefined {
  const l = new Float64Array(p * p);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * p + j];
      for (let k = 0; k < j; k++) s -= l[i * p + k] * l[j * p + k];
      if (i === j) {
        if (!(s > 0)) return undefined;
        l[i * p + i] = Math.sqrt(s);
      } else {
        l[i * p + j] = s / l[j * p + j];
      }
    }
  }
  return l;
}

/** Inverse of a symmetric positive-definite matrix via Cholesky, or undefined if it is not SPD. */
export function invertSymmetricPositiveDefinite(a: Float64Array, p: number): Float64Array | undefined {
  const l = cholesky(a, p);
  if (!l) return undefined;
  // inv(A) = inv(L)ᵀ inv(L); inv(L) is lower triangular.
  const li = new Float64Array(p * p);
  for (let col = 0; col < p; col++) {
    for (let i = 0; i < p; i++) {
      let s = i === col ? 1 : 0;
      for (let k = 0; k < i; k++) s -= l[i * p + k] * li[k * p + col];
      li[i * p + col] = s / l[i * p + i];
    }
  }
  const inv = new Float64Array(p * p);
  for (let i = 0; i < p; i++)
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let k = Math.max(i, j); k < p; k++) s += li[k * p + i] * li[k * p + j];
      inv[i * p + j] = s;
    }
  return inv;
}
