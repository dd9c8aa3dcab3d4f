/**
 * The `multiplet run` command (registered by ../run.ts).
 *
 * `multiplet run NOTEBOOK.ipynb [--out EXECUTED.ipynb] [--allow-errors] [--check [--tolerance REL]]`
 *
 * Executes a notebook in-process with the same CellSession the Jupyter kernel hosts and writes an nbformat 4.5
 * notebook with the outputs (execution counts, display_data / execute_result / error / stream outputs, and cell
 * metadata `multiplet: { kind, name, inputs, seed, version }`). Exit status 1 names the failing cell.
 * `--check` recomputes every cell and reports, cell by cell, whether the stored outputs are reproduced (numbers to
 * a relative tolerance, default 1e-9; other text exactly after normalising line endings and trailing spaces).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { NotebookError, parseNotebook, firstLine, type Notebook, type NotebookOutput } from './notebook';
import { executeNotebook } from './execute';
import { compareOutputs, DEFAULT_RELATIVE_TOLERANCE } from './compare';

export const RUN_USAGE =
  'run NOTEBOOK.ipynb [--out EXECUTED.ipynb] [--allow-errors] [--check [--tolerance 1e-9]]  — execute a notebook headless';

interface RunOptions {
  notebook: string;
  out?: string;
  check: boolean;
  allowErrors: boolean;
  tolerance: number;
}

function parseArgs(args: string[]): RunOptions | string {
  const options: Partial<RunOptions> = { check: false, allowErrors: false, tolerance: DEFAULT_RELATIVE_TOLERANCE };
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg === '--out') {
      const value = args[++i];
      if (!value) return '--out needs a file name';
      options.out = value;
    } else if (arg === '--check') options.check = true;
    else if (arg === '--allow-errors') options.allowErrors = true;
    else if (arg === '--tolerance') {
      const value = Number(args[++i]);
      if (!Number.isFinite(value) || value < 0 || value >= 1) return `--tolerance: got ${JSON.stringify(args[i])}, expected a relative tolerance such as 1e-9`;
      options.tolerance = value;
    } else if (arg.startsWith('-')) return `unknown option ${arg}`;
    else if (options.notebook === undefined) options.notebook = arg;
    else return `got a second notebook ${JSON.stringify(arg)}, expected one`;
  }
  if (!options.notebook) return 'expected a notebook file';
  return options as RunOptions;
}

/** Serialize as Jupyter does: one-space indent, keys sorted, trailing newline. */
export function notebookJson(nb: Notebook): string {
  const sort = (value: unknown): unknown => {
    if (Array.isArray(value)) return value.map(sort);
    if (value && typeof value === 'object') {
      return Object.fromEntries(Object.keys(value).sort().map((k) => [k, sort((value as Record<string, unknown>)[k])]));
    }
    return value;
  };
  return JSON.stringify(sort(nb), null, 1) + '\n';
}

export async function runCommand(args: string[]): Promise<number> {
  const options = parseArgs(args);
  if (typeof options === 'string') {
    process.stderr.write(`multiplet run: ${options}\nusage: multiplet ${RUN_USAGE}\n`);
    return 2;
  }
  let input: Notebook;
  try {
    input = parseNotebook(readFileSync(options.notebook, 'utf8'), options.notebook);
  } catch (error) {
    process.stderr.write(`multiplet run: ${error instanceof NotebookError ? error.message : `cannot read ${options.notebook}: ${(error as Error).message}`}\n`);
    return 2;
  }
  const executed = await executeNotebook(input, options.notebook, { allowErrors: options.allowErrors || options.check });
  if (options.out) writeFileSync(options.out, notebookJson(executed.notebook));

  if (options.check) return reportCheck(input, executed.notebook, options.tolerance);

  for (const failure of executed.failures) {
    process.stderr.write(`multiplet run: cell ${failure.index} (${failure.firstLine}) failed: ${failure.ename}: ${failure.evalue}\n`);
  }
  const skipped = executed.failures.length && !options.allowErrors ? '; stopped at the first failing cell' : '';
  process.stdout.write(
    `${options.notebook}: ${executed.executed} code cells executed, ${executed.failures.length} failed${skipped}${options.out ? `; wrote ${options.out}` : ''}\n`,
  );
  return executed.failures.length ? 1 : 0;
}

function reportCheck(stored: Notebook, fresh: Notebook, tolerance: number): number {
  let differences = 0;
  let checked = 0;
  stored.cells.forEach((cell, index) => {
    if (cell.cell_type !== 'code') return;
    const label = `cell ${index} (${firstLine(cell) || 'empty'})`;
    const before = (cell.outputs ?? []) as NotebookOutput[];
    const after = (fresh.cells[index]!.outputs ?? []) as NotebookOutput[];
    if (firstLine(cell) === '') return;
    checked++;
    if (cell.execution_count === null || cell.execution_count === undefined) {
      if (before.length === 0) {
        differences++;
        process.stdout.write(`${label}: DIFFERS: not executed in the stored notebook\n`);
        return;
      }
    }
    const difference = compareOutputs(before, after, tolerance);
    if (difference) {
      differences++;
      process.stdout.write(`${label}: DIFFERS: ${difference}\n`);
    } else process.stdout.write(`${label}: reproduced\n`);
  });
  process.stdout.write(
    `check: ${checked - differences} of ${checked} code cells reproduced (numbers to relative tolerance ${tolerance}, text exact)\n`,
  );
  return differences ? 1 : 0;
}
