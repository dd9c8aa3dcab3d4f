/**
 * Effective pseudospin exchange: exact limits, the dipolar spin-ice value, exact two-site diagonalisation,
 * time reversal, lattice symmetry and independence of the doublet phase convention.
 */
import { describe, it, expect } from 'vitest';
import { getIon } from '@multiplet/physics/ions';
import { solveCef } from '@multiplet/physics/cef';
import { KELVIN_IN_MEV } from '@multiplet/physics/units';
import { InputError } from '@multiplet/physics/errors';
import { createRandom } from '@multiplet/physics/random';
import { hermitianEigen, zeros, multiply, type ComplexMatrix } from '@multiplet/physics/linalg';
import {
  pseudospinSite,
  pseudospinSiteFromParameters,
  pyrochloreBond,
  microscopicCouplingMatrix,
  effectiveExchange,
  dipolarEnergyMeV,
} from '@multiplet/physics/exchange';

const dy = getIon('Dy3+');
const yb = getIon('Yb3+');
const pr = getIon('Pr3+');
// Trigonal (D3d, z ∥ local ⟨111⟩) parameter sets chosen by us to give mixed doublets; meV.
const YB_B = { B20: 0.4, B40: 0.02, B43: 0.15, B60: 0.0003, B63: -0.002, B66: 0.003 };
const PR_B = { B20: -0.5, B40: 0.003, B43: 0.08 };

describe('first order, pure |±J⟩ doublets (exact limit)', () => {
  // H_CEF = B20 O20 with B20 < 0 makes |±15/2⟩ the ground doublet of Dy3+ (O20 = 3Jz² − J(J+1)).
  const site = pseudospinSiteFromParameters(dy, { B20: -0.1 });
  it('isotropic exchange: J_zz = 4J²(ẑ_i·ẑ_j)J_ex with ẑ_i·ẑ_j = −1/3, transverse terms zero', () => {
    // Derivation: inside {|+J⟩, |−J⟩} only J^z has matrix elements (J^± change m by 1 ≠ 2J), P J^z P = 2J S^z,
    // and J_i·J_j = Σ_ab J_i^a (ê_a^i·ê_b^j) J_j^b → (ẑ_i·ẑ_j)(2J)² S^z_i S^z_j. On a pyrochlore bond
    // ẑ_0·ẑ_1 = (1,1,1)·(1,−1,−1)/3 = −1/3.
    const bond = pyrochloreBond(10.1);
    const jEx = 0.002;
    const r = effectiveExchange(site, site, bond, microscopicCouplingMatrix({ isotropicMeV: jEx }, bond, dy.gJ, dy.gJ), { order: 1 });
    const J = 7.5;
    expect(r.first.Jzz).toBeCloseTo(4 * J * J * (-1 / 3) * jEx, 13);
    expect(Math.abs(r.first.Jpm)).toBeLessThan(1e-14);
    expect(Math.abs(r.first.Jpmpm)).toBeLessThan(1e-14);
    expect(Math.abs(r.first.Jzpm)).toBeLessThan(1e-14);
    expect(r.first.residualMeV).toBeLessThan(1e-14);
  });

  it('dipolar: J_zz/4 = D_nn = 5D/3, D ≈ 1.41 K for μ = 10 μB at r_nn = 3.54 Å (published value; from memory)', () => {
    // g_J J = (4/3)(15/2) = 10 μB. For Ising moments μσ_i ẑ_i: E = D[ẑ_i·ẑ_j − 3(ẑ_i·r̂)(ẑ_j·r̂)]σ_iσ_j
    // = D(−1/3 + 2)σσ = (5D/3)σσ, and σ = 2S^z gives J_zz = 4 D_nn.
    const rnn = 3.54;
    const bond = pyrochloreBond((4 * rnn) / Math.SQRT2);
    const r = effectiveExchange(site, site, bond, microscopicCouplingMatrix({ dipolar: true }, bond, dy.gJ, dy.gJ), { order: 1 });
    const dnnK = r.first.Jzz / 4 / KELVIN_IN_MEV;
    expect(dnnK).toBeCloseTo(((5 / 3) * dipolarEnergyMeV(10, 10, rnn)) / KELVIN_IN_MEV, 10);
    expect(Math.abs(dnnK - (5 / 3) * 1.41)).toBeLessThan(0.02);
    expect(r.first.Jzz).toBeGreaterThan(0); // ferromagnetic in the local frames: spin ice
  });
});

