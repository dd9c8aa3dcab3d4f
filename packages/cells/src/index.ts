/**
 * @multiplet/cells: typed science cells, the shared sample state and its dependency graph.
 * Hosts use `createCellSession` (the CellSession contract of protocol.ts); kind authors use `defineKind` and the
 * schema types (packages/cells/README.md, "Adding a cell kind").
 */
export * from './protocol';
export { createCellSession, type MultipletSession, type CellSessionOptions, type RerunReport } from './session/session';
export { CONTROLS_TARGET, STATE_TARGET, stateSnapshot, type StateSnapshot } from './session/comms';
export { setFieldInSource } from './session/writeback';
export { CELL_KINDS, getKind, kindNames, defineKind, registerKind } from './kinds';
export type { CellKind, AnyCellKind, RunContext, RenderInfo, RenderedResult, SampleResult, DatasetResult } from './kinds';
export type { FieldSpec, Schema, ControlSpec } from './schema';
export { SampleState, STATE_FORMAT, STATE_VERSION, parseSavedState, type ResultRecord, type StateData } from './state';
export { CellError, type SourcePosition, type CellErrorName } from './errors';
export { canonicalJson, type JsonValue } from './json';
export { RESULT_MIME_TYPE, RESULT_MIME_VERSION, VEGALITE_MIME_TYPE, type ResultPayload, type ResultControl } from './mime';
export { parseQuantity, parseRange, convertValue, isKnownUnit } from './syntax/quantity';
export { splitCell } from './syntax/header';
export { CELLS_VERSION } from './version';
