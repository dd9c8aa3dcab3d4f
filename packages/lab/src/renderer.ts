/**
 * The renderer of `application/vnd.multiplet.result+json`: a typed cell's result as a header (kind, name, stale
 * mark), live controls, the tables with units of the bundle's `text/html` and its vega-lite v5 plot. Follows the
 * JupyterLab light/dark theme.
 */
import type { IRenderMime } from '@jupyterlab/rendermime-interfaces';
import { Panel, Widget } from '@lumino/widgets';
import { ControlsView, type ControlChannel } from './controls';
import { parseResult, RESULT_MIME_TYPE, type ResultPayload } from './protocol';

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
    const result = parseResult(model.data as Record<string, unknown>);
    this._result = result;
    this.node.dataset.kind = result.kind;
    this.node.dataset.resultName = result.name;
    this.node.classList.toggle('jp-mod-stale', result.stale);
    this._controls.showResult(result);
    await this._render(result);
  }

  protected override onAfterAttach(msg: Parameters<Panel['onAfterAttach']>[0]): void {
    super.onAfterAttach(msg);
    this._themeObserver = new MutationObserver(() => {
      const dark = isDarkTheme();
      if (dark !== this._renderedDark && this._result) void this._render(this._result);
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
  }

  private async _render(result: ResultPayload): Promise<void> {
    this._renderHeader(result);
    const generation = ++this._generation;
    this._finalizeViews();
    const dark = isDarkTheme();
    this._renderedDark = dark;
    const body = this._body.node;
    body.textContent = '';
    const { paragraphs, tables } = Private.readHtml(result.html);
    for (const paragraph of paragraphs) {
      const summary = document.createElement('p');
      summary.className = 'jp-Multiplet-summary';
      summary.textContent = paragraph;
      this._header.node.appendChild(summary);
    }
    const tablesBox = document.createElement('div');
    tablesBox.className = 'jp-Multiplet-tables';
    tablesBox.append(...tables);
    if (!result.vegaLite) {
      body.appendChild(tablesBox);
      return;
    }
    const figure = document.createElement('figure');
    figure.className = 'jp-Multiplet-plot';
    figure.dataset.kind = result.kind;
    const target = document.createElement('div');
    figure.appendChild(target);
    const description = result.vegaLite.description;
    if (typeof description === 'string') {
      const caption = document.createElement('figcaption');
      caption.textContent = description;
      figure.appendChild(caption);
    }
    body.append(figure, tablesBox);
    const embed = await Private.loadEmbed();
    if (generation !== this._generation || this.isDisposed) return;
    const view = await embed(target, result.vegaLite, {
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

  /**
   * The kernel's HTML, reduced to text: paragraphs and tables rebuilt cell by cell from their text, so nothing of
   * the markup (attributes, scripts, styles) reaches the page. Numeric cells are right-aligned.
   */
  export function readHtml(html: string): { paragraphs: string[]; tables: HTMLTableElement[] } {
    const parsed = new DOMParser().parseFromString(html, 'text/html');
    const paragraphs = Array.from(parsed.querySelectorAll('p'))
      .filter((p) => !p.closest('table'))
      .map((p) => (p.textContent ?? '').trim())
      .filter((t) => t !== '');
    const tables = Array.from(parsed.querySelectorAll('table')).map((source) => {
      const table = document.createElement('table');
      table.className = 'jp-Multiplet-table';
      const caption = source.querySelector('caption')?.textContent?.trim();
      if (caption) table.createCaption().textContent = caption;
      const head = table.createTHead();
      const body = table.createTBody();
      for (const sourceRow of Array.from(source.querySelectorAll('tr'))) {
        const inHead = sourceRow.closest('thead') !== null;
        const row = (inHead ? head : body).insertRow();
        for (const sourceCell of Array.from(sourceRow.querySelectorAll('th, td'))) {
          const cell = document.createElement(sourceCell.tagName === 'TH' ? 'th' : 'td');
          const content = (sourceCell.textContent ?? '').trim();
          cell.textContent = content;
          if (cell.tagName === 'TH' && inHead) cell.setAttribute('scope', 'col');
          if (cell.tagName === 'TD' && /^[-+−]?(\d|\.\d)[\d.,eE+−-]*(\s\S+)?$/.test(content)) cell.classList.add('jp-Multiplet-number');
          row.appendChild(cell);
        }
      }
      return table;
    });
    return { paragraphs, tables };
  }
}
