import { describe, expect, it } from 'vitest';
import { lebedevGrid, LEBEDEV_DEGREES } from '@multiplet/physics/quadrature';
import { createRandom } from '@multiplet/physics/random';
import { InputError } from '@multiplet/physics/errors';

// Published grid sizes: Lebedev & Laikov, Doklady Math. 59, 477 (1999), Table 1.
const PUBLISHED_POINTS: Record<number, number> = {
  3: 6, 5: 14, 7: 26, 9: 38, 11: 50, 13: 74, 15: 86, 17: 110, 19: 146, 21: 170, 23: 194, 25: 230, 27: 266, 29: 302,
  31: 350, 35: 434, 41: 590, 47: 770, 53: 974, 59: 1202, 65: 1454, 71: 1730, 77: 2030, 83: 2354, 89: 2702, 95: 3074,
  101: 3470, 107: 3890, 113: 4334, 119: 4802, 125: 5294, 131: 5810,
};

function doubleFactorial(n: number): number {
  let p = 1;
  for (let k = n; k > 1; k -= 2) p *= k;
  return p;
}

/** Spherical mean of x^a y^b z^c (G. B. Folland, Amer. Math. Monthly 108, 446 (2001)): zero unless all even. */
function monomialMean(a: number, b: number, c: number): number {
  if (a % 2 || b % 2 || c % 2) return 0;
  return (doubleFactorial(a - 1) * doubleFactorial(b - 1) * doubleFactorial(c - 1)) / doubleFactorial(a + b + c + 1);
}

/**
 * Real spherical harmonics Y_lm (orthonormal on the sphere, ∮ Y² dΩ = 1) from the associated Legendre recurrences
 * (Abramowitz & Stegun 8.5.3; normalisation as in Jackson, Classical Electrodynamics, eq. 3.53).
 */
function realHarmonic(l: number, m: number, x: number, y: number, z: number): number {
  const am = Math.abs(m);
  // P_m^m(z) = (−1)^m (2m−1)!! (1−z²)^{m/2}; we drop the Condon–Shortley sign (irrelevant for these checks).
  const s = Math.sqrt(Math.max(0, 1 - z * z));
  let pmm = doubleFactorial(2 * am - 1) * s ** am;
  let plm = pmm;
  if (l > am) {
    let pm1 = z * (2 * am + 1) * pmm;
    plm = pm1;
    for (let ll = am + 2; ll <= l; ll++) {
      const next = ((2 * ll - 1) * z * pm1 - (ll + am - 1) * pmm) / (ll - am);
      pmm = pm1;
      pm1 = next;
      plm = next;
    }
  }
  let ratio = 1; // (l−|m|)!/(l+|m|)!
  for (let k = l - am + 1; k <= l + am; k++) ratio /= k;
  const norm = Math.sqrt(((2 * l + 1) / (4 * Math.PI)) * ratio) * (m === 0 ? 1 : Math.SQRT2);
  const phi = Math.atan2(y, x);
  return norm * plm * (m > 0 ? Math.cos(am * phi) : m < 0 ? Math.sin(am * phi) : 1);
}

function gridMean(degree: number, f: (x: number, y: number, z: number) => number): number {
  const g = lebedevGrid(degree);
  let sum = 0;
  for (let k = 0; k < g.count; k++) sum += g.weights[k] * f(g.directions[3 * k], g.directions[3 * k + 1], g.directions[3 * k + 2]);
  return sum;
}

describe('lebedevGrid', () => {
  it('expands every stored grid to the published number of unit vectors with weights adding up to 1', () => {
    expect(LEBEDEV_DEGREES.length).toBe(32);
    for (const degree of LEBEDEV_DEGREES) {
      const g = lebedevGrid(degree);
      expect(g.count).toBe(PUBLISHED_POINTS[degree]);
      let total = 0;
      for (let k = 0; k < g.count; k++) {
        total += g.weights[k];
        expect(Math.hypot(g.directions[3 * k], g.directions[3 * k + 1], g.directions[3 * k + 2])).toBeCloseTo(1, 14);
      }
      expect(total).toBeCloseTo(1, 13);
    }
  });

  it('integrates random combinations of spherical harmonics exactly up to its degree (Lebedev & Laikov 1999)', () => {
    const rng = createRandom(20261202);
    for (const degree of [3, 7, 11, 17, 23, 35, 59]) {
      // A random f = Σ c_lm Y_lm with l ≤ degree: its spherical mean is c_00 Y_00 = c_00/√(4π).
      const terms: Array<[number, number, number]> = [];
      for (let l = 0; l <= degree; l++) for (let m = -l; m <= l; m++) terms.push([l, m, rng.normal()]);
      const f = (x: number, y: number, z: number) => terms.reduce((s, [l, m, c]) => s + c * realHarmonic(l, m, x, y, z), 0);
      const exact = terms[0][2] / Math.sqrt(4 * Math.PI);
      expect(Math.abs(gridMean(degree, f) - exact)).toBeLessThan(1e-12 * terms.length);
    }
  });

  it('reproduces orthonormality of pairs of harmonics with l + l′ ≤ degree', () => {
    const degree = 17;
    const rng = createRandom(7);
    for (let trial = 0; trial < 30; trial++) {
      const l1 = rng.nextInt(9), l2 = rng.nextInt(9);
      const m1 = rng.nextInt(2 * l1 + 1) - l1, m2 = rng.nextInt(2 * l2 + 1) - l2;
      const mean = gridMean(degree, (x, y, z) => realHarmonic(l1, m1, x, y, z) * realHarmonic(l2, m2, x, y, z));
      expect(mean * 4 * Math.PI).toBeCloseTo(l1 === l2 && m1 === m2 ? 1 : 0, 11);
    }
  });

  it('integrates monomials of degree ≤ its degree exactly and fails just above it', () => {
    for (const degree of [5, 13, 29]) {
      for (let a = 0; a <= degree; a++)
        for (let b = 0; a + b <= degree; b++)
          for (let c = 0; a + b + c <= degree; c++)
            expect(gridMean(degree, (x, y, z) => x ** a * y ** b * z ** c)).toBeCloseTo(monomialMean(a, b, c), 14);
      // One degree of even order past exactness: at least one monomial is missed (the grids are not exact beyond).
      const above = degree + 1;
      let worst = 0;
      for (let a = 0; a <= above; a += 2)
        for (let b = 0; a + b <= above; b += 2) {
          const c = above - a - b;
          const exact = monomialMean(a, b, c);
          worst = Math.max(worst, Math.abs(gridMean(degree, (x, y, z) => x ** a * y ** b * z ** c) - exact) / exact);
        }
      expect(worst).toBeGreaterThan(1e-6); // relative error of the worst monomial
    }
  });

  it('returns the smallest stored degree at least the one asked for, and rejects out-of-range degrees', () => {
    expect(lebedevGrid(16).degree).toBe(17);
    expect(lebedevGrid(0).count).toBe(6);
    expect(() => lebedevGrid(132)).toThrow(InputError);
    expect(() => lebedevGrid(Number.NaN)).toThrow(InputError);
  });
});
