// Bundles scripts/demo/generate-data.ts with the workspace esbuild plugin (physics compiled from source) and runs it.
// Usage: node scripts/demo/generate-data.mjs [--check]
import * as esbuild from 'esbuild';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { root, nodeBundleOptions } from '../esbuild-workspace.mjs';

const dir = mkdtempSync(join(root, 'node_modules', '.demo-generate-'));
const outfile = join(dir, 'generate-data.mjs');
try {
  await esbuild.build({ ...nodeBundleOptions, sourcemap: false, entryPoints: [join(root, 'scripts/demo/generate-data.ts')], outfile });
  await import(pathToFileURL(outfile).href);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
