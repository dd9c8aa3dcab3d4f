// Molecular-field and demagnetisation corrections, both linear in the magnetisation, combined into one constant.
import { InputError } from '../../errors';
import { AVOGADRO_PER_MOL, BOHR_MAGNETON_J_PER_T } from '../../units';
import { finiteNumber, positiveNumber } from './validate';

/** Demagnetisation: SI shape factor N (0 … 1) and the molar volume per mole of rare-earth ions in cm³/mol. */
export interface Demagnetization {
  factor: number;
  molarVolumeCm3PerMol: number;
}

/**
 * λ_total in mol/emu (per mole of rare-earth ions): the molecular-field constant λ (1/χ = 1/χ₀ − λ; Weiss; common
 * practice) minus the demagnetising term 4πN/V_m (CGS: H_int = H − 4πN M_vol with M_vol = M_mol/V_m; e.g.
 * Aharoni, Introduction to the Theory of Ferromagnetism, ch. 6), so that 1/χ_measured = 1/χ₀ − λ_total.
 */
export function totalMeanFieldMolPerEmu(meanFieldMolPerEmu: unknown, demagnetization: unknown): number {
  let lambda = meanFieldMolPerEmu === undefined ? 0 : finiteNumber(meanFieldMolPerEmu, 'meanFieldMolPerEmu', 'a molecular-field constant λ in mol/emu');
  if (demagnetization !== undefined) {
    if (demagnetization === null || typeof demagnetization !== 'object')
      throw new InputError('demagnetization', demagnetization, 'an object { factor (SI, 0 … 1), molarVolumeCm3PerMol }');
    const d = demagnetization as Partial<Demagnetization>;
    const factor = finiteNumber(d.factor, 'demagnetization.factor', 'an SI demagnetising factor from 0 to 1');
    if (factor < 0 || factor > 1) throw new InputError('demagnetization.factor', factor, 'an SI demagnetising factor from 0 to 1');
    const volume = positiveNumber(d.molarVolumeCm3PerMol, 'demagnetization.molarVolumeCm3PerMol', 'a molar volume > 0 cm³ per mole of ions');
    lambda -= (4 * Math.PI * factor) / volume;
  }
  return lambda;
}

/** Convert λ in mol/emu to the field per moment in T/μB: B_mf = λ M_mol, M_mol[emu/mol] = N_A μB[erg/G] M[μB], 1 G = 1e−4 T. */
export function teslaPerMuB(lambdaMolPerEmu: number): number {
  return lambdaMolPerEmu * AVOGADRO_PER_MOL * BOHR_MAGNETON_J_PER_T * 1e3 * 1e-4;
}
