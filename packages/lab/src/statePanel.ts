/**
 * The sample-state panel: what the current notebook's kernel holds in its shared sample state — the compound, the
 * datasets, every named result with the cell that made it and a stale mark — and buttons to rerun the stale cells
 * and to save or load the state file. Reads `SessionLink` snapshots; the buttons run commands.
 */
import type { NotebookPanel } from '@jupyterlab/notebook';
import type { CommandRegistry } from '@lumino/commands';
import { Widget } from '@lumino/widgets';
import { CommandIDs } from './commandIds';
import { levelsIcon } from './icons';
import { findResultCell, type NotebookLinks, type SessionLink } from './links';
import type { StateSnapshot } from './protocol';

export class SampleStatePanel extends Widget {
  constructor(links: NotebookLinks, commands: CommandRegistry) {
    super();
    this._links = links;
    this._commands = commands;
    this.id = 'jp-Multiplet-statePanel';
    this.title.label = 'Sample state';
    this.title.icon = levelsIcon;
    this.title.caption = 'Multiplet: the shared sample state of the current notebook';
    this.addClass('jp-Multiplet-statePanel');
    this.node.setAttribute('role', 'region');
    this.node.setAttribute('aria-label', 'Sample state');
    this.node.tabIndex = -1;

    const toolbar = document.createElement('div');
    toolbar.className = 'jp-Multiplet-stateToolbar';
    const buttons: Array<[string, string]> = [
      [CommandIDs.rerunStale, 'Rerun stale'],
      [CommandIDs.saveState, 'Save state'],
      [CommandIDs.loadState, 'Load state'],
      [CommandIDs.refreshState, 'Refresh'],
    ];
    for (const [command, label] of buttons) {
      const button = document.createElement('button');
      button.type = 'button';
      button.className = 'jp-Multiplet-stateButton jp-mod-styled';
      button.dataset.command = command;
      button.textContent = label;
      toolbar.appendChild(button);
    }
    this._content = document.createElement('div');
    this._content.className = 'jp-Multiplet-stateContent';
    this.node.append(toolbar, this._content);

    links.tracker.currentChanged.connect(this._onCurrentChanged, this);
    this._onCurrentChanged();
  }

  /** The snapshot on display (null before the kernel sent one). */
  get snapshot(): StateSnapshot | null {
    return this._link?.snapshot ?? null;
  }

  handleEvent(event: Event): void {
    if (event.type !== 'click') return;
    const button = (event.target as HTMLElement).closest<HTMLButtonElement>('.jp-Multiplet-stateButton');
    const command = button?.dataset.command;
    if (command && this._commands.isEnabled(command)) void this._commands.execute(command);
  }

  protected override onAfterAttach(): void {
    this.node.addEventListener('click', this);
  }

  protected override onBeforeDetach(): void {
    this.node.removeEventListener('click', this);
  }

  override dispose(): void {
    if (this.isDisposed) return;
    this._link?.stateChanged.disconnect(this._render, this);
    this._links.tracker.currentChanged.disconnect(this._onCurrentChanged, this);
    super.dispose();
  }

  private _onCurrentChanged(): void {
    this._link?.stateChanged.disconnect(this._render, this);
    const panel = this._links.tracker.currentWidget;
    this._panel = panel;
    this._link = panel ? this._links.linkFor(panel) : null;
    this._link?.stateChanged.connect(this._render, this);
    this._render();
  }

