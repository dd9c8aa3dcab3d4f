// Gauss–Legendre nodes and weights on [−1, 1] by Newton iteration on P_n (Abramowitz & Stegun 25.4.29; Press et al.,
// Numerical Recipes 3rd ed. §4.6, the standard recipe). Used for smooth integrals such as the Debye function.
const cache = new Map<number, { nodes: Float64Array; weights: Float64Array }>();

export function gaussLegendre(n: number): { nodes: Float64Array; weights: Float64Array } {
  const hit = cache.get(n);
  if (hit) return hit;
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 0;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1, p1 = x;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      const pn = n === 1 ? x : p1;
      const pn1 = n === 1 ? 1 : p0;
      dp = (n * (x * pn - pn1)) / (x * x - 1);
      const dx = pn / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    nodes[i] = -x;
    nodes[n - 1 - i] = x;
    weights[i] = weights[n - 1 - i] = 2 / ((1 - x * x) * dp * dp);
  }
  const rule = { nodes, weights };
  cache.set(n, rule);
  return rule;
}

/** ∫_a^b f(x) dx by composite Gauss–Legendre (16 nodes per panel, `panels` equal panels). */
export function integrate(f: (x: number) => number, a: number, b: number, panels: number): number {
  const { nodes, weights } = gaussLegendre(16);
  const h = (b - a) / panels;
  let sum = 0;
  for (let p = 0; p < panels; p++) {
    const mid = a + (p + 0.5) * h;
    for (let k = 0; k < nodes.length; k++) sum += weights[k] * f(mid + 0.5 * h * nodes[k]);
  }
  return 0.5 * h * sum;
}
