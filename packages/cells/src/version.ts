/** The package version recorded in every result's provenance (from packages/cells/package.json). */
import pkg from '../package.json';

export const CELLS_VERSION: string = pkg.version;
export const CELLS_PACKAGE = `${pkg.name}@${pkg.version}`;
