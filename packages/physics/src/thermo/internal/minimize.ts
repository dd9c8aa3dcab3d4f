// Small derivative-free minimisers for the few-parameter fits of thermo (phonon temperatures, Curie–Weiss θ).
// Golden-section search: Kiefer (1953); Press et al., Numerical Recipes 3rd ed. §10.2. Nelder–Mead simplex: Nelder &
// Mead, Computer Journal 7, 308 (1965), with the standard coefficients (1, 2, 1/2, 1/2).

/** Minimum of f on [a, b] (f assumed unimodal there) to a relative bracket width `tolerance`. */
export function goldenSection(f: (x: number) => number, a: number, b: number, tolerance = 1e-10): { x: number; value: number } {
  const r = (Math.sqrt(5) - 1) / 2;
  let c = b - r * (b - a), d = a + r * (b - a);
  let fc = f(c), fd = f(d);
  for (let iter = 0; iter < 200 && Math.abs(b - a) > tolerance * (Math.abs(a) + Math.abs(b) + 1e-300); iter++) {
    if (fc < fd) {
      b = d; d = c; fd = fc; c = b - r * (b - a); fc = f(c);
    } else {
      a = c; c = d; fc = fd; d = a + r * (b - a); fd = f(d);
    }
  }
  return fc < fd ? { x: c, value: fc } : { x: d, value: fd };
}

/** Minimum of f: R^n → R from a start point and initial step sizes. */
export function nelderMead(
  f: (x: number[]) => number,
  start: number[],
  steps: number[],
  { maxIterations = 4000, tolerance = 1e-12, xTolerance = 1e-10 } = {},
): { x: number[]; value: number } {
  const n = start.length;
  let simplex: number[][] = [start.slice()];
  for (let i = 0; i < n; i++) {
    const p = start.slice();
    p[i] += steps[i];
    simplex.push(p);
  }
  let values = simplex.map(f);
  for (let iter = 0; iter < maxIterations; iter++) {
    const order = values.map((v, i) => i).sort((i, j) => values[i] - values[j]);
    simplex = order.map((i) => simplex[i]);
    values = order.map((i) => values[i]);
    if (Math.abs(values[n] - values[0]) <= tolerance * (Math.abs(values[0]) + 1e-300)) break;
    // Also stop once the simplex has shrunk to a point (a perfect fit drives the values to 0, defeating the above).
    let size = 0;
    for (let i = 1; i <= n; i++) for (let k = 0; k < n; k++) size = Math.max(size, Math.abs(simplex[i][k] - simplex[0][k]));
    if (size <= xTolerance) break;
    const centroid = new Array(n).fill(0);
    for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) centroid[k] += simplex[i][k] / n;
    const along = (t: number) => centroid.map((c, k) => c + t * (simplex[n][k] - c));
    const reflected = along(-1);
    const fr = f(reflected);
    if (fr < values[0]) {
      const expanded = along(-2);
      const fe = f(expanded);
      if (fe < fr) { simplex[n] = expanded; values[n] = fe; } else { simplex[n] = reflected; values[n] = fr; }
    } else if (fr < values[n - 1]) {
      simplex[n] = reflected; values[n] = fr;
    } else {
      const contracted = fr < values[n] ? along(-0.5) : along(0.5);
      const fc = f(contracted);
      if (fc < Math.min(fr, values[n])) {
        simplex[n] = contracted; values[n] = fc;
      } else {
        for (let i = 1; i <= n; i++) {
          simplex[i] = simplex[i].map((x, k) => simplex[0][k] + 0.5 * (x - simplex[0][k]));
          values[i] = f(simplex[i]);
        }
      }
    }
  }
  let best = 0;
  for (let i = 1; i <= n; i++) if (values[i] < values[best]) best = i;
  return { x: simplex[best], value: values[best] };
}
