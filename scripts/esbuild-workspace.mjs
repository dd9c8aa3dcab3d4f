// The esbuild plugin that compiles @multiplet/* workspace packages from their TypeScript sources and leaves
// every other bare import external (resolved from node_modules at run time). Shared by build, bench and demo.
import { join, dirname, basename, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');

export const workspaceSources = {
  '@multiplet/physics': 'packages/physics/src',
  '@multiplet/cells': 'packages/cells/src',
  '@multiplet/cli': 'packages/cli/src',
  '@multiplet/kernel-bridge': 'kernel-bridge/src',
};

/** Resolve @multiplet/* to TypeScript sources; leave every other bare import to Node at run time. */
export const workspacePlugin = {
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


/** Options shared by every Node bundle of the project. */
export const nodeBundleOptions = {
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  plugins: [workspacePlugin],
  banner: { js: "import { createRequire as __multipletCreateRequire } from 'module'; const require = __multipletCreateRequire(import.meta.url);" },
};
