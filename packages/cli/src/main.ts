/**
 * The `multiplet` command. Each subcommand lives in its own module; this file only dispatches.
 *
 *   multiplet compute KIND FILE.json|-   one JSON object in, one JSON object out (see compute/)
 *   multiplet run NOTEBOOK.ipynb [...]   headless notebook runner on the embedded kernel
 *   multiplet kernel [install|start]     the Jupyter kernel (ZeroMQ)
 *   multiplet lab                        the standalone notebook page
 */
import { computeCommand } from './compute/command';

type Command = { summary: string; main(args: string[]): Promise<number> };

const COMMANDS: Record<string, Command> = {
  compute: { summary: 'compute KIND FILE.json|-  — run one computation, JSON in, JSON out', main: computeCommand },
};

/** Let other modules add subcommands (run, kernel, lab) without editing the dispatcher's logic. */
export function registerCommand(name: string, command: Command): void {
  COMMANDS[name] = command;
}

function usage(): string {
  const lines = Object.entries(COMMANDS).map(([name, c]) => `  multiplet ${c.summary.startsWith(name) ? c.summary : name + '  ' + c.summary}`);
  return ['usage:', ...lines].join('\n');
}

async function main(argv: string[]): Promise<number> {
  await import('./commands');
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    process.stdout.write(usage() + '\n');
    return name ? 0 : 2;
  }
  const command = COMMANDS[name];
  if (!command) {
    process.stderr.write(`multiplet: unknown command "${name}", expected one of: ${Object.keys(COMMANDS).join(', ')}\n`);
    return 2;
  }
  return command.main(rest);
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    process.stderr.write(`multiplet: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exitCode = 1;
  },
);
