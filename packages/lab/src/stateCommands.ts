/** The sample-state commands: rerun the stale cells, save and load the state file, refresh the panel. */
import { InputDialog, showErrorMessage } from '@jupyterlab/apputils';
import type { NotebookPanel } from '@jupyterlab/notebook';
import type { CommandRegistry } from '@lumino/commands';
import { CommandIDs } from './commandIds';
import type { NotebookLinks } from './links';

/** The state file name offered by save and load (relative to the notebook's directory, where the kernel runs). */
export const DEFAULT_STATE_FILE = 'sample-state.json';

export function addStateCommands(commands: CommandRegistry, links: NotebookLinks): void {
  const current = (): NotebookPanel | null => links.tracker.currentWidget;
  const isEnabled = () => current() !== null;
  const report = (title: string) => (reason: unknown) => showErrorMessage(title, reason instanceof Error ? reason.message : String(reason));

  commands.addCommand(CommandIDs.rerunStale, {
    label: 'Rerun Stale Multiplet Cells',
    caption: 'Have the kernel run again, in dependency order, every result marked stale; their outputs update in place',
    isEnabled,
    execute: async () => {
      const panel = current();
      if (!panel) return;
      const reports = await links.linkFor(panel).rerunStale().catch(report('Rerun stale cells'));
      const failed = (Array.isArray(reports) ? reports : []).filter((r) => r.status === 'error');
      if (failed.length > 0) await showErrorMessage('Rerun stale cells', failed.map((r) => `${String(r.name)}: ${String(r.error)}`).join('\n'));
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
      await links.linkFor(panel).saveState(path).catch(report('Save the sample state'));
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
      await links.linkFor(panel).loadState(path).catch(report('Load the sample state'));
    },
  });
}

namespace Private {
  export async function askPath(title: string, text: string): Promise<string | null> {
    const answer = await InputDialog.getText({ title, text, label: 'File (relative to the notebook)' });
    return answer.button.accept && answer.value ? answer.value : null;
  }
}
