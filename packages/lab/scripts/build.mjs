// Builds packages/lab in three steps, each skipped when its inputs did not change (content hashes in
// page-dist/.build-stamps.json), so `npx multiplet lab` and the browser tests build once:
//   0. templates: the cells package's kind schemas -> src/generated/kindTemplates.json (scripts/templates.mjs)
//   1. tsc: src/ -> lib/ (the extension as JavaScript, what @jupyterlab/builder reads)
//   2. @jupyterlab/builder: lib/, schema/, style/ -> labextension/ (the prebuilt federated extension users install)
//   3. esbuild: page/ -> page-dist/multiplet/ (the standalone page) + a copy of labextension/ it loads at run time
import { createHash } from 'node:crypto';
import { execFileSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync, copyFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import * as esbuild from 'esbuild';
import { writeTemplates } from './templates.mjs';

const lab = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const root = resolve(lab, '../..');
const pageOut = join(lab, 'page-dist/multiplet');
const stampFile = join(lab, 'page-dist/.build-stamps.json');
const force = process.argv.includes('--force');
const quiet = process.argv.includes('--quiet');
const log = (text) => quiet || console.log(`lab build: ${text}`);

function files(dir, found = []) {
  if (!existsSync(dir)) return found;
  for (const entry of readdirSync(dir).sort()) {
    const path = join(dir, entry);
    if (statSync(path).isDirectory()) files(path, found);
    else found.push(path);
  }
  return found;
}

function hashOf(paths) {
  const hash = createHash('sha256');
  for (const path of paths.flatMap((p) => (existsSync(p) && statSync(p).isDirectory() ? files(p) : [p]))) {
    hash.update(relative(lab, path));
    if (existsSync(path)) hash.update(readFileSync(path));
  }
  return hash.digest('hex');
}

const stamps = existsSync(stampFile) ? JSON.parse(readFileSync(stampFile, 'utf8')) : {};
async function step(name, inputs, outputs, run) {
  const hash = hashOf(inputs);
  if (!force && stamps[name] === hash && outputs.every((o) => existsSync(o))) {
    log(`${name}: up to date`);
    return;
  }
  const started = Date.now();
  await run();
  stamps[name] = hash;
  mkdirSync(dirname(stampFile), { recursive: true });
  writeFileSync(stampFile, JSON.stringify(stamps, null, 2));
  log(`${name}: built in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}

const node = process.execPath;

/** Run a build tool; its output is shown only when it fails (the builder prints pages of license warnings). */
function run(args) {
  try {
    execFileSync(node, args, { cwd: lab, stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 64 * 1024 * 1024 });
  } catch (error) {
    process.stderr.write(String(error.stdout ?? '') + String(error.stderr ?? ''));
    throw new Error(`lab build: ${args.slice(0, 2).join(' ')} failed`);
  }
}
const bin = (pkg, path) => join(root, 'node_modules', pkg, path);

await step('templates', [join(root, 'packages/cells/src'), join(lab, 'scripts/templates.mjs')], [join(lab, 'src/generated/kindTemplates.json')], writeTemplates);

await step('tsc', [join(lab, 'src'), join(lab, 'tsconfig.json')], [join(lab, 'lib/index.js')], () => {
  run([bin('typescript', 'bin/tsc'), '-p', join(lab, 'tsconfig.json')]);
});

await step(
  'labextension',
  [join(lab, 'lib'), join(lab, 'schema'), join(lab, 'style'), join(lab, 'core-meta'), join(lab, 'package.json')],
  [join(lab, 'labextension/package.json')],
  () => {
    run([bin('@jupyterlab/builder', 'lib/build-labextension.js'), '--core-path', join(lab, 'core-meta'), lab]);
  },
);

/** The versions of the shared singletons this page provides, checked against core-meta/package.json. */
function sharedVersions() {
  const core = JSON.parse(readFileSync(join(lab, 'core-meta/package.json'), 'utf8'));
  const federation = readFileSync(join(lab, 'page/federation.ts'), 'utf8');
  const provided = [...federation.matchAll(/^\s+'(@[\w-]+\/[\w-]+)': \w+,$/gm)].map((m) => m[1]).sort();
  const expected = Object.keys(core.dependencies).sort();
  if (JSON.stringify(provided) !== JSON.stringify(expected)) {
    throw new Error(`page/federation.ts provides [${provided}] but core-meta/package.json lists [${expected}]`);
  }
  return Object.fromEntries(expected.map((name) => [name, JSON.parse(readFileSync(join(root, 'node_modules', name, 'package.json'), 'utf8')).version]));
}

/** JupyterLab CSS imports packages as `~@scope/pkg/...`; SVG in CSS becomes a data URL, SVG in JS a string. */
const jupyterAssets = {
  name: 'jupyter-assets',
  setup(build) {
    build.onResolve({ filter: /^~/ }, (args) => build.resolve(args.path.slice(1), { resolveDir: args.resolveDir, kind: args.kind }));
    build.onResolve({ filter: /\.svg$/ }, async (args) => {
      if (args.kind !== 'url-token' || args.pluginData === 'svg') return undefined;
      const target = args.path.startsWith('~') ? args.path.slice(1) : args.path;
      const resolved = await build.resolve(target, { resolveDir: args.resolveDir, kind: args.kind, pluginData: 'svg' });
      return { path: resolved.path, namespace: 'svg-url' };
    });
    build.onLoad({ filter: /.*/, namespace: 'svg-url' }, (args) => ({ contents: readFileSync(args.path), loader: 'dataurl' }));
  },
};

await step(
  'page',
  [join(lab, 'page'), join(lab, 'labextension'), join(lab, 'core-meta'), join(lab, 'scripts/build.mjs')],
  [join(pageOut, 'page.js'), join(pageOut, 'index.html')],
  async () => {
    rmSync(pageOut, { recursive: true, force: true });
    mkdirSync(pageOut, { recursive: true });
    const common = {
      bundle: true,
      minify: true,
      sourcemap: false,
      logLevel: 'warning',
      outdir: pageOut,
      plugins: [jupyterAssets],
      loader: { '.svg': 'text', '.woff': 'file', '.woff2': 'file', '.ttf': 'file', '.eot': 'file', '.png': 'file', '.gif': 'file' },
      assetNames: 'assets/[name]-[hash]',
    };
    await esbuild.build({
      ...common,
      entryPoints: { page: join(lab, 'page/main.ts') },
      format: 'esm',
      splitting: true,
      chunkNames: 'chunks/[name]-[hash]',
      target: 'es2022',
      platform: 'browser',
      define: {
        'process.env.NODE_ENV': '"production"',
        global: 'globalThis',
        MULTIPLET_SHARED_VERSIONS: JSON.stringify(sharedVersions()),
      },
      banner: { js: "var process = globalThis.process || { env: { NODE_ENV: 'production' }, cwd: () => '/', platform: 'browser' };" },
    });
    await esbuild.build({
      ...common,
      entryPoints: {
        page: join(lab, 'page/page.css'),
        'theme-light': join(lab, 'page/theme-light.css'),
        'theme-dark': join(lab, 'page/theme-dark.css'),
      },
    });
    copyFileSync(join(lab, 'page/index.html'), join(pageOut, 'index.html'));
    cpSync(join(lab, 'labextension'), join(pageOut, 'labextension'), { recursive: true });
  },
);
