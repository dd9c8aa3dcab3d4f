import { describe, expect, it } from 'vitest';
import { fibonacciGrid, inversionHalf, lebedevGrid, LEBEDEV_DEGREES } from '@multiplet/physics/quadrature';
import { InputError } from '@multiplet/physics/errors';

describe('inversionHalf', () => {
  it('keeps one of each pair n, −n with doubled weight for every Lebedev grid', () => {
    for (const degree of LEBEDEV_DEGREES) {
      const full = lebedevGrid(degree);
      const half = inversionHalf(full);
      expect(half.count * 2).toBe(full.count);
      expect(half.weights.reduce((s, w) => s + w, 0)).toBeCloseTo(1, 13);
    }
  });

  it('gives the same mean as the full grid for an even function such as (n·a)² |n·b| (degree-3 exactness check)', () => {
    const full = lebedevGrid(41);
    const half = inversionHalf(full);
    const f = (x: number, y: number, z: number) => (0.3 * x + 0.5 * y - 0.8 * z) ** 2 * Math.abs(x - 0.2 * z);
    const mean = (g: typeof full) => {
      let s = 0;
      for (let k = 0; k < g.count; k++) s += g.weights[k] * f(g.directions[3 * k], g.directions[3 * k + 1], g.directions[3 * k + 2]);
      return s;
    };
    expect(mean(half)).toBeCloseTo(mean(full), 13);
  });

  it('rejects a grid without inversion symmetry', () => {
    expect(() => inversionHalf(fibonacciGrid(11))).toThrow(InputError);
  });
});
