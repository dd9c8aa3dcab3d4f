/**
 * `multiplet kernel install …` and `multiplet kernel start …`: the Jupyter kernel (kernel-bridge/) hosting the
 * cells session. See kernel/install.ts and kernel/start.ts.
 */
import { registerCommand } from './main';
import { installCommand, INSTALL_USAGE } from './kernel/install';
import { startCommand, START_USAGE } from './kernel/start';

export async function kernelCommand(args: string[]): Promise<number> {
  const [sub, ...rest] = args;
  if (sub === 'install') return installCommand(rest);
  if (sub === 'start') return startCommand(rest);
  const usage = `usage:\n  ${INSTALL_USAGE}\n  ${START_USAGE}\n`;
  if (sub === '--help' || sub === '-h' || sub === 'help') {
    process.stdout.write(usage);
    return 0;
  }
  process.stderr.write(`multiplet kernel: unknown subcommand ${sub ? JSON.stringify(sub) : '(none)'}\n${usage}`);
  return 2;
}

registerCommand('kernel', { summary: 'kernel install [--user | --prefix DIR] [--name NAME] | kernel start --connection-file FILE', main: kernelCommand });
