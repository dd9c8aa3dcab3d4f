/**
 * `multiplet lab [NOTEBOOK|DIR ...] [--port N] [--token T] [--no-build]`: build the standalone notebook page and
 * the prebuilt extension once (packages/lab/scripts/build.mjs skips what is up to date), start Debian's
 * jupyter_server on 127.0.0.1 with a token over a temporary copy of the notebooks (default: notebooks-demo/),
 * print one page address per notebook, and run until Ctrl+C. `multiplet lab install [--user | --prefix DIR]`
 * installs the prebuilt extension and the kernelspec for a user's own JupyterLab 4. See packages/lab/README.md.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { registerCommand } from './main';
import { installLabExtension, LAB_INSTALL_USAGE, parseLabInstallArgs } from './lab/install';
import { startLabServer } from './lab/server';

export const LAB_USAGE = 'multiplet lab [NOTEBOOK.ipynb|DIR ...] [--port N] [--token TOKEN] [--no-build]';

/** In the bundle, import.meta.url is packages/cli/dist/multiplet.js. */
function repoRoot(): string {
  return resolve(dirname(fileURLToPath(import.meta.url)), '../../..');
}

function buildLab(root: string): boolean {
  const result = spawnSync(process.execPath, [join(root, 'packages/lab/scripts/build.mjs')], { stdio: 'inherit' });
  if (result.status === 0) return true;
  process.stderr.write('multiplet lab: building the page and the prebuilt extension failed\n');
  return false;
}

function installCommand(args: string[]): number {
  const target = parseLabInstallArgs(args);
  if (typeof target === 'string') {
    process.stderr.write(`multiplet lab install: ${target}\nusage: ${LAB_INSTALL_USAGE}\n`);
    return 2;
  }
  const root = repoRoot();
  if (!buildLab(root)) return 1;
  const { extensionDir, kernelDir } = installLabExtension(root, join(root, 'packages/cli/dist/multiplet.js'), target);
  process.stdout.write(`multiplet lab install: prebuilt extension in ${extensionDir}\nmultiplet lab install: kernelspec in ${kernelDir}\n`);
  return 0;
}

export async function labCommand(args: string[]): Promise<number> {
  if (args[0] === 'install') return installCommand(args.slice(1));
  const notebooks: string[] = [];
  let port: number | undefined;
  let token: string | undefined;
  let build = true;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (arg === undefined) continue;
    if (arg === '--port') port = Number(args[++i]);
    else if (arg === '--token') token = args[++i];
    else if (arg === '--no-build') build = false;
    else if (arg === '--help' || arg === '-h') {
      process.stdout.write(`usage: ${LAB_USAGE}\n       ${LAB_INSTALL_USAGE}\n`);
      return 0;
    } else if (arg.startsWith('--')) {
      process.stderr.write(`multiplet lab: unknown option ${arg}\nusage: ${LAB_USAGE}\n`);
      return 2;
    } else notebooks.push(resolve(arg));
  }
  if (port !== undefined && !(Number.isInteger(port) && port > 0 && port < 65536)) {
    process.stderr.write(`multiplet lab: --port needs a port number (1-65535)\n`);
    return 2;
  }
  const root = repoRoot();
  if (build && !buildLab(root)) return 1;
  if (notebooks.length === 0) notebooks.push(join(root, 'notebooks-demo'));
  const cliPath = join(root, 'packages/cli/dist/multiplet.js');
  if (!existsSync(cliPath)) {
    process.stderr.write('multiplet lab: the CLI bundle is missing; run `npm run build`\n');
    return 1;
  }
  // Ctrl+C (or SIGTERM) at any time, start-up included, stops the server and removes its temporary directory.
  const stopRequested = new AbortController();
  const onSignal = () => stopRequested.abort();
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  let server;
  try {
    server = await startLabServer({
      repoRoot: root,
      cliPath,
      notebooks,
      port,
      token,
      signal: stopRequested.signal,
      onOutput: process.env.MULTIPLET_LAB_VERBOSE ? (text) => process.stderr.write(text) : undefined,
    });
  } catch (err) {
    if (stopRequested.signal.aborted) return 130;
    throw err;
  }
  process.stdout.write(`multiplet lab: jupyter_server on ${server.url} (root ${server.rootDir})\n`);
  if (server.notebooks.length === 0) process.stdout.write('multiplet lab: no notebooks found\n');
  for (const notebook of server.notebooks) process.stdout.write(`multiplet lab: ${server.pageUrl(notebook)}\n`);
  process.stdout.write('multiplet lab: Ctrl+C stops the server\n');
  if (!stopRequested.signal.aborted) await new Promise((resolveStop) => stopRequested.signal.addEventListener('abort', resolveStop, { once: true }));
  await server.stop();
  return 0;
}

registerCommand('lab', {
  summary: `${LAB_USAGE.replace('multiplet ', '')}  — the standalone notebook page; lab install [--user | --prefix DIR]  — the extension for your JupyterLab 4`,
  main: labCommand,
});
