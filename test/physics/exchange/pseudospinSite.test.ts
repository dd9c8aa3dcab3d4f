/** The pseudospin basis of a ground doublet: convention, g-tensor, kinds of doublets, errors. */
import { describe, it, expect } from 'vitest';
import { getIon } from '@multiplet/physics/ions';
import { solveCef } from '@multiplet/physics/cef';
import { InputError } from '@multiplet/physics/errors';
import { pseudospinSiteFromParameters } from '@multiplet/physics/exchange';

describe('pseudospinSite', () => {
  it('Kramers dipolar doublet: S^x ∥ local x̂ (⟨↑|J^x|↓⟩ real > 0), g∥ and g⊥ equal those of the CEF module', () => {
    const yb = getIon('Yb3+');
    const B = { B20: 0.4, B40: 0.02, B43: 0.15 };
    const site = pseudospinSiteFromParameters(yb, B);
    const cef = solveCef(yb, B);
    expect(site.doubletKind).toBe('dipolar');
    const jx = site.jLocal[0];
    expect(jx.re[1]).toBeGreaterThan(0); // ⟨↑|J^x|↓⟩
    expect(Math.abs(jx.im[1])).toBeLessThan(1e-14);
    expect(Math.abs(site.gLocal[2][2])).toBeCloseTo(cef.groundDoublet!.gParallel, 10);
    expect(site.gLocal[0][0]).toBeCloseTo(cef.groundDoublet!.gPerpendicular, 10);
    expect(site.gLocal[1][1]).toBeCloseTo(cef.groundDoublet!.gPerpendicular, 10);
    // ↑ carries the larger ⟨J^z⟩ unless the exchange of ↑ and ↓ was needed (then g_zz < 0).
    const jzUp = site.jLocal[2].re[0], jzDown = site.jLocal[2].re[site.dimension + 1];
    expect(site.zReversed ? jzUp < jzDown : jzUp > jzDown).toBe(true);
    expect(Array.from(site.energiesMeV.slice(0, 2))).toEqual([0, 0]);
    expect(site.gapMeV).toBeCloseTo(cef.levels[1].energyMeV, 10);
  });

  it('non-Kramers doublet on a 3-fold axis: no transverse moment (g⊥ = 0), quadrupolar transverse components', () => {
    // g⊥ = 0 for a non-Kramers doublet on a three-fold axis (Abragam & Bleaney 1970; issue 2 checks).
    const site = pseudospinSiteFromParameters(getIon('Pr3+'), { B20: -0.5, B40: 0.003, B43: 0.08 });
    expect(site.kramers).toBe(false);
    expect(site.doubletKind).toBe('quadrupolar');
    expect(Math.abs(site.gLocal[0][0]) + Math.abs(site.gLocal[1][1])).toBeLessThan(1e-12);
  });

  it('pure |±J⟩ doublet: multipolar transverse components, g∥ = 2 g_J J', () => {
    // Pure |±J⟩: g∥ = 2 g_J J, g⊥ = 0 (issue 2 checks; exact).
    const dy = getIon('Dy3+');
    const site = pseudospinSiteFromParameters(dy, { B20: -0.1 });
    expect(site.doubletKind).toBe('multipolar');
    expect(site.gLocal[2][2]).toBeCloseTo(2 * dy.gJ * 7.5, 12);
  });

  it('a ground level that is not a doublet → InputError', () => {
    expect(() => pseudospinSiteFromParameters(getIon('Pr3+'), { B20: 0.3 })).toThrow(InputError);
    // Cubic Dy3+ with B40 only: the ground level is a Γ8 quartet or a doublet depending on the sign; one of them fails.
    const quartet = [0.001, -0.001].some((b) => {
      try {
        pseudospinSiteFromParameters(getIon('Dy3+'), { B40: b, B44: 5 * b });
        return false;
      } catch (error) {
        return error instanceof InputError;
      }
    });
    expect(quartet).toBe(true);
  });
});
