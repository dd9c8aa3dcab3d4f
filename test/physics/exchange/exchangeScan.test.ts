/** Scans against the CEF scale and the exchange scale: exact scaling laws of perturbation theory. */
import { describe, it, expect } from 'vitest';
import { getIon } from '@multiplet/physics/ions';
import {
  pseudospinSiteFromParameters,
  pyrochloreBond,
  microscopicCouplingMatrix,
  exchangeScan,
  scaledCefSite,
  scaledCoupling,
} from '@multiplet/physics/exchange';
import { createTask } from '@multiplet/physics/progress';
import { CancelledError, InputError } from '@multiplet/physics/errors';

const yb = getIon('Yb3+');
const site = pseudospinSiteFromParameters(yb, { B20: 0.4, B40: 0.02, B43: 0.15, B60: 0.0003, B63: -0.002, B66: 0.003 });
const bond = pyrochloreBond(10.03);
const k = microscopicCouplingMatrix({ isotropicMeV: 0.01, dipolar: true }, bond, yb.gJ, yb.gJ);

describe('exchangeScan', () => {
  it('CEF scale s: first order unchanged, second-order correction ∝ 1/s (energy denominators ∝ s); gap ∝ s', () => {
    // H_eff⁽²⁾ = P V Q (E0 − H0)⁻¹ Q V P: scaling H_CEF by s scales every denominator by s (derivation).
    const scales = [0.5, 1, 2, 4];
    const rows = exchangeScan(scales.map((s) => ({ value: s, siteI: scaledCefSite(site, s), siteJ: scaledCefSite(site, s), couplingGlobalMeV: k })), bond);
    const reference = rows[1];
    rows.forEach((row, i) => {
      expect(row.gapMeV).toBeCloseTo(site.gapMeV * scales[i], 10);
      for (const key of ['Jzz', 'Jpm', 'Jpmpm', 'Jzpm'] as const) {
        expect(row.first[key]).toBeCloseTo(reference.first[key], 14);
        const correction = (row.second[key] - row.first[key]) * scales[i];
        expect(correction).toBeCloseTo(reference.second[key] - reference.first[key], 12);
      }
    });
    // The transverse/Ising ratio moves towards the first-order value as the gap grows.
    expect(Math.abs(rows[3].second.Jpm - rows[3].first.Jpm)).toBeLessThan(Math.abs(rows[0].second.Jpm - rows[0].first.Jpm));
  });

  it('exchange scale λ: first order ∝ λ, second-order correction ∝ λ²; the two-site error shrinks with λ', () => {
    const lambdas = [0.5, 1, 2];
    const rows = exchangeScan(lambdas.map((l) => ({ value: l, siteI: site, siteJ: site, couplingGlobalMeV: scaledCoupling(k, l) })), bond, { twoSiteCheck: true });
    rows.forEach((row, i) => {
      const l = lambdas[i];
      expect(row.first.Jzz).toBeCloseTo(rows[1].first.Jzz * l, 14);
      expect(row.second.Jpm - row.first.Jpm).toBeCloseTo((rows[1].second.Jpm - rows[1].first.Jpm) * l * l, 14);
    });
    expect(rows[0].twoSiteCheckMeV!).toBeLessThan(rows[2].twoSiteCheckMeV!);
  });

  it('cancellation through the LongTask, and a too-small gap names the scan point', () => {
    const task = createTask();
    task.cancel();
    expect(() => exchangeScan([{ value: 1, siteI: site, siteJ: site, couplingGlobalMeV: k }], bond, { task })).toThrow(CancelledError);
    expect(() => exchangeScan([{ value: 0.001, siteI: scaledCefSite(site, 0.001), siteJ: scaledCefSite(site, 0.001), couplingGlobalMeV: k }], bond)).toThrow(/scan\[0\]/);
    expect(() => scaledCefSite(site, 0)).toThrow(InputError);
  });
});
