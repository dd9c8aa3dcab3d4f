// Linear interpolation in a strictly increasing table; outside the table → InputError (no silent extrapolation).
import { InputError } from '../../errors';

export function interpolateLinear(xs: Float64Array, ys: Float64Array, x: number, field: string, value: number, what: string): number {
  if (x < xs[0] || x > xs[xs.length - 1])
    throw new InputError(field, value, `${what} within ${xs[0]}–${xs[xs.length - 1]}`);
  let lo = 0, hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  if (hi === lo) return ys[lo];
  const f = (x - xs[lo]) / (xs[hi] - xs[lo]);
  return ys[lo] + f * (ys[hi] - ys[lo]);
}
