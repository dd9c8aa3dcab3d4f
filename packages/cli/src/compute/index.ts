/**
 * The registry of `compute` kinds. Each kind is one module in this folder exporting a `ComputeKind`;
 * add one import line and one entry below. Input validation errors are `InputError`s (exit code 2).
 */
export interface ComputeKind {
  /** One line for `multiplet compute --help` and the README. */
  summary: string;
  run(input: Record<string, unknown>): unknown | Promise<unknown>;
}

import { crystalField } from './crystalField';
import { magnetization } from './magnetization';
import { susceptibility } from './susceptibility';
import { heatCapacity } from './heatCapacity';
import { entropy } from './entropy';
import { neutronSpectrum } from './neutronSpectrum';
import { cefFit } from './cefFit';
import { exchange } from './exchange';
import { spinIceMc } from './spinIceMc';
import { structureFactor } from './structureFactor';

export const COMPUTE_KINDS: Record<string, ComputeKind> = {
  'crystal-field': crystalField,
  magnetization,
  susceptibility,
  'heat-capacity': heatCapacity,
  entropy,
  exchange,
  'neutron-spectrum': neutronSpectrum,
  'cef-fit': cefFit,
  'spin-ice-mc': spinIceMc,
  'structure-factor': structureFactor,
};
