/**
 * The registry of cell kinds. Each kind is one module in this folder exporting a `CellKind` (see types.ts and
 * packages/cells/README.md, "Adding a cell kind"); add one import line and one entry in KINDS below.
 */
import type { AnyCellKind } from './types';
import { sampleKind } from './sample';
import { dataKind } from './data';
import { crystalFieldKind } from './crystalField';

const KINDS: AnyCellKind[] = [sampleKind, dataKind, crystalFieldKind];

/** Every registered kind by name. */
export const CELL_KINDS: ReadonlyMap<string, AnyCellKind> = new Map(KINDS.map((k) => [k.kind, k]));

/** Look up a kind by its header name. */
export function getKind(name: string): AnyCellKind | undefined {
  return CELL_KINDS.get(name);
}

export function kindNames(): string[] {
  return [...CELL_KINDS.keys()].sort();
}

export type { CellKind, AnyCellKind, RunContext, RenderInfo, RenderedResult, SampleResult, DatasetResult } from './types';
export { defineKind } from './types';
