/**
 * Physical constants and energy/temperature conversions: the one place in `@multiplet/physics` where they live.
 *
 * The SI values come from mathjs, whose constants are the CODATA 2018 recommended values (exact where the 2019 SI
 * redefinition fixed them: h, e, k_B, N_A). Derived conversion factors are computed here, never typed in by hand.
 *
 * Internal units of the physics package: energy meV, temperature K, field T, moment μB, length Å.
 *
 * See also: `energyToMeV`, `meVTo`.
 */
import {
  boltzmann as boltzmannQ,
  bohrMagneton as bohrMagnetonQ,
  avogadro as avogadroQ,
  planckConstant as planckQ,
  speedOfLight as speedOfLightQ,
  elementaryCharge as elementaryChargeQ,
  magneticConstant as magneticConstantQ,
  gasConstant as gasConstantQ,
  classicalElectronRadius as classicalElectronRadiusQ,
  neutronMass as neutronMassQ,
  reducedPlanckConstant as reducedPlanckQ,
  bohrRadius as bohrRadiusQ,
} from 'mathjs';

type MathjsUnitLike = { toNumber(unit: string): number };
const si = (q: unknown, unit: string): number => (q as MathjsUnitLike).toNumber(unit);

/** Boltzmann constant k_B in J/K (CODATA, exact). */
export const BOLTZMANN_J_PER_K = si(boltzmannQ, 'J / K');
/** Bohr magneton μB in J/T (CODATA 2018). */
export const BOHR_MAGNETON_J_PER_T = si(bohrMagnetonQ, 'J / T');
/** Avogadro constant N_A in 1/mol (exact). */
export const AVOGADRO_PER_MOL = si(avogadroQ, 'mol^-1');
/** Planck constant h in J s (exact). */
export const PLANCK_J_S = si(planckQ, 'J s');
/** Reduced Planck constant ħ in J s. */
export const HBAR_J_S = si(reducedPlanckQ, 'J s');
/** Speed of light c in m/s (exact). */
export const SPEED_OF_LIGHT_M_PER_S = si(speedOfLightQ, 'm / s');
/** Elementary charge e in C (exact). */
export const ELEMENTARY_CHARGE_C = si(elementaryChargeQ, 'C');
/** Vacuum permeability μ0 in T m / A (CODATA 2018). */
export const MU0_T_M_PER_A = si(magneticConstantQ, 'T m / A');
/** Molar gas constant R in J/(mol K) (exact: N_A k_B). */
export const GAS_CONSTANT_J_PER_MOL_K = si(gasConstantQ, 'J / (mol K)');
/** Classical electron radius r0 in m (CODATA 2018). */
export const CLASSICAL_ELECTRON_RADIUS_M = si(classicalElectronRadiusQ, 'm');
/** Neutron mass in kg (CODATA 2018). */
export const NEUTRON_MASS_KG = si(neutronMassQ, 'kg');
/**
 * Neutron magnetic moment in nuclear magnetons, magnitude |γ| = 1.91304273 (CODATA 2018; mathjs has no such constant).
 * Used for the magnetic scattering length prefactor (γ r0 / 2).
 */
export const NEUTRON_GYROMAGNETIC_RATIO = 1.91304273;

/** Bohr radius a0 in Å (CODATA 2018), for ⟨r^n⟩ tabulated in bohr^n. */
export const BOHR_RADIUS_ANGSTROM = si(bohrRadiusQ, 'm') * 1e10;
/** e²/(4πε0) in meV·Å (≈ 14399.6): Coulomb energy of two elementary charges 1 Å apart; ε0 = 1/(μ0 c²). */
export const COULOMB_MEV_ANGSTROM =
  (ELEMENTARY_CHARGE_C ** 2 * MU0_T_M_PER_A * SPEED_OF_LIGHT_M_PER_S ** 2) / (4 * Math.PI) / (1e-3 * ELEMENTARY_CHARGE_C) * 1e10;

