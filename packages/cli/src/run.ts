/**
 * Registers `multiplet run NOTEBOOK.ipynb [--out EXECUTED.ipynb] [--allow-errors] [--check [--tolerance REL]]`:
 * the headless runner on the embedded cells session (implementation in run/command.ts).
 */
import { registerCommand } from './main';
import { runCommand, RUN_USAGE } from './run/command';

registerCommand('run', { summary: RUN_USAGE, main: runCommand });