  private _render(_sender?: SessionLink, _snapshot?: StateSnapshot | null): void {
    const content = this._content;
    content.textContent = '';
    const snapshot = this._link?.snapshot ?? null;
    this.node.dataset.staleCount = String(snapshot?.results.filter((r) => r.stale).length ?? 0);
    if (!this._panel || !snapshot) {
      const empty = document.createElement('p');
      empty.className = 'jp-Multiplet-stateEmpty';
      empty.textContent = this._panel ? 'Run a cell to fill the sample state.' : 'Open a notebook on the Multiplet kernel.';
      content.appendChild(empty);
      return;
    }
    content.appendChild(this._section('Compound', Private.compoundList(snapshot.sample)));
    const datasets = document.createElement('ul');
    datasets.className = 'jp-Multiplet-stateDatasets';
    for (const dataset of snapshot.datasets) {
      const item = document.createElement('li');
      item.dataset.name = dataset.name;
      const columns = dataset.columns.map((c) => (c.unit ? `${c.name} (${c.unit})` : c.name)).join(', ');
      item.textContent = `${dataset.name}: ${dataset.rows} rows; ${columns}`;
      datasets.appendChild(item);
    }
    if (snapshot.datasets.length === 0) datasets.appendChild(Private.note('no datasets loaded'));
    content.appendChild(this._section('Datasets', datasets));

    const results = document.createElement('ul');
    results.className = 'jp-Multiplet-stateResults';
    for (const entry of snapshot.results) {
      const item = document.createElement('li');
      item.className = 'jp-Multiplet-stateResult';
      item.classList.toggle('jp-mod-stale', entry.stale);
      item.dataset.name = entry.name;
      item.dataset.stale = String(entry.stale);
      const name = document.createElement('span');
      name.className = 'jp-Multiplet-stateResultName';
      name.textContent = entry.name;
      const kind = document.createElement('span');
      kind.className = 'jp-Multiplet-kindBadge';
      kind.textContent = entry.kind;
      const origin = document.createElement('span');
      origin.className = 'jp-Multiplet-stateOrigin';
      const index = findResultCell(this._panel, entry.name, entry.cellId);
      const count = entry.executionCount !== null ? ` [${entry.executionCount}]` : '';
      origin.textContent = index >= 0 ? `made by cell ${index + 1}${count}` : `made by a cell${count} not in this notebook`;
      if (entry.reads.length > 0) item.title = `reads ${entry.reads.join(', ')}`;
      item.append(name, kind, origin);
      if (entry.stale) {
        const mark = document.createElement('span');
        mark.className = 'jp-Multiplet-staleMark';
        mark.textContent = 'stale';
        item.appendChild(mark);
      }
      results.appendChild(item);
    }
    if (snapshot.results.length === 0) results.appendChild(Private.note('no results yet'));
    content.appendChild(this._section('Results', results));
  }

  private _section(title: string, body: HTMLElement): HTMLElement {
    const section = document.createElement('section');
    section.className = 'jp-Multiplet-stateSection';
    const heading = document.createElement('h3');
    heading.textContent = title;
    section.append(heading, body);
    return section;
  }

  private _links: NotebookLinks;
  private _commands: CommandRegistry;
  private _content: HTMLElement;
  private _panel: NotebookPanel | null = null;
  private _link: SessionLink | null = null;
}

namespace Private {
  export function note(text: string): HTMLElement {
    const item = document.createElement('li');
    item.className = 'jp-Multiplet-stateEmpty';
    item.textContent = text;
    return item;
  }

  /** The sample as the kernel sends it: its cell's result name and fields (units in the field names). */
  export function compoundList(compound: Record<string, unknown> | null): HTMLElement {
    const list = document.createElement('dl');
    list.className = 'jp-Multiplet-stateCompound';
    if (!compound || Object.keys(compound).length === 0) {
      const empty = document.createElement('dd');
      empty.className = 'jp-Multiplet-stateEmpty';
      empty.textContent = 'no sample cell run yet';
      list.appendChild(empty);
      return list;
    }
    for (const [key, value] of Object.entries(compound)) {
      if (value === null) continue;
      const term = document.createElement('dt');
      term.textContent = key;
      const description = document.createElement('dd');
      description.textContent = typeof value === 'object' && value !== null ? JSON.stringify(value) : String(value);
      list.append(term, description);
    }
    return list;
  }
}
