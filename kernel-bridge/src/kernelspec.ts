/**
 * Kernelspec installation: a `kernels/<name>/kernel.json` under a Jupyter data directory, found by
 * `jupyter kernelspec list` (jupyter_core's path rules: the user data dir, `<prefix>/share/jupyter`, JUPYTER_PATH).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join, resolve } from 'node:path';

export const DEFAULT_KERNEL_NAME = 'multiplet';

export interface KernelSpec {
  argv: string[];
  display_name: string;
  language: string;
  interrupt_mode: 'message' | 'signal';
  env?: Record<string, string>;
  metadata: Record<string, unknown>;
}

/** kernel.json for a kernel started as `node CLI kernel start --connection-file {connection_file}`. */
export function buildKernelSpec(nodePath: string, cliPath: string, version: string): KernelSpec {
  return {
    argv: [nodePath, cliPath, 'kernel', 'start', '--connection-file', '{connection_file}'],
    display_name: 'Multiplet',
    language: 'multiplet-cells',
    interrupt_mode: 'message',
    metadata: { debugger: false, multiplet: { version, protocol: 'jupyter-messaging-5.3' } },
  };
}

/** The user's Jupyter data directory, as jupyter_core computes it on Linux. */
export function userDataDir(env: NodeJS.ProcessEnv = process.env): string {
  if (env.JUPYTER_DATA_DIR) return resolve(env.JUPYTER_DATA_DIR);
  const xdg = env.XDG_DATA_HOME || join(env.HOME || homedir(), '.local', 'share');
  return join(xdg, 'jupyter');
}

export type InstallTarget = { kind: 'user' } | { kind: 'prefix'; prefix: string };

/** Directory that will hold kernel.json. */
export function kernelSpecDir(target: InstallTarget, name: string, env: NodeJS.ProcessEnv = process.env): string {
  const base = target.kind === 'user' ? userDataDir(env) : join(resolve(target.prefix), 'share', 'jupyter');
  return join(base, 'kernels', name);
}

export class KernelNameError extends Error {
  constructor(readonly given: string) {
    super(`kernel name "${given}": expected letters, digits, ".", "_" or "-" (jupyter_client's rule)`);
    this.name = 'KernelNameError';
  }
}

/** Write kernel.json; returns its directory. */
export function installKernelSpec(spec: KernelSpec, target: InstallTarget, name = DEFAULT_KERNEL_NAME, env: NodeJS.ProcessEnv = process.env): string {
  if (!/^[a-z0-9._-]+$/i.test(name)) throw new KernelNameError(name);
  const dir = kernelSpecDir(target, name, env);
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'kernel.json'), JSON.stringify(spec, null, 2) + '\n');
  return dir;
}
