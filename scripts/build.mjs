// Bundles the runnable entry points with esbuild: the `multiplet` CLI (which also hosts the kernel) and every
// `*.worker.ts` module (Monte Carlo, fits) into packages/cli/dist/. Workspace packages are compiled from source;
// npm dependencies stay external and are resolved from node_modules at run time.
// Type checking is separate: `npm run typecheck` (tsc --noEmit over the whole workspace).
import * as esbuild from 'esbuild';
import { readdirSync, statSync, mkdirSync } from 'node:fs';
import { join, basename } from 'node:path';
import { root, workspaceSources, nodeBundleOptions } from './esbuild-workspace.mjs';

function findWorkers(dir, found = []) {
  for (const entry of readdirSync(dir)) {
    if (entry === 'node_modules' || entry === 'dist') continue;
    const p = join(dir, entry);
    if (statSync(p).isDirectory()) findWorkers(p, found);
    else if (entry.endsWith('.worker.ts')) found.push(p);
  }
  return found;
}

const outdir = join(root, 'packages/cli/dist');
mkdirSync(outdir, { recursive: true });

const workerEntries = Object.values(workspaceSources).flatMap((d) => findWorkers(join(root, d)));
const entryPoints = { multiplet: join(root, 'packages/cli/src/main.ts') };
for (const w of workerEntries) entryPoints[basename(w, '.ts')] = w;

const started = Date.now();
await esbuild.build({
  entryPoints,
  outdir,
  ...nodeBundleOptions,
});
console.log(`build: ${Object.keys(entryPoints).length} entry points -> packages/cli/dist (${Date.now() - started} ms)`);
