/**
 * The standalone page's shell: the notebook in the main area, side widgets (the sample-state panel) in a tabbed
 * right area. Implements just what `JupyterFrontEnd.IShell` asks of a shell.
 */
import type { JupyterFrontEnd } from '@jupyterlab/application';
import type { DocumentRegistry } from '@jupyterlab/docregistry';
import { BoxLayout, DockPanel, FocusTracker, SplitPanel, TabPanel, Widget } from '@lumino/widgets';
import { Signal, type ISignal } from '@lumino/signaling';

export class PageShell extends Widget implements JupyterFrontEnd.IShell {
  constructor() {
    super();
    this.id = 'multiplet-page-shell';
    this.addClass('multiplet-PageShell');
    this._main = new DockPanel({ mode: 'single-document' });
    this._main.id = 'multiplet-page-main';
    this._right = new TabPanel({ tabPlacement: 'top' });
    this._right.id = 'multiplet-page-right';
    this._right.addClass('multiplet-PageSide');
    const split = new SplitPanel({ orientation: 'horizontal', spacing: 1 });
    split.addWidget(this._main);
    split.addWidget(this._right);
    SplitPanel.setStretch(this._main, 3);
    SplitPanel.setStretch(this._right, 1);
    const layout = new BoxLayout();
    BoxLayout.setStretch(split, 1);
    layout.addWidget(split);
    this.layout = layout;
    this._tracker.currentChanged.connect((_, args) => this._currentChanged.emit(args));
  }

  get currentWidget(): Widget | null {
    return this._tracker.currentWidget ?? this._lastMain;
  }

  get currentChanged(): ISignal<this, FocusTracker.IChangedArgs<Widget>> {
    return this._currentChanged;
  }

  add(widget: Widget, area: string = 'main', _options?: DocumentRegistry.IOpenOptions): void {
    if (area === 'left' || area === 'right') {
      this._right.addWidget(widget);
      return;
    }
    this._main.addWidget(widget);
    this._tracker.add(widget);
    this._lastMain = widget;
    this._main.activateWidget(widget);
  }

  activateById(id: string): void {
    const side = this._right.widgets.find((w) => w.id === id);
    if (side) {
      this._right.currentWidget = side;
      side.activate();
      return;
    }
    for (const widget of this._main.widgets()) {
      if (widget.id === id) this._main.activateWidget(widget);
    }
  }

  *widgets(area?: string): IterableIterator<Widget> {
    if (area === undefined || area === 'main') yield* this._main.widgets();
    if (area === undefined || area === 'left' || area === 'right') yield* this._right.widgets;
  }

  private _main: DockPanel;
  private _right: TabPanel;
  private _tracker = new FocusTracker<Widget>();
  private _lastMain: Widget | null = null;
  private _currentChanged = new Signal<this, FocusTracker.IChangedArgs<Widget>>(this);
}
