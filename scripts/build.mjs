// Bundles the runnable entry points with esbuild: the `multiplet` CLI (which also hosts the kernel) and every
// `*.worker.ts` module (Monte Carlo, fits) into packages/cli/dist/. Workspace packages are compiled from source;
// npm dependencies stay external and are resolved from node_modules at run time.
// Type checking is separate: `npm run typecheck` (tsc --noEmit over the whole workspace).
import * as esbuild from 'esbuild';
import { readdirSync, statSync, mkdirSync } from 'node:fs';
import { join, dirname, basename, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const outdir = join(root, 'packages/cli/dist');
mkdirSync(outdir, { recursive: true });

const workspaceSources = {
  '@multiplet/physics': 'packages/physics/src',
  '@multiplet/cells': 'packages/cells/src',
  '@multiplet/cli': 'packages/cli/src',
  '@multiplet/kernel-bridge': 'kernel-bridge/src',
};

/** Resolve @multiplet/* to TypeScript sources; leave every other bare import to Node at run time. */
const workspacePlugin = {
  name: 'multiplet-workspace',
  setup(build) {
    build.onResolve({ filter: /^@multiplet\// }, async (args) => {
      for (const [name, dir] of Object.entries(workspaceSources)) {
        if (args.path === name || args.path.startsWith(name + '/')) {
          const rest = args.path.slice(name.length).replace(/^\//, '');
          const target = rest ? join(root, dir, rest) : join(root, dir, 'index.ts');
          const r = await build.resolve('./' + basename(target), { resolveDir: dirname(target), kind: args.kind });
          return { path: r.path };
        }
      }
      return undefined;
    });
    build.onResolve({ filter: /^[^./]/ }, (args) => {
      if (args.path.startsWith('@multiplet/')) return undefined;
      return { path: args.path, external: true };
    });
  },
};

function findWorkers(dir, found = []) {
  for (const entry of readdirSync(dir)) {
    if (entry === 'node_modules' || entry === 'dist') continue;
    const p = join(dir, entry);
    if (statSync(p).isDirectory()) findWorkers(p, found);
    else if (entry.endsWith('.worker.ts')) found.push(p);
  }
  return found;
}

const workerEntries = Object.values(workspaceSources).flatMap((d) => findWorkers(join(root, d)));
const entryPoints = { multiplet: join(root, 'packages/cli/src/main.ts') };
for (const w of workerEntries) entryPoints[basename(w, '.ts')] = w;

const started = Date.now();
await esbuild.build({
  entryPoints,
  outdir,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  plugins: [workspacePlugin],
  banner: { js: "import { createRequire as __multipletCreateRequire } from 'module'; const require = __multipletCreateRequire(import.meta.url);" },
});
console.log(`build: ${Object.keys(entryPoints).length} entry points -> packages/cli/dist (${Date.now() - started} ms)`);
