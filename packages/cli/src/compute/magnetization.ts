/**
 * `multiplet compute magnetization`: M(B, T) of a rare-earth ion in its crystal field, along a direction or powder.
 *
 * Input (JSON object):
 *   ion, B, unit?, symmetry?   as for crystal-field (Stevens parameters in the local frame)
 *   temperaturesK              [K, …], each > 0                                                  required
 *   fieldsT                    [T, …], applied field μ0H                                           required
 *   direction                  [x, y, z] in the crystal frame, or "powder"                          required
 *   sites                      "single" (default) or "pyrochlore" (four ⟨111⟩ local frames)
 *   powderDegree | powderTolerance   Lebedev–Laikov degree, or relative tolerance (default 1e-4)
 *   meanFieldMolPerEmu         molecular-field λ in mol/emu (per mole of ions), default 0
 *   demagnetization            { factor (SI), molarVolumeCm3PerMol (per mole of ions) }, default none
 * Output: magnetizationMuB (μB per ion; one array per temperature, one value per field), and the powder grid used.
 */
import { InputError } from '@multiplet/physics/errors';
import { magnetization as computeMagnetization } from '@multiplet/physics/thermo';
import type { ComputeKind } from './index';
import { checkFields, optionalNumber, plain, readDirection, readIon, readMeanField, readSites, requiredArray } from './inputs';

const FIELDS = ['ion', 'B', 'unit', 'symmetry', 'temperaturesK', 'fieldsT', 'direction', 'sites', 'powderDegree', 'powderTolerance', 'meanFieldMolPerEmu', 'demagnetization'];

export const magnetization: ComputeKind = {
  summary: 'M(B, T) in μB per ion along a direction or powder-averaged (Lebedev–Laikov), single site or pyrochlore ⟨111⟩ frames',
  run(input) {
    checkFields(input, FIELDS);
    const { name, single } = readIon(input);
    const temperaturesK = requiredArray(input, 'temperaturesK', 'temperatures in K');
    const fieldsT = requiredArray(input, 'fieldsT', 'fields in T');
    const direction = readDirection(input);
    const sites = readSites(input);
    const degree = optionalNumber(input, 'powderDegree');
    const tolerance = optionalNumber(input, 'powderTolerance');
    if (direction !== 'powder' && (degree !== undefined || tolerance !== undefined))
      throw new InputError(degree !== undefined ? 'powderDegree' : 'powderTolerance', degree ?? tolerance, 'nothing unless direction is "powder"');
    const r = computeMagnetization(single, {
      temperaturesK,
      fieldsT,
      direction,
      sites,
      powder: direction === 'powder' ? (degree !== undefined ? { degree, tolerance } : { tolerance }) : undefined,
      ...readMeanField(input),
    });
    return {
      ion: name,
      direction,
      sites,
      temperaturesK: plain(r.temperaturesK),
      fieldsT: plain(r.fieldsT),
      magnetizationMuB: r.magnetizationMuB.map(plain),
      powder: r.powder ?? null,
      diagonalisations: r.diagonalisations,
    };
  },
};
