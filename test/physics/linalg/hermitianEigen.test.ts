/**
 * Tests of the complex Hermitian eigensolver.
 * Reference library: mathjs `eigs` (an independent implementation this project did not write).
 * Invariants: A v = λ v, V†V = I, Tr A = Σ λ, spectral projectors of degenerate subspaces.
 */
import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import {
  hermitianEigen,
  zeros,
  identity,
  multiply,
  adjoint,
  trace,
  fromArrays,
  type ComplexMatrix,
} from '@multiplet/physics/linalg';
import { createRandom, type Random } from '@multiplet/physics/random';
import { InputError } from '@multiplet/physics/errors';
import { randomHermitian } from './randomHermitian';


/** A random unitary from the eigenvectors of a random Hermitian matrix. */
function randomUnitary(n: number, rng: Random): ComplexMatrix {
  return hermitianEigen(randomHermitian(n, rng)).vectors;
}

/** U diag(λ) U†. */
function withSpectrum(values: number[], u: ComplexMatrix): ComplexMatrix {
  const n = values.length;
  const d = zeros(n);
  values.forEach((v, i) => (d.re[i * n + i] = v));
  return multiply(multiply(u, d), adjoint(u));
}

function toMathjs(a: ComplexMatrix): math.Matrix {
  const rows: math.Complex[][] = [];
  for (let i = 0; i < a.n; i++) {
    const row: math.Complex[] = [];
    for (let j = 0; j < a.n; j++) row.push(math.complex(a.re[i * a.n + j], a.im[i * a.n + j]));
    rows.push(row);
  }
  return math.matrix(rows);
}

/**
 * mathjs eigen-decomposition: all n eigenvalues (real parts, ascending) from `values`, and the eigenpairs it
 * returns (for a degenerate complex matrix mathjs 15 returns one vector per distinct eigenvalue), normalised.
 */
function mathjsEigen(a: ComplexMatrix): { values: number[]; pairs: Array<{ value: number; vector: Array<[number, number]> }> } {
  const result = math.eigs(toMathjs(a));
  const realPart = (x: unknown): number => (typeof x === 'number' ? x : (x as math.Complex).re);
  const values = ((result.values as math.Matrix).toArray() as unknown[]).map(realPart).sort((p, q) => p - q);
  const pairs = result.eigenvectors.map((p) => {
    const data = (p.vector as math.Matrix).toArray() as unknown[];
    const vec = data.map((c) => (typeof c === 'number' ? ([c, 0] as [number, number]) : ([(c as math.Complex).re, (c as math.Complex).im] as [number, number])));
    const norm = Math.sqrt(vec.reduce((s, [x, y]) => s + x * x + y * y, 0));
    return { value: realPart(p.value), vector: vec.map(([x, y]) => [x / norm, y / norm] as [number, number]) };
  });
  return { values, pairs };
}

function column(v: ComplexMatrix, k: number): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let r = 0; r < v.n; r++) out.push([v.re[r * v.n + k], v.im[r * v.n + k]]);
  return out;
}

/** Projector Σ_k v_k v_k† over the given vectors. */
function projector(vectors: Array<Array<[number, number]>>, n: number): ComplexMatrix {
  const p = zeros(n);
  for (const v of vectors)
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const [ar, ai] = v[i];
        const [br, bi] = v[j];
        p.re[i * n + j] += ar * br + ai * bi;
        p.im[i * n + j] += ai * br - ar * bi;
      }
  return p;
}

function maxDiff(a: ComplexMatrix, b: ComplexMatrix): number {
  let w = 0;
  for (let k = 0; k < a.re.length; k++) w = Math.max(w, Math.hypot(a.re[k] - b.re[k], a.im[k] - b.im[k]));
  return w;
}

/** Group ascending values into degenerate clusters (indices). */
function clusters(values: ArrayLike<number>, tol: number): number[][] {
  const groups: number[][] = [];
  for (let k = 0; k < values.length; k++) {
    const last = groups[groups.length - 1];
    if (last && Math.abs(values[k] - values[last[last.length - 1]]) <= tol) last.push(k);
    else groups.push([k]);
  }
  return groups;
}

function residual(a: ComplexMatrix, values: Float64Array, v: ComplexMatrix): number {
  const n = a.n;
  const av = multiply(a, v);
  let worst = 0;
  for (let i = 0; i < n; i++)
    for (let k = 0; k < n; k++)
      worst = Math.max(worst, Math.hypot(av.re[i * n + k] - values[k] * v.re[i * n + k], av.im[i * n + k] - values[k] * v.im[i * n + k]));
  return worst;
}

