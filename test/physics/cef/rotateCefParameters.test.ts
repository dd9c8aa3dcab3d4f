import { describe, it, expect } from 'vitest';
import { expm, matrix } from 'mathjs';
import {
  rotateCefParameters,
  wignerD,
  wignerSmallD,
  rotationMatrixFromEuler,
  eulerAnglesFromMatrix,
  angularMomentumMatrices,
  cefHamiltonian,
  CEF_PARAMETER_KEYS,
  parseParameterKey,
} from '@multiplet/physics/cef';
import { hermitianEigen, multiply, adjoint, maxAbsDifference, zeros, addScaledInPlace } from '@multiplet/physics/linalg';
import { createRandom } from '@multiplet/physics/random';

function randomParameters(seed: number): Record<string, number> {
  const rng = createRandom(seed);
  const B: Record<string, number> = {};
  for (const key of CEF_PARAMETER_KEYS) B[key] = rng.normal() * { 2: 0.1, 4: 1e-3, 6: 1e-5 }[parseParameterKey(key)!.n]!;
  return B;
}

function spectrum(J: number, B: Record<string, number>): Float64Array {
  return hermitianEigen(cefHamiltonian(J, B), { vectors: false }).values;
}

describe('Wigner rotation matrices', () => {
  it('d^J(β) equals mathjs expm(−iβJy) = expm(−β(J+ − J−)/2) (reference library: mathjs)', () => {
    for (const J of [0.5, 2, 3.5, 7.5]) {
      const n = 2 * J + 1;
      const { Jplus, Jminus } = angularMomentumMatrices(J);
      const beta = 0.73;
      const generator = Array.from({ length: n }, (_, r) =>
        Array.from({ length: n }, (_, c) => (-beta / 2) * (Jplus.re[r * n + c] - Jminus.re[r * n + c])),
      );
      const reference = (expm(matrix(generator)).toArray() as number[][]).flat();
      const d = wignerSmallD(J, beta);
      reference.forEach((v, k) => expect(Math.abs(d[k] - v), `J=${J} element ${k}`).toBeLessThan(1e-12));
    }
  });

  it('D(A)† J_i D(A) = Σ_j A_ij J_j for the active rotation A = Rz(α)Ry(β)Rz(γ) (Sakurai, Modern Quantum Mechanics, ch. 3)', () => {
    const angles = { alpha: 0.3, beta: 1.1, gamma: -0.8 };
    const A = rotationMatrixFromEuler(angles);
    const J = 2.5;
    const d = wignerD(J, angles);
    const jm = angularMomentumMatrices(J);
    const ops = [jm.Jx, jm.Jy, jm.Jz];
    ops.forEach((op, i) => {
      const lhs = multiply(multiply(adjoint(d), op), d);
      const rhs = zeros(op.n);
      ops.forEach((opj, j) => addScaledInPlace(rhs, opj, A[i][j]));
      expect(maxAbsDifference(lhs, rhs)).toBeLessThan(1e-12);
    });
  });

  it('Euler angles round-trip through rotation matrices, including β = 0 and β = π', () => {
    for (const angles of [{ alpha: 0.4, beta: 2.0, gamma: -1.2 }, { alpha: 0.7, beta: 0, gamma: 0 }, { alpha: -0.5, beta: Math.PI, gamma: 0 }]) {
      const A = rotationMatrixFromEuler(angles);
      const back = rotationMatrixFromEuler(eulerAnglesFromMatrix(A));
      for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(back[i][j]).toBeCloseTo(A[i][j], 12);
    }
  });
});

describe('rotateCefParameters', () => {
  it('leaves the spectrum invariant under random rotations (J = 15/2 and 4, all 27 parameters) to 1e-10', () => {
    const rng = createRandom(99);
    for (const J of [7.5, 4]) {
      const B = randomParameters(Math.round(J * 10));
      const before = spectrum(J, B);
      for (let t = 0; t < 3; t++) {
        const angles = { alpha: 2 * Math.PI * rng.nextDouble(), beta: Math.PI * rng.nextDouble(), gamma: 2 * Math.PI * rng.nextDouble() };
        const rotated = rotateCefParameters(B, J, angles);
        const after = spectrum(J, rotated);
        before.forEach((e, k) => expect(Math.abs(after[k] - e)).toBeLessThan(1e-10));
      }
    }
  });

  it('a rotation matrix and its inverse give back the original parameters; ranks never mix', () => {
    const R = rotationMatrixFromEuler({ alpha: 0.2, beta: 0.9, gamma: 2.1 });
    const Rt = [0, 1, 2].map((i) => [0, 1, 2].map((j) => R[j][i]));
    const B = { B20: -0.2, B43: 0.01, B66: 1e-5 };
    const there = rotateCefParameters(B, 7.5, R);
    const back = rotateCefParameters(there, 7.5, Rt);
    expect(Object.keys(back).sort()).toEqual(Object.keys(B).sort());
    for (const [k, v] of Object.entries(B)) expect(back[k]).toBeCloseTo(v, 14);
    // a rank-2 field stays rank 2
    expect(Object.keys(rotateCefParameters({ B20: 1 }, 2, R)).every((k) => k.startsWith('B2'))).toBe(true);
  });

  it('B20 about an axis at angle β: B20 → B20 (3cos²β − 1)/2 (Legendre P2; exact)', () => {
    const beta = 0.6;
    const out = rotateCefParameters({ B20: 1 }, 1, { alpha: 0, beta, gamma: 0 });
    expect(out.B20).toBeCloseTo((3 * Math.cos(beta) ** 2 - 1) / 2, 14);
  });

  it('a 90° rotation about z turns B22 into −B22 and B44 into B44 (cos 2φ, cos 4φ; exact)', () => {
    const Rz90 = [[0, 1, 0], [-1, 0, 0], [0, 0, 1]]; // rows: new x = old y, new y = −old x
    const out = rotateCefParameters({ B22: 1, B44: 1 }, 4, Rz90);
    expect(out.B22).toBeCloseTo(-1, 14);
    expect(out.B44).toBeCloseTo(1, 14);
    expect(Object.keys(out).sort()).toEqual(['B22', 'B44']);
  });

  it('rejects improper or malformed rotations', () => {
    expect(() => rotateCefParameters({ B20: 1 }, 2, [[1, 0, 0], [0, 1, 0], [0, 0, -1]])).toThrow(/^rotation: .*determinant −1/);
    expect(() => rotateCefParameters({ B20: 1 }, 2, [[1, 0], [0, 1]])).toThrow(/^rotation:/);
    expect(() => rotateCefParameters({ B20: 1 }, 2, [[1, 1, 0], [0, 1, 0], [0, 0, 1]])).toThrow(/orthonormal/);
  });
});
