import { describe, it, expect } from 'vitest';
import { erfc } from '@multiplet/physics/lattice/erfc';

// Reference values: Abramowitz & Stegun Table 7.1 extended to 16 digits (from memory: standard values of erfc).
describe('erfc', () => {
  it.each([
    [0, 1],
    [0.5, 0.4795001221869535],
    [1, 0.15729920705028513],
    [2, 0.004677734981047266],
    [3, 2.209049699858544e-5],
    [5, 1.5374597944280349e-12],
  ])('erfc(%f)', (x, ref) => {
    expect(Math.abs(erfc(x) - ref) / ref).toBeLessThan(1e-13);
  });
  it('is continuous at the switch from series to continued fraction and obeys erfc(−x) = 2 − erfc(x)', () => {
    expect(Math.abs(erfc(2.5 - 1e-12) - erfc(2.5)) / erfc(2.5)).toBeLessThan(1e-10);
    expect(erfc(-1.3) + erfc(1.3)).toBeCloseTo(2, 15);
  });
});
