/**
 * Further-neighbour couplings mediated by a virtually excited middle ion: exact three-site diagonalisation,
 * consistency with the two-site calculation, scaling laws and the pyrochlore neighbour counts.
 */
import { describe, it, expect } from 'vitest';
import { getIon } from '@multiplet/physics/ions';
import { hermitianEigen } from '@multiplet/physics/linalg';
import {
  pseudospinSiteFromParameters,
  pyrochloreBond,
  microscopicCouplingMatrix,
  effectiveExchange,
  clusterEffectiveHamiltonian,
  exactClusterLevels,
  furtherNeighbourExchange,
  scaledCefSite,
  frameRows,
  toLocalFrames,
  type Matrix3,
} from '@multiplet/physics/exchange';

const yb = getIon('Yb3+');
const site = pseudospinSiteFromParameters(yb, { B20: 0.4, B40: 0.02, B43: 0.15, B60: 0.0003, B63: -0.002, B66: 0.003 });
const a = 10.03;

function localK(from: number, to: number, spec: { isotropicMeV?: number; dipolar?: boolean }): Matrix3 {
  const bond = pyrochloreBond(a, from, to);
  return toLocalFrames(microscopicCouplingMatrix(spec, bond, yb.gJ, yb.gJ), frameRows(bond.frameI), frameRows(bond.frameJ));
}

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

describe('cluster perturbation theory', () => {
  it('two-site cluster reproduces effectiveExchange (independent code paths)', () => {
    const bond = pyrochloreBond(a, 0, 1);
    const k = microscopicCouplingMatrix({ isotropicMeV: 0.01, dipolar: true }, bond, yb.gJ, yb.gJ);
    const pair = effectiveExchange(site, site, bond, k, { twoSiteCheck: false });
    const h = clusterEffectiveHamiltonian([site, site], [{ s: 0, t: 1, kLocalMeV: localK(0, 1, { isotropicMeV: 0.01, dipolar: true }) }], 2);
    for (let x = 0; x < 16; x++) {
      expect(h.re[x]).toBeCloseTo(pair.hamiltonianSecond!.re[x], 14);
      expect(h.im[x]).toBeCloseTo(pair.hamiltonianSecond!.im[x], 14);
    }
  });

  it('three-site chain i–k–j: the eight lowest exact levels agree with the second-order model, error ∝ coupling³', () => {
    // Exact diagonalisation on the full 8³ = 512-dimensional space of three Yb3+ multiplets.
    const scales = [0.005, 0.01, 0.02];
    const errors = scales.map((s) => {
      const bonds = [
        { s: 0, t: 1, kLocalMeV: localK(0, 1, { isotropicMeV: s }) },
        { s: 1, t: 2, kLocalMeV: localK(1, 2, { isotropicMeV: s }) },
      ];
      const exact = exactClusterLevels([site, site, site], bonds, 8);
      const eff = hermitianEigen(clusterEffectiveHamiltonian([site, site, site], bonds, 2), { vectors: false }).values;
      return Math.max(...exact.map((e, k) => Math.abs(e - eff[k])));
    });
    expect(Math.abs(slope(scales, errors) - 3)).toBeLessThan(0.2);
  });
});

describe('furtherNeighbourExchange on the pyrochlore lattice', () => {
  const result = furtherNeighbourExchange(site, a, { isotropicMeV: 0.01 });
  const byShell = Object.fromEntries(result.map((c) => [c.shell, c]));

  it('counts the common nearest neighbours: J1 two, J2 one, J3b one, J3a none (lattice geometry)', () => {
    expect(byShell.J1.middleIons).toBe(2);
    expect(byShell.J2.middleIons).toBe(1);
    expect(byShell.J3b.middleIons).toBe(1);
    expect(byShell.J3a.middleIons).toBe(0);
    expect(byShell.J3a.matrixLocalMeV.flat().every((x) => x === 0)).toBe(true);
    expect(Math.abs(byShell.J2.JzzMeV) + Math.abs(byShell.J2.matrixLocalMeV[0][0])).toBeGreaterThan(1e-9);
  });

  it('mediated couplings scale as J_ex² and as 1/(CEF scale) (second order, energy denominator of the middle ion)', () => {
    const doubled = furtherNeighbourExchange(site, a, { isotropicMeV: 0.02 });
    const stiff = furtherNeighbourExchange(scaledCefSite(site, 2), a, { isotropicMeV: 0.01 });
    for (const shell of [1, 3]) {
      const ref = result[shell].matrixLocalMeV.flat();
      doubled[shell].matrixLocalMeV.flat().forEach((x, k) => expect(x).toBeCloseTo(4 * ref[k], 14));
      stiff[shell].matrixLocalMeV.flat().forEach((x, k) => expect(x).toBeCloseTo(ref[k] / 2, 14));
    }
  });

  it('reports the direct first-order dipolar coupling beside the mediated one; refuses a bond matrix', () => {
    const withDipolar = furtherNeighbourExchange(site, a, { isotropicMeV: 0.01, dipolar: true });
    expect(withDipolar.find((c) => c.shell === 'J2')!.directDipolarLocalMeV).not.toBeNull();
    expect(() => furtherNeighbourExchange(site, a, { matrixMeV: [[1, 0, 0], [0, 1, 0], [0, 0, 1]] })).toThrow(/matrixMeV/);
  });
});
