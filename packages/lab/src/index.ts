/**
 * Multiplet for JupyterLab 4. This file only wires the plugins; see renderer.ts (results), links.ts (kernel
 * comms), statePanel.ts and stateCommands.ts (sample state), templates.ts (cell templates).
 */
import type { JupyterFrontEnd, JupyterFrontEndPlugin } from '@jupyterlab/application';
import { ICommandPalette } from '@jupyterlab/apputils';
import { INotebookTracker, NotebookActions } from '@jupyterlab/notebook';
import { IRenderMimeRegistry } from '@jupyterlab/rendermime';
import { CommandIDs } from './commandIds';
import { NotebookLinks } from './links';
import { createResultRendererFactory } from './renderer';
import { addStateCommands } from './stateCommands';
import { SampleStatePanel } from './statePanel';
import { CELL_TEMPLATES, insertTemplate } from './templates';
import { INotebookLinks } from './tokens';

const PALETTE_CATEGORY = 'Multiplet';

/** The result renderer and the kernel links it sends control changes through. */
const resultsPlugin: JupyterFrontEndPlugin<NotebookLinks> = {
  id: '@multiplet/lab:results',
  description: 'Renders Multiplet cell results with live controls.',
  autoStart: true,
  requires: [IRenderMimeRegistry, INotebookTracker],
  provides: INotebookLinks,
  activate: (_app: JupyterFrontEnd, rendermime: IRenderMimeRegistry, tracker: INotebookTracker) => {
    const links = new NotebookLinks(tracker);
    rendermime.addFactory(createResultRendererFactory(links), 40);
    NotebookActions.executed.connect((_, { notebook }) => {
      const panel = tracker.find((p) => p.content === notebook);
      if (panel) links.linkFor(panel).refreshState().catch(() => undefined);
    });
    return links;
  },
};

/** The sample-state side panel and its commands. */
const statePanelPlugin: JupyterFrontEndPlugin<void> = {
  id: '@multiplet/lab:state-panel',
  description: 'The sample-state panel: compound, datasets, results, stale marks, save and load.',
  autoStart: true,
  requires: [INotebookLinks],
  optional: [ICommandPalette],
  activate: (app: JupyterFrontEnd, links: NotebookLinks, palette: ICommandPalette | null) => {
    const panel = new SampleStatePanel(links, app.commands);
    app.shell.add(panel, 'right', { rank: 600 });
    addStateCommands(app.commands, links);
    app.commands.addCommand(CommandIDs.showState, {
      label: 'Show Sample State',
      execute: () => app.shell.activateById(panel.id),
    });
    for (const command of [CommandIDs.rerunStale, CommandIDs.saveState, CommandIDs.loadState, CommandIDs.refreshState, CommandIDs.showState]) {
      palette?.addItem({ command, category: PALETTE_CATEGORY });
    }
  },
};

/** One `multiplet:insert-<kind>` command per cell kind, inserting its documented template. */
const templatesPlugin: JupyterFrontEndPlugin<void> = {
  id: '@multiplet/lab:templates',
  description: 'Commands that insert a documented template of each Multiplet cell kind.',
  autoStart: true,
  requires: [INotebookTracker],
  optional: [ICommandPalette],
  activate: (app: JupyterFrontEnd, tracker: INotebookTracker, palette: ICommandPalette | null) => {
    for (const template of CELL_TEMPLATES) {
      const id = CommandIDs.insertPrefix + template.kind;
      app.commands.addCommand(id, {
        label: `Insert ${template.kind} Cell`,
        caption: `Insert a documented ${template.kind} cell below the active cell: ${template.summary}`,
        isEnabled: () => tracker.currentWidget !== null,
        execute: () => {
          const panel = tracker.currentWidget;
          if (panel) insertTemplate(panel, template.text);
        },
      });
      palette?.addItem({ command: id, category: PALETTE_CATEGORY });
    }
  },
};

export default [resultsPlugin, statePanelPlugin, templatesPlugin];
