/**
 * Inelastic neutron spectrum of crystal-field transitions in absolute units, mb sr⁻¹ meV⁻¹ per magnetic ion:
 *
 *   d²σ/dΩdE = (γr0/2)² (k_f/k_i) g_J² f(Q)² Σ_{i,j} p_i |⟨j|J⊥|i⟩|² L(E − (E_j − E_i))  + elastic + background
 *
 * (dipole approximation; Squires 1978 eq. 7.x for the magnetic cross-section; Furrer, Mesot & Strässle 2009 eq. 10.3;
 * Debye–Waller factor taken as 1). (γr0/2)² = MAGNETIC_PREFACTOR_MB ≈ 72.65 mb. |⟨j|J⊥|i⟩|² is the powder average
 * (2/3)Σ_α|⟨j|J_α|i⟩|² or, with `qDirection`, the single-crystal value. L is a unit-area line (lineShape.ts) whose
 * Gaussian FWHM is the instrumental resolution FWHM(E) = Σ_k c_k E^k evaluated at the line energy (the usual
 * description for direct-geometry spectrometers) and whose Lorentzian FWHM is the intrinsic width.
 * k_f/k_i = √(1 − E/E_i) when an incident energy is given, else 1 (and 0 beyond E_i).
 *
 * @example neutronSpectrum('Er3+', B, { temperatureK: 5, energiesMeV: grid, resolution: { fwhmPolynomialMeV: [0.3, 0.02] } })
 * See also: cefTransitions, magneticFormFactor, lineShape
 */
import { InputError } from '../errors';
import { getIon, type Ion } from '../ions';
import type { CefParameters } from '../cef/cefHamiltonian';
import { MAGNETIC_PREFACTOR_MB } from '../units';
import { cefTransitions, type CefTransitionsResult } from './cefTransitions';
import { LINE_SHAPES, lineShape, type LineShapeKind } from './lineShape';
import { magneticFormFactor } from './magneticFormFactor';

export interface NeutronSpectrumOptions {
  readonly temperatureK: number;
  readonly energiesMeV: ArrayLike<number>;
  /** |Q| for the form factor, Å⁻¹. Default 0 (f = 1). */
  readonly qInvAngstrom?: number;
  /** Incident energy for k_f/k_i, meV. Default: no k_f/k_i factor. */
  readonly incidentEnergyMeV?: number;
  /** Resolution FWHM(E) = Σ c_k E^k in meV. Default { fwhmPolynomialMeV: [0.1] }. */
  readonly resolution?: { readonly fwhmPolynomialMeV: readonly number[] };
  readonly lineShape?: LineShapeKind;
  /** Intrinsic (Lorentzian) FWHM of the inelastic lines, meV. Default 0. */
  readonly intrinsicFwhmMeV?: number;
  readonly qDirection?: readonly [number, number, number];
  /** Integrated nuclear incoherent elastic intensity, mb/sr per ion, drawn with the resolution at E = 0. Default 0. */
  readonly elasticIncoherentMbSr?: number;
  /** Background a + b·E in mb/sr/meV per ion. Default 0. */
  readonly background?: { readonly constant?: number; readonly slope?: number };
}

export interface NeutronSpectrumResult {
  /** One value per input energy, mb sr⁻¹ meV⁻¹ per ion. */
  readonly intensity: Float64Array;
  /** Integrated intensity of each transition in mb/sr per ion (before k_f/k_i, which depends on the grid). */
  readonly transitionIntensitiesMbSr: Float64Array;
  readonly formFactor: number;
  readonly cef: CefTransitionsResult;
}

/** Evaluate FWHM(E) = Σ c_k E^k (meV). */
export function resolutionFwhmMeV(coefficients: readonly number[], energyMeV: number): number {
  let value = 0;
  for (let k = coefficients.length - 1; k >= 0; k--) value = value * energyMeV + coefficients[k];
  return value;
}

function finite(value: unknown, field: string, expected: string, test: (v: number) => boolean = () => true): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || !test(value)) throw new InputError(field, value, expected);
  return value;
}

