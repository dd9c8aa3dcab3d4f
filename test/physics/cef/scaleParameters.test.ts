import { describe, expect, it } from 'vitest';
import { scaleCefParameters } from '@multiplet/physics/cef/scaleParameters';
import { pointChargeParameters, type PointCharge } from '@multiplet/physics/cef/pointCharge';
import { InputError } from '@multiplet/physics/errors';

const ligands: PointCharge[] = [
  { positionAngstrom: [0, 0, 2.2], charge: -2 }, { positionAngstrom: [0, 0, -2.2], charge: -2 },
  { positionAngstrom: [2.4, 0, 0.8], charge: -2 }, { positionAngstrom: [-1.2, 2.08, 0.8], charge: -2 },
  { positionAngstrom: [-1.2, -2.08, 0.8], charge: -2 }, { positionAngstrom: [1.3, 1.5, -0.9], charge: -1.5 },
];

describe('scaleCefParameters', () => {
  it('is exact for the point-charge model: scaling Er3+ parameters to Yb3+ at a contracted distance', () => {
    const er = pointChargeParameters('Er3+', ligands);
    const lambda = 0.97;
    const yb = pointChargeParameters('Yb3+', ligands.map((l) => ({ ...l, positionAngstrom: l.positionAngstrom.map((c) => c * lambda) as [number, number, number] })));
    const scaled = scaleCefParameters(er, 'Er3+', 'Yb3+', { fromDistanceAngstrom: 1, toDistanceAngstrom: lambda });
    for (const key of Object.keys(yb)) expect(scaled[key] / yb[key]).toBeCloseTo(1, 10);
  });

  it('is the identity for the same ion and distance, and drops ranks the target ion lacks', () => {
    const b = { B20: -0.1, B40: 1e-3, B66: 2e-5 };
    expect(scaleCefParameters(b, 'Dy3+', 'Dy3+')).toEqual(b);
    // Ce3+ (J = 5/2) has γ_J = 0: no sixth-rank terms.
    expect(Object.keys(scaleCefParameters(b, 'Dy3+', 'Ce3+'))).toEqual(['B20', 'B40']);
  });

  it('rejects transfer from an ion without the Stevens factor, and half-given distances', () => {
    expect(() => scaleCefParameters({ B20: 1 }, 'Gd3+', 'Dy3+')).toThrow(/fromIon/);
    expect(() => scaleCefParameters({ B20: 1 }, 'Er3+', 'Dy3+', { fromDistanceAngstrom: 2.3 })).toThrow(InputError);
  });
});
