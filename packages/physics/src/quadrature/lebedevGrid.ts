import { InputError } from '../errors';
import { LEBEDEV_TABLE } from './lebedevTable';
import type { SphereGrid } from './sphereGrid';

/** Degrees of exactness of the stored Lebedev–Laikov grids, ascending (3 … 131; 6 … 5810 points). */
export const LEBEDEV_DEGREES: readonly number[] = LEBEDEV_TABLE.map((entry) => entry.degree);

const cache = new Map<number, SphereGrid>();

/**
 * A Lebedev–Laikov grid on the unit sphere that integrates every spherical harmonic of order ≤ `degree` exactly.
 *
 * Returns the stored grid of the smallest degree ≥ the one asked for (see `LEBEDEV_DEGREES`); weights add up to 1,
 * so Σ w_k f(n_k) is the spherical mean of f. The grids are invariant under the full octahedral group, inversion
 * included, which `inversionHalf` uses to halve the work for odd functions such as M(B).
 *
 * Source: Lebedev & Laikov, Doklady Mathematics 59, 477 (1999); table provenance in `lebedevTable.ts`.
 *
 * @example lebedevGrid(17).count // 110
 * @throws InputError if degree is not a number in [0, 131].
 * See also: inversionHalf, fibonacciGrid, SphereGrid.
 */
export function lebedevGrid(degree: number): SphereGrid {
  if (typeof degree !== 'number' || !Number.isFinite(degree) || degree < 0 || degree > LEBEDEV_DEGREES[LEBEDEV_DEGREES.length - 1])
    throw new InputError('degree', degree, `a number from 0 to ${LEBEDEV_DEGREES[LEBEDEV_DEGREES.length - 1]}`);
  const entry = LEBEDEV_TABLE.find((e) => e.degree >= degree)!;
  const cached = cache.get(entry.degree);
  if (cached) return cached;

  const directions: number[] = [];
  const weights: number[] = [];
  const seen = new Set<string>();
  const permutations = [
    [0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0],
  ];
  for (const [a, b, c, w] of entry.generators) {
    const v = [a, b, c];
    for (const p of permutations) {
      for (let signs = 0; signs < 8; signs++) {
        const x = (signs & 1 ? -1 : 1) * v[p[0]];
        const y = (signs & 2 ? -1 : 1) * v[p[1]];
        const z = (signs & 4 ? -1 : 1) * v[p[2]];
        // −0 and +0 are the same point; rounding to 1e-12 merges the copies an orbit with equal/zero coordinates makes.
        const key = `${Math.round(x * 1e12)},${Math.round(y * 1e12)},${Math.round(z * 1e12)}`;
        if (seen.has(key)) continue;
        seen.add(key);
        const norm = Math.hypot(x, y, z);
        directions.push(x / norm, y / norm, z / norm);
        weights.push(w);
      }
    }
  }
  if (weights.length !== entry.points)
    throw new InputError('degree', degree, `a grid of ${entry.points} points`, `table expansion gave ${weights.length}`);
  const total = weights.reduce((s, w) => s + w, 0);
  const grid: SphereGrid = {
    name: `Lebedev–Laikov degree ${entry.degree} (${entry.points} points)`,
    degree: entry.degree,
    count: entry.points,
    directions: Float64Array.from(directions),
    weights: Float64Array.from(weights, (w) => w / total),
  };
  cache.set(entry.degree, grid);
  return grid;
}
