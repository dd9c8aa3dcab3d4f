import { describe, it, expect } from 'vitest';
import { stevensToWybourne, wybourneToStevens, stevensWybourneFactor, CEF_PARAMETER_KEYS, parseParameterKey } from '@multiplet/physics/cef';
import { getIon } from '@multiplet/physics/ions';

/** |λ_kq| conversion factors between Stevens and Wybourne parameters (Kassman 1970; from memory). */
const LAMBDA: Record<string, number> = {
  '2,0': 1 / 2, '2,1': Math.sqrt(6), '2,2': Math.sqrt(6) / 2,
  '4,0': 1 / 8, '4,1': Math.sqrt(5) / 2, '4,2': Math.sqrt(10) / 4, '4,3': Math.sqrt(35) / 2, '4,4': Math.sqrt(70) / 8,
  '6,0': 1 / 16, '6,1': Math.sqrt(42) / 8, '6,2': Math.sqrt(105) / 16, '6,3': Math.sqrt(105) / 8, '6,4': (3 * Math.sqrt(14)) / 16,
  '6,5': (3 * Math.sqrt(77)) / 8, '6,6': Math.sqrt(231) / 16,
};

describe('Stevens ↔ Wybourne', () => {
  it('the derived factors have the published magnitudes λ_kq (Kassman 1970) for all 27 components', () => {
    for (const key of CEF_PARAMETER_KEYS) {
      const { n, m } = parseParameterKey(key)!;
      expect(Math.abs(stevensWybourneFactor(n, m)), key).toBeCloseTo(LAMBDA[`${n},${Math.abs(m)}`], 13);
    }
    // q = 0 carries no phase convention: the sign is fixed
    expect(stevensWybourneFactor(4, 0)).toBe(1 / 8);
  });

  it('Dy3+: B20 = −0.2 meV (Stevens) is B^2_0 = −0.2 / (α_J/2) = 63 meV (α_J = −2/315, Stevens 1952)', () => {
    expect(stevensToWybourne({ B20: -0.2 }, getIon('Dy3+')).B20).toBeCloseTo(63, 10);
  });

  it('round-trips every parameter for a Kramers and a non-Kramers ion', () => {
    for (const ion of [getIon('Er3+'), getIon('Tb3+')]) {
      const B: Record<string, number> = {};
      CEF_PARAMETER_KEYS.forEach((k, i) => (B[k] = (i % 5) - 2.5 + i * 1e-3));
      const back = wybourneToStevens(stevensToWybourne(B, ion), ion);
      for (const k of CEF_PARAMETER_KEYS) expect(back[k]).toBeCloseTo(B[k], 12);
    }
  });

  it('a non-zero Stevens parameter with θ_n = 0 has no Wybourne equivalent (Ce3+ has γ_J = 0)', () => {
    expect(() => stevensToWybourne({ B60: 1 }, getIon('Ce3+'))).toThrow(/^B\.B60: .*Stevens factor θ_6 of Ce3\+ is zero/);
    expect(wybourneToStevens({ B60: 5 }, getIon('Ce3+')).B60).toBe(0);
  });
});
