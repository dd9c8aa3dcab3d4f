/**
 * Central finite-difference Jacobian of a residual function, respecting a parameter box (one-sided differences at a
 * bound). Step h_j = ε^{1/3} · max(|p_j|, typical_j) (typical_j defaults to 0, and the size to 1 at p_j = 0), the optimal step for central differences
 * (Nocedal & Wright, Numerical Optimization, 2nd ed., §8.1).
 *
 * @example const jac = finiteDifferenceJacobian((p) => residuals(p), p, r0);
 * See also: levenbergMarquardt.
 */
const CUBE_ROOT_EPS = Math.cbrt(Number.EPSILON);

export interface FiniteDifferenceOptions {
  /** Typical magnitude of each parameter (sets the step when p_j ≈ 0). Default 1. */
  readonly typicalScale?: ArrayLike<number>;
  readonly lower?: ArrayLike<number>;
  readonly upper?: ArrayLike<number>;
  /** 'central' (default, error O(h²)) or 'forward' (half the evaluations). */
  readonly method?: 'central' | 'forward';
}

/** Returns the row-major m×p Jacobian ∂r_i/∂p_j. `r0` are the residuals at `p` (length m). */
export function finiteDifferenceJacobian(
  residuals: (p: Float64Array) => Float64Array,
  p: Float64Array,
  r0: Float64Array,
  options: FiniteDifferenceOptions = {},
): Float64Array {
  const n = p.length;
  const m = r0.length;
  const jac = new Float64Array(m * n);
  const x = Float64Array.from(p);
  const method = options.method ?? 'central';
  for (let j = 0; j < n; j++) {
    // Without a typical scale the parameter's own size sets the step (1 when it is exactly zero).
    const typical = options.typicalScale ? Math.abs(options.typicalScale[j]) : 0;
    const size = Math.max(Math.abs(p[j]), typical) || 1;
    const h = (method === 'central' ? CUBE_ROOT_EPS : Math.sqrt(Number.EPSILON)) * size;
    const lo = options.lower ? options.lower[j] : -Infinity;
    const hi = options.upper ? options.upper[j] : Infinity;
    const canUp = p[j] + h <= hi;
    const canDown = p[j] - h >= lo;
    if (method === 'central' && canUp && canDown) {
      x[j] = p[j] + h;
      const up = residuals(x);
      x[j] = p[j] - h;
      const down = residuals(x);
      const step = (p[j] + h) - (p[j] - h);
      for (let i = 0; i < m; i++) jac[i * n + j] = (up[i] - down[i]) / step;
    } else {
      const sign = canUp ? 1 : -1;
      x[j] = p[j] + sign * h;
      const moved = residuals(x);
      const step = x[j] - p[j];
      for (let i = 0; i < m; i++) jac[i * n + j] = (moved[i] - r0[i]) / step;
    }
    x[j] = p[j];
  }
  return jac;
}
