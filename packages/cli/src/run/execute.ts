/**
 * Execute a notebook in-process with the same CellSession the kernel hosts. Mirrors nbclient: markdown/raw cells
 * untouched, code cells with only whitespace skipped, execution counts 1, 2, ... for executed cells, stop at the
 * first error unless allowErrors.
 */
import { dirname, resolve } from 'node:path';
import { createCellSession, splitCell, CELLS_VERSION, type MultipletSession } from '@multiplet/cells';
import { OutputCollector, ensureCellIds, firstLine, sourceText, type Notebook } from './notebook';

export interface CellFailure {
  index: number;
  firstLine: string;
  ename: string;
  evalue: string;
}

export interface ExecutedNotebook {
  notebook: Notebook;
  failures: CellFailure[];
  session: MultipletSession;
  executed: number;
}

export async function executeNotebook(input: Notebook, notebookPath: string, options: { allowErrors?: boolean } = {}): Promise<ExecutedNotebook> {
  const nb: Notebook = JSON.parse(JSON.stringify(input)) as Notebook;
  nb.nbformat = 4;
  nb.nbformat_minor = Math.max(5, nb.nbformat_minor);
  ensureCellIds(nb);
  const session = createCellSession({ notebookDir: dirname(resolve(notebookPath)) });
  nb.metadata = { ...nb.metadata, language_info: session.languageInfo() };
  const collector = new OutputCollector(nb);
  const failures: CellFailure[] = [];
  let count = 0;
  for (let index = 0; index < nb.cells.length; index++) {
    const cell = nb.cells[index]!;
    if (cell.cell_type !== 'code') continue;
    cell.outputs = [];
    cell.execution_count = null;
    if (cell.metadata && typeof cell.metadata === 'object') delete cell.metadata.multiplet;
    else cell.metadata = {};
    const code = sourceText(cell);
    if (code.trim() === '') continue;
    if (failures.length && !options.allowErrors) continue;
    count++;
    cell.execution_count = count;
    const outcome = await session.execute(code, {
      emit: (output) => collector.add(index, output),
      executionCount: count,
      cellId: cell.id,
    });
    collector.finish(index, outcome, count);
    cell.metadata.multiplet = cellProvenance(session, code);
    if (outcome.status === 'error') failures.push({ index, firstLine: firstLine(cell), ename: outcome.ename, evalue: outcome.evalue });
  }
  return { notebook: nb, failures, session, executed: count };
}

/** Cell metadata recording what the cell computed: kind, name, inputs, seed and package version. */
function cellProvenance(session: MultipletSession, code: string): Record<string, unknown> {
  let split;
  try {
    split = splitCell(code);
  } catch {
    return { version: CELLS_VERSION, kind: 'invalid' };
  }
  if (split.type === 'script') return { version: CELLS_VERSION, kind: 'script' };
  const record = session.state.get(split.header.name);
  if (!record || record.source !== code) return { version: CELLS_VERSION, kind: split.header.kind, name: split.header.name };
  return { version: record.version, kind: record.kind, name: record.name, seed: record.seed, inputs: record.inputsGiven };
}
