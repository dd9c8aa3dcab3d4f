import { describe, expect, it } from 'vitest';
import { vanVleckSusceptibility } from '@multiplet/physics/thermo/susceptibility';
import { curieWeissFit } from '@multiplet/physics/thermo/curieWeiss';
import { CURIE_PREFACTOR_EMU_K_PER_MOL, EMU_PER_MOL_IN_M3_PER_MOL } from '@multiplet/physics/units';
import { createRandom } from '@multiplet/physics/random';
import { InputError } from '@multiplet/physics/errors';

const dy = { J: 7.5, gJ: 4 / 3 };
function randomCef(seed: number) {
  const rng = createRandom(seed);
  const p: Record<string, number> = {};
  for (const key of ['B20', 'B22', 'B2-2', 'B40', 'B43', 'B4-3', 'B44', 'B60', 'B63', 'B66', 'B6-6'])
    p[key] = rng.normal() * (key.startsWith('B2') ? 0.3 : key.startsWith('B4') ? 3e-3 : 3e-5);
  return p;
}

describe('vanVleckSusceptibility', () => {
  it("Van Vleck's theorem: T·χ_powder → N_A μB² g_J² J(J+1)/(3k_B) ≈ 0.12505 g_J² J(J+1) emu K/mol for any CEF", () => {
    expect(CURIE_PREFACTOR_EMU_K_PER_MOL).toBeCloseTo(0.12505, 5); // handbook value of N_A μB²/3k_B
    for (const seed of [1, 2, 3]) {
      const ion = { ...dy, parametersMeV: randomCef(seed) };
      // The powder's 1/T correction vanishes (Tr J² H_CEF = 0), so T·χ approaches the limit as 1/T².
      const r = vanVleckSusceptibility(ion, { temperaturesK: [1e6], direction: 'powder' });
      const curie = CURIE_PREFACTOR_EMU_K_PER_MOL * dy.gJ ** 2 * dy.J * (dy.J + 1);
      expect((1e6 * r.chiEmuPerMol[0]) / curie).toBeCloseTo(1, 6);
    }
  });

  it('a Curie–Weiss fit of the computed χ at high T gives the free-ion μ_eff = g_J √(J(J+1)) = 10.65 μB for Dy³⁺ (Kittel table: 10.6)', () => {
    const ion = { ...dy, parametersMeV: randomCef(4) };
    const t = Array.from({ length: 30 }, (_, i) => 3000 + 200 * i); // far above the ~1000 K CEF spread
    const r = vanVleckSusceptibility(ion, { temperaturesK: t, direction: 'powder' });
    const fit = curieWeissFit(t, r.chiEmuPerMol);
    expect(fit.effectiveMomentMuB).toBeCloseTo((4 / 3) * Math.sqrt(7.5 * 8.5), 1);
  });

  it('trigonal (D3d) sites on the four ⟨111⟩ frames give an isotropic crystal χ equal to the single-site powder', () => {
    // Only the parameters allowed by D3d with z ∥ local [111] (a lower symmetry would not average to a scalar).
    const { B20, B40, B43, B60, B63, B66 } = randomCef(5);
    const ion = { ...dy, parametersMeV: { B20, B40, B43, B60, B63, B66 } };
    const powder = vanVleckSusceptibility(ion, { temperaturesK: [3, 30], direction: 'powder' }).chiEmuPerMol;
    for (const direction of [[0, 0, 1], [1, 1, 1], [1, -2, 0.3]] as Array<[number, number, number]>) {
      const crystal = vanVleckSusceptibility(ion, { temperaturesK: [3, 30], direction, sites: 'pyrochlore' }).chiEmuPerMol;
      crystal.forEach((x, i) => expect(x / powder[i]).toBeCloseTo(1, 10));
    }
  });

  it('unit conversions: m³/mol = 4π·10⁻⁶ emu/mol; per formula unit × ions; mean field 1/χ = 1/χ₀ − λ; demagnetisation', () => {
    const ion = { ...dy, parametersMeV: randomCef(6) };
    const base = vanVleckSusceptibility(ion, { temperaturesK: [10], direction: [0, 0, 1], ionsPerFormulaUnit: 2 });
    expect(base.chiM3PerMol[0]).toBeCloseTo(base.chiEmuPerMol[0] * 4 * Math.PI * 1e-6, 15);
    expect(EMU_PER_MOL_IN_M3_PER_MOL).toBeCloseTo(1.2566e-5, 8);
    expect(base.chiEmuPerMolFormulaUnit[0]).toBeCloseTo(2 * base.chiEmuPerMol[0], 12);
    // Free ion (isotropic tensor): the 3×3 correction reduces to the scalar formula.
    const free = { J: 3.5, gJ: 2, parametersMeV: {} };
    const chi0 = vanVleckSusceptibility(free, { temperaturesK: [5], direction: 'powder' }).chiEmuPerMol[0];
    const mf = vanVleckSusceptibility(free, { temperaturesK: [5], direction: 'powder', meanFieldMolPerEmu: -0.7 }).inverseChiMolPerEmu[0];
    expect(mf).toBeCloseTo(1 / chi0 + 0.7, 10);
    const demag = vanVleckSusceptibility(free, { temperaturesK: [5], direction: 'powder', demagnetization: { factor: 1 / 3, molarVolumeCm3PerMol: 36 } });
    expect(demag.inverseChiMolPerEmu[0]).toBeCloseTo(1 / chi0 + (4 * Math.PI) / 3 / 36, 10);
  });

  it('rejects T ≤ 0, a zero direction, a bad demagnetisation factor and a mean field beyond the instability', () => {
    const ion = { ...dy, parametersMeV: {} };
    expect(() => vanVleckSusceptibility(ion, { temperaturesK: [-2], direction: 'powder' })).toThrow(InputError);
    expect(() => vanVleckSusceptibility(ion, { temperaturesK: [2], direction: [0, 0, 0] })).toThrow(InputError);
    expect(() => vanVleckSusceptibility(ion, { temperaturesK: [2], direction: 'powder', demagnetization: { factor: 2, molarVolumeCm3PerMol: 30 } })).toThrow(InputError);
    expect(() => vanVleckSusceptibility(ion, { temperaturesK: [2], direction: 'powder', meanFieldMolPerEmu: 10 })).toThrow(InputError);
  });
});
