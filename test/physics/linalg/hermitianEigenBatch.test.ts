/** Batch diagonalisation: identical to single solves, mixed dimensions, values-only mode, error naming. */
import { describe, it, expect } from 'vitest';
import { hermitianEigen, hermitianEigenBatch, zeros, identity, fromArrays, type ComplexMatrix } from '@multiplet/physics/linalg';
import { createRandom } from '@multiplet/physics/random';
import { randomHermitian } from './randomHermitian';


function maxDiff(a: ComplexMatrix, b: ComplexMatrix): number {
  let w = 0;
  for (let k = 0; k < a.re.length; k++) w = Math.max(w, Math.hypot(a.re[k] - b.re[k], a.im[k] - b.im[k]));
  return w;
}

describe('hermitianEigenBatch', () => {
  it('matches single solves for a mix of dimensions', () => {
    const rng = createRandom(12);
    const mats = [4, 16, 4, 3, 16].map((n) => randomHermitian(n, rng));
    const batch = hermitianEigenBatch(mats);
    mats.forEach((a, i) => {
      const single = hermitianEigen(a);
      expect(Array.from(batch[i].values)).toEqual(Array.from(single.values));
      expect(maxDiff(batch[i].vectors, single.vectors)).toBe(0);
    });
    const valuesOnly = hermitianEigenBatch(mats, { vectors: false });
    expect(valuesOnly[1].vectors).toBeNull();
  });

  it('names the offending matrix', () => {
    const bad = fromArrays([[1, 2], [3, 1]]);
    expect(() => hermitianEigenBatch([identity(2), bad])).toThrow(/matrices\[1\]/);
  });
});