function orthonormalityError(v: ComplexMatrix): number {
  return maxDiff(multiply(adjoint(v), v), identity(v.n));
}

function matrixNorm(a: ComplexMatrix): number {
  let s = 0;
  for (let k = 0; k < a.re.length; k++) s += a.re[k] ** 2 + a.im[k] ** 2;
  return Math.sqrt(s);
}

/** ‖A v − λ v‖ for one vector. */
function vectorResidual(a: ComplexMatrix, value: number, v: Array<[number, number]>): number {
  const n = a.n;
  let s = 0;
  for (let i = 0; i < n; i++) {
    let xr = -value * v[i][0], xi = -value * v[i][1];
    for (let j = 0; j < n; j++) {
      const ar = a.re[i * n + j], ai = a.im[i * n + j];
      xr += ar * v[j][0] - ai * v[j][1];
      xi += ar * v[j][1] + ai * v[j][0];
    }
    s += xr * xr + xi * xi;
  }
  return Math.sqrt(s);
}

/**
 * Compare with mathjs: all eigenvalues to 1e-10 relative, degeneracies identical, and every mathjs eigenvector
 * lies in our spectral subspace of its eigenvalue: ‖(I − P)v‖ ≤ ‖A v − λ v‖ / gap (Davis & Kahan 1970,
 * sin θ theorem; the gap is the distance from λ to the rest of the spectrum). mathjs's inverse-iteration vectors
 * are sometimes only accurate to 1e-6, so the bound uses mathjs's own residual; ours is checked to 1e-13 elsewhere.
 */
function expectAgreesWithMathjs(a: ComplexMatrix, clusterTol = 1e-8): void {
  const ours = hermitianEigen(a);
  const ref = mathjsEigen(a);
  const n = a.n;
  const scale = Math.max(1, ...ref.values.map(Math.abs));
  for (let k = 0; k < n; k++) expect(Math.abs(ours.values[k] - ref.values[k])).toBeLessThanOrEqual(1e-10 * scale);
  const groups = clusters(ours.values, clusterTol * scale);
  expect(groups.map((g) => g.length)).toEqual(clusters(ref.values, clusterTol * scale).map((g) => g.length));
  expect(ref.pairs.length).toBeGreaterThan(0);
  for (const { value, vector } of ref.pairs) {
    const group = groups.find((g) => Math.abs(ours.values[g[0]] - value) <= clusterTol * scale);
    expect(group).toBeDefined();
    let gap = Infinity;
    for (let k = 0; k < n; k++) if (!group!.includes(k)) gap = Math.min(gap, Math.abs(ours.values[k] - value));
    // (I − P) v with P = Σ_{k in group} u_k u_k†
    const rest = vector.map(([x, y]) => [x, y] as [number, number]);
    for (const k of group!) {
      const u = column(ours.vectors, k);
      let cr = 0, ci = 0; // u† v
      for (let r = 0; r < n; r++) {
        cr += u[r][0] * vector[r][0] + u[r][1] * vector[r][1];
        ci += u[r][0] * vector[r][1] - u[r][1] * vector[r][0];
      }
      for (let r = 0; r < n; r++) {
        rest[r][0] -= u[r][0] * cr - u[r][1] * ci;
        rest[r][1] -= u[r][0] * ci + u[r][1] * cr;
      }
    }
    const outside = Math.sqrt(rest.reduce((s, [x, y]) => s + x * x + y * y, 0));
    const bound = vectorResidual(a, value, vector) / gap;
    expect(outside).toBeLessThanOrEqual(Math.max(2 * bound, 1e-12 * n));
    expect(outside).toBeLessThan(1e-5);
  }
}

