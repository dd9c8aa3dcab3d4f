/**
 * The registry of cell kinds. Each kind is one module in this folder exporting a `CellKind` (see types.ts and
 * packages/cells/README.md, "Adding a cell kind"); add one import line and one entry in KINDS below.
 */
import type { AnyCellKind } from './types';
import { sampleKind } from './sample';
import { dataKind } from './data';
import { crystalFieldKind } from './crystalField';
import { exchangeKind } from './exchange';
import { neutronSpectrumKind } from './neutronSpectrum';
import { cefFitKind } from './cefFit';
import { pointChargeKind } from './pointCharge';
import { magnetizationKind } from './magnetization';
import { susceptibilityKind } from './susceptibility';
import { heatCapacityKind } from './heatCapacity';
import { heatCapacityReductionKind } from './heatCapacityReduction';
import { curieWeissFitKind } from './curieWeissFit';
import { spinIceMcKind } from './spinIceMc';
import { structureFactorKind } from './structureFactor';
import { mcFitKind } from './mcFit';

const KINDS: AnyCellKind[] = [sampleKind, dataKind, crystalFieldKind, exchangeKind, neutronSpectrumKind, cefFitKind, pointChargeKind, magnetizationKind, susceptibilityKind, heatCapacityKind, heatCapacityReductionKind, curieWeissFitKind, spinIceMcKind, structureFactorKind, mcFitKind];

const REGISTRY = new Map(KINDS.map((k) => [k.kind, k]));

/** Every registered kind by name. */
export const CELL_KINDS: ReadonlyMap<string, AnyCellKind> = REGISTRY;

/**
 * Add a kind at run time (tests, or a package that extends Multiplet). Kinds of this repository are listed in
 * KINDS above instead. Refuses a bad or already used name.
 */
export function registerKind(kind: AnyCellKind): void {
  if (!/^[a-z][a-z0-9]*(?:-[a-z0-9]+)*$/.test(kind.kind)) throw new Error(`registerKind: "${kind.kind}" is not a lower-case hyphenated kind name`);
  if (REGISTRY.has(kind.kind)) throw new Error(`registerKind: a kind named "${kind.kind}" is already registered`);
  REGISTRY.set(kind.kind, kind);
}

/** Look up a kind by its header name. */
export function getKind(name: string): AnyCellKind | undefined {
  return CELL_KINDS.get(name);
}

export function kindNames(): string[] {
  return [...CELL_KINDS.keys()].sort();
}

export type { CellKind, AnyCellKind, RunContext, RenderInfo, RenderedResult, SampleResult, DatasetResult } from './types';
export { defineKind } from './types';
