/**
 * Random complex Hermitian test matrices, shared by the linalg tests and bench/eigen.bench.ts: independent normal
 * entries (times `scale`) below the diagonal, real normal diagonal, the upper triangle the conjugate.
 */
import { zeros, type ComplexMatrix } from '@multiplet/physics/linalg';
import type { Random } from '@multiplet/physics/random';

export function randomHermitian(n: number, rng: Random, scale = 1): ComplexMatrix {
  const a = zeros(n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      const x = scale * rng.normal();
      const y = i === j ? 0 : scale * rng.normal();
      a.re[i * n + j] = x;
      a.im[i * n + j] = y;
      a.re[j * n + i] = x;
      a.im[j * n + i] = -y;
    }
  return a;
}
