/**
 * Dense complex matrices stored as two row-major Float64Arrays (real and imaginary parts).
 * Element (r, c) of an n×n matrix is at index r*n + c. This is the one matrix type of `@multiplet/physics`.
 *
 * See also: hermitianEigen (linalg/hermitianEigen.ts).
 */
export interface ComplexMatrix {
  readonly n: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/** An n×n zero matrix. */
export function zeros(n: number): ComplexMatrix {
  return { n, re: new Float64Array(n * n), im: new Float64Array(n * n) };
}

/** The n×n identity. */
export function identity(n: number): ComplexMatrix {
  const m = zeros(n);
  for (let i = 0; i < n; i++) m.re[i * n + i] = 1;
  return m;
}

/** A deep copy. */
export function clone(a: ComplexMatrix): ComplexMatrix {
  return { n: a.n, re: Float64Array.from(a.re), im: Float64Array.from(a.im) };
}

/** a + s·b (new matrix). */
export function addScaled(a: ComplexMatrix, b: ComplexMatrix, s = 1): ComplexMatrix {
  const out = clone(a);
  for (let k = 0; k < a.re.length; k++) {
    out.re[k] += s * b.re[k];
    out.im[k] += s * b.im[k];
  }
  return out;
}

/** In place: a += s·b. Returns a. */
export function addScaledInPlace(a: ComplexMatrix, b: ComplexMatrix, s = 1): ComplexMatrix {
  for (let k = 0; k < a.re.length; k++) {
    a.re[k] += s * b.re[k];
    a.im[k] += s * b.im[k];
  }
  return a;
}

/** Matrix product a·b. */
export function multiply(a: ComplexMatrix, b: ComplexMatrix): ComplexMatrix {
  const n = a.n;
  const out = zeros(n);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < n; k++) {
      const ar = a.re[i * n + k], ai = a.im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < n; j++) {
        const br = b.re[k * n + j], bi = b.im[k * n + j];
        out.re[i * n + j] += ar * br - ai * bi;
        out.im[i * n + j] += ar * bi + ai * br;
      }
    }
  }
  return out;
}

/** Conjugate transpose a†. */
export function adjoint(a: ComplexMatrix): ComplexMatrix {
  const n = a.n;
  const out = zeros(n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      out.re[j * n + i] = a.re[i * n + j];
      out.im[j * n + i] = -a.im[i * n + j];
    }
  return out;
}

/** Trace, as [re, im]. */
export function trace(a: ComplexMatrix): [number, number] {
  let r = 0, i = 0;
  for (let k = 0; k < a.n; k++) {
    r += a.re[k * a.n + k];
    i += a.im[k * a.n + k];
  }
  return [r, i];
}

/** Largest |a_ij − (a_ji)*|: zero for a Hermitian matrix. */
export function hermiticityError(a: ComplexMatrix): number {
  const n = a.n;
  let worst = 0;
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) {
      const dr = a.re[i * n + j] - a.re[j * n + i];
      const di = a.im[i * n + j] + a.im[j * n + i];
      worst = Math.max(worst, Math.hypot(dr, di));
    }
  return worst;
}

/** Largest elementwise modulus of a − b. */
export function maxAbsDifference(a: ComplexMatrix, b: ComplexMatrix): number {
  let worst = 0;
  for (let k = 0; k < a.re.length; k++) worst = Math.max(worst, Math.hypot(a.re[k] - b.re[k], a.im[k] - b.im[k]));
  return worst;
}

/** Build from nested arrays of real numbers or [re, im] pairs. */
export function fromArrays(rows: ReadonlyArray<ReadonlyArray<number | readonly [number, number]>>): ComplexMatrix {
  const n = rows.length;
  const m = zeros(n);
  rows.forEach((row, i) =>
    row.forEach((v, j) => {
      if (typeof v === 'number') m.re[i * n + j] = v;
      else {
        m.re[i * n + j] = v[0];
        m.im[i * n + j] = v[1];
      }
    }),
  );
  return m;
}
