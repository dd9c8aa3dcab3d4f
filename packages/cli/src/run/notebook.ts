/**
 * Reading and writing nbformat 4 notebooks for the headless runner, and turning session outputs into nbformat
 * outputs exactly the way Jupyter's nbclient does (display ids update earlier outputs in place, clear_output with
 * wait clears before the next output), so that the runner and nbclient-through-the-kernel give the same outputs.
 */
import type { CellOutput, ExecuteOutcome, MimeBundle } from '@multiplet/cells';

export interface NotebookOutput {
  output_type: 'stream' | 'display_data' | 'execute_result' | 'error';
  [key: string]: unknown;
}

export interface NotebookCell {
  cell_type: 'code' | 'markdown' | 'raw';
  id?: string;
  source: string | string[];
  metadata: Record<string, unknown>;
  outputs?: NotebookOutput[];
  execution_count?: number | null;
  attachments?: unknown;
}

export interface Notebook {
  nbformat: number;
  nbformat_minor: number;
  metadata: Record<string, unknown>;
  cells: NotebookCell[];
}

export class NotebookError extends Error {}

export function sourceText(cell: NotebookCell): string {
  return Array.isArray(cell.source) ? cell.source.join('') : String(cell.source ?? '');
}

/** First non-blank line of a cell, for messages. */
export function firstLine(cell: NotebookCell): string {
  const line = sourceText(cell).split('\n').find((l) => l.trim() !== '') ?? '';
  return line.length > 60 ? line.slice(0, 57) + '...' : line;
}

export function parseNotebook(text: string, path: string): Notebook {
  let nb: unknown;
  try {
    nb = JSON.parse(text);
  } catch (error) {
    throw new NotebookError(`${path}: not a JSON notebook (${(error as Error).message})`);
  }
  const n = nb as Partial<Notebook>;
  if (typeof nb !== 'object' || nb === null || n.nbformat !== 4 || !Array.isArray(n.cells)) {
    throw new NotebookError(`${path}: got ${typeof nb === 'object' && nb ? `nbformat ${String(n.nbformat)}` : 'no notebook'}, expected an nbformat 4 notebook with a cells list`);
  }
  n.cells.forEach((cell, i) => {
    if (typeof cell !== 'object' || cell === null || !['code', 'markdown', 'raw'].includes(cell.cell_type)) {
      throw new NotebookError(`${path}: cell ${i}: got ${JSON.stringify(cell)?.slice(0, 40)}, expected a code, markdown or raw cell`);
    }
    if (typeof cell.source !== 'string' && !Array.isArray(cell.source)) throw new NotebookError(`${path}: cell ${i}: source must be text or a list of lines`);
  });
  return { nbformat: 4, nbformat_minor: typeof n.nbformat_minor === 'number' ? n.nbformat_minor : 0, metadata: (n.metadata as Record<string, unknown>) ?? {}, cells: n.cells as NotebookCell[] };
}

const CELL_ID = /^[a-zA-Z0-9-_]{1,64}$/;

/** Cell ids required by nbformat 4.5: keep valid unique ones, otherwise a deterministic `cell-<index>`. */
export function ensureCellIds(nb: Notebook): void {
  const seen = new Set<string>();
  nb.cells.forEach((cell, i) => {
    let id = typeof cell.id === 'string' && CELL_ID.test(cell.id) && !seen.has(cell.id) ? cell.id : `cell-${i}`;
    while (seen.has(id)) id = `${id}-x`;
    seen.add(id);
    cell.id = id;
  });
}

/** Outputs of one cell, accumulated as nbclient does. Shared display-id map across the whole notebook. */
export class OutputCollector {
  private readonly displayMap = new Map<string, { cell: number; index: number }[]>();
  private clearBeforeNext = new Set<number>();

  constructor(private readonly nb: Notebook) {}

  private updateDisplays(displayId: string, data: MimeBundle, metadata: Record<string, unknown>): void {
    for (const { cell, index } of this.displayMap.get(displayId) ?? []) {
      const output = this.nb.cells[cell]!.outputs![index];
      if (output) {
        output.data = data;
        output.metadata = metadata;
      }
    }
  }

  private clearCell(cellIndex: number): void {
    this.nb.cells[cellIndex]!.outputs = [];
    for (const [id, places] of this.displayMap) {
      const kept = places.filter((p) => p.cell !== cellIndex);
      if (kept.length) this.displayMap.set(id, kept);
      else this.displayMap.delete(id);
    }
  }

  private append(cellIndex: number, output: NotebookOutput, displayId?: string): void {
    if (this.clearBeforeNext.has(cellIndex)) {
      this.clearBeforeNext.delete(cellIndex);
      this.clearCell(cellIndex);
    }
    const outputs = (this.nb.cells[cellIndex]!.outputs ??= []);
    if (displayId) {
      const places = this.displayMap.get(displayId) ?? [];
      places.push({ cell: cellIndex, index: outputs.length });
      this.displayMap.set(displayId, places);
    }
    outputs.push(output);
  }

  /** An intermediate output of the session. */
  add(cellIndex: number, output: CellOutput): void {
    switch (output.type) {
      case 'stream':
        this.append(cellIndex, { output_type: 'stream', name: output.name, text: output.text });
        return;
      case 'display_data':
        if (output.displayId) this.updateDisplays(output.displayId, output.data, output.metadata);
        this.append(cellIndex, { output_type: 'display_data', data: output.data, metadata: output.metadata }, output.displayId);
        return;
      case 'update_display_data':
        this.updateDisplays(output.displayId, output.data, output.metadata);
        return;
      case 'clear_output':
        if (output.wait) this.clearBeforeNext.add(cellIndex);
        else this.clearCell(cellIndex);
        return;
    }
  }

  /** The execute reply: execute_result or error. */
  finish(cellIndex: number, outcome: ExecuteOutcome, executionCount: number): void {
    if (outcome.status === 'error') {
      this.append(cellIndex, { output_type: 'error', ename: outcome.ename, evalue: outcome.evalue, traceback: outcome.traceback });
      return;
    }
    if (!outcome.result) return;
    const { data, metadata, displayId } = outcome.result;
    if (displayId) this.updateDisplays(displayId, data, metadata);
    this.append(cellIndex, { output_type: 'execute_result', execution_count: executionCount, data, metadata }, displayId);
  }
}
