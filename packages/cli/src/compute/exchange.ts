/**
 * `multiplet compute exchange`: effective pseudospin-1/2 exchange of a nearest-neighbour pyrochlore bond (or a
 * general two-site geometry) from the CEF of the ion and a microscopic coupling, to first and second order, with
 * an exact two-site check.
 *
 * Input (JSON object):
 *   ion                     'Ce3+' … 'Yb3+'                                                        required
 *   B                       Stevens parameters in the local frame (z ∥ local ⟨111⟩)                required
 *   unit                    energy unit of B: 'meV' (default), 'K', 'cm-1'
 *   symmetry                optional site symmetry check of B (e.g. 'D3d')
 *   latticeConstantAngstrom cubic lattice constant a (r_nn = a√2/4)                      required unless geometry
 *   bond                    [from, to] pyrochlore sublattices (default [0, 1])
 *   geometry                {bondVectorAngstrom | positionIAngstrom + positionJAngstrom, frameI, frameJ}: a general
 *                           two-site geometry instead of the lattice
 *   coupling                {isotropicMeV?, matrixMeV? (3×3, global frame), dipolar?: true}          required
 *   order                   1 or 2 (default 2)
 *   furtherNeighbours       true: also the J1/J2/J3a/J3b couplings mediated by a virtually excited middle ion
 * Output: first, second ({Jzz, Jpm, Jpmpm, Jzpm, residualMeV, matrixLocalMeV, …} in meV; second = through second
 * order, null for order 1), ratios, interpretation, twoSiteCheck (meV), and the details listed in the README.
 */
import { InputError } from '@multiplet/physics/errors';
import {
  pseudospinSiteFromParameters,
  pyrochloreBond,
  generalBond,
  microscopicCouplingMatrix,
  effectiveExchange,
  furtherNeighbourExchange,
  curieWeissThetaK,
  type PseudospinCouplings,
  type MicroscopicCouplingSpec,
} from '@multiplet/physics/exchange';
import type { ComputeKind } from './index';
import { checkFields, readCefInput } from './inputs';

const FIELDS = ['ion', 'B', 'unit', 'symmetry', 'latticeConstantAngstrom', 'bond', 'geometry', 'coupling', 'order', 'furtherNeighbours'];
const COUPLING_FIELDS = ['isotropicMeV', 'matrixMeV', 'dipolar'];

function couplingsJson(c: PseudospinCouplings) {
  return {
    Jzz: c.Jzz,
    Jpm: c.Jpm,
    Jpmpm: c.Jpmpm,
    Jzpm: c.Jzpm,
    residualMeV: c.residualMeV,
    matrixLocalMeV: c.matrixLocalMeV,
    fieldIMeV: c.fieldIMeV,
    fieldJMeV: c.fieldJMeV,
    constantMeV: c.constantMeV,
  };
}

