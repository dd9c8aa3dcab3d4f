/**
 * `multiplet compute neutron-spectrum`: the CEF inelastic neutron spectrum of one rare-earth ion in absolute units.
 *
 * Input (JSON object):
 *   ion            'Ce3+' … 'Yb3+'                                                          required
 *   B              Stevens parameters {"B20": …}                                             required
 *   unit           energy unit of B: 'meV' (default), 'K', 'cm-1', …
 *   symmetry       site symmetry; forbidden parameters are errors
 *   temperatureK   temperature, K                                                           required
 *   energiesMeV    energy-transfer grid, meV                                                required
 *   qInvAngstrom   |Q| for the form factor, Å⁻¹ (default 0: f = 1)
 *   incidentEnergyMeV  for k_f/k_i (default: no k_f/k_i factor)
 *   resolution     {fwhmPolynomialMeV: [c0, c1, …]}: FWHM(E) = Σ c_k E^k, meV (default [0.1])
 *   lineShape      'gaussian' | 'lorentzian' | 'pseudo-voigt' (default)
 *   intrinsicFwhmMeV   Lorentzian width of the inelastic lines, meV (default 0)
 *   qDirection     [x, y, z] in the CEF frame for a single crystal (default: powder)
 *   background     {constant, slope} in mb/sr/meV (default 0); elasticIncoherentMbSr (default 0)
 * Output: intensity (mb sr⁻¹ meV⁻¹ per ion, one per energy), transitions [{fromMeV, toMeV, energyMeV, strength,
 * integratedIntensityMbSr}] (strength: |⟨j|J⊥|i⟩|² summed over the degenerate states of both levels, powder average
 * unless qDirection), levelsMeV, populations, formFactor.
 */
import { InputError } from '@multiplet/physics/errors';
import { neutronSpectrum as computeSpectrum, type NeutronSpectrumOptions } from '@multiplet/physics/neutron/neutronSpectrum';
import type { ComputeKind } from './index';
import { checkFields, readCefInput } from './inputs';

const FIELDS = [
  'ion', 'B', 'unit', 'symmetry', 'temperatureK', 'energiesMeV', 'qInvAngstrom', 'incidentEnergyMeV', 'resolution',
  'lineShape', 'intrinsicFwhmMeV', 'qDirection', 'background', 'elasticIncoherentMbSr',
];

function optional<T>(input: Record<string, unknown>, key: string, check: (v: unknown) => v is T, expected: string): T | undefined {
  const v = input[key];
  if (v === undefined) return undefined;
  if (!check(v)) throw new InputError(key, v, expected);
  return v;
}
const isString = (v: unknown): v is string => typeof v === 'string';
const isNumber = (v: unknown): v is number => typeof v === 'number';
const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isTriple = (v: unknown): v is [number, number, number] => Array.isArray(v) && v.length === 3 && v.every((x) => typeof x === 'number');

export const neutronSpectrum: ComputeKind = {
  summary: 'CEF neutron spectrum S(E) in mb/sr/meV per ion (powder or single crystal) with resolution, plus transitions',
  run(input) {
    checkFields(input, FIELDS);
    const { ion, parametersMeV } = readCefInput(input, { requireB: true, ionExample: 'Er3+', expectedB: 'an object of Stevens parameters, e.g. {"B20": -0.2}' });
    if (!Array.isArray(input.energiesMeV)) throw new InputError('energiesMeV', input.energiesMeV, 'a list of energy transfers in meV');
    const resolution = optional(input, 'resolution', isObject, 'an object {fwhmPolynomialMeV: [c0, c1, …]}');
    if (resolution) for (const key of Object.keys(resolution)) if (key !== 'fwhmPolynomialMeV') throw new InputError(`resolution.${key}`, resolution[key], 'only fwhmPolynomialMeV');
    const background = optional(input, 'background', isObject, 'an object {constant, slope} in mb/sr/meV');
    const options: NeutronSpectrumOptions = {
      temperatureK: input.temperatureK as number,
      energiesMeV: input.energiesMeV as number[],
      qInvAngstrom: optional(input, 'qInvAngstrom', isNumber, 'Q ≥ 0 in Å⁻¹'),
      incidentEnergyMeV: optional(input, 'incidentEnergyMeV', isNumber, 'a positive energy in meV'),
      resolution: resolution as NeutronSpectrumOptions['resolution'],
      lineShape: optional(input, 'lineShape', isString, 'gaussian, lorentzian or pseudo-voigt') as NeutronSpectrumOptions['lineShape'],
      intrinsicFwhmMeV: optional(input, 'intrinsicFwhmMeV', isNumber, 'a width ≥ 0 in meV'),
      qDirection: optional(input, 'qDirection', isTriple, 'a 3-vector [x, y, z] in the CEF frame'),
      background: background as NeutronSpectrumOptions['background'],
      elasticIncoherentMbSr: optional(input, 'elasticIncoherentMbSr', isNumber, 'an intensity ≥ 0 in mb/sr'),
    };
    if (input.temperatureK === undefined) throw new InputError('temperatureK', undefined, 'a temperature in K');
    const result = computeSpectrum(ion, parametersMeV, options);
    return {
      ion: ion.name,
      parametersMeV,
      intensityUnit: 'mb/sr/meV per ion',
      intensity: Array.from(result.intensity),
      formFactor: result.formFactor,
      levelsMeV: result.cef.levels.map((l) => l.energyMeV),
      levelDegeneracies: result.cef.levels.map((l) => l.degeneracy),
      populations: result.cef.levels.map((l) => l.populationPerState * l.degeneracy),
      transitions: result.cef.transitions.map((t, k) => ({
        fromMeV: t.fromMeV,
        toMeV: t.toMeV,
        energyMeV: t.energyMeV,
        strength: t.strength,
        integratedIntensityMbSr: result.transitionIntensitiesMbSr[k],
      })),
    };
  },
};
