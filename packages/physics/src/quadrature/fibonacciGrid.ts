import { InputError } from '../errors';
import type { SphereGrid } from './sphereGrid';

/**
 * The Fibonacci (golden-spiral) sphere grid of `count` nearly uniform points with equal weights 1/count.
 *
 * Points z_k = 1 − (2k + 1)/count, azimuth φ_k = 2π k/φ² (φ the golden ratio); see Á. González, "Measurement of
 * areas on a sphere using Fibonacci and latitude–longitude lattices", Math. Geosci. 42, 49 (2010). No algebraic
 * degree of exactness: used as the plain reference against which the Lebedev–Laikov grids are benchmarked. An even
 * count gives an inversion-symmetric set (z_k = −z_{count−1−k}) only up to the azimuth, so it is used whole.
 *
 * @example fibonacciGrid(1000).weights[0] // 0.001
 * See also: lebedevGrid, SphereGrid.
 */
export function fibonacciGrid(count: number): SphereGrid {
  if (!Number.isInteger(count) || count < 1) throw new InputError('count', count, 'a positive integer');
  const directions = new Float64Array(3 * count);
  const goldenAngle = Math.PI * (3 - Math.sqrt(5)); // 2π/φ², common practice
  for (let k = 0; k < count; k++) {
    const z = 1 - (2 * k + 1) / count;
    const r = Math.sqrt(Math.max(0, 1 - z * z));
    const phi = goldenAngle * k;
    directions[3 * k] = r * Math.cos(phi);
    directions[3 * k + 1] = r * Math.sin(phi);
    directions[3 * k + 2] = z;
  }
  return { name: `Fibonacci sphere (${count} points)`, degree: 0, count, directions, weights: new Float64Array(count).fill(1 / count) };
}
