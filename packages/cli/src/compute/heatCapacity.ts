/**
 * `multiplet compute heat-capacity`: crystal-field (Schottky) heat capacity and entropy of a rare-earth ion.
 *
 * Input (JSON object):
 *   ion, B, unit?, symmetry?   as for crystal-field
 *   temperaturesK              [K, …], each > 0                                   required
 *   fieldT                     [Bx, By, Bz] in T in the local frame, default none
 *   ionsPerFormulaUnit         default 1
 * Output: heatCapacityJPerMolK and entropyJPerMolK (per mole of ions; entropy counted from T = 0), the statistical
 * entropy totalEntropyJPerMolK (→ R ln(2J+1)), per-formula-unit values and levelsMeV.
 */
import { InputError } from '@multiplet/physics/errors';
import { cefHeatCapacity } from '@multiplet/physics/thermo';
import type { ComputeKind } from './index';
import { checkFields, optionalNumber, plain, readIon, requiredArray } from './inputs';

const FIELDS = ['ion', 'B', 'unit', 'symmetry', 'temperaturesK', 'fieldT', 'ionsPerFormulaUnit'];

export const heatCapacity: ComputeKind = {
  summary: 'CEF Schottky heat capacity C(T) and entropy S(T) in J/(mol K) per mole of ions (and per formula unit)',
  run(input) {
    checkFields(input, FIELDS);
    const { name, single } = readIon(input);
    const field = input.fieldT;
    if (field !== undefined && !(Array.isArray(field) && field.length === 3 && field.every((x) => typeof x === 'number' && Number.isFinite(x))))
      throw new InputError('fieldT', field, 'a field [Bx, By, Bz] in T (local frame)');
    const r = cefHeatCapacity(single, {
      temperaturesK: requiredArray(input, 'temperaturesK', 'temperatures in K'),
      fieldTesla: field as [number, number, number] | undefined,
      ionsPerFormulaUnit: optionalNumber(input, 'ionsPerFormulaUnit'),
    });
    return {
      ion: name,
      temperaturesK: requiredArray(input, 'temperaturesK', 'temperatures in K'),
      levelsMeV: plain(r.levelsMeV),
      heatCapacityJPerMolK: plain(r.heatCapacityJPerMolK),
      entropyJPerMolK: plain(r.entropyJPerMolK),
      totalEntropyJPerMolK: plain(r.totalEntropyJPerMolK),
      groundStateEntropyJPerMolK: r.groundStateEntropyJPerMolK,
      heatCapacityJPerMolFormulaUnitK: plain(r.heatCapacityJPerMolFormulaUnitK),
      entropyJPerMolFormulaUnitK: plain(r.entropyJPerMolFormulaUnitK),
    };
  },
};