describe('first order, mixed D3d doublet against the g-tensor of the CEF module (independent code)', () => {
  it('isotropic exchange: J_zz = −(1/3)(g∥/g_J)² J_ex and J_± = (g⊥/g_J)² J_ex / 6', () => {
    // Derivation: on a D3d doublet P J^a P = (g_a/g_J) S^a (g_x = g_y = g⊥, g_z = g∥: effective-spin Hamiltonian,
    // Abragam & Bleaney 1970, ch. 3), so J_ab = J_ex (ê_a^i·ê_b^j)(g_a g_b/g_J²). Bond 0→1: ẑ_0·ẑ_1 = −1/3,
    // x̂_0·x̂_1 = 1/3, ŷ_0·ŷ_1 = −1, and J_± = −(J_xx + J_yy)/4 = (g⊥/g_J)² J_ex/6.
    const cef = solveCef(yb, YB_B);
    const gPar = cef.groundDoublet!.gParallel, gPerp = cef.groundDoublet!.gPerpendicular;
    const site = pseudospinSite(yb, cef.energiesMeV, cef.eigenvectors);
    const bond = pyrochloreBond(10.03);
    const jEx = 0.01;
    const r = effectiveExchange(site, site, bond, microscopicCouplingMatrix({ isotropicMeV: jEx }, bond, yb.gJ, yb.gJ), { order: 1, twoSiteCheck: false });
    expect(r.first.Jzz).toBeCloseTo((-1 / 3) * (gPar / yb.gJ) ** 2 * jEx, 12);
    expect(r.first.Jpm).toBeCloseTo(((gPerp / yb.gJ) ** 2 * jEx) / 6, 12);
    expect(Math.abs(site.gLocal[2][2])).toBeCloseTo(gPar, 10);
  });
});

function slope(xs: number[], ys: number[]): number {
  const lx = xs.map(Math.log), ly = ys.map(Math.log);
  const mx = lx.reduce((s, x) => s + x, 0) / lx.length, my = ly.reduce((s, y) => s + y, 0) / ly.length;
  let num = 0, den = 0;
  lx.forEach((x, k) => {
    num += (x - mx) * (ly[k] - my);
    den += (x - mx) ** 2;
  });
  return num / den;
}

describe('exact two-site diagonalisation on the full (2J+1)² space', () => {
  const anisotropic = [
    [0.3, 0.1, -0.2],
    [0.1, -0.4, 0.05],
    [-0.2, 0.05, 0.2],
  ];
  for (const [name, ion, B] of [['Yb3+ (Kramers)', yb, YB_B], ['Pr3+ (non-Kramers)', pr, PR_B]] as const) {
    it(`${name}: second-order error falls as the third power of the coupling (slope 3 ± 0.2); first order as the second`, () => {
      const site = pseudospinSiteFromParameters(ion, B);
      const bond = pyrochloreBond(10.05);
      const scales = [0.0025, 0.005, 0.01, 0.02];
      const err1: number[] = [], err2: number[] = [];
      for (const s of scales) {
        const k = microscopicCouplingMatrix(
          { isotropicMeV: s, matrixMeV: anisotropic.map((row) => row.map((x) => x * s)), dipolar: false },
          bond,
          ion.gJ,
          ion.gJ,
        );
        err2.push(effectiveExchange(site, site, bond, k).twoSiteCheck!.maxDifferenceMeV);
        err1.push(effectiveExchange(site, site, bond, k, { order: 1 }).twoSiteCheck!.maxDifferenceMeV);
      }
      expect(Math.abs(slope(scales, err2) - 3)).toBeLessThan(0.2);
      expect(Math.abs(slope(scales, err1) - 2)).toBeLessThan(0.2);
      err2.forEach((e, k) => expect(e).toBeLessThan(err1[k]));
    });
  }
});

