/**
 * The renderer of `application/vnd.multiplet.result+json`: a typed cell's result as a header (kind, name, stale
 * mark), live controls, tables with units and vega-lite plots. Follows the JupyterLab light/dark theme.
 */
import type { IRenderMime } from '@jupyterlab/rendermime-interfaces';
import { Panel, Widget } from '@lumino/widgets';
import { ControlsView, formatNumber, type ControlChannel } from './controls';
import { parseResult, RESULT_MIME_TYPE, type ResultPayload, type ResultTable } from './protocol';

type EmbedResult = { finalize(): void; view: { runAsync(): Promise<unknown> } };
type EmbedFunction = (element: HTMLElement, spec: Record<string, unknown>, options: Record<string, unknown>) => Promise<EmbedResult>;

/** True when JupyterLab's current theme is a dark one (the theme manager sets this attribute on <body>). */
export function isDarkTheme(): boolean {
  return document.body.dataset.jpThemeLight === 'false';
}

export class ResultRenderer extends Panel implements IRenderMime.IRenderer {
  constructor(options: IRenderMime.IRendererOptions, channel: ControlChannel) {
    super();
    this._mimeType = options.mimeType;
    this.addClass('jp-Multiplet-result');
    this._header = new Widget();
    this._header.addClass('jp-Multiplet-resultHeader');
    this._controls = new ControlsView(channel);
    this._body = new Widget();
    this._body.addClass('jp-Multiplet-resultBody');
    this.addWidget(this._header);
    this.addWidget(this._controls);
    this.addWidget(this._body);
  }

  async renderModel(model: IRenderMime.IMimeModel): Promise<void> {
    const result = parseResult(model.data[this._mimeType]);
    this._result = result;
    this.node.dataset.kind = result.kind;
    this.node.dataset.resultName = result.name;
    this.node.classList.toggle('jp-mod-stale', result.stale);
    this._renderHeader(result);
    this._controls.showResult(result);
    await this._renderBody(result);
  }

  protected override onAfterAttach(msg: Parameters<Panel['onAfterAttach']>[0]): void {
    super.onAfterAttach(msg);
    this._themeObserver = new MutationObserver(() => {
      const dark = isDarkTheme();
      if (dark !== this._renderedDark && this._result) void this._renderBody(this._result);
    });
    this._themeObserver.observe(document.body, { attributes: true, attributeFilter: ['data-jp-theme-light'] });
  }

  protected override onBeforeDetach(msg: Parameters<Panel['onBeforeDetach']>[0]): void {
    this._themeObserver?.disconnect();
    this._themeObserver = null;
    super.onBeforeDetach(msg);
  }

  override dispose(): void {
    if (this.isDisposed) return;
    this._finalizeViews();
    super.dispose();
  }

  private _renderHeader(result: ResultPayload): void {
    const node = this._header.node;
    node.textContent = '';
    const kind = document.createElement('span');
    kind.className = 'jp-Multiplet-kindBadge';
    kind.textContent = result.kind;
    const name = document.createElement('span');
    name.className = 'jp-Multiplet-resultName';
    name.textContent = result.name;
    node.append(kind, name);
    if (result.stale) {
      const stale = document.createElement('span');
      stale.className = 'jp-Multiplet-staleMark';
      stale.textContent = 'stale: an input changed, rerun to refresh';
      node.append(stale);
    }
    if (result.summary) {
      const summary = document.createElement('div');
      summary.className = 'jp-Multiplet-summary';
      summary.textContent = result.summary;
      node.append(summary);
    }
  }

  private async _renderBody(result: ResultPayload): Promise<void> {
    const generation = ++this._generation;
    this._finalizeViews();
    const dark = isDarkTheme();
    this._renderedDark = dark;
    const body = this._body.node;
    body.textContent = '';
    for (const table of result.tables) body.appendChild(Private.renderTable(table));
    if (result.plots.length === 0) return;
    const embed = await Private.loadEmbed();
    for (const plot of result.plots) {
      if (generation !== this._generation || this.isDisposed) return;
      const figure = document.createElement('figure');
      figure.className = 'jp-Multiplet-plot';
      if (plot.role) figure.dataset.role = plot.role;
      const target = document.createElement('div');
      figure.appendChild(target);
      if (plot.title) {
        const caption = document.createElement('figcaption');
        caption.textContent = plot.title;
        figure.appendChild(caption);
      }
      body.appendChild(figure);
      const view = await embed(target, plot.spec, {
        actions: false,
        renderer: 'svg',
        theme: dark ? 'dark' : undefined,
        config: { background: 'transparent' },
      });
      if (generation !== this._generation || this.isDisposed) {
        view.finalize();
        return;
      }
      this._views.push(view);
      figure.dataset.rendered = 'true';
    }
  }

  private _finalizeViews(): void {
    for (const view of this._views) view.finalize();
    this._views = [];
  }

  private _mimeType: string;
  private _header: Widget;
  private _controls: ControlsView;
  private _body: Widget;
  private _result: ResultPayload | null = null;
  private _views: EmbedResult[] = [];
  private _generation = 0;
  private _renderedDark = false;
  private _themeObserver: MutationObserver | null = null;
}

/** The renderer factory; `channel` connects controls to the kernel of the notebook the output is in. */
export function createResultRendererFactory(channel: ControlChannel): IRenderMime.IRendererFactory {
  return {
    safe: true,
    mimeTypes: [RESULT_MIME_TYPE],
    defaultRank: 40,
    createRenderer: (options) => new ResultRenderer(options, channel),
  };
}

namespace Private {
  let embedPromise: Promise<EmbedFunction> | null = null;

  /** vega-embed (with vega and vega-lite) is large: load it the first time a plot is shown. */
  export function loadEmbed(): Promise<EmbedFunction> {
    embedPromise ??= import('vega-embed').then((module) => module.default as unknown as EmbedFunction);
    return embedPromise;
  }

  export function renderTable(table: ResultTable): HTMLElement {
    const element = document.createElement('table');
    element.className = 'jp-Multiplet-table';
    if (table.title) element.createCaption().textContent = table.title;
    const headRow = element.createTHead().insertRow();
    for (const column of table.columns) {
      const cell = document.createElement('th');
      cell.scope = 'col';
      cell.textContent = column.name;
      if (column.unit) {
        const unit = document.createElement('span');
        unit.className = 'jp-Multiplet-unit';
        unit.textContent = ` (${column.unit})`;
        cell.appendChild(unit);
      }
      headRow.appendChild(cell);
    }
    const body = element.createTBody();
    for (const row of table.rows) {
      const tr = body.insertRow();
      for (const value of row) {
        const cell = tr.insertCell();
        if (typeof value === 'number') {
          cell.textContent = formatNumber(value);
          cell.className = 'jp-Multiplet-number';
        } else {
          cell.textContent = value === null || value === undefined ? '' : String(value);
        }
      }
    }
    return element;
  }
}