export const exchange: ComputeKind = {
  summary: 'effective pseudospin-1/2 exchange J_zz, J_±, J_±±, J_z± of a bond to first and second order, with exact two-site check',
  run(input) {
    checkFields(input, FIELDS);
    const { ion, parametersMeV } = readCefInput(input, {
      requireB: true,
      ionExample: 'Yb3+',
      expectedB: 'an object of Stevens parameters in the local frame, e.g. {"B20": 0.4, "B43": 0.1}',
    });
    const order = input.order ?? 2;
    if (order !== 1 && order !== 2) throw new InputError('order', order, '1 or 2');

    let geometry;
    if (input.geometry !== undefined) {
      if (input.latticeConstantAngstrom !== undefined || input.bond !== undefined)
        throw new InputError('geometry', input.geometry, 'either geometry or latticeConstantAngstrom (+ bond), not both');
      const g = input.geometry as Record<string, unknown>;
      if (g === null || typeof g !== 'object') throw new InputError('geometry', g, 'an object {bondVectorAngstrom (or positionIAngstrom and positionJAngstrom), frameI, frameJ}');
      for (const key of Object.keys(g))
        if (!['bondVectorAngstrom', 'positionIAngstrom', 'positionJAngstrom', 'frameI', 'frameJ'].includes(key))
          throw new InputError(`geometry.${key}`, g[key], 'no such field; fields are bondVectorAngstrom or positionIAngstrom + positionJAngstrom, frameI, frameJ');
      let bondVector = g.bondVectorAngstrom;
      if (g.positionIAngstrom !== undefined || g.positionJAngstrom !== undefined) {
        if (bondVector !== undefined) throw new InputError('geometry.bondVectorAngstrom', bondVector, 'either bondVectorAngstrom or the two positions, not both');
        const [pi, pj] = (['positionIAngstrom', 'positionJAngstrom'] as const).map((key) => {
          const v = g[key];
          if (!Array.isArray(v) || v.length !== 3 || v.some((x) => typeof x !== 'number' || !Number.isFinite(x)))
            throw new InputError(`geometry.${key}`, v, 'three finite numbers (Å)');
          return v as number[];
        });
        bondVector = [pj[0] - pi[0], pj[1] - pi[1], pj[2] - pi[2]];
      }
      geometry = generalBond(bondVector, g.frameI, g.frameJ, 'geometry');
    } else {
      if (input.latticeConstantAngstrom === undefined)
        throw new InputError('latticeConstantAngstrom', undefined, 'the cubic lattice constant in Å (or a general "geometry")');
      const bond = input.bond ?? [0, 1];
      if (!Array.isArray(bond) || bond.length !== 2) throw new InputError('bond', bond, 'two pyrochlore sublattices [from, to], 0..3');
      geometry = pyrochloreBond(input.latticeConstantAngstrom as number, bond[0] as number, bond[1] as number, 'latticeConstantAngstrom');
    }

    const coupling = input.coupling;
    if (coupling === undefined || coupling === null || typeof coupling !== 'object' || Array.isArray(coupling))
      throw new InputError('coupling', coupling, 'an object {isotropicMeV?, matrixMeV?, dipolar?: true}');
    for (const key of Object.keys(coupling))
      if (!COUPLING_FIELDS.includes(key)) throw new InputError(`coupling.${key}`, (coupling as Record<string, unknown>)[key], `no such field; fields are ${COUPLING_FIELDS.join(', ')}`);

    const further = input.furtherNeighbours ?? false;
    if (typeof further !== 'boolean') throw new InputError('furtherNeighbours', further, 'true or false');
    if (further && input.geometry !== undefined)
      throw new InputError('furtherNeighbours', further, 'the pyrochlore lattice (latticeConstantAngstrom), not a general geometry');
    const site = pseudospinSiteFromParameters(ion, parametersMeV, { field: 'B' });
    const k = microscopicCouplingMatrix(coupling as MicroscopicCouplingSpec, geometry, ion.gJ, ion.gJ, 'coupling');
    const r = effectiveExchange(site, site, geometry, k, { order });
    return {
      ion: ion.name,
      J: ion.J,
      kramers: ion.kramers,
      parametersMeV,
      bond: geometry.label,
      bondVectorAngstrom: geometry.bondVectorAngstrom,
      gapMeV: Number.isFinite(site.gapMeV) ? site.gapMeV : null,
      doubletKind: site.doubletKind,
      zReversed: site.zReversed,
      gLocal: site.gLocal,
      phases: r.phases,
      couplingGlobalMeV: k,
      couplingLocalMeV: r.couplingLocalMeV,
      order,
      first: couplingsJson(r.first),
      second: r.second ? couplingsJson(r.second) : null,
      ratios: r.ratios,
      interpretation: r.interpretation,
      // Mean-field θ_CW of the nearest-neighbour pyrochlore model (exchange/curieWeiss.ts); null for a general geometry.
      thetaCWMeanFieldK: input.geometry === undefined ? curieWeissThetaK(r.second ?? r.first, site.gLocal) : null,
      twoSiteCheck: r.twoSiteCheck!.maxDifferenceMeV,
      twoSiteLevelsMeV: { exact: r.twoSiteCheck!.exactLevelsMeV, effective: r.twoSiteCheck!.effectiveLevelsMeV },
      furtherNeighbours: further
        ? furtherNeighbourExchange(site, input.latticeConstantAngstrom as number, coupling as MicroscopicCouplingSpec).map((c) => ({
            shell: c.shell,
            distanceAngstrom: c.distanceAngstrom,
            middleIons: c.middleIons,
            matrixLocalMeV: c.matrixLocalMeV,
            JzzMeV: c.JzzMeV,
            directDipolarLocalMeV: c.directDipolarLocalMeV,
          }))
        : null,
    };
  },
};
