/**
 * `multiplet lab install [--user | --prefix DIR]`: put the prebuilt extension where a user's own JupyterLab 4
 * finds it (`<data dir>/labextensions/@multiplet/lab`, the layout `jupyter labextension` uses for prebuilt
 * extensions) and the Multiplet kernelspec beside it (`<data dir>/kernels/multiplet`). No Python package and no
 * JupyterLab rebuild are needed: JupyterLab 4 loads prebuilt extensions from these directories at start.
 */
import { cpSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { buildKernelSpec, installKernelSpec, KERNEL_IDENTITY, userDataDir, type InstallTarget } from '@multiplet/kernel-bridge';

export const LAB_INSTALL_USAGE = 'multiplet lab install [--user | --prefix DIR]';

/** The Jupyter data directory of an install target (user: ~/.local/share/jupyter; prefix: DIR/share/jupyter). */
export function dataDir(target: InstallTarget): string {
  return target.kind === 'user' ? userDataDir() : join(resolve(target.prefix), 'share', 'jupyter');
}

export function parseLabInstallArgs(args: string[]): InstallTarget | string {
  let target: InstallTarget = { kind: 'user' };
  for (let i = 0; i < args.length; i++) {
    if (args[i] === '--user') target = { kind: 'user' };
    else if (args[i] === '--prefix') {
      const prefix = args[++i];
      if (!prefix) return '--prefix needs a directory';
      target = { kind: 'prefix', prefix };
    } else return `unknown option ${JSON.stringify(args[i])}`;
  }
  return target;
}

/** Copy the built extension and write the kernelspec; returns both directories. */
export function installLabExtension(repoRoot: string, cliPath: string, target: InstallTarget): { extensionDir: string; kernelDir: string } {
  const built = join(repoRoot, 'packages/lab/labextension');
  if (!existsSync(join(built, 'package.json'))) throw new Error(`the prebuilt extension is missing (${built}); run node packages/lab/scripts/build.mjs`);
  const extensionDir = join(dataDir(target), 'labextensions', '@multiplet', 'lab');
  rmSync(extensionDir, { recursive: true, force: true });
  mkdirSync(extensionDir, { recursive: true });
  cpSync(built, extensionDir, { recursive: true });
  const kernelDir = installKernelSpec(buildKernelSpec(process.execPath, cliPath, KERNEL_IDENTITY.implementationVersion), target);
  return { extensionDir, kernelDir };
}
