/**
 * MIME types of cell outputs. The result JSON is documented in packages/cells/README.md ("Result MIME type").
 */
import type { JsonValue } from './json';

/** Multiplet's own result JSON, versioned; rendered by the JupyterLab extension as interactive widgets. */
export const RESULT_MIME_TYPE = 'application/vnd.multiplet.result+json';
/** Vega-Lite 5: the newest version JupyterLab 4 renders natively. */
export const VEGALITE_MIME_TYPE = 'application/vnd.vegalite.v5+json';
/** Version of the RESULT_MIME_TYPE payload. Bump on an incompatible change; additions keep the number. */
export const RESULT_MIME_VERSION = 1;

/** A live-editable numeric input, for sliders. Values are in `unit` (the schema's unit). */
export interface ResultControl {
  /** Field path in the cell body, e.g. "B.B20" or "temperature". */
  field: string;
  label: string;
  unit: string;
  value: number;
  min: number;
  max: number;
  step: number;
}

export interface ResultPayload {
  version: typeof RESULT_MIME_VERSION;
  kind: string;
  name: string;
  /** Normalized inputs (numbers in the schema's units). */
  inputs: JsonValue;
  result: JsonValue;
  provenance: {
    kind: string;
    /** The body as written in the cell. */
    inputsGiven: JsonValue;
    seed: number;
    /** "@multiplet/cells@<version>". */
    package: string;
    /** Names of the results this one read. */
    reads: string[];
  };
  stale: boolean;
  controls?: ResultControl[];
}
