/**
 * Transfer Stevens parameters between ions and isostructural compounds:
 *   B_n^m(to) = B_n^m(from) · [θ_n(to)/θ_n(from)] · [⟨r^n⟩(to)/⟨r^n⟩(from)] · [R(from)/R(to)]^{n+1}
 * i.e. the A_n^m ⟨r^n⟩ θ_n factorisation of the point-charge form (Hutchings 1964 §5) with A_n^m ∝ R^{−(n+1)}, the
 * common practice for predicting a neighbour in a rare-earth series before measuring it. θ_n are the Stevens factors
 * and ⟨r^n⟩ the Freeman–Desclaux radial integrals of the ions table; R is a typical ligand distance.
 *
 * @example scaleCefParameters({ B20: -0.1, B40: 1e-3 }, 'Er3+', 'Yb3+', { fromDistanceAngstrom: 2.28, toDistanceAngstrom: 2.25 })
 * See also: pointChargeParameters
 */
import { InputError } from '../errors';
import { getIon, stevensFactor, type Ion } from '../ions';
import type { CefParameters } from './cefHamiltonian';
import { requireParameterKey } from './parameterKeys';

export interface ScaleOptions {
  /** Ligand distance in the source compound, Å (with toDistanceAngstrom; default: no distance scaling). */
  readonly fromDistanceAngstrom?: number;
  readonly toDistanceAngstrom?: number;
}

/** Stevens parameters (meV) of `fromIon` rescaled to `toIon` (and to another ligand distance). */
export function scaleCefParameters(parametersMeV: CefParameters, fromIon: Ion | string, toIon: Ion | string, options: ScaleOptions = {}): CefParameters {
  const from = typeof fromIon === 'string' ? getIon(fromIon) : fromIon;
  const to = typeof toIon === 'string' ? getIon(toIon) : toIon;
  const { fromDistanceAngstrom: r1, toDistanceAngstrom: r2 } = options;
  if ((r1 === undefined) !== (r2 === undefined))
    throw new InputError(r1 === undefined ? 'fromDistanceAngstrom' : 'toDistanceAngstrom', undefined, 'both ligand distances, or neither');
  for (const [name, r] of [['fromDistanceAngstrom', r1], ['toDistanceAngstrom', r2]] as const)
    if (r !== undefined && !(typeof r === 'number' && Number.isFinite(r) && r > 0)) throw new InputError(name, r, 'a positive distance in Å');
  const radial = (ion: Ion, n: number) => (n === 2 ? ion.radial.r2 : n === 4 ? ion.radial.r4 : ion.radial.r6);
  const out: Record<string, number> = {};
  for (const [key, value] of Object.entries(parametersMeV)) {
    const { n } = requireParameterKey(key, 'B');
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new InputError(`B.${key}`, value, 'a finite number (meV)');
    if (value === 0) continue;
    const thetaFrom = stevensFactor(from, n);
    if (thetaFrom === 0) throw new InputError('fromIon', from.name, `an ion with a non-zero rank-${n} Stevens factor (${from.name} has none, so B${n}m cannot be transferred from it)`);
    const distance = r1 !== undefined && r2 !== undefined ? (r1 / r2) ** (n + 1) : 1;
    const scaled = value * (stevensFactor(to, n) / thetaFrom) * (radial(to, n) / radial(from, n)) * distance;
    if (scaled !== 0) out[key] = scaled;
  }
  return out;
}