describe('hermitianEigen against mathjs eigs (reference library)', () => {
  it('agrees on seeded random Hermitian matrices, n = 1..17 and 24', () => {
    const rng = createRandom(20261202);
    for (const n of [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 24]) expectAgreesWithMathjs(randomHermitian(n, rng));
  });

  it('agrees on real symmetric matrices and on widely scaled entries', () => {
    const rng = createRandom(7);
    const a = randomHermitian(9, rng);
    a.im.fill(0);
    expectAgreesWithMathjs(a);
    expectAgreesWithMathjs(randomHermitian(8, rng, 1e-4));
    expectAgreesWithMathjs(randomHermitian(8, rng, 1e4));
  });

  it('agrees on degenerate spectra: repeated blocks and Kramers-like pairs; exact spectral projectors', () => {
    const rng = createRandom(99);
    // A = U diag(λ) U† with a known unitary U: the exact projector of each degenerate level is Σ u_k u_k† over
    // the columns of U carrying that level (construction, exact up to rounding).
    const cases = [
      [-3, -3, -1, -1, 0.5, 0.5, 2, 2], // Kramers-like: every level doubly degenerate
      [-2, -2, -2, -2, 1, 1, 1, 4, 5], // a quartet, a triplet and singlets (cubic-like pattern)
      [0, 0, 0, 0, 0, 1], // a five-fold level
    ];
    for (const spectrum of cases) {
      const n = spectrum.length;
      const u = randomUnitary(n, rng);
      const a = withSpectrum(spectrum, u);
      expectAgreesWithMathjs(a);
      const ours = hermitianEigen(a);
      for (const group of clusters(ours.values, 1e-9)) {
        const level = ours.values[group[0]];
        const exactColumns = spectrum.map((x, k) => (Math.abs(x - level) < 1e-9 ? k : -1)).filter((k) => k >= 0);
        expect(exactColumns.length).toBe(group.length);
        const pOurs = projector(group.map((k) => column(ours.vectors, k)), n);
        const pExact = projector(exactColumns.map((k) => column(u, k)), n);
        expect(maxDiff(pOurs, pExact)).toBeLessThan(1e-12);
      }
    }
  });
});

describe('hermitianEigen: exact cases and invariants', () => {
  it('identity and diagonal matrices: exact values, unit vectors', () => {
    const id = hermitianEigen(identity(6));
    expect(Array.from(id.values)).toEqual([1, 1, 1, 1, 1, 1]);
    expect(orthonormalityError(id.vectors)).toBeLessThan(1e-15);
    const diag = fromArrays([
      [3, 0, 0, 0],
      [0, -1, 0, 0],
      [0, 0, 2, 0],
      [0, 0, 0, -1],
    ]);
    const r = hermitianEigen(diag);
    expect(Array.from(r.values)).toEqual([-1, -1, 2, 3]);
    // The eigenvector of 3 is e_0, of 2 is e_2 (exactly; phase convention: largest component real positive).
    expect(column(r.vectors, 3)).toEqual([[1, 0], [0, 0], [0, 0], [0, 0]]);
    expect(column(r.vectors, 2)).toEqual([[0, 0], [0, 0], [1, 0], [0, 0]]);
  });

  it('2×2 closed form: λ = (a+d)/2 ± sqrt(((a−d)/2)² + |b|²)', () => {
    // Exact 2×2 Hermitian eigenvalues (elementary algebra, common practice).
    const a = 2, dd = 3, br = 0.3, bi = 1.1;
    const r = hermitianEigen(fromArrays([[a, [br, bi]], [[br, -bi], dd]]));
    const mean = (a + dd) / 2, rad = Math.sqrt(((a - dd) / 2) ** 2 + br * br + bi * bi);
    expect(r.values[0]).toBeCloseTo(mean - rad, 14);
    expect(r.values[1]).toBeCloseTo(mean + rad, 14);
  });

  it('residual, orthonormality, trace on random matrices up to n = 40', () => {
    const rng = createRandom(5);
    for (const n of [2, 5, 13, 17, 25, 40]) {
      const a = randomHermitian(n, rng);
      const { values, vectors } = hermitianEigen(a);
      const norm = matrixNorm(a);
      expect(residual(a, values, vectors)).toBeLessThan(1e-13 * norm * n);
      expect(orthonormalityError(vectors)).toBeLessThan(1e-13 * n);
      const sum = values.reduce((s, x) => s + x, 0);
      expect(Math.abs(sum - trace(a)[0])).toBeLessThan(1e-12 * norm * n);
      for (let k = 1; k < n; k++) expect(values[k]).toBeGreaterThanOrEqual(values[k - 1]);
    }
  });

  it('tridiagonal-already and block-diagonal inputs (Householder steps skipped) stay exact', () => {
    const rng = createRandom(11);
    const block = randomHermitian(3, rng);
    const n = 6;
    const a = zeros(n);
    for (let b = 0; b < 2; b++)
      for (let i = 0; i < 3; i++)
        for (let j = 0; j < 3; j++) {
          a.re[(b * 3 + i) * n + b * 3 + j] = block.re[i * 3 + j];
          a.im[(b * 3 + i) * n + b * 3 + j] = block.im[i * 3 + j];
        }
    const r = hermitianEigen(a);
    const rb = hermitianEigen(block);
    for (let k = 0; k < 3; k++) {
      expect(r.values[2 * k]).toBeCloseTo(rb.values[k], 13);
      expect(r.values[2 * k + 1]).toBeCloseTo(rb.values[k], 13);
    }
    expect(residual(a, r.values, r.vectors)).toBeLessThan(1e-13);
    expectAgreesWithMathjs(a);
  });

  it('phase convention: the largest component of each eigenvector is real and positive', () => {
    const rng = createRandom(3);
    const a = randomHermitian(7, rng);
    const { vectors } = hermitianEigen(a);
    for (let k = 0; k < 7; k++) {
      const col = column(vectors, k);
      const mods = col.map(([x, y]) => Math.hypot(x, y));
      const best = mods.indexOf(Math.max(...mods));
      expect(col[best][1]).toBe(0);
      expect(col[best][0]).toBeGreaterThan(0);
    }
  });

  it('values-only mode returns the same eigenvalues and null vectors', () => {
    const rng = createRandom(8);
    const a = randomHermitian(12, rng);
    const full = hermitianEigen(a);
    const only = hermitianEigen(a, { vectors: false });
    expect(only.vectors).toBeNull();
    for (let k = 0; k < 12; k++) expect(Math.abs(only.values[k] - full.values[k])).toBeLessThan(1e-13);
  });

  it('does not modify its input', () => {
    const rng = createRandom(4);
    const a = randomHermitian(5, rng);
    const copy = { n: 5, re: Float64Array.from(a.re), im: Float64Array.from(a.im) };
    hermitianEigen(a);
    expect(maxDiff(a, copy)).toBe(0);
  });
});

