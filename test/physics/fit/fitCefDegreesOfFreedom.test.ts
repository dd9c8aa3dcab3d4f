/**
 * Degrees of freedom ν = data − free parameters − profiled scales: an under-determined fit (ν < 0) returns its best
 * point with undetermined errors and a warning, ν = 0 has no χ²_red and no residual-scaled errors, ν > 0 is ordinary.
 * No NaN anywhere (three energy-only peaks with six free D3d parameters used to end in "B.B20: got NaN").
 */
import { describe, it, expect } from 'vitest';
import { fitCef, levenbergMarquardt } from '@multiplet/physics/fit';
import { householderQr } from '@multiplet/physics/fit/numerics/denseLinearAlgebra';
import { levelStrengths } from '@multiplet/physics/neutron/cefTransitions';
import { getIon } from '@multiplet/physics/ions';

const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };
/** The seven excited Kramers doublets of Er3+ with TRUTH, meV. */
const LEVELS = Array.from(levelStrengths(getIon('Er3+'), TRUTH).levelEnergiesMeV).slice(1);
const energyPeaks = (n: number) => LEVELS.slice(0, n).map((energyMeV) => ({ energyMeV, errorMeV: 0.1, temperatureK: 5 }));
const spec = (n: number) => ({ ion: 'Er3+', symmetry: 'D3d', start: START, peaks: energyPeaks(n) });

function expectNoNaN(report: ReturnType<typeof fitCef>): void {
  const best = report.best;
  for (const v of [best.chi2, best.chi2Reduced, ...Object.values(best.parametersMeV), ...best.levelsMeV, ...best.correlation.flat()])
    expect(Number.isNaN(v)).toBe(false);
  for (const v of Object.values(best.errorsMeV)) expect(Number.isNaN(v)).toBe(false);
}

describe('fitCef degrees of freedom', () => {
  it('ν < 0: three energy-only peaks, six free parameters (Er3+ D3d, starts 0): best point, null errors, a warning', () => {
    expect(LEVELS).toHaveLength(7);
    for (const errorScaling of ['data', 'residual'] as const) {
      const report = fitCef(spec(3), { starts: 0, errorScaling });
      expectNoNaN(report);
      expect(report.best.degreesOfFreedom).toBe(-3);
      // three data, six parameters: the peaks are matched exactly by some point of the family
      expect(report.best.chi2).toBeLessThan(1e-6);
      expect(report.best.chi2Reduced).toBe(report.best.chi2);
      for (const key of Object.keys(START)) expect(report.best.errorsMeV[key]).toBe(Infinity);
      report.best.correlation.forEach((row, a) => row.forEach((v, b) => expect(v).toBe(a === b ? 1 : 0)));
      expect(report.warnings.join('\n')).toMatch(/under-determined: 3 data for 6 free parameters \(ν = -3\)/);
    }
  });

  it('ν < 0 through the profiled intensity scale, with random starts, and for Dy3+', () => {
    const withIntensity = energyPeaks(3).map((p, i) => ({ ...p, intensity: 1 + i, intensityError: 0.1 }));
    const report = fitCef({ ...spec(3), peaks: withIntensity }, { starts: 4, seed: 2 });
    expectNoNaN(report);
    expect(report.best.degreesOfFreedom).toBe(-1);
    for (const key of Object.keys(START)) expect(report.best.errorsMeV[key]).toBe(Infinity);
    expect(report.warnings.join('\n')).toMatch(/6 data for 6 free parameters and 1 profiled scales\/backgrounds \(ν = -1\)/);
    const dy = fitCef(
      { ion: 'Dy3+', symmetry: 'D3d', start: { B20: -0.25, B40: -3e-3, B43: 2e-2, B60: -1e-5, B63: -1e-4, B66: -1e-4 }, peaks: [20, 30, 40].map((e) => ({ energyMeV: e, errorMeV: 0.2, temperatureK: 5 })) },
      { starts: 0 },
    );
    expectNoNaN(dy);
    expect(dy.best.degreesOfFreedom).toBe(-3);
    expect(Object.values(dy.best.errorsMeV).every((e) => e === Infinity)).toBe(true);
  });

  it('ν = 0: six peaks; data-scaled errors exist, residual-scaled ones do not', () => {
    const data = fitCef(spec(6), { starts: 0, errorScaling: 'data' });
    expectNoNaN(data);
    expect(data.best.degreesOfFreedom).toBe(0);
    expect(data.best.chi2Reduced).toBe(data.best.chi2);
    for (const key of Object.keys(START)) {
      expect(Number.isFinite(data.best.errorsMeV[key])).toBe(true);
      expect(data.best.errorsMeV[key]).toBeGreaterThan(0);
    }
    expect(data.warnings.join('\n')).toMatch(/no degrees of freedom: 6 data for 6 free parameters \(ν = 0\); χ²_red is χ²$/m);
    const residual = fitCef(spec(6), { starts: 0, errorScaling: 'residual' });
    expectNoNaN(residual);
    expect(residual.best.parametersMeV).toEqual(data.best.parametersMeV);
    for (const key of Object.keys(START)) expect(residual.best.errorsMeV[key]).toBe(Infinity);
    expect(residual.warnings.join('\n')).toMatch(/errors scaled by the residuals are undetermined/);
  });

  it('ν > 0: all seven levels; finite errors, χ²_red = χ²/ν, no degrees-of-freedom warning', () => {
    const report = fitCef(spec(7), { starts: 0, errorScaling: 'residual' });
    expectNoNaN(report);
    expect(report.best.degreesOfFreedom).toBe(1);
    expect(report.best.chi2Reduced).toBe(report.best.chi2 / 1);
    for (const key of Object.keys(START)) expect(Number.isFinite(report.best.errorsMeV[key])).toBe(true);
    expect(report.warnings.join('\n')).not.toMatch(/degrees of freedom|under-determined/);
  });
});

