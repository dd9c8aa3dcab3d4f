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
import { fetchTemplates, insertTemplate } from './templates';
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

/** One `multiplet:insert-<kind>` command per cell kind the kernel offers a template for. */
const templatesPlugin: JupyterFrontEndPlugin<void> = {
  id: '@multiplet/lab:templates',
  description: 'Commands that insert a documented template of each Multiplet cell kind.',
  autoStart: true,
  requires: [INotebookLinks],
  optional: [ICommandPalette],
  activate: (app: JupyterFrontEnd, links: NotebookLinks, palette: ICommandPalette | null) => {
    const texts = new Map<string, string>();
    const register = async (panel = links.tracker.currentWidget) => {
      if (!panel) return;
      await panel.sessionContext.ready;
      for (const template of await fetchTemplates(links.linkFor(panel))) {
        const id = CommandIDs.insertPrefix + template.kind;
        texts.set(template.kind, template.text);
        if (app.commands.hasCommand(id)) continue;
        app.commands.addCommand(id, {
          label: `Insert ${template.kind} Cell`,
          caption: template.summary,
          isEnabled: () => links.tracker.currentWidget !== null,
          execute: () => {
            const current = links.tracker.currentWidget;
            const text = texts.get(template.kind);
            if (current && text !== undefined) insertTemplate(current, text);
          },
        });
        palette?.addItem({ command: id, category: PALETTE_CATEGORY });
      }
    };
    links.tracker.widgetAdded.connect((_, panel) => {
      panel.sessionContext.kernelChanged.connect(() => void register(panel).catch(() => undefined));
      void register(panel).catch(() => undefined);
    });
  },
};

export default [resultsPlugin, statePanelPlugin, templatesPlugin];