describe('hermitianEigen: bad input', () => {
  it('non-square storage → InputError', () => {
    const a = { n: 3, re: new Float64Array(6), im: new Float64Array(6) };
    expect(() => hermitianEigen(a)).toThrow(InputError);
  });

  it('non-Hermitian beyond tolerance → InputError naming the element; rounding-level asymmetry accepted', () => {
    const a = fromArrays([[1, [2, 1]], [[2, 1], 3]]); // a01 = 2+i, a10 should be 2−i
    expect(() => hermitianEigen(a)).toThrow(InputError);
    expect(() => hermitianEigen(a)).toThrow(/matrix\[1\]\[0\]/);
    const nearly = fromArrays([[1, [2, 1]], [[2 + 1e-14, -1], 3]]);
    expect(() => hermitianEigen(nearly)).not.toThrow();
    const complexDiagonal = fromArrays([[[1, 0.5], 0], [0, 1]]);
    expect(() => hermitianEigen(complexDiagonal)).toThrow(/real diagonal/);
  });

  it('NaN or Infinity → InputError', () => {
    const a = identity(3);
    a.re[4] = NaN;
    expect(() => hermitianEigen(a)).toThrow(InputError);
    const b = identity(3);
    b.im[1] = Infinity;
    expect(() => hermitianEigen(b)).toThrow(/matrix\[0\]\[1\]/);
  });

  it('zero dimension → InputError', () => {
    expect(() => hermitianEigen({ n: 0, re: new Float64Array(0), im: new Float64Array(0) })).toThrow(InputError);
  });
});

describe('hermitianEigen: extreme magnitudes', () => {
  it('matrices scaled by 1e-200 and 1e200 give the scaled spectrum and the same vectors; the zero matrix is exact', () => {
    const rng = createRandom(21);
    const a = randomHermitian(9, rng);
    const ref = hermitianEigen(a);
    for (const s of [1e-200, 1e200]) {
      const b = { n: 9, re: a.re.map((x) => x * s), im: a.im.map((x) => x * s) };
      const r = hermitianEigen(b);
      for (let k = 0; k < 9; k++) expect(r.values[k] / s).toBeCloseTo(ref.values[k], 12);
      expect(maxDiff(r.vectors, ref.vectors)).toBeLessThan(1e-12);
    }
    const z = hermitianEigen(zeros(4));
    expect(Array.from(z.values)).toEqual([0, 0, 0, 0]);
    expect(orthonormalityError(z.vectors)).toBe(0);
  });
});
