/**
 * From the nearest-neighbour coupling J1 of the classical Ising spin-ice model (montecarlo module convention:
 * H = Σ J1 S_i·S_j with unit vectors S_i = σ_i ẑ_i, so the σσ coefficient is J_nn = −J1/3; J1 > 0
 * antiferromagnetic; dipolar interaction separate) to the isotropic exchange J_ex between total angular momenta.
 *
 * Our first-order pseudospin model has J_zz S^z_i S^z_j with S^z = σ/2, so J_zz/4 = J_nn = −J1/3. J_zz is linear
 * in J_ex at first order, J_zz = c J_ex with c from the projection (c = −(1/3)(g∥/g_J)² on a D3d doublet), hence
 * J_ex = −4 J1 / (3 c). For a pure |±J⟩ doublet this is J_ex = J1/J² (derivation; checked in the test).
 */
import { InputError } from '../errors';
import { KELVIN_IN_MEV } from '../units';
import { pyrochloreBond } from './bondGeometry';
import { effectiveExchange } from './effectiveExchange';
import { microscopicCouplingMatrix } from './microscopicCoupling';
import type { PseudospinSite } from './pseudospinSite';

/**
 * J_ex (meV) whose first-order J_zz reproduces the Ising-model J1 (K) of the Monte Carlo (dipolar excluded on
 * both sides).
 * @example isotropicExchangeFromIsingJ1(3.2, site, 10.12) // meV
 * @throws InputError when J_zz does not depend on J_ex (a doublet without a moment along z).
 * See also: exchangeScaleFromCurieWeiss
 */
export function isotropicExchangeFromIsingJ1(j1K: number, site: PseudospinSite, latticeConstantAngstrom: number): { isotropicMeV: number; jzzPerMeV: number } {
  if (typeof j1K !== 'number' || !Number.isFinite(j1K)) throw new InputError('J1', j1K, 'a finite coupling in K');
  const bond = pyrochloreBond(latticeConstantAngstrom);
  const k = microscopicCouplingMatrix({ isotropicMeV: 1 }, bond, site.ion.gJ, site.ion.gJ);
  const jzzPerMeV = effectiveExchange(site, site, bond, k, { order: 1, twoSiteCheck: false }).first.Jzz;
  if (!(Math.abs(jzzPerMeV) > 1e-12)) throw new InputError('J1', j1K, 'a doublet with a moment along the local axis (J_zz does not depend on J_ex)');
  return { isotropicMeV: ((-4 / 3) * j1K * KELVIN_IN_MEV) / jzzPerMeV, jzzPerMeV };
}
