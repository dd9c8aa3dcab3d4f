/**
 * `multiplet compute crystal-field`: levels, eigenvectors and the ground-doublet g-tensor of one rare-earth ion.
 *
 * Input (JSON object):
 *   ion        string, 'Ce3+' … 'Yb3+' ('Dy' and 'dy3+' accepted)                      required
 *   B          object of Stevens parameters {"B20": -0.2, "B43": 0.01, "B4-3": …}        required
 *   unit       energy unit of B: 'meV' (default), 'K', 'cm-1' (also 'THz', 'ueV')
 *   symmetry   site symmetry ('Oh', 'D3d', 'D4h', 'C2v', 'none', …): forbidden parameters are errors;
 *              cubic: B44 = 5 B40 and B64 = −21 B60 are filled in when left out
 *   degeneracyToleranceMeV (default 1e-4), isolationWarningMeV (default 5), weightThreshold (default 0.001)
 * Output keys carry their units; see the README's compute table.
 */
import { InputError } from '@multiplet/physics/errors';
import { solveCef, describeLevels } from '@multiplet/physics/cef';
import type { ComputeKind } from './index';
import { groundDoubletJson } from '@multiplet/cells/kinds/crystalField';
import { checkFields, optionalNumber, readCefInput } from './inputs';

const FIELDS = ['ion', 'B', 'unit', 'symmetry', 'degeneracyToleranceMeV', 'isolationWarningMeV', 'weightThreshold'];

export const crystalField: ComputeKind = {
  summary: 'CEF levels, |J,m> eigenvectors and ground-doublet g-tensor of an R3+ ion from Stevens parameters',
  run(input) {
    checkFields(input, FIELDS);
    const { ion, parametersMeV } = readCefInput(input, { requireB: true });
    const weightThreshold = optionalNumber(input, 'weightThreshold') ?? 1e-3;
    if (weightThreshold < 0 || weightThreshold > 1) throw new InputError('weightThreshold', weightThreshold, 'a number between 0 and 1');
    const solution = solveCef(ion, parametersMeV, {
      degeneracyToleranceMeV: optionalNumber(input, 'degeneracyToleranceMeV'),
      isolationWarningMeV: optionalNumber(input, 'isolationWarningMeV'),
    });
    const described = describeLevels(solution, weightThreshold);
    return {
      ion: ion.name,
      J: ion.J,
      gJ: ion.gJ,
      parametersMeV,
      energiesMeV: Array.from(solution.energiesMeV),
      groundEnergyMeV: solution.groundEnergyMeV,
      levels: described.map((level) => ({
        energyMeV: level.energyMeV,
        degeneracy: level.degeneracy,
        states: level.states.map((s) => ({
          ket: s.ket,
          components: s.components,
          expectationJ: s.expectationJ,
          momentMuB: s.momentMuB,
        })),
      })),
      groundDoublet: groundDoubletJson(solution.groundDoublet),
      classification: solution.classification,
      summary: solution.summary,
      warnings: solution.warnings,
    };
  },
};
