/**
 * `multiplet compute structure-factor`: powder magnetic diffuse scattering I(Q) of a spin-ice Monte Carlo run, in
 * barn/sr per magnetic ion, at every temperature, and the difference I(T) − I(T_high) that experiments report.
 *
 * Input: every field of `spin-ice-mc` (the run), plus
 *   QInvAngstrom      [Å⁻¹, …] > 0                                                   required
 *   ion               rare-earth ion for the dipole form factor ("Ho3+", "Dy3+", …), or omitted for f = 1
 *   snapshots         configurations kept per temperature for the correlations          default 20
 * Output: QInvAngstrom, temperaturesK, intensityBarnPerSrPerIon[T][Q], differenceBarnPerSrPerIon[T][Q]
 * (minus the highest temperature), paramagnetBarnPerSrPerIon[Q] ((2/3)(γr0/2)² μ² f²), referenceTemperatureK,
 * the thermodynamics of spin-ice-mc, momentMuB.
 */
import { InputError } from '@multiplet/physics/errors';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo/runSpinIceMonteCarlo';
import { pairTable, pairCorrelationShells } from '@multiplet/physics/scattering/pairCorrelationShells';
import { powderIntensity } from '@multiplet/physics/scattering/powderIntensity';
import { magneticFormFactor } from '@multiplet/physics/neutron';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';
import type { ComputeKind } from './index';
import { checkFields, optionalNumber, optionalString, requiredArray } from './inputs';
import { SPIN_ICE_FIELDS, readSpinIceRunInput } from './spinIceMc';

export const structureFactor: ComputeKind = {
  summary: 'powder magnetic diffuse scattering I(Q) (barn/sr per ion) of a spin-ice Monte Carlo run, and I(T) − I(T_high)',
  run(input) {
    checkFields(input, [...SPIN_ICE_FIELDS, 'QInvAngstrom', 'ion', 'snapshots']);
    const options = readSpinIceRunInput(input);
    const Q = requiredArray(input, 'QInvAngstrom', 'momentum transfers in Å⁻¹');
    Q.forEach((q, k) => {
      if (typeof q !== 'number' || !(q > 0) || !Number.isFinite(q)) throw new InputError(`QInvAngstrom[${k}]`, q, 'a positive Q in Å⁻¹');
    });
    const ion = optionalString(input, 'ion');
    const formFactor = ion === undefined ? () => 1 : (q: number) => magneticFormFactor(ion, q);
    if (ion !== undefined) formFactor(1);
    const snapshots = optionalNumber(input, 'snapshots') ?? 20;
    if (!Number.isInteger(snapshots) || snapshots < 1 || snapshots > options.sweeps) throw new InputError('snapshots', snapshots, `an integer from 1 to sweeps (${options.sweeps})`);
    const run = runSpinIceMonteCarlo({ ...options, snapshotEvery: Math.floor(options.sweeps / snapshots) });
    const mu = options.model.momentMuB;
    const table = pairTable(run.raw.couplings.cell);
    const intensity = run.raw.snapshots.map((configs) => powderIntensity(pairCorrelationShells(table, configs), Q, mu, formFactor));
    const temps = run.result.temperaturesK;
    const high = temps.indexOf(Math.max(...temps));
    return {
      QInvAngstrom: Q,
      temperaturesK: temps,
      momentMuB: mu,
      referenceTemperatureK: temps[high],
      intensityBarnPerSrPerIon: intensity,
      differenceBarnPerSrPerIon: intensity.map((row) => row.map((v, k) => v - intensity[high][k])),
      paramagnetBarnPerSrPerIon: Q.map((q) => (2 / 3) * (MAGNETIC_PREFACTOR_MB / 1000) * mu * mu * formFactor(q) ** 2),
      energyKPerSpin: run.result.energyKPerSpin,
      heatCapacityJPerMolK: run.result.heatCapacityJPerMolK,
      entropyJPerMolK: run.result.entropyJPerMolK,
      magnetizationMuBPerSpin: run.result.magnetizationMuBPerSpin,
    };
  },
};
