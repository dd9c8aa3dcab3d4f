/**
 * `multiplet kernel install [--user | --prefix DIR] [--name NAME]`: write the kernelspec that points Jupyter at
 * this bundled CLI (see kernel-bridge/src/kernelspec.ts). Default: the user's Jupyter data directory.
 */
import { fileURLToPath } from 'node:url';
import { buildKernelSpec, installKernelSpec, DEFAULT_KERNEL_NAME, KERNEL_IDENTITY, type InstallTarget } from '@multiplet/kernel-bridge';

export const INSTALL_USAGE = 'multiplet kernel install [--user | --prefix DIR] [--name NAME]';

export interface InstallArgs {
  target: InstallTarget;
  name: string;
}

/** Parse install flags; returns an error message for bad flags. */
export function parseInstallArgs(args: string[]): InstallArgs | string {
  let target: InstallTarget | undefined;
  let name = DEFAULT_KERNEL_NAME;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    const [flag, inline] = arg.startsWith('--') && arg.includes('=') ? [arg.slice(0, arg.indexOf('=')), arg.slice(arg.indexOf('=') + 1)] : [arg, undefined];
    const value = () => inline ?? args[++i];
    if (flag === '--user') {
      if (target && target.kind !== 'user') return '--user and --prefix exclude each other';
      target = { kind: 'user' };
    } else if (flag === '--prefix') {
      if (target?.kind === 'user') return '--user and --prefix exclude each other';
      const prefix = value();
      if (!prefix) return '--prefix needs a directory';
      target = { kind: 'prefix', prefix };
    } else if (flag === '--name') {
      const given = value();
      if (!given) return '--name needs a kernel name';
      name = given;
    } else return `unknown option ${JSON.stringify(arg)}`;
  }
  return { target: target ?? { kind: 'user' }, name };
}

export function installCommand(args: string[]): number {
  const parsed = parseInstallArgs(args);
  if (typeof parsed === 'string') {
    process.stderr.write(`multiplet kernel install: ${parsed}\nusage: ${INSTALL_USAGE}\n`);
    return 2;
  }
  // In the bundle, import.meta.url is packages/cli/dist/multiplet.js: the kernel runs from the bundle.
  const cliPath = fileURLToPath(import.meta.url);
  const spec = buildKernelSpec(process.execPath, cliPath, KERNEL_IDENTITY.implementationVersion);
  try {
    const dir = installKernelSpec(spec, parsed.target, parsed.name);
    process.stdout.write(`installed kernelspec "${parsed.name}" in ${dir}\n`);
    return 0;
  } catch (err) {
    process.stderr.write(`multiplet kernel install: ${err instanceof Error ? err.message : String(err)}\n`);
    return 1;
  }
}
