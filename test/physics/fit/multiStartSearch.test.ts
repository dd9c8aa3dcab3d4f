import { describe, expect, it } from 'vitest';
import { multiStartSearch } from '@multiplet/physics/fit/multiStartSearch';
import { InputError } from '@multiplet/physics/errors';

// Four separated minima at p = (±1, ±1): r = (p0² − 1, p1² − 1, 0.1(p0 − 1), 0.05(p1 − 1)).
// χ² at the minima ≈ 0, 0.01, 0.04, 0.05 (to first order), so all four lie within the default margin of 1.
const fourWells = {
  parameterCount: 2,
  residuals: (p: Float64Array) => Float64Array.of(p[0] ** 2 - 1, p[1] ** 2 - 1, 0.1 * (p[0] - 1), 0.05 * (p[1] - 1)),
};

describe('multiStartSearch', () => {
  it('finds every distinct minimum, best first, with hit counts summing to the starts', () => {
    const search = multiStartSearch(fourWells, { lower: [-2, -2], upper: [2, 2], starts: 24, seed: 7 });
    expect(search.minima.length).toBe(4);
    const signs = search.minima.map((m) => `${Math.sign(m.fit.parameters[0])}${Math.sign(m.fit.parameters[1])}`);
    expect(new Set(signs).size).toBe(4);
    expect(signs[0]).toBe('11');
    for (let k = 1; k < search.minima.length; k++) expect(search.minima[k].fit.chi2).toBeGreaterThanOrEqual(search.minima[k - 1].fit.chi2);
    expect(search.minima.reduce((s, m) => s + m.hits, 0)).toBe(24);
    expect(search.best.parameters[0]).toBeCloseTo(1, 2);
  });

  it('cuts minima outside the χ² margin', () => {
    const search = multiStartSearch(fourWells, { lower: [-2, -2], upper: [2, 2], starts: 24, seed: 7, chi2Margin: 0.02, relativeMargin: 0 });
    expect(search.minima.length).toBe(2);
    expect(search.distinctMinimaFound).toBe(4);
  });

  it('is reproducible with a seed', () => {
    const a = multiStartSearch(fourWells, { lower: [-2, -2], upper: [2, 2], starts: 8, seed: 3 });
    const b = multiStartSearch(fourWells, { lower: [-2, -2], upper: [2, 2], starts: 8, seed: 3 });
    expect(Array.from(a.best.parameters)).toEqual(Array.from(b.best.parameters));
    expect(a.evaluations).toBe(b.evaluations);
  });

  it('screening draws candidatesPerStart × starts points, keeps the best starts and counts their evaluations', () => {
    const plain = multiStartSearch(fourWells, { lower: [-2, -2], upper: [2, 2], starts: 6, seed: 2 });
    const screened = multiStartSearch(fourWells, { lower: [-2, -2], upper: [2, 2], starts: 6, seed: 2, candidatesPerStart: 10 });
    expect(screened.startsRun).toBe(6);
    expect(screened.best.chi2).toBeLessThanOrEqual(plain.best.chi2 + 1e-12);
    // the six best of 60 screened points all lie in the best well's basin or close: more hits there than without
    const hitsBest = (r: typeof plain) => r.minima.find((m) => m.fit.parameters[0] > 0 && m.fit.parameters[1] > 0)?.hits ?? 0;
    expect(hitsBest(screened)).toBeGreaterThanOrEqual(hitsBest(plain));
    expect(() => multiStartSearch(fourWells, { lower: [-2, -2], upper: [2, 2], starts: 2, candidatesPerStart: 0 })).toThrow(InputError);
  });

  it('needs a finite box', () => {
    expect(() => multiStartSearch(fourWells, { lower: [-2, -Infinity], upper: [2, 2] })).toThrow(InputError);
    expect(() => multiStartSearch(fourWells, { lower: [2, -2], upper: [-2, 2] })).toThrow(InputError);
  });
});
