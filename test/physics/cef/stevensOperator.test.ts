import { describe, it, expect } from 'vitest';
import { stevensOperator } from '@multiplet/physics/cef/stevensOperator';
import { stevensOperatorFromTensor, legendreDerivativeScale } from '@multiplet/physics/cef/stevensOperatorFromTensor';
import { angularMomentumMatrices } from '@multiplet/physics/cef/angularMomentum';
import { multiply, trace, hermiticityError, maxAbsDifference, addScaled, type ComplexMatrix } from '@multiplet/physics/linalg/complexMatrix';

const RANK_COMPONENTS: [number, number][] = [2, 4, 6].flatMap((n) => Array.from({ length: 2 * n + 1 }, (_, i) => [n, i - n] as [number, number]));
const J_VALUES = [0.5, 1, 2.5, 3, 3.5, 4, 4.5, 6, 7.5, 8];

/** Tr(A·B) (both Hermitian ⇒ real). */
function traceProduct(a: ComplexMatrix, b: ComplexMatrix): number {
  return trace(multiply(a, b))[0];
}

describe('stevensOperator', () => {
  it('agrees with the independent tensor-operator construction to 1e-12 (relative) for all 27 (n, m) and J = 1/2 … 8', () => {
    for (const J of J_VALUES)
      for (const [n, m] of RANK_COMPONENTS) {
        const a = stevensOperator(J, n, m);
        const b = stevensOperatorFromTensor(J, n, m);
        const size = Math.max(1, ...Array.from(a.re, Math.abs), ...Array.from(a.im, Math.abs));
        expect(maxAbsDifference(a, b) / size, `J=${J} O_${n}^${m}`).toBeLessThan(1e-12);
      }
  });

  it('is Hermitian and traceless; distinct operators are trace-orthogonal', () => {
    for (const J of [3, 7.5, 8]) {
      const ops = RANK_COMPONENTS.map(([n, m]) => stevensOperator(J, n, m));
      ops.forEach((o, i) => {
        expect(hermiticityError(o)).toBe(0);
        expect(Math.abs(trace(o)[0]) / Math.sqrt(traceProduct(o, o))).toBeLessThan(1e-13);
        for (let j = 0; j < i; j++) {
          const overlap = traceProduct(o, ops[j]) / Math.sqrt(traceProduct(o, o) * traceProduct(ops[j], ops[j]));
          expect(Math.abs(overlap), `${RANK_COMPONENTS[i]} vs ${RANK_COMPONENTS[j]}`).toBeLessThan(1e-13);
        }
        expect(traceProduct(o, o)).toBeGreaterThan(1);
      });
    }
  });

  it('matches hand-evaluated textbook forms (Hutchings 1964, operator tables)', () => {
    const J = 2.5;
    const { Jz, Jplus, Jminus } = angularMomentumMatrices(J);
    const X = J * (J + 1);
    // O20 = 3Jz² − X: diagonal 3m² − 35/4
    const o20 = stevensOperator(J, 2, 0);
    [2.5, 1.5, 0.5, -0.5, -1.5, -2.5].forEach((m, k) => expect(o20.re[k * 6 + k]).toBeCloseTo(3 * m * m - X, 12));
    // O22 = ½(J+² + J−²)
    const jp2 = multiply(Jplus, Jplus), jm2 = multiply(Jminus, Jminus);
    const o22 = addScaled(jp2, jm2, 1);
    o22.re.forEach((_, k) => (o22.re[k] /= 2));
    expect(maxAbsDifference(stevensOperator(J, 2, 2), o22)).toBeLessThan(1e-13);
    // O4-4 = (1/2i)(J+⁴ − J−⁴): ⟨5/2| O4-4 |−3/2⟩ = (1/2i)·⟨5/2|J+⁴|−3/2⟩ = −(i/2)·sqrt(5·8·9·8) (hand product)
    const o4m4 = stevensOperator(J, 4, -4);
    expect(o4m4.im[0 * 6 + 4]).toBeCloseTo(-0.5 * Math.sqrt(5 * 8 * 9 * 8), 10);
    void Jz;
  });

  it('Legendre scale factors: P2 = (3μ²−1)/2, P4 = (35μ⁴−30μ²+3)/8, d²P6/dμ² = 210(33μ⁴−18μ²+1)/16 (Abramowitz & Stegun ch. 22)', () => {
    expect(legendreDerivativeScale(2, 0)).toBe(1 / 2);
    expect(legendreDerivativeScale(4, 0)).toBe(1 / 8);
    expect(legendreDerivativeScale(6, 2)).toBe(210 / 16);
  });

  it('rejects bad (n, m)', () => {
    expect(() => stevensOperator(2, 3, 0)).toThrow(/rank 2, 4 or 6/);
    expect(() => stevensOperator(2, 2, 3)).toThrow(/m/);
    expect(() => stevensOperator(-1, 2, 0)).toThrow(/J/);
  });
});
