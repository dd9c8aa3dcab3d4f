/**
 * Cost of the effective-exchange calculation against its reference, the exact two-site diagonalisation, for the
 * largest multiplets (Dy3+: 16 states per ion, 256 two-site states; Ho3+: 17, 289), side by side; plus the
 * three-site cluster used for the further-neighbour couplings. No target in the issue: the figures say what a
 * scan of N points costs in a notebook.
 * Run: `npm run bench exchange`.
 */
import { getIon } from '@multiplet/physics/ions';
import {
  pseudospinSiteFromParameters,
  pyrochloreBond,
  microscopicCouplingMatrix,
  effectiveExchange,
  exactTwoSiteLevels,
  furtherNeighbourExchange,
  frameRows,
  toLocalFrames,
} from '@multiplet/physics/exchange';

function timePerCall(fn: () => void, minSeconds = 0.5): number {
  fn();
  let calls = 0;
  const t0 = process.hrtime.bigint();
  let elapsed = 0;
  while (elapsed < minSeconds) {
    fn();
    calls++;
    elapsed = Number(process.hrtime.bigint() - t0) / 1e9;
  }
  return elapsed / calls;
}

const cases = [
  { name: 'Dy3+', B: { B20: -0.4, B40: -0.0002, B43: 0.003 } },
  { name: 'Ho3+', B: { B20: -0.3, B40: 0.0001, B43: 0.002 } },
];
console.log('effective exchange (second order) vs exact two-site diagonalisation, one bond:');
for (const c of cases) {
  const ion = getIon(c.name);
  const site = pseudospinSiteFromParameters(ion, c.B);
  const bond = pyrochloreBond(10.1);
  const k = microscopicCouplingMatrix({ isotropicMeV: 0.002, dipolar: true }, bond, ion.gJ, ion.gJ);
  const kLocal = toLocalFrames(k, frameRows(bond.frameI), frameRows(bond.frameJ));
  const perturbative = timePerCall(() => effectiveExchange(site, site, bond, k, { twoSiteCheck: false }));
  const exact = timePerCall(() => exactTwoSiteLevels(site, site, kLocal));
  const dim = site.dimension ** 2;
  console.log(
    `  ${c.name} (${dim} states): perturbative ${(perturbative * 1e3).toFixed(2)} ms, exact ED ${(exact * 1e3).toFixed(1)} ms, ratio ED/perturbative = ${(exact / perturbative).toFixed(0)}×`,
  );
}
{
  const ion = getIon('Dy3+');
  const site = pseudospinSiteFromParameters(ion, cases[0].B);
  const t = timePerCall(() => furtherNeighbourExchange(site, 10.1, { isotropicMeV: 0.002, dipolar: true }), 1);
  console.log(`  Dy3+ further neighbours (J1, J2, J3a, J3b: 4 three-site clusters of 4096 states, sparse rows): ${(t * 1e3).toFixed(0)} ms`);
}
