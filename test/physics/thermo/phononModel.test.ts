import { describe, expect, it } from 'vitest';
import { phononHeatCapacity } from '@multiplet/physics/thermo/phononModel';
import { fitPhononModel } from '@multiplet/physics/thermo/fitPhononModel';
import { debyeHeatCapacity } from '@multiplet/physics/thermo/debye';
import { einsteinHeatCapacity } from '@multiplet/physics/thermo/einstein';
import { InputError } from '@multiplet/physics/errors';

describe('phononHeatCapacity and fitPhononModel', () => {
  const t = Array.from({ length: 40 }, (_, i) => 5 + 7 * i);

  it('adds the Debye and Einstein terms', () => {
    const c = phononHeatCapacity(t, { debye: { atoms: 3, temperatureK: 280 }, einstein: [{ atoms: 8, temperatureK: 520 }] });
    const d = debyeHeatCapacity(t, 280, 3), e = einsteinHeatCapacity(t, 520, 8);
    t.forEach((_, i) => expect(c[i]).toBeCloseTo(d[i] + e[i], 12));
  });

  it('recovers Debye and Einstein temperatures from synthetic data', () => {
    const c = phononHeatCapacity(t, { debye: { atoms: 3, temperatureK: 280 }, einstein: [{ atoms: 8, temperatureK: 520 }] });
    const fit = fitPhononModel(t, c, { debye: { atoms: 3, startK: 200 }, einstein: [{ atoms: 8, startK: 400 }] });
    expect(fit.model.debye!.temperatureK).toBeCloseTo(280, 2);
    expect(fit.model.einstein![0].temperatureK).toBeCloseTo(520, 2);
    expect(fit.relativeRms).toBeLessThan(1e-6);
  });

  it('rejects a model with nothing to fit and an empty model', () => {
    expect(() => fitPhononModel(t, debyeHeatCapacity(t, 200), { debye: { atoms: 1, temperatureK: 200 } })).toThrow(InputError);
    expect(() => phononHeatCapacity(t, {})).toThrow(InputError);
  });
});
