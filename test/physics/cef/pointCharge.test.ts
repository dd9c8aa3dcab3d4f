import { describe, expect, it } from 'vitest';
import { pointChargeCoefficients, pointChargeParameters, type PointCharge } from '@multiplet/physics/cef/pointCharge';
import { stevensPolynomial } from '@multiplet/physics/cef/pointChargeHarmonics';
import { cefHamiltonian } from '@multiplet/physics/cef/cefHamiltonian';
import { parseParameterKey } from '@multiplet/physics/cef/parameterKeys';
import { hermitianEigen } from '@multiplet/physics/linalg/hermitianEigen';
import { getIon } from '@multiplet/physics/ions';
import { createRandom, type Random } from '@multiplet/physics/random';
import { COULOMB_MEV_ANGSTROM } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

function legendre(n: number, x: number): number {
  let p0 = 1, p1 = x;
  for (let k = 1; k < n; k++) [p0, p1] = [p1, ((2 * k + 1) * x * p1 - k * p0) / (k + 1)];
  return n === 0 ? 1 : p1;
}

function randomLigands(rng: Random, count: number): PointCharge[] {
  return Array.from({ length: count }, () => {
    const v = [rng.normal(), rng.normal(), rng.normal()];
    const r = 2 + rng.nextDouble();
    const s = r / Math.hypot(v[0], v[1], v[2]);
    return { positionAngstrom: [v[0] * s, v[1] * s, v[2] * s] as [number, number, number], charge: -1 - rng.nextDouble() };
  });
}

function randomRotation(rng: Random): number[][] {
  const q = [rng.normal(), rng.normal(), rng.normal(), rng.normal()];
  const n = Math.hypot(...q);
  const [w, x, y, z] = q.map((v) => v / n);
  return [
    [1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y)],
    [2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x)],
    [2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y)],
  ];
}

const rotate = (r: number[][], p: readonly number[]) => r.map((row) => row[0] * p[0] + row[1] * p[1] + row[2] * p[2]) as [number, number, number];

describe('point-charge crystal field', () => {
  it('the harmonic expansion reproduces the multipole sum −(e²/4πε0) Σ_j q_j P_n(r̂·R̂_j)/R_j^{n+1} at random points, n = 2, 4, 6', () => {
    const rng = createRandom(42);
    const ligands = randomLigands(rng, 7);
    const a = pointChargeCoefficients(ligands);
    for (let trial = 0; trial < 20; trial++) {
      const v = [rng.normal(), rng.normal(), rng.normal()];
      const norm = Math.hypot(v[0], v[1], v[2]);
      const u = v.map((c) => c / norm);
      for (const n of [2, 4, 6]) {
        let expansion = 0;
        for (const [key, value] of Object.entries(a)) if (parseParameterKey(key)!.n === n) {
          const { m } = parseParameterKey(key)!;
          expansion += value * stevensPolynomial(n, m, u[0], u[1], u[2]);
        }
        let direct = 0;
        for (const l of ligands) {
          const p = l.positionAngstrom;
          const r = Math.hypot(p[0], p[1], p[2]);
          direct += (l.charge * legendre(n, (u[0] * p[0] + u[1] * p[1] + u[2] * p[2]) / r)) / r ** (n + 1);
        }
        expect(expansion).toBeCloseTo(-COULOMB_MEV_ANGSTROM * direct, 8);
      }
    }
  });

  it('octahedron: A40 = −(7/16) q e²/a⁵, A60 = −(3/64) q e²/a⁷ (Hutchings 1964 §6, from memory), B44 = 5 B40, B64 = −21 B60', () => {
    const a = 2.3;
    const q = -2;
    const ligands: PointCharge[] = [[a, 0, 0], [-a, 0, 0], [0, a, 0], [0, -a, 0], [0, 0, a], [0, 0, -a]].map((p) => ({ positionAngstrom: p as [number, number, number], charge: q }));
    const coefficients = pointChargeCoefficients(ligands);
    expect(coefficients.B40).toBeCloseTo((-(7 / 16) * q * COULOMB_MEV_ANGSTROM) / a ** 5, 8);
    expect(coefficients.B60).toBeCloseTo((-(3 / 64) * q * COULOMB_MEV_ANGSTROM) / a ** 7, 8);
    const b = pointChargeParameters('Yb3+', ligands);
    expect(Object.keys(b).sort()).toEqual(['B40', 'B44', 'B60', 'B64']);
    expect(b.B44 / b.B40).toBeCloseTo(5, 10);
    expect(b.B64 / b.B60).toBeCloseTo(-21, 10);
  });

  // The strongest check of the normalisations: a rotated ligand set gives different B_n^m but the same physics, so
  // the eigenvalues of H_CEF (built with the cef module's Stevens operators) must not change. This ties every
  // f_n^m here to its operator O_n^m there, m = −n … n.
  for (const name of ['Er3+', 'Tb3+', 'Nd3+']) {
    it(`rotating the ligands leaves the ${name} levels unchanged`, () => {
      const rng = createRandom(7 + name.length);
      const ligands = randomLigands(rng, 8);
      const J = getIon(name).J;
      const levels = (l: PointCharge[]) => hermitianEigen(cefHamiltonian(J, pointChargeParameters(name, l)), { vectors: false }).values;
      const reference = levels(ligands);
      const spread = reference[reference.length - 1] - reference[0];
      expect(spread).toBeGreaterThan(1);
      for (let k = 0; k < 3; k++) {
        const r = randomRotation(rng);
        const rotated = levels(ligands.map((l) => ({ ...l, positionAngstrom: rotate(r, l.positionAngstrom) })));
        for (let i = 0; i < reference.length; i++) expect(rotated[i]).toBeCloseTo(reference[i], 8);
      }
    });
  }

  it('applies shielding (1 − σ_n) per rank', () => {
    const ligands = randomLigands(createRandom(3), 5);
    const bare = pointChargeParameters('Er3+', ligands);
    const shielded = pointChargeParameters('Er3+', ligands, { shielding: { sigma2: 0.5, sigma4: 0.1, sigma6: -0.1 } });
    expect(shielded.B20 / bare.B20).toBeCloseTo(0.5, 12);
    expect(shielded.B40 / bare.B40).toBeCloseTo(0.9, 12);
    expect(shielded.B60 / bare.B60).toBeCloseTo(1.1, 12);
  });

  it('rejects bad ligands', () => {
    expect(() => pointChargeParameters('Er3+', [])).toThrow(InputError);
    expect(() => pointChargeParameters('Er3+', [{ positionAngstrom: [0, 0, 0], charge: -2 }])).toThrow(/positionAngstrom/);
    expect(() => pointChargeParameters('Er3+', [{ positionAngstrom: [0, 0, 2], charge: Number.NaN }])).toThrow(/charge/);
  });
});
