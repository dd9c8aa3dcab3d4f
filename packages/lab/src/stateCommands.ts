/** The sample-state commands: rerun the stale cells, save and load the state file, refresh the panel. */
import { InputDialog, showErrorMessage } from '@jupyterlab/apputils';
import { NotebookActions, type NotebookPanel } from '@jupyterlab/notebook';
import type { CommandRegistry } from '@lumino/commands';
import { CommandIDs } from './commandIds';
import type { NotebookLinks } from './links';
import { findResultCell } from './statePanel';

/** The state file name offered by save and load (relative to the notebook's directory, where the kernel runs). */
export const DEFAULT_STATE_FILE = 'sample-state.json';

/** Rerun, in notebook order, the cells whose results are stale; returns how many cells ran. */
export async function rerunStaleCells(links: NotebookLinks, panel: NotebookPanel): Promise<number> {
  const link = links.linkFor(panel);
  const snapshot = link.snapshot ?? (await link.refreshState());
  const stale = snapshot?.results.filter((r) => r.stale) ?? [];
  const indices = [...new Set(stale.map((r) => findResultCell(panel, r.name, r.cellId)?.index).filter((i): i is number => i !== undefined))];
  indices.sort((a, b) => a - b);
  const notebook = panel.content;
  for (const index of indices) {
    notebook.deselectAll();
    notebook.activeCellIndex = index;
    const ok = await NotebookActions.run(notebook, panel.sessionContext);
    if (!ok) break;
  }
  await link.refreshState();
  return indices.length;
}

export function addStateCommands(commands: CommandRegistry, links: NotebookLinks): void {
  const current = (): NotebookPanel | null => links.tracker.currentWidget;
  const isEnabled = () => current() !== null;
  const report = (title: string) => (reason: unknown) => showErrorMessage(title, reason instanceof Error ? reason.message : String(reason));

  commands.addCommand(CommandIDs.rerunStale, {
    label: 'Rerun Stale Multiplet Cells',
    caption: 'Run again, in order, every cell whose result is marked stale in the sample state',
    isEnabled,
    execute: async () => {
      const panel = current();
      if (panel) await rerunStaleCells(links, panel).catch(report('Rerun stale cells'));
    },
  });
  commands.addCommand(CommandIDs.refreshState, {
    label: 'Refresh Sample State',
    isEnabled,
    execute: async () => {
      const panel = current();
      if (panel) await links.linkFor(panel).refreshState().catch(report('Refresh the sample state'));
    },
  });
  commands.addCommand(CommandIDs.saveState, {
    label: 'Save Sample State…',
    caption: 'Write the sample state to a JSON file beside the notebook',
    isEnabled,
    execute: async (args) => {
      const panel = current();
      if (!panel) return;
      const path = typeof args.path === 'string' ? args.path : await Private.askPath('Save the sample state to', DEFAULT_STATE_FILE);
      if (path === null) return;
      await links.linkFor(panel).requestState({ type: 'save', path }).catch(report('Save the sample state'));
    },
  });
  commands.addCommand(CommandIDs.loadState, {
    label: 'Load Sample State…',
    caption: 'Replace the sample state with one saved in a JSON file',
    isEnabled,
    execute: async (args) => {
      const panel = current();
      if (!panel) return;
      const path = typeof args.path === 'string' ? args.path : await Private.askPath('Load the sample state from', DEFAULT_STATE_FILE);
      if (path === null) return;
      await links.linkFor(panel).requestState({ type: 'load', path }).catch(report('Load the sample state'));
    },
  });
}

namespace Private {
  export async function askPath(title: string, text: string): Promise<string | null> {
    const answer = await InputDialog.getText({ title, text, label: 'File (relative to the notebook)' });
    return answer.button.accept && answer.value ? answer.value : null;
  }
}
