/**
 * `multiplet compute susceptibility`: zero-field dc susceptibility (Van Vleck formula) of a rare-earth ion.
 *
 * Input (JSON object):
 *   ion, B, unit?, symmetry?   as for crystal-field
 *   temperaturesK              [K, …], each > 0                                   required
 *   direction                  [x, y, z] in the crystal frame, or "powder"          required
 *   sites                      "single" (default) or "pyrochlore"
 *   ionsPerFormulaUnit         default 1 (for the per-formula-unit values)
 *   meanFieldMolPerEmu         λ in mol/emu per mole of ions (1/χ = 1/χ₀ − λ), default 0
 *   demagnetization            { factor (SI), molarVolumeCm3PerMol (per mole of ions) }, default none
 * Output: chiEmuPerMol (per mole of rare-earth ions) and inverseChiMolPerEmu, chiM3PerMol, and per formula unit.
 */
import { vanVleckSusceptibility } from '@multiplet/physics/thermo';
import { CURIE_PREFACTOR_EMU_K_PER_MOL } from '@multiplet/physics/units';
import type { ComputeKind } from './index';
import { checkFields, optionalNumber, plain, readDirection, readIon, readMeanField, readSites, requiredArray } from './inputs';

const FIELDS = ['ion', 'B', 'unit', 'symmetry', 'temperaturesK', 'direction', 'sites', 'ionsPerFormulaUnit', 'meanFieldMolPerEmu', 'demagnetization'];

export const susceptibility: ComputeKind = {
  summary: 'Van Vleck dc susceptibility χ(T) in emu/mol and m³/mol (per mole of ions and per formula unit), direction or powder',
  run(input) {
    checkFields(input, FIELDS);
    const { name, single } = readIon(input);
    const direction = readDirection(input);
    const sites = readSites(input);
    const r = vanVleckSusceptibility(single, {
      temperaturesK: requiredArray(input, 'temperaturesK', 'temperatures in K'),
      direction,
      sites,
      ionsPerFormulaUnit: optionalNumber(input, 'ionsPerFormulaUnit'),
      ...readMeanField(input),
    });
    return {
      ion: name,
      direction,
      sites,
      temperaturesK: plain(r.temperaturesK),
      chiEmuPerMol: plain(r.chiEmuPerMol),
      inverseChiMolPerEmu: plain(r.inverseChiMolPerEmu),
      chiM3PerMol: plain(r.chiM3PerMol),
      chiEmuPerMolFormulaUnit: plain(r.chiEmuPerMolFormulaUnit),
      chiM3PerMolFormulaUnit: plain(r.chiM3PerMolFormulaUnit),
      freeIonCurieConstantEmuKPerMol: CURIE_PREFACTOR_EMU_K_PER_MOL * single.gJ ** 2 * single.J * (single.J + 1),
      freeIonMomentMuB: single.gJ * Math.sqrt(single.J * (single.J + 1)),
    };
  },
};
