/**
 * Stevens operator equivalents O_n^m (n = 2, 4, 6; −n ≤ m ≤ n) as matrices in the |J, m⟩ basis, built from the
 * explicit polynomial forms in Jz, J+ and J−.
 *
 * Forms (X = J(J+1)): K. W. H. Stevens, Proc. Phys. Soc. A 65, 209 (1952); M. T. Hutchings, Solid State Phys. 16, 227
 * (1964), operator tables; the full set with odd m and sine types in the same normalisation as collected by C. Rudowicz
 * (1985). From memory: the polynomials f_n^m below are recalled; they are checked to 1e-12
 * against the independent tensor-operator construction in cef/stevensOperatorFromTensor.ts
 * (test/physics/cef/stevensOperator.test.ts).
 *
 *   O_n^0      = f_n^0(Jz)
 *   O_n^m      = ¼ [ (J+^m + J−^m) f_n^m(Jz) + f_n^m(Jz) (J+^m + J−^m) ]          (m > 0, cosine type)
 *   O_n^{−m}   = (1/4i) [ (J+^m − J−^m) f_n^m(Jz) + f_n^m(Jz) (J+^m − J−^m) ]     (sine type)
 * so that O_n^n = ½(J+^n + J−^n) and O_n^{−n} = (1/2i)(J+^n − J−^n) (f_n^n = 1).
 */
import { InputError } from '../errors';
import { zeros, clone, type ComplexMatrix } from '../linalg/complexMatrix';
import { checkJ } from './angularMomentum';

type Polynomial = (mz: number, X: number) => number;

/** f_n^m(Jz) of the table above (Hutchings 1964, operator tables; Rudowicz 1985; from memory, checked by the tensor route). */
const F: Record<string, Polynomial> = {
  '2,0': (z, X) => 3 * z * z - X,
  '2,1': (z) => z,
  '2,2': () => 1,
  '4,0': (z, X) => 35 * z ** 4 - (30 * X - 25) * z * z + 3 * X * X - 6 * X,
  '4,1': (z, X) => 7 * z ** 3 - (3 * X + 1) * z,
  '4,2': (z, X) => 7 * z * z - X - 5,
  '4,3': (z) => z,
  '4,4': () => 1,
  '6,0': (z, X) =>
    231 * z ** 6 - (315 * X - 735) * z ** 4 + (105 * X * X - 525 * X + 294) * z * z - 5 * X ** 3 + 40 * X * X - 60 * X,
  '6,1': (z, X) => 33 * z ** 5 - (30 * X - 15) * z ** 3 + (5 * X * X - 10 * X + 12) * z,
  '6,2': (z, X) => 33 * z ** 4 - (18 * X + 123) * z * z + X * X + 10 * X + 102,
  '6,3': (z, X) => 11 * z ** 3 - (3 * X + 59) * z,
  '6,4': (z, X) => 11 * z * z - X - 38,
  '6,5': (z) => z,
  '6,6': () => 1,
};

/** Validate (n, m) of a Stevens operator. */
export function checkRankAndComponent(n: number, m: number): void {
  if (n !== 2 && n !== 4 && n !== 6) throw new InputError('n', n, 'rank 2, 4 or 6');
  if (!Number.isInteger(m) || Math.abs(m) > n) throw new InputError('m', m, `an integer with −${n} ≤ m ≤ ${n}`);
}

function buildStevensOperator(J: number, n: number, m: number): ComplexMatrix {
  const dim = checkJ(J);
  const X = J * (J + 1);
  const f = F[`${n},${Math.abs(m)}`];
  const out = zeros(dim);
  const fz = new Float64Array(dim);
  for (let k = 0; k < dim; k++) fz[k] = f(J - k, X);
  if (m === 0) {
    for (let k = 0; k < dim; k++) out.re[k * dim + k] = fz[k];
    return out;
  }
  const a = Math.abs(m);
  // Column c holds |mc⟩; J+^a |mc⟩ = P |mc + a⟩ (row c − a), with P = Π_{j<a} sqrt(X − (mc+j)(mc+j+1)).
  // The symmetrised product ¼(A f + f A) has elements ¼ A_rc (f(m_r) + f(m_c)).
  for (let c = a; c < dim; c++) {
    const mc = J - c;
    let p = 1;
    for (let j = 0; j < a; j++) p *= Math.sqrt(Math.max(0, X - (mc + j) * (mc + j + 1)));
    const r = c - a;
    const element = 0.25 * p * (fz[r] + fz[c]);
    if (m > 0) {
      // (J+^a + J−^a): J+^a at (r, c), J−^a = (J+^a)ᵀ at (c, r)
      out.re[r * dim + c] = element;
      out.re[c * dim + r] = element;
    } else {
      // (1/i)(J+^a − J−^a) = −i J+^a + i J−^a
      out.im[r * dim + c] = -element;
      out.im[c * dim + r] = element;
    }
  }
  return out;
}

// Bounded memo (at most (2·MAX_J + 1) × 27 small matrices): fits call cefHamiltonian thousands of times and the
// operators depend on (J, n, m) only. Entries are never handed out; callers get copies or read-only use internally.
const cache = new Map<string, ComplexMatrix>();

/** Internal: the cached operator, not to be mutated. */
export function stevensOperatorShared(J: number, n: number, m: number): ComplexMatrix {
  checkRankAndComponent(n, m);
  checkJ(J);
  const key = `${Math.round(2 * J)},${n},${m}`;
  let op = cache.get(key);
  if (!op) {
    op = buildStevensOperator(J, n, m);
    cache.set(key, op);
  }
  return op;
}

/**
 * The Stevens operator O_n^m as a Hermitian (2J+1)×(2J+1) matrix in the |J, m⟩ basis (dimensionless; contains no
 * Stevens factor). m < 0 gives the sine type O_n^{|m|}(s). Operators with n > 2J vanish identically.
 *
 * @example stevensOperator(2.5, 4, 4) // ½(J+⁴ + J−⁴) for Ce3+
 * See also: stevensOperatorFromTensor (independent construction), cefHamiltonian, angularMomentumMatrices
 */
export function stevensOperator(J: number, n: number, m: number): ComplexMatrix {
  return clone(stevensOperatorShared(J, n, m));
}
