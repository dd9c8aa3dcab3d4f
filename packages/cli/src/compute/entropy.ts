/**
 * `multiplet compute entropy`: entropy ∫ C/T dT of measured heat-capacity data.
 *
 * Input (JSON object):
 *   temperaturesK              [K, …], strictly increasing, > 0                    required
 *   heatCapacityJPerMolK       [J/(mol K), …], one per temperature                  required
 *   uncertaintyJPerMolK        standard uncertainties, one per temperature (optional)
 *   extrapolation              "none" (default) or "power-law" (C = a Tⁿ fitted to the lowest points)
 *   lowPoints                  points used by the power-law fit (default 5)
 * Output: entropyJPerMolK at each temperature (same mole as the input), its uncertainty, the extrapolation used,
 * and the comparison lines R ln 2 and R[ln 2 − ½ ln(3/2)].
 */
import { InputError } from '@multiplet/physics/errors';
import { magneticEntropy, R_LN2_J_PER_MOL_K, SPIN_ICE_ENTROPY_J_PER_MOL_K, type EntropyExtrapolation } from '@multiplet/physics/thermo';
import type { ComputeKind } from './index';
import { checkFields, optionalNumber, optionalString, plain, requiredArray } from './inputs';

const FIELDS = ['temperaturesK', 'heatCapacityJPerMolK', 'uncertaintyJPerMolK', 'extrapolation', 'lowPoints'];

export const entropy: ComputeKind = {
  summary: 'entropy S(T) = ∫C/T dT of heat-capacity data in J/(mol K), with optional power-law extrapolation below the data',
  run(input) {
    checkFields(input, FIELDS);
    const extrapolation = optionalString(input, 'extrapolation') ?? 'none';
    if (extrapolation !== 'none' && extrapolation !== 'power-law') throw new InputError('extrapolation', extrapolation, '"none" or "power-law"');
    const uncertainty = input.uncertaintyJPerMolK === undefined ? undefined : requiredArray(input, 'uncertaintyJPerMolK', 'uncertainties in J/(mol K)');
    const r = magneticEntropy(
      requiredArray(input, 'temperaturesK', 'temperatures in K'),
      requiredArray(input, 'heatCapacityJPerMolK', 'heat capacities in J/(mol K)'),
      { extrapolation: extrapolation as EntropyExtrapolation, lowPoints: optionalNumber(input, 'lowPoints'), uncertaintyJPerMolK: uncertainty },
    );
    return {
      temperaturesK: input.temperaturesK,
      entropyJPerMolK: plain(r.entropyJPerMolK),
      uncertaintyJPerMolK: plain(r.uncertaintyJPerMolK),
      extrapolation: r.extrapolation,
      rLn2JPerMolK: R_LN2_J_PER_MOL_K,
      spinIceJPerMolK: SPIN_ICE_ENTROPY_J_PER_MOL_K,
    };
  },
};