/** A random Hermitian-free real parameter set without symmetry (all 27 B_n^m), meV. */
function randomParameters(seed: number, scale: number): Record<string, number> {
  const rng = createRandom(seed);
  const out: Record<string, number> = {};
  for (const n of [2, 4, 6]) for (let m = -n; m <= n; m++) out[`B${n}${m}`] = rng.normal() * scale * (n === 2 ? 1 : n === 4 ? 0.05 : 0.002);
  return out;
}

function randomMatrix3(seed: number, scale: number): number[][] {
  const rng = createRandom(seed);
  return [0, 1, 2].map(() => [0, 1, 2].map(() => rng.normal() * scale));
}

describe('time reversal', () => {
  it('Kramers doublets: no single-site (field-like) terms at first or second order, any CEF and coupling', () => {
    const site = pseudospinSiteFromParameters(yb, randomParameters(3, 0.5));
    const bond = pyrochloreBond(10.1, 1, 3);
    const k = microscopicCouplingMatrix({ matrixMeV: randomMatrix3(4, 0.003), dipolar: true }, bond, yb.gJ, yb.gJ);
    const r = effectiveExchange(site, site, bond, k);
    const scale = Math.max(...r.second!.matrixLocalMeV.flat().map(Math.abs));
    for (const c of [r.first, r.second!]) for (const h of [...c.fieldIMeV, ...c.fieldJMeV]) expect(Math.abs(h)).toBeLessThan(1e-12 * scale);
    expect(r.twoSiteCheck!.maxDifferenceMeV).toBeLessThan(1e-3 * scale);
  });

  it('non-Kramers doublets: transverse terms vanish at first order, appear at second; no S^z field; J_z± absent', () => {
    const site = pseudospinSiteFromParameters(pr, PR_B);
    expect(site.kramers).toBe(false);
    expect(site.doubletKind).toBe('quadrupolar');
    const bond = pyrochloreBond(10.05);
    const k = microscopicCouplingMatrix({ isotropicMeV: 0.01, dipolar: true }, bond, pr.gJ, pr.gJ);
    const r = effectiveExchange(site, site, bond, k);
    expect(Math.abs(r.first.Jpm) + Math.abs(r.first.Jpmpm)).toBeLessThan(1e-15);
    expect(Math.abs(r.second!.Jpm)).toBeGreaterThan(1e-7);
    expect(Math.abs(r.second!.Jpmpm)).toBeGreaterThan(1e-7);
    expect(r.second!.Jzpm).toBe(0);
    expect(Math.abs(r.second!.fieldIMeV[2])).toBeLessThan(1e-14);
    expect(r.second!.residualMeV).toBeLessThan(1e-12);
  });
});