/** Validate the shared spectrum options (also used by the fits). */
export function checkSpectrumOptions(options: NeutronSpectrumOptions, field = ''): void {
  const f = (name: string) => (field ? `${field}.${name}` : name);
  finite(options.temperatureK, f('temperatureK'), 'a finite temperature ≥ 0 K', (v) => v >= 0);
  if (!options.energiesMeV || typeof options.energiesMeV.length !== 'number' || options.energiesMeV.length === 0)
    throw new InputError(f('energiesMeV'), options.energiesMeV, 'a non-empty list of energies in meV');
  for (let k = 0; k < options.energiesMeV.length; k++) finite(options.energiesMeV[k], `${f('energiesMeV')}[${k}]`, 'a finite energy in meV');
  if (options.qInvAngstrom !== undefined) finite(options.qInvAngstrom, f('qInvAngstrom'), 'a finite Q ≥ 0 in Å⁻¹', (v) => v >= 0);
  if (options.incidentEnergyMeV !== undefined) finite(options.incidentEnergyMeV, f('incidentEnergyMeV'), 'a positive incident energy in meV', (v) => v > 0);
  if (options.lineShape !== undefined && !LINE_SHAPES.includes(options.lineShape))
    throw new InputError(f('lineShape'), options.lineShape, `one of ${LINE_SHAPES.join(', ')}`);
  if (options.intrinsicFwhmMeV !== undefined) finite(options.intrinsicFwhmMeV, f('intrinsicFwhmMeV'), 'a width ≥ 0 meV', (v) => v >= 0);
  if (options.elasticIncoherentMbSr !== undefined) finite(options.elasticIncoherentMbSr, f('elasticIncoherentMbSr'), 'an intensity ≥ 0', (v) => v >= 0);
  const poly = options.resolution?.fwhmPolynomialMeV;
  if (options.resolution !== undefined) {
    if (!Array.isArray(poly) || poly.length === 0)
      throw new InputError(f('resolution.fwhmPolynomialMeV'), poly, 'a non-empty list of polynomial coefficients [c0, c1, …] in meV');
    poly.forEach((c, k) => finite(c, `${f('resolution.fwhmPolynomialMeV')}[${k}]`, 'a finite coefficient'));
  }
  if (options.background) {
    if (options.background.constant !== undefined) finite(options.background.constant, f('background.constant'), 'a finite number');
    if (options.background.slope !== undefined) finite(options.background.slope, f('background.slope'), 'a finite number');
  }
}

/** The CEF neutron spectrum S(E) on `energiesMeV`, in mb sr⁻¹ meV⁻¹ per ion. */
export function neutronSpectrum(ionOrName: Ion | string, parametersMeV: CefParameters, options: NeutronSpectrumOptions): NeutronSpectrumResult {
  const ion = typeof ionOrName === 'string' ? getIon(ionOrName) : ionOrName;
  checkSpectrumOptions(options);
  const cef = cefTransitions(ion, parametersMeV, options.temperatureK, { qDirection: options.qDirection });
  return spectrumFromTransitions(ion, cef, options);
}

/** S(E) from already computed transitions (lets fits reuse one diagonalisation for several datasets). */
export function spectrumFromTransitions(ion: Ion, cef: CefTransitionsResult, options: NeutronSpectrumOptions): NeutronSpectrumResult {
  const poly = options.resolution?.fwhmPolynomialMeV ?? [0.1];
  const kind = options.lineShape ?? 'pseudo-voigt';
  const intrinsic = options.intrinsicFwhmMeV ?? 0;
  const formFactor = magneticFormFactor(ion.name, options.qInvAngstrom ?? 0);
  const prefactor = MAGNETIC_PREFACTOR_MB * ion.gJ * ion.gJ * formFactor * formFactor;
  const widthAt = (energyMeV: number): number => {
    const w = resolutionFwhmMeV(poly, energyMeV);
    if (!(w > 0)) throw new InputError('resolution.fwhmPolynomialMeV', poly, `a FWHM polynomial that is positive at every line energy (it is ${w} meV at ${energyMeV} meV)`);
    return w;
  };
  const lines = cef.transitions.map((t) => ({ energy: t.energyMeV, area: prefactor * t.weight, width: widthAt(t.energyMeV), intrinsic }));
  const elasticWidth = widthAt(0);
  // Magnetic quasi-elastic scattering within degenerate levels: at E = 0 with the resolution width only.
  lines.push({ energy: 0, area: prefactor * cef.elasticWeight, width: elasticWidth, intrinsic: 0 });
  const incoherent = options.elasticIncoherentMbSr ?? 0;
  const a = options.background?.constant ?? 0;
  const b = options.background?.slope ?? 0;
  const ei = options.incidentEnergyMeV;
  const energies = options.energiesMeV;
  const intensity = new Float64Array(energies.length);
  for (let k = 0; k < energies.length; k++) {
    const e = energies[k];
    const kfOverKi = ei === undefined ? 1 : e < ei ? Math.sqrt(1 - e / ei) : 0;
    let s = 0;
    for (const line of lines) if (line.area !== 0) s += line.area * lineShape(kind, e - line.energy, line.width, line.intrinsic);
    intensity[k] = kfOverKi * s + incoherent * lineShape('gaussian', e, elasticWidth) + a + b * e;
  }
  return {
    intensity,
    transitionIntensitiesMbSr: Float64Array.from(cef.transitions, (t) => prefactor * t.weight),
    formFactor,
    cef,
  };
}
