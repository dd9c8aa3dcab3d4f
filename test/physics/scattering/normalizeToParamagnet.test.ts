import { describe, it, expect } from 'vitest';
import { normalizeToParamagnet } from '@multiplet/physics/scattering/normalizeToParamagnet';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';

describe('normalizeToParamagnet', () => {
  it('recovers the scale of synthetic paramagnetic data in counts', () => {
    const f = (q: number) => Math.exp(-0.02 * q * q);
    const Q = [0.4, 0.8, 1.2, 1.6, 2.0, 2.4];
    const model = Q.map((q) => (2 / 3) * (MAGNETIC_PREFACTOR_MB / 1000) * 100 * f(q) ** 2);
    const counts = model.map((m) => 250 * m);
    const r = normalizeToParamagnet(Q, counts, counts.map((c) => 0.01 * c), 10, f);
    expect(r.scaleBarnPerSrPerIonPerUnit).toBeCloseTo(1 / 250, 12);
    expect(r.reducedChiSquare).toBeLessThan(1e-20);
    expect(r.paramagnetBarnPerSrPerIon[0]).toBeCloseTo(model[0], 12);
    expect(() => normalizeToParamagnet(Q, counts.slice(1), undefined, 10)).toThrow(InputError);
  });
});
