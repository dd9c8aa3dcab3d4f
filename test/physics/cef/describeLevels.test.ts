import { describe, it, expect } from 'vitest';
import { describeLevels, solveCef } from '@multiplet/physics/cef';
import { getIon } from '@multiplet/physics/ions';

describe('describeLevels', () => {
  it('writes Ce3+ cubic Γ7 states as √(1/6)|±5/2⟩ − √(5/6)|∓3/2⟩ (Hutchings 1964; Abragam & Bleaney; from memory)', () => {
    const s = solveCef(getIon('Ce3+'), { B40: 0.01, B44: 0.05 });
    const [up, down] = describeLevels(s)[0].states;
    // ⟨Jz⟩ descending inside the level: the first state has ⟨Jz⟩ = (5/6)(3/2) + (1/6)(−5/2) = 5/6
    expect(up.expectationJ[2]).toBeCloseTo(5 / 6, 12);
    expect(down.expectationJ[2]).toBeCloseTo(-5 / 6, 12);
    const weights = Object.fromEntries(up.components.map((c) => [c.m, c.weight]));
    expect(weights[-2.5]).toBeCloseTo(1 / 6, 12);
    expect(weights[1.5]).toBeCloseTo(5 / 6, 12);
    // moment g_J⟨Jz⟩ = (6/7)(5/6) = 5/7 μB = g/2 with g = 10/7
    expect(up.momentMuB[2]).toBeCloseTo(5 / 7, 12);
    expect(up.ket).toMatch(/^0\.913\|3\/2⟩ [+−] 0\.408\|−5\/2⟩$/);
  });

  it('filters by weight and validates the threshold', () => {
    const s = solveCef(getIon('Dy3+'), { B20: -0.2, B40: 1e-3, B43: 1e-2 });
    const all = describeLevels(s, 0)[0].states[0].components;
    const big = describeLevels(s, 0.01)[0].states[0].components;
    expect(all.length).toBe(16);
    expect(big.length).toBeLessThan(all.length);
    expect(big.every((c) => c.weight >= 0.01)).toBe(true);
    expect(() => describeLevels(s, 2)).toThrow(/^weightThreshold/);
  });
});