/** 1 meV in joules. */
export const MEV_IN_J = 1e-3 * ELEMENTARY_CHARGE_C;
/** k_B in meV/K (≈ 0.08617333). */
export const BOLTZMANN_MEV_PER_K = BOLTZMANN_J_PER_K / MEV_IN_J;
/** μB in meV/T (≈ 0.05788382). */
export const BOHR_MAGNETON_MEV_PER_T = BOHR_MAGNETON_J_PER_T / MEV_IN_J;
/** 1 cm⁻¹ in meV (h c × 100 m⁻¹, ≈ 0.1239842). */
export const INVERSE_CM_IN_MEV = (PLANCK_J_S * SPEED_OF_LIGHT_M_PER_S * 100) / MEV_IN_J;
/** 1 K (as an energy, k_B × 1 K) in meV. */
export const KELVIN_IN_MEV = BOLTZMANN_MEV_PER_K;
/** 1 THz (h × 10¹² Hz) in meV (≈ 4.135667). */
export const THZ_IN_MEV = (PLANCK_J_S * 1e12) / MEV_IN_J;
/** (γ r0 / 2)² in millibarn: the magnetic neutron scattering prefactor (≈ 72.65 mb). */
export const MAGNETIC_PREFACTOR_MB = ((NEUTRON_GYROMAGNETIC_RATIO * CLASSICAL_ELECTRON_RADIUS_M) / 2) ** 2 * 1e28 * 1e3;
/** Neutron energy (meV) for wavevector k (Å⁻¹): E = ħ²k²/2m_n, factor ≈ 2.0722. */
export const NEUTRON_MEV_PER_INV_ANGSTROM_SQUARED = (HBAR_J_S ** 2 * 1e20) / (2 * NEUTRON_MASS_KG) / MEV_IN_J;
/**
 * Molar Curie-law prefactor in CGS-emu: N_A μB² / (3 k_B) in emu K / mol (≈ 0.12505), i.e. χ T = this × g² J(J+1).
 * μB in erg/G is 1e3 × μB in J/T.
 */
export const CURIE_PREFACTOR_EMU_K_PER_MOL = (AVOGADRO_PER_MOL * (BOHR_MAGNETON_J_PER_T * 1e3) ** 2) / (3 * BOLTZMANN_J_PER_K * 1e7);
/** Molar susceptibility conversion: 1 emu/mol (CGS) = 4π × 10⁻⁶ m³/mol (SI). */
export const EMU_PER_MOL_IN_M3_PER_MOL = 4 * Math.PI * 1e-6;

/** Energy units accepted at the edges of the physics package. */
export type EnergyUnit = 'meV' | 'K' | 'cm-1' | 'THz' | 'ueV';

const ENERGY_UNIT_IN_MEV: Record<EnergyUnit, number> = {
  meV: 1,
  K: KELVIN_IN_MEV,
  'cm-1': INVERSE_CM_IN_MEV,
  THz: THZ_IN_MEV,
  ueV: 1e-3,
};

/** All accepted spellings of energy units (case-sensitive), mapped to the canonical `EnergyUnit`. */
const ENERGY_UNIT_ALIASES: Record<string, EnergyUnit> = {
  meV: 'meV',
  K: 'K',
  'cm-1': 'cm-1',
  'cm^-1': 'cm-1',
  'cm⁻¹': 'cm-1',
  '1/cm': 'cm-1',
  THz: 'THz',
  ueV: 'ueV',
  'μeV': 'ueV',
  'µeV': 'ueV',
};

/** Parse an energy unit name; returns undefined if it is not one we accept. */
export function parseEnergyUnit(name: string): EnergyUnit | undefined {
  return ENERGY_UNIT_ALIASES[name.trim()];
}

/** The list of accepted energy unit spellings, for error messages. */
export const ACCEPTED_ENERGY_UNITS: readonly string[] = Object.keys(ENERGY_UNIT_ALIASES);

/**
 * Convert an energy in `unit` to meV.
 * @example energyToMeV(1, 'K') // 0.0861733...
 * See also: meVTo
 */
export function energyToMeV(value: number, unit: EnergyUnit): number {
  return value * ENERGY_UNIT_IN_MEV[unit];
}

/**
 * Convert an energy in meV to `unit`.
 * @example meVTo(1, 'cm-1') // 8.0655...
 */
export function meVTo(valueMeV: number, unit: EnergyUnit): number {
  return valueMeV / ENERGY_UNIT_IN_MEV[unit];
}
