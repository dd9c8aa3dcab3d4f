/**
 * Helpers for the point-charge model: the classical (c-number) Stevens polynomials f_n^m(x, y, z) on the unit sphere
 * and their normalisation ∮ (f_n^m)² dΩ.
 *
 * f_n^m = Re[(x + iy)^|m|] p_n^|m|(z) for m ≥ 0 (cosine type) and Im[(x + iy)^|m|] p_n^|m|(z) for m < 0 (sine type),
 * with p_n^m the leading (classical) parts of the polynomials of cef/stevensOperator.ts (X = J(J+1) → r² = 1); that
 * is, f_n^m is the function whose operator equivalent is O_n^m (Stevens 1952; Hutchings 1964 Table VII).
 * The normalisation is integrated with a Lebedev–Laikov grid exact to degree 13 (quadrature/lebedevGrid.ts).
 */
import { lebedevGrid } from '../quadrature';

/** p_n^|m|(z) on the unit sphere (r = 1). */
const P: Record<string, (z: number) => number> = {
  '2,0': (z) => 3 * z * z - 1,
  '2,1': (z) => z,
  '2,2': () => 1,
  '4,0': (z) => 35 * z ** 4 - 30 * z * z + 3,
  '4,1': (z) => 7 * z ** 3 - 3 * z,
  '4,2': (z) => 7 * z * z - 1,
  '4,3': (z) => z,
  '4,4': () => 1,
  '6,0': (z) => 231 * z ** 6 - 315 * z ** 4 + 105 * z * z - 5,
  '6,1': (z) => 33 * z ** 5 - 30 * z ** 3 + 5 * z,
  '6,2': (z) => 33 * z ** 4 - 18 * z * z + 1,
  '6,3': (z) => 11 * z ** 3 - 3 * z,
  '6,4': (z) => 11 * z * z - 1,
  '6,5': (z) => z,
  '6,6': () => 1,
};

/** f_n^m at a unit vector (x, y, z). */
export function stevensPolynomial(n: number, m: number, x: number, y: number, z: number): number {
  const a = Math.abs(m);
  // (x + iy)^a by repeated multiplication
  let re = 1;
  let im = 0;
  for (let k = 0; k < a; k++) [re, im] = [re * x - im * y, re * y + im * x];
  return (m >= 0 ? re : im) * P[`${n},${a}`](z);
}

const normCache = new Map<string, number>();

/** ∮ (f_n^m)² dΩ over the unit sphere. */
export function stevensPolynomialNorm(n: number, m: number): number {
  const key = `${n},${m}`;
  let value = normCache.get(key);
  if (value === undefined) {
    const grid = lebedevGrid(13);
    let mean = 0;
    for (let k = 0; k < grid.count; k++) {
      const f = stevensPolynomial(n, m, grid.directions[3 * k], grid.directions[3 * k + 1], grid.directions[3 * k + 2]);
      mean += grid.weights[k] * f * f;
    }
    value = 4 * Math.PI * mean;
    normCache.set(key, value);
  }
  return value;
}
