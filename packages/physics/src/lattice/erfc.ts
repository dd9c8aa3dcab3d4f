/**
 * Complementary error function to near machine precision, for the Ewald sums (JavaScript has no Math.erfc, and
 * 1 − erf loses all digits where the Ewald real-space terms live).
 *
 * x < 2.5: erf by the everywhere-positive series erf x = (2/√π) e^{−x²} Σ_n 2ⁿ x^{2n+1} / (1·3·…·(2n+1))
 * (Abramowitz & Stegun 7.1.6), erfc = 1 − erf. x ≥ 2.5: the continued fraction
 * erfc x = (e^{−x²}/√π) · 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + …))))) (A&S 7.1.14), evaluated by the modified
 * Lentz method (Press et al., Numerical Recipes 3rd ed. §5.2).
 */

/**
 * erfc(x) for real x, relative accuracy about 1e-14.
 * @example erfc(3) // 2.209049699858544e-5
 * See also: ewaldDipolarKernel
 */
export function erfc(x: number): number {
  if (x < 0) return 2 - erfc(-x);
  if (x < 2.5) {
    let term = x;
    let sum = x;
    const x2 = x * x;
    for (let n = 1; n < 200; n++) {
      term *= (2 * x2) / (2 * n + 1);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
    return 1 - (2 / Math.sqrt(Math.PI)) * Math.exp(-x2) * sum;
  }
  // Lentz: f = b0 + a1/(b1 + a2/(b2 + ...)) with b_n = x, a_n = n/2.
  const tiny = 1e-300;
  let f = x;
  let C = f;
  let D = 0;
  for (let n = 1; n < 500; n++) {
    const an = n / 2;
    D = x + an * D;
    D = Math.abs(D) < tiny ? tiny : D;
    C = x + an / C;
    C = Math.abs(C) < tiny ? tiny : C;
    D = 1 / D;
    const delta = C * D;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x * x) / (Math.sqrt(Math.PI) * f);
}