describe('lattice symmetry and conventions', () => {
  it('a D3d CEF gives the same four couplings on all 12 directed bonds with zero residual (phase consistency)', () => {
    const site = pseudospinSiteFromParameters(yb, YB_B);
    const reference = (() => {
      const bond = pyrochloreBond(10.03, 0, 1);
      return effectiveExchange(site, site, bond, microscopicCouplingMatrix({ isotropicMeV: 0.01, dipolar: true }, bond, yb.gJ, yb.gJ), { twoSiteCheck: false }).second!;
    })();
    expect(Math.abs(reference.Jpmpm)).toBeGreaterThan(1e-5);
    expect(Math.abs(reference.Jzpm)).toBeGreaterThan(1e-5);
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        if (i === j) continue;
        const bond = pyrochloreBond(10.03, i, j);
        const c = effectiveExchange(site, site, bond, microscopicCouplingMatrix({ isotropicMeV: 0.01, dipolar: true }, bond, yb.gJ, yb.gJ), { twoSiteCheck: false }).second!;
        for (const key of ['Jzz', 'Jpm', 'Jpmpm', 'Jzpm'] as const) expect(c[key]).toBeCloseTo(reference[key], 12);
        expect(c.residualMeV).toBeLessThan(1e-12);
      }
  });

  for (const [ion, B] of [[yb, YB_B], [pr, PR_B]] as const)
  it(`${ion.name}: results do not depend on the phases (or the basis inside the doublet) of the input eigenstates`, () => {
    const rng = createRandom(77);
    const solution = solveCef(ion, B);
    const n = solution.eigenvectors.n;
    // Random unitary inside the ground doublet and random phases on every state.
    const u = hermitianEigen({ n: 2, re: Float64Array.from([0.3, 0.7, 0.7, -1.1]), im: Float64Array.from([0, 0.4, -0.4, 0]) }).vectors;
    const mixed = zeros(n);
    for (let r = 0; r < n; r++) {
      for (let c = 0; c < 2; c++) {
        let re = 0, im = 0;
        for (let k = 0; k < 2; k++) {
          const ar = solution.eigenvectors.re[r * n + k], ai = solution.eigenvectors.im[r * n + k];
          re += ar * u.re[k * 2 + c] - ai * u.im[k * 2 + c];
          im += ar * u.im[k * 2 + c] + ai * u.re[k * 2 + c];
        }
        mixed.re[r * n + c] = re;
        mixed.im[r * n + c] = im;
      }
      for (let c = 2; c < n; c++) {
        mixed.re[r * n + c] = solution.eigenvectors.re[r * n + c];
        mixed.im[r * n + c] = solution.eigenvectors.im[r * n + c];
      }
    }
    const phased: ComplexMatrix = multiply(mixed, diagonalPhases(n, rng));
    const a = pseudospinSite(ion, solution.energiesMeV, solution.eigenvectors);
    const b = pseudospinSite(ion, solution.energiesMeV, phased);
    const bond = pyrochloreBond(10.03, 0, 2);
    const k = microscopicCouplingMatrix({ isotropicMeV: 0.004, matrixMeV: randomMatrix3(9, 0.001), dipolar: true }, bond, ion.gJ, ion.gJ);
    const ra = effectiveExchange(a, a, bond, k), rb = effectiveExchange(b, b, bond, k);
    for (const key of ['Jzz', 'Jpm', 'Jpmpm', 'Jzpm'] as const) {
      expect(rb.first[key]).toBeCloseTo(ra.first[key], 12);
      expect(rb.second![key]).toBeCloseTo(ra.second![key], 12);
    }
    rb.twoSiteCheck!.effectiveLevelsMeV.forEach((e, i) => expect(e).toBeCloseTo(ra.twoSiteCheck!.effectiveLevelsMeV[i], 12));
  });
});

function diagonalPhases(n: number, rng: ReturnType<typeof createRandom>): ComplexMatrix {
  const d = zeros(n);
  for (let k = 0; k < n; k++) {
    const t = 2 * Math.PI * rng.next();
    d.re[k * n + k] = Math.cos(t);
    d.im[k * n + k] = Math.sin(t);
  }
  return d;
}

describe('bad input', () => {
  it('no doublet ground state → InputError', () => {
    // Pr3+ with B20 > 0: the |J, 0⟩ singlet is the ground state.
    expect(() => pseudospinSiteFromParameters(pr, { B20: 0.3 })).toThrow(InputError);
    expect(() => pseudospinSiteFromParameters(pr, { B20: 0.3 })).toThrow(/doublet ground state/);
  });
  it('coupling comparable to the CEF gap → InputError for second order', () => {
    const site = pseudospinSiteFromParameters(yb, YB_B);
    const bond = pyrochloreBond(10.03);
    const k = microscopicCouplingMatrix({ isotropicMeV: 2 }, bond, yb.gJ, yb.gJ);
    expect(() => effectiveExchange(site, site, bond, k)).toThrow(/CEF gap/);
    expect(() => effectiveExchange(site, site, bond, k, { order: 3 as never })).toThrow(/order/);
  });
});
