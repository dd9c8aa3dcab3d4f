/**
 * Start Debian's jupyter_server (`/usr/bin/python3 -m jupyter_server`, 1.23) for the standalone page: on
 * 127.0.0.1, with a token, a temporary root directory holding copies of the notebooks, the page and the prebuilt
 * extension as extra static files, and the Multiplet kernelspec on a private JUPYTER_PATH (the user's Jupyter
 * configuration is not read). Stopped by PID.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { copyFileSync, cpSync, existsSync, mkdirSync, mkdtempSync, rmSync, statSync, readdirSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { basename, join, resolve } from 'node:path';
import { buildKernelSpec, installKernelSpec, KERNEL_IDENTITY } from '@multiplet/kernel-bridge';

export const SYSTEM_PYTHON = '/usr/bin/python3';

export interface LabServerOptions {
  /** Repository root (holds packages/lab/page-dist). */
  repoRoot: string;
  /** The bundled CLI the kernelspec runs (`node CLI kernel start …`). */
  cliPath: string;
  /** Notebooks (.ipynb files, or directories copied whole with their data) for the server's root directory. */
  notebooks: string[];
  port?: number;
  token?: string;
  /** Keep the server's files here instead of a new temporary directory. */
  workDir?: string;
  /** Receives the server's output (default: dropped). */
  onOutput?: (text: string) => void;
  /** Aborting while the server starts stops it and removes the work directory (Ctrl+C during start-up). */
  signal?: AbortSignal;
}

export interface LabServer {
  url: string;
  token: string;
  port: number;
  rootDir: string;
  /** Page address for one notebook of the root directory. */
  pageUrl(notebook: string, theme?: 'light' | 'dark'): string;
  notebooks: string[];
  stop(): Promise<void>;
}

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolvePort(port));
    });
  });
}

function collectNotebooks(paths: string[]): string[] {
  const found: string[] = [];
  for (const path of paths) {
    if (!existsSync(path)) throw new Error(`no such notebook or directory: ${path}`);
    if (statSync(path).isDirectory()) {
      for (const entry of readdirSync(path).sort()) if (entry.endsWith('.ipynb')) found.push(join(path, entry));
    } else found.push(path);
  }
  return found;
}

async function waitForServer(url: string, token: string, child: ChildProcess, timeoutMs: number, signal?: AbortSignal): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let lastProblem = '';
  while (Date.now() < deadline) {
    if (signal?.aborted) throw new Error('stopped while jupyter_server was starting');
    if (child.exitCode !== null) throw new Error(`jupyter_server exited with code ${child.exitCode}${lastProblem ? ` (${lastProblem})` : ''}`);
    try {
      const response = await fetch(`${url}api/status`, { headers: { Authorization: `token ${token}` } });
      if (response.ok) return;
      lastProblem = `HTTP ${response.status}`;
    } catch (err) {
      lastProblem = err instanceof Error ? err.message : String(err);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`jupyter_server did not answer ${url}api/status within ${timeoutMs / 1000} s (${lastProblem})`);
}

export async function startLabServer(options: LabServerOptions): Promise<LabServer> {
  if (!existsSync(SYSTEM_PYTHON)) throw new Error(`${SYSTEM_PYTHON} not found: run scripts/setup-system.sh (Debian's jupyter-server)`);
  const pageDist = join(options.repoRoot, 'packages/lab/page-dist');
  if (!existsSync(join(pageDist, 'multiplet/index.html'))) throw new Error(`the page is not built: ${pageDist}/multiplet/index.html is missing`);
  const workDir = options.workDir ?? mkdtempSync(join(tmpdir(), 'multiplet-lab-'));
  const ownsWorkDir = options.workDir === undefined;
  const rootDir = join(workDir, 'notebooks');
  const jupyterPath = join(workDir, 'share/jupyter');
  for (const dir of [rootDir, jupyterPath, join(workDir, 'config'), join(workDir, 'runtime'), join(workDir, 'data')]) mkdirSync(dir, { recursive: true });
  // A directory comes whole (data files in subdirectories, read by `data` cells, keep their relative paths).
  for (const path of options.notebooks) {
    if (existsSync(path) && statSync(path).isDirectory()) cpSync(path, rootDir, { recursive: true });
  }
  const notebooks = collectNotebooks(options.notebooks).map((path) => {
    copyFileSync(path, join(rootDir, basename(path)));
    return basename(path);
  });
  installKernelSpec(buildKernelSpec(process.execPath, options.cliPath, KERNEL_IDENTITY.implementationVersion), { kind: 'prefix', prefix: workDir });

  const port = options.port ?? (await freePort());
  const token = options.token ?? randomBytes(24).toString('hex');
  const args = [
    '-m',
    'jupyter_server',
    '--ServerApp.ip=127.0.0.1',
    `--ServerApp.port=${port}`,
    '--ServerApp.port_retries=0',
    `--ServerApp.token=${token}`,
    `--ServerApp.root_dir=${rootDir}`,
    '--ServerApp.open_browser=False',
    `--ServerApp.extra_static_paths=${JSON.stringify([resolve(pageDist)])}`,
  ];
  if (process.getuid?.() === 0) args.push('--allow-root');
  const env = {
    ...process.env,
    JUPYTER_PATH: jupyterPath,
    JUPYTER_CONFIG_DIR: join(workDir, 'config'),
    JUPYTER_RUNTIME_DIR: join(workDir, 'runtime'),
    JUPYTER_DATA_DIR: join(workDir, 'data'),
    JUPYTER_PLATFORM_DIRS: '1',
  };
  const child = spawn(SYSTEM_PYTHON, args, { cwd: rootDir, env, stdio: ['ignore', 'pipe', 'pipe'] });
  const forward = (chunk: Buffer) => options.onOutput?.(chunk.toString());
  child.stdout?.on('data', forward);
  child.stderr?.on('data', forward);
  const url = `http://127.0.0.1:${port}/`;
  const stop = async () => {
    if (child.exitCode === null && child.pid !== undefined) {
      const exited = new Promise<void>((r) => child.once('exit', () => r()));
      process.kill(child.pid, 'SIGTERM');
      const timer = setTimeout(() => child.pid !== undefined && child.exitCode === null && process.kill(child.pid, 'SIGKILL'), 5000);
      await exited;
      clearTimeout(timer);
    }
    if (ownsWorkDir) rmSync(workDir, { recursive: true, force: true });
  };
  try {
    await waitForServer(url, token, child, 60_000, options.signal);
  } catch (err) {
    await stop();
    throw err;
  }
  return {
    url,
    token,
    port,
    rootDir,
    notebooks,
    pageUrl: (notebook, theme = 'light') =>
      `${url}static/multiplet/index.html?token=${token}&path=${encodeURIComponent(notebook)}${theme === 'dark' ? '&theme=dark' : ''}`,
    stop,
  };
}
