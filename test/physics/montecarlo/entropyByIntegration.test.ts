import { describe, it, expect } from 'vitest';
import { entropyByIntegration } from '@multiplet/physics/montecarlo/entropyByIntegration';

describe('entropyByIntegration', () => {
  it('reproduces the exact entropy of a two-level Ising moment, s = ln(2 cosh x) − x tanh x, x = b/T', () => {
    const b = 1.3;
    const temps = Array.from({ length: 60 }, (_, k) => 0.1 * Math.pow(400, k / 59));
    const eps = temps.map((T) => -b * Math.tanh(b / T));
    const c = temps.map((T) => (b / T / Math.cosh(b / T)) ** 2);
    const plain = entropyByIntegration(temps, eps, b * b);
    const corrected = entropyByIntegration(temps, eps, b * b, c);
    temps.forEach((T, k) => {
      const x = b / T;
      const exact = Math.log(2 * Math.cosh(x)) - x * Math.tanh(x);
      expect(Math.abs(plain[k] - exact)).toBeLessThan(2e-3);
      expect(Math.abs(corrected[k] - exact)).toBeLessThan(2e-5);
    });
  });
});
