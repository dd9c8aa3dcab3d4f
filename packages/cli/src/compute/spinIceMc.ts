/**
 * `multiplet compute spin-ice-mc`: classical Monte Carlo of Ising spin ice on the pyrochlore lattice.
 *
 * Input (JSON object):
 *   L                       cubic cells per axis (N = 16 L³ spins; ≤ 6 with the dipolar sum)     required
 *   temperaturesK           [K, …], distinct, > 0                                              required
 *   J1K, J2K, J3aK, J3bK    exchange in K, H = Σ J S_i·S_j with unit Ising vectors (J > 0 antiferro;
 *                           dipolar spin-ice J_nn = −J1/3); shells as in physics/lattice     default 0
 *   dipolar                 { momentMuB, latticeConstantAngstrom } for the Ewald dipolar sum, or false   default false
 *   momentMuB               Ising moment in μB when dipolar is false (Zeeman only)             default 10
 *   latticeConstantAngstrom cubic lattice constant when dipolar is false                       default 10.1
 *   fieldT                  field magnitude in T                                                default 0
 *   fieldDirection          [x, y, z] cubic axes; also the magnetization axis                   default [0, 0, 1]
 *   sweeps                  measured Monte Carlo steps (≥ 40)                                   required
 *   thermalizationSweeps    discarded steps                                                     default sweeps/2
 *   loopMovesPerSweep       loop-move attempts per step and replica                             default N/64
 *   parallelTempering       replica exchange between neighbouring temperatures                  default true
 *   seed                    integer seed (same seed → identical output)                         required
 * Output: one value per temperature: energyKPerSpin, heatCapacityJPerMolK (per mole of spins, binning errors in
 * heatCapacityErrorJPerMolK), entropyJPerMolK (integrated from R ln 2 at infinite T), magnetizationMuBPerSpin
 * (along fieldDirection), orderParameter001, acceptance rates; plus numberOfSpins, dipolarDK, warnings.
 */
import { InputError } from '@multiplet/physics/errors';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo/runSpinIceMonteCarlo';
import type { SpinIceRunOptions } from '@multiplet/physics/montecarlo/spinIceSimulation';
import type { ComputeKind } from './index';
import { checkFields, optionalNumber, requiredArray } from './inputs';

/** Input fields shared with `structure-factor`. */
export const SPIN_ICE_FIELDS = [
  'L', 'temperaturesK', 'J1K', 'J2K', 'J3aK', 'J3bK', 'dipolar', 'momentMuB', 'latticeConstantAngstrom', 'fieldT',
  'fieldDirection', 'sweeps', 'thermalizationSweeps', 'loopMovesPerSweep', 'parallelTempering', 'seed',
];

