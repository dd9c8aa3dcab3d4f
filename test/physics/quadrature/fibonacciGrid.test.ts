import { describe, expect, it } from 'vitest';
import { fibonacciGrid } from '@multiplet/physics/quadrature';
import { InputError } from '@multiplet/physics/errors';

describe('fibonacciGrid', () => {
  it('gives unit vectors whose mean of z² tends to 1/3 (the exact spherical mean)', () => {
    const g = fibonacciGrid(2000);
    let z2 = 0;
    for (let k = 0; k < g.count; k++) {
      expect(Math.hypot(g.directions[3 * k], g.directions[3 * k + 1], g.directions[3 * k + 2])).toBeCloseTo(1, 14);
      z2 += g.weights[k] * g.directions[3 * k + 2] ** 2;
    }
    expect(Math.abs(z2 - 1 / 3)).toBeLessThan(1e-5);
  });

  it('rejects a non-positive count', () => {
    expect(() => fibonacciGrid(0)).toThrow(InputError);
  });
});
