/**
 * Validation at the edge: turn user-supplied Stevens parameters (any accepted energy unit, optional site symmetry)
 * into a clean CefParameters object in meV with canonical keys.
 */
import { InputError } from '../errors';
import { parseEnergyUnit, energyToMeV, ACCEPTED_ENERGY_UNITS } from '../units';
import type { CefParameters } from './cefHamiltonian';
import { requireParameterKey, parameterKey } from './parameterKeys';
import { allowedParameters, resolveSymmetry, CUBIC_SYMMETRIES } from './siteSymmetry';

/** Options of normalizeCefParameters. */
export interface NormalizeCefOptions {
  /** Energy unit of the values: 'meV' (default), 'K', 'cm-1' (and the other units of physics/units). */
  unit?: string;
  /** Site symmetry (see SITE_SYMMETRIES); parameters it forbids are an error. */
  symmetry?: string;
  /** Field path used in error messages (default 'B'). */
  field?: string;
}

/** Relative tolerance for the cubic ratios B44/B40 = 5 and B64/B60 = −21 when both are given. */
const CUBIC_RATIO_TOLERANCE = 1e-6;

/**
 * Validate and convert Stevens parameters to meV with canonical keys ('B4m3' → 'B4-3'). Rules:
 * - every key must be a Stevens parameter name, every value a finite number (else InputError naming `B.key`);
 * - the same parameter given twice (e.g. 'B4-3' and 'B4m3') is an error;
 * - with a symmetry, a non-zero parameter the symmetry forbids is an InputError naming the parameter and the
 *   symmetry (zeros are accepted and dropped);
 * - cubic symmetries (Oh, Td, O; z ∥ [001]): B44 and B64 may be omitted and are then filled in as B44 = 5 B40 and
 *   B64 = −21 B60 (Hutchings 1964, cubic fields; from memory); if given they must satisfy these ratios to 1e-6 relative.
 * Zero-valued parameters are dropped from the result.
 *
 * @example normalizeCefParameters({ B40: 1, B60: 0.01 }, { unit: 'K', symmetry: 'Oh' }) // meV, B44 and B64 filled in
 * See also: cefHamiltonian, allowedParameters
 */
export function normalizeCefParameters(input: Record<string, unknown>, options: NormalizeCefOptions = {}): CefParameters {
  const field = options.field ?? 'B';
  if (input === null || typeof input !== 'object' || Array.isArray(input))
    throw new InputError(field, input, 'an object of Stevens parameters, e.g. {"B20": -0.2, "B40": 0.001}');
  const unitName = options.unit ?? 'meV';
  const unit = typeof unitName === 'string' ? parseEnergyUnit(unitName) : undefined;
  if (!unit) throw new InputError('unit', unitName, `an energy unit, one of ${ACCEPTED_ENERGY_UNITS.join(', ')}`);
  const symmetry = options.symmetry === undefined ? undefined : resolveSymmetry(options.symmetry);
  const allowed = symmetry ? allowedParameters(symmetry) : undefined;

  const out: Record<string, number> = {};
  const seen = new Map<string, unknown>();
  for (const [key, value] of Object.entries(input)) {
    const { n, m } = requireParameterKey(key, field);
    const canonical = parameterKey(n, m);
    if (seen.has(canonical)) throw new InputError(`${field}.${key}`, value, `a single value for ${canonical} (given twice under different spellings)`);
    seen.set(canonical, value);
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new InputError(`${field}.${key}`, value, `a finite number (${unitName})`);
    if (value === 0) continue;
    if (allowed && !allowed.includes(canonical))
      throw new InputError(`${field}.${key}`, value, `no ${canonical} term in ${symmetry} site symmetry (allowed: ${allowed.join(', ')})`);
    out[canonical] = energyToMeV(value, unit);
  }

  if (symmetry && CUBIC_SYMMETRIES.includes(symmetry)) {
    for (const [fourfold, axial, ratio] of [['B44', 'B40', 5], ['B64', 'B60', -21]] as const) {
      const expected = ratio * (out[axial] ?? 0);
      if (!seen.has(fourfold)) {
        if (expected !== 0) out[fourfold] = expected;
      } else {
        const given = out[fourfold] ?? 0;
        if (Math.abs(given - expected) > CUBIC_RATIO_TOLERANCE * Math.max(Math.abs(expected), Math.abs(given)))
          throw new InputError(`${field}.${fourfold}`, seen.get(fourfold),
            `${fourfold} = ${ratio} × ${axial} for ${symmetry} symmetry with z ∥ [001] (or leave ${fourfold} out to have it filled in)`);
      }
    }
  }
  return Object.freeze(out);
}
