/** Curie–Weiss temperature of the pseudospin model and the exchange scale inferred from it. */
import { describe, it, expect } from 'vitest';
import { getIon } from '@multiplet/physics/ions';
import { KELVIN_IN_MEV } from '@multiplet/physics/units';
import { zeros } from '@multiplet/physics/linalg';
import {
  pseudospinSiteFromParameters,
  pyrochloreBond,
  bondPhases,
  couplingsFromHamiltonian,
  curieWeissThetaK,
  exchangeScaleFromCurieWeiss,
  isotropicExchangeFromIsingJ1,
  microscopicCouplingMatrix,
  effectiveExchange,
} from '@multiplet/physics/exchange';

describe('curieWeissThetaK', () => {
  it('Ising doublet: θ = J_zz/(2k_B) (sublattice mean field, derived independently)', () => {
    // Derivation: Ising pseudospins with moment g μB S^z ẑ_μ, field B: ⟨S^z_μ⟩ = (b_μ − J_zz Σ_{j∈nn} ⟨S^z_j⟩)/(4k_BT),
    // b_μ = gμB B·ẑ_μ. Each site has two neighbours on each other sublattice and Σ_μ ẑ_μ = 0, so the uniform
    // response has Σ_ν ⟨S^z_ν⟩ = 0 and Σ_{j} ⟨S^z_j⟩ = −2⟨S^z_μ⟩: ⟨S^z_μ⟩ = b_μ / (4k_B(T − J_zz/2k_B)).
    const g = [[0, 0, 0], [0, 0, 0], [0, 0, 19.9]];
    const jzz = 0.08;
    expect(curieWeissThetaK({ Jzz: jzz, Jpm: 0, Jpmpm: 0, Jzpm: 0 }, g)).toBeCloseTo(jzz / 2 / KELVIN_IN_MEV, 12);
  });

  it('isotropic Heisenberg spins 1/2 with isotropic g: θ = −zJS(S+1)/(3k_B), z = 6 (Blundell 2001, §5.1)', () => {
    // Global H = J S_i·S_j written in the local frames: J_ab = J ê_a^i·ê_b^j; build the 4×4 Hamiltonian and project.
    const J = 0.05;
    const bond = pyrochloreBond(10, 0, 1);
    const ei = [bond.frameI.x, bond.frameI.y, bond.frameI.z], ej = [bond.frameJ.x, bond.frameJ.y, bond.frameJ.z];
    const sigma = [
      [[0, 1], [1, 0]].map((r) => r.map((x) => [x, 0])),
      [[[0, 0], [0, -1]], [[0, 1], [0, 0]]],
      [[1, 0], [0, -1]].map((r) => r.map((x) => [x, 0])),
    ] as number[][][][];
    const h = zeros(4);
    for (let a = 0; a < 3; a++)
      for (let b = 0; b < 3; b++) {
        const jab = J * (ei[a][0] * ej[b][0] + ei[a][1] * ej[b][1] + ei[a][2] * ej[b][2]) / 4; // S = σ/2
        for (let p = 0; p < 2; p++)
          for (let q = 0; q < 2; q++)
            for (let r = 0; r < 2; r++)
              for (let s = 0; s < 2; s++) {
                const [xr, xi] = sigma[a][p][r], [yr, yi] = sigma[b][q][s];
                h.re[(p * 2 + q) * 4 + r * 2 + s] += jab * (xr * yr - xi * yi);
                h.im[(p * 2 + q) * 4 + r * 2 + s] += jab * (xr * yi + xi * yr);
              }
      }
    const c = couplingsFromHamiltonian(h, bondPhases(bond), true);
    expect(c.residualMeV).toBeLessThan(1e-14); // the Heisenberg bond has the full lattice symmetry
    const g = [[2, 0, 0], [0, 2, 0], [0, 0, 2]];
    expect(curieWeissThetaK(c, g)).toBeCloseTo((-6 * J * 0.75) / 3 / KELVIN_IN_MEV, 12);
  });
});

describe('exchangeScaleFromCurieWeiss', () => {
  it('round trip: θ from a chosen J_ex (with dipolar) gives J_ex back', () => {
    const dy = getIon('Dy3+');
    const site = pseudospinSiteFromParameters(dy, { B20: -0.1, B40: -0.0001 });
    const a = 10.12;
    const bond = pyrochloreBond(a);
    const jEx = -0.0012;
    const k = microscopicCouplingMatrix({ isotropicMeV: jEx, dipolar: true }, bond, dy.gJ, dy.gJ);
    const theta = curieWeissThetaK(effectiveExchange(site, site, bond, k, { order: 1, twoSiteCheck: false }).first, site.gLocal);
    const r = exchangeScaleFromCurieWeiss(theta, site, a, { dipolar: true });
    expect(r.isotropicMeV).toBeCloseTo(jEx, 12);
    expect(r.thetaFixedK).toBeGreaterThan(0); // nearest-neighbour dipolar spin ice is ferromagnetic
  });
});

describe('isotropicExchangeFromIsingJ1', () => {
  it('pure |±J⟩ doublet: J_ex = J1/J² (Ising J_nn = −J1/3 and J_zz/4 = J_nn; derivation in isingCouplingMap.ts)', () => {
    const dy = getIon('Dy3+');
    const site = pseudospinSiteFromParameters(dy, { B20: -0.1 });
    const j1K = 3.2;
    const r = isotropicExchangeFromIsingJ1(j1K, site, 10.12);
    expect(r.isotropicMeV).toBeCloseTo((j1K * KELVIN_IN_MEV) / 7.5 ** 2, 14);
    // and back: the first-order J_zz of that J_ex is −4 J1/3
    const bond = pyrochloreBond(10.12);
    const c = effectiveExchange(site, site, bond, microscopicCouplingMatrix({ isotropicMeV: r.isotropicMeV }, bond, dy.gJ, dy.gJ), { order: 1, twoSiteCheck: false }).first;
    expect(c.Jzz / 4 / KELVIN_IN_MEV).toBeCloseTo(-j1K / 3, 12);
  });
});
