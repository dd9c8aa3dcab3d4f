/**
 * Cell templates, one per cell kind, documented field by field. They are made at build time from the cells
 * package's schemas (scripts/templates.mjs writes src/generated/kindTemplates.json), so each template matches
 * what the kernel of the same checkout accepts.
 */
import { NotebookActions, type NotebookPanel } from '@jupyterlab/notebook';
import kindTemplates from './generated/kindTemplates.json';

export interface CellTemplate {
  kind: string;
  /** One line saying what the kind does (palette caption). */
  summary: string;
  /** The full cell text: header `[kind] name`, a comment per field (doc, default, what it expects), the fields. */
  text: string;
}

export const CELL_TEMPLATES: readonly CellTemplate[] = kindTemplates;

/** Insert a code cell holding `text` below the active cell and put the cursor in it, ready to edit or run. */
export function insertTemplate(panel: NotebookPanel, text: string): void {
  const notebook = panel.content;
  NotebookActions.insertBelow(notebook);
  const cell = notebook.activeCell;
  if (!cell) return;
  cell.model.sharedModel.setSource(text);
  notebook.mode = 'edit';
  cell.editor?.focus();
}
