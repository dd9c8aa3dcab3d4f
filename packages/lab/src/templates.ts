/**
 * Cell templates, one per cell kind, documented field by field. The kernel owns them (packages/cells knows each
 * kind's schema); the front end asks for them on the state comm and registers one `multiplet:insert-<kind>`
 * command per kind.
 */
import { NotebookActions, type NotebookPanel } from '@jupyterlab/notebook';
import type { SessionLink } from './links';

export interface CellTemplate {
  kind: string;
  /** One line saying what the kind does (palette caption). */
  summary: string;
  /** The full cell text: header `[kind] name`, then the body with a comment per field. */
  text: string;
}

/** Ask the kernel for the templates of every kind it knows. */
export async function fetchTemplates(link: SessionLink): Promise<CellTemplate[]> {
  const answer = await link.requestState({ type: 'templates' });
  const list = Array.isArray(answer.templates) ? answer.templates : [];
  return list
    .map((t) => t as Record<string, unknown>)
    .filter((t) => typeof t.kind === 'string' && typeof t.text === 'string')
    .map((t) => ({ kind: String(t.kind), summary: String(t.summary ?? ''), text: String(t.text) }));
}

/** Insert a code cell holding `text` below the active cell and select it, ready to edit or run. */
export function insertTemplate(panel: NotebookPanel, text: string): void {
  const notebook = panel.content;
  NotebookActions.insertBelow(notebook);
  const cell = notebook.activeCell;
  if (!cell) return;
  cell.model.sharedModel.setSource(text);
  notebook.mode = 'edit';
  cell.editor?.focus();
}