/** Parse and validate the Monte Carlo part of the input (fields above) into run options. */
export function readSpinIceRunInput(input: Record<string, unknown>): SpinIceRunOptions {
  const L = input.L;
  if (typeof L !== 'number' || !Number.isInteger(L) || L < 1) throw new InputError('L', L, 'a positive integer number of cubic cells');
  const temperaturesK = requiredArray(input, 'temperaturesK', 'temperatures in K');
  temperaturesK.forEach((t, k) => {
    if (typeof t !== 'number' || !(t > 0) || !Number.isFinite(t)) throw new InputError(`temperaturesK[${k}]`, t, 'a positive temperature in K');
  });
  const dip = input.dipolar ?? false;
  let dipolar = false;
  let momentMuB = optionalNumber(input, 'momentMuB') ?? 10;
  let latticeConstantAngstrom = optionalNumber(input, 'latticeConstantAngstrom') ?? 10.1;
  if (dip !== false) {
    if (typeof dip !== 'object' || dip === null || Array.isArray(dip)) throw new InputError('dipolar', dip, '{ momentMuB, latticeConstantAngstrom } or false');
    const d = dip as Record<string, unknown>;
    for (const k of Object.keys(d)) if (k !== 'momentMuB' && k !== 'latticeConstantAngstrom') throw new InputError(`dipolar.${k}`, d[k], 'no such field; fields are momentMuB, latticeConstantAngstrom');
    if (typeof d.momentMuB !== 'number' || !(d.momentMuB > 0)) throw new InputError('dipolar.momentMuB', d.momentMuB, 'a positive moment in μB');
    if (typeof d.latticeConstantAngstrom !== 'number' || !(d.latticeConstantAngstrom > 0)) throw new InputError('dipolar.latticeConstantAngstrom', d.latticeConstantAngstrom, 'a positive length in Å');
    dipolar = true;
    momentMuB = d.momentMuB;
    latticeConstantAngstrom = d.latticeConstantAngstrom;
  }
  if (!(momentMuB > 0)) throw new InputError('momentMuB', momentMuB, 'a positive moment in μB');
  if (!(latticeConstantAngstrom > 0)) throw new InputError('latticeConstantAngstrom', latticeConstantAngstrom, 'a positive length in Å');
  const fieldT = optionalNumber(input, 'fieldT') ?? 0;
  const dir = input.fieldDirection ?? [0, 0, 1];
  if (!Array.isArray(dir) || dir.length !== 3 || !dir.every((x) => typeof x === 'number' && Number.isFinite(x)) || Math.hypot(...(dir as number[])) === 0) {
    throw new InputError('fieldDirection', dir, 'a non-zero vector [x, y, z] in cubic axes');
  }
  const n = Math.hypot(...(dir as number[]));
  const unit = (dir as number[]).map((x) => x / n) as [number, number, number];
  const sweeps = input.sweeps;
  if (typeof sweeps !== 'number' || !Number.isInteger(sweeps) || sweeps < 40) throw new InputError('sweeps', sweeps, 'an integer ≥ 40');
  const seed = input.seed;
  if (typeof seed !== 'number' || !Number.isInteger(seed)) throw new InputError('seed', seed, 'an integer');
  const pt = input.parallelTempering ?? true;
  if (typeof pt !== 'boolean') throw new InputError('parallelTempering', pt, 'true or false');
  return {
    model: {
      L,
      latticeConstantAngstrom,
      momentMuB,
      dipolar,
      exchangeK: {
        J1: optionalNumber(input, 'J1K') ?? 0,
        J2: optionalNumber(input, 'J2K') ?? 0,
        J3a: optionalNumber(input, 'J3aK') ?? 0,
        J3b: optionalNumber(input, 'J3bK') ?? 0,
      },
      fieldTesla: [fieldT * unit[0], fieldT * unit[1], fieldT * unit[2]],
      magnetizationDirection: unit,
    },
    temperaturesK,
    sweeps,
    thermalizationSweeps: optionalNumber(input, 'thermalizationSweeps'),
    loopMovesPerSweep: optionalNumber(input, 'loopMovesPerSweep'),
    parallelTempering: pt,
    seed,
  };
}

/** Warnings a user should see next to the numbers. */
export function spinIceWarnings(options: SpinIceRunOptions, scaleK: number): string[] {
  const w: string[] = [];
  const tMax = Math.max(...options.temperaturesK);
  if (tMax < 10 * scaleK) w.push(`entropy: the highest temperature ${tMax} K is below 10 × the largest coupling (${scaleK.toPrecision(3)} K); S(T) from R ln 2 is then inaccurate`);
  if (options.temperaturesK.length < 12) w.push('entropy: fewer than 12 temperatures; the integration from R ln 2 is coarse');
  return w;
}

export const spinIceMc: ComputeKind = {
  summary: 'Monte Carlo of Ising spin ice (J1/J2/J3a/J3b, Ewald dipolar, field): E, C, S, M per temperature',
  run(input) {
    checkFields(input, SPIN_ICE_FIELDS);
    const options = readSpinIceRunInput(input);
    const { result, raw } = runSpinIceMonteCarlo(options);
    const ex = options.model.exchangeK ?? {};
    const scale = Math.max(Math.abs(ex.J1 ?? 0), Math.abs(ex.J2 ?? 0), Math.abs(ex.J3a ?? 0), Math.abs(ex.J3b ?? 0), (5 / 3) * raw.couplings.dipolarDK);
    return {
      temperaturesK: result.temperaturesK,
      numberOfSpins: result.numberOfSites,
      dipolarDK: raw.couplings.dipolarDK,
      energyKPerSpin: result.energyKPerSpin,
      energyErrorKPerSpin: result.energyErrorKPerSpin,
      heatCapacityJPerMolK: result.heatCapacityJPerMolK,
      heatCapacityErrorJPerMolK: result.heatCapacityErrorJPerMolK,
      entropyJPerMolK: result.entropyJPerMolK,
      magnetizationMuBPerSpin: result.magnetizationMuBPerSpin,
      magnetizationErrorMuBPerSpin: result.magnetizationErrorMuBPerSpin,
      orderParameter001: result.orderParameter001,
      acceptance: result.acceptance,
      warnings: spinIceWarnings(options, scale),
    };
  },
};
