/**
 * An independent route to the Stevens operators: spherical tensor operators generated from J+^n by repeated
 * commutators with J−, scaled to the Stevens normalisation computed from Legendre polynomials.
 *
 * Reasoning (operator-equivalent method, Stevens 1952; tensor operators: Racah 1942, Edmonds 1957 ch. 5):
 * - The operator equivalent of a polynomial in (x, y, z) is its fully symmetrised form in (Jx, Jy, Jz). The map
 *   commutes with rotations: [J_a, ·] acts on operators as L_a = −i(r × ∇)_a acts on polynomials.
 * - (x + iy)^n ↦ J+^n exactly. Lowering: L− [r^n F_n^q] = −(n+q)(n−q+1) r^n F_n^{q−1}, where
 *   r^n F_n^q = (x+iy)^q r^{n−q} P_n^{(q)}(z/r) (P_n^{(q)} the q-th derivative of the Legendre polynomial; this
 *   follows from L− Y_n^q = sqrt((n+q)(n−q+1)) Y_n^{q−1} with Condon–Shortley phases).
 * - So T_q := ad(J−)^{n−q} J+^n is the operator equivalent of (K_nq / g_nn) (x+iy)^q r^{n−q} P_n^{(q)}(z/r),
 *   with K_nq = Π_{q'=q+1}^{n} [−(n+q')(n−q'+1)] and g_nn = P_n^{(n)} = (2n)!/(2^n n!) (a constant).
 * - Stevens' normalisation (Stevens 1952; Hutchings 1964, operator tables): O_n^q ↔ Re[(x+iy)^q] p_nq(z, r),
 *   O_n^{−q} ↔ Im[(x+iy)^q] p_nq, where p_nq is r^{n−q} P_n^{(q)}(z/r) divided by g_nq, the factor that leaves
 *   coprime integer coefficients with a positive leading one (e.g. p_40 = 35z⁴ − 30z²r² + 3r⁴, p_42 = 7z² − r²).
 * Hence O_n^q = g_nn (T_q + T_q†)/(2 K_nq g_nq) and O_n^{−q} = g_nn (T_q − T_q†)/(2i K_nq g_nq).
 */
import { zeros, multiply, adjoint, type ComplexMatrix } from '../linalg/complexMatrix';
import { angularMomentumMatrices, checkJ } from './angularMomentum';
import { checkRankAndComponent } from './stevensOperator';

function binomial(n: number, k: number): number {
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return Math.round(r);
}

function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a;
}

/**
 * g_nq: the factor between the q-th derivative of the Legendre polynomial P_n and the primitive integer polynomial
 * p_nq of the Stevens normalisation (see the file comment).
 * @example legendreDerivativeScale(4, 0) // 1/8, since P_4 = (35μ⁴ − 30μ² + 3)/8
 */
export function legendreDerivativeScale(n: number, q: number): number {
  // 2^n P_n(μ) = Σ_k (−1)^k C(n,k) C(2n−2k, n) μ^{n−2k}  (Rodrigues' formula expanded; Abramowitz & Stegun ch. 22)
  let coefficients = new Array<number>(n + 1).fill(0);
  for (let k = 0; 2 * k <= n; k++) coefficients[n - 2 * k] = (k % 2 ? -1 : 1) * binomial(n, k) * binomial(2 * n - 2 * k, n);
  for (let d = 0; d < q; d++) coefficients = coefficients.slice(1).map((c, power) => c * (power + 1));
  const common = coefficients.reduce((g, c) => gcd(g, c), 0);
  return common / 2 ** n;
}

function commutator(a: ComplexMatrix, b: ComplexMatrix): ComplexMatrix {
  const ab = multiply(a, b), ba = multiply(b, a);
  for (let k = 0; k < ab.re.length; k++) {
    ab.re[k] -= ba.re[k];
    ab.im[k] -= ba.im[k];
  }
  return ab;
}

/**
 * O_n^m built from the tensor-operator construction (no polynomial table). Same normalisation and sign conventions
 * as stevensOperator; used as its independent check and for general (n, m).
 *
 * @example stevensOperatorFromTensor(4, 6, 3)
 * See also: stevensOperator (explicit polynomial forms)
 */
export function stevensOperatorFromTensor(J: number, n: number, m: number): ComplexMatrix {
  checkRankAndComponent(n, m);
  const dim = checkJ(J);
  const { Jplus, Jminus } = angularMomentumMatrices(J);
  const q = Math.abs(m);
  let t = zeros(dim);
  for (let k = 0; k < dim; k++) t.re[k * dim + k] = 1;
  for (let i = 0; i < n; i++) t = multiply(t, Jplus);
  let K = 1;
  for (let qq = n; qq > q; qq--) {
    t = commutator(Jminus, t);
    K *= -(n + qq) * (n - qq + 1);
  }
  // J+^n ↦ (x+iy)^n = r^n F_n^n / g_nn (P_n^{(n)} is the constant g_nn), hence the factor g_nn.
  const scale = legendreDerivativeScale(n, n) / (2 * K * legendreDerivativeScale(n, q));
  const td = adjoint(t);
  const out = zeros(dim);
  for (let k = 0; k < out.re.length; k++) {
    if (m >= 0) {
      out.re[k] = scale * (t.re[k] + td.re[k]);
      out.im[k] = scale * (t.im[k] + td.im[k]);
    } else {
      // (T − T†)/(2i K g): divide by i ⇒ (re, im) → (im, −re)
      out.re[k] = scale * (t.im[k] - td.im[k]);
      out.im[k] = -scale * (t.re[k] - td.re[k]);
    }
  }
  return out;
}
