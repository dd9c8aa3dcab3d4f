import { InputError } from '../errors';
import type { SphereGrid } from './sphereGrid';

/**
 * Half of an inversion-symmetric sphere grid: one direction of each pair (n, −n), with doubled weight.
 *
 * For a function odd under inversion paired with an odd projection, such as the powder magnetization
 * M(B n)·n = M(−B n)·(−n) (time reversal: M(−B) = −M(B) for any crystal field), the spherical mean over the full grid
 * equals the mean over this half, at half the cost. Kept: the member with z > 0, or z = 0 and y > 0, or z = y = 0
 * and x > 0.
 *
 * @example inversionHalf(lebedevGrid(17)).count // 55
 * @throws InputError if some direction of the grid has no partner −n of equal weight.
 * See also: lebedevGrid, SphereGrid.
 */
export function inversionHalf(grid: SphereGrid): SphereGrid {
  const n = grid.count;
  const index = new Map<string, number>();
  const key = (x: number, y: number, z: number) => `${Math.round(x * 1e10)},${Math.round(y * 1e10)},${Math.round(z * 1e10)}`;
  for (let k = 0; k < n; k++) index.set(key(grid.directions[3 * k], grid.directions[3 * k + 1], grid.directions[3 * k + 2]), k);
  const directions: number[] = [];
  const weights: number[] = [];
  for (let k = 0; k < n; k++) {
    const x = grid.directions[3 * k], y = grid.directions[3 * k + 1], z = grid.directions[3 * k + 2];
    const partner = index.get(key(-x, -y, -z));
    if (partner === undefined || Math.abs(grid.weights[partner] - grid.weights[k]) > 1e-12 * Math.max(1, grid.weights[k]))
      throw new InputError('grid', grid.name, 'a grid symmetric under inversion (n ↔ −n with equal weights)');
    const eps = 1e-12;
    const keep = z > eps || (Math.abs(z) <= eps && (y > eps || (Math.abs(y) <= eps && x > 0)));
    if (!keep) continue;
    directions.push(x, y, z);
    weights.push(2 * grid.weights[k]);
  }
  return {
    name: `${grid.name}, inversion half`,
    degree: grid.degree,
    count: weights.length,
    directions: Float64Array.from(directions),
    weights: Float64Array.from(weights),
  };
}