describe('least squares with fewer residuals than parameters', () => {
  it('levenbergMarquardt: one residual, two parameters: converges, errors Infinity, no NaN', () => {
    const fit = levenbergMarquardt({ parameterCount: 2, residuals: (x) => Float64Array.of(x[0] + 2 * x[1] - 3) }, [0, 0]);
    expect(fit.chi2).toBeLessThan(1e-20);
    expect(fit.parameters[0] + 2 * fit.parameters[1]).toBeCloseTo(3, 12);
    expect(Array.from(fit.standardErrors)).toEqual([Infinity, Infinity]);
    expect(fit.undetermined).toEqual([0, 1]);
    expect(fit.degreesOfFreedom).toBe(0);
  });

  it('levenbergMarquardt: n = p with residual scaling has no errors, with data scaling it has', () => {
    const problem = { parameterCount: 2, residuals: (x: Float64Array) => Float64Array.of(x[0] - 1, x[0] + x[1] - 2) };
    expect(Array.from(levenbergMarquardt(problem, [0, 0], { errorScaling: 'residual' }).standardErrors)).toEqual([Infinity, Infinity]);
    const data = levenbergMarquardt(problem, [0, 0], { errorScaling: 'data' });
    expect(data.standardErrors[0]).toBeCloseTo(1, 10);
    expect(data.standardErrors[1]).toBeCloseTo(Math.SQRT2, 10);
  });

  it('householderQr of a 2×3 matrix: R is the upper-trapezoidal factor with a zero third row', () => {
    const a = Float64Array.of(3, 1, 2, 4, 5, 6);
    const qr = householderQr(a, 2, 3);
    expect(Array.from(qr.r).every(Number.isFinite)).toBe(true);
    expect(Array.from(qr.r.subarray(6))).toEqual([0, 0, 0]);
    // RᵀR = AᵀA (Q orthogonal)
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        let rr = 0;
        let aa = 0;
        for (let k = 0; k < 3; k++) rr += qr.r[k * 3 + i] * qr.r[k * 3 + j];
        for (let k = 0; k < 2; k++) aa += a[k * 3 + i] * a[k * 3 + j];
        expect(rr).toBeCloseTo(aa, 12);
      }
  });
});
