/**
 * The standalone Multiplet notebook page: a small JupyterFrontEnd (notebook, rendermime with vega, services, a command
 * palette) that loads the prebuilt Multiplet extension through module federation, then opens one notebook.
 * URL: /static/multiplet/index.html?token=…&path=notebook.ipynb[&theme=dark]
 */
import { JupyterFrontEnd, type JupyterFrontEndPlugin } from '@jupyterlab/application';
import { CommandToolbarButton, ICommandPalette, ModalCommandPalette, SessionContextDialogs, Toolbar } from '@jupyterlab/apputils';
import {
  CodeMirrorEditorFactory,
  CodeMirrorMimeTypeService,
  EditorExtensionRegistry,
  EditorLanguageRegistry,
  ybinding,
} from '@jupyterlab/codemirror';
import { PageConfig } from '@jupyterlab/coreutils';
import { DocumentManager } from '@jupyterlab/docmanager';
import { createMarkdownParser } from '@jupyterlab/markedparser-extension';
import { DocumentRegistry, type IDocumentWidget } from '@jupyterlab/docregistry';
import {
  INotebookTracker,
  NotebookActions,
  NotebookModelFactory,
  NotebookPanel,
  NotebookTracker,
  NotebookWidgetFactory,
  runCell,
  setCellExecutor,
} from '@jupyterlab/notebook';
import { IRenderMimeRegistry, RenderMimeRegistry, standardRendererFactories } from '@jupyterlab/rendermime';
import { ServerConnection, ServiceManager, type Event, type User } from '@jupyterlab/services';
import { rendererFactory as vegaRendererFactory } from '@jupyterlab/vega5-extension';
import { CommandRegistry } from '@lumino/commands';
import { Signal, Stream } from '@lumino/signaling';
import { CommandPalette, Widget } from '@lumino/widgets';
import { loadFederatedExtension } from './federation';
import { PageShell } from './shell';

const params = new URLSearchParams(window.location.search);
const token = params.get('token') ?? '';
const notebookPath = params.get('path') ?? '';
const baseUrl = new URL('../../', window.location.href).href; // the page lives at <base>/static/multiplet/
const wsUrl = baseUrl.replace(/^http/, 'ws');
PageConfig.setOption('baseUrl', baseUrl);
PageConfig.setOption('wsUrl', wsUrl);
PageConfig.setOption('token', token);
PageConfig.setOption('appName', 'Multiplet');

class MultipletPage extends JupyterFrontEnd<PageShell> {
  readonly name = 'Multiplet';
  readonly namespace = 'multiplet';
  readonly version = '0.1.0';
}

/** jupyter_server 1.x has no /api/events: a manager that never connects. */
function quietEvents(serverSettings: ServerConnection.ISettings): Event.IManager {
  const manager = {
    serverSettings,
    isDisposed: false,
    dispose() {
      manager.isDisposed = true;
    },
    emit: async () => undefined,
  } as unknown as Event.IManager & { isDisposed: boolean };
  (manager as unknown as { stream: Stream<Event.IManager, Event.Emission> }).stream = new Stream(manager);
  return manager;
}

/** jupyter_server 1.x has no /api/me: a fixed local user. */
function localUser(serverSettings: ServerConnection.ISettings): User.IManager {
  const identity = { username: 'local', name: 'Local user', display_name: 'Local user', initials: 'L', color: 'var(--jp-collaborator-color1)', avatar_url: null };
  const manager = {
    serverSettings,
    isDisposed: false,
    isReady: true,
    ready: Promise.resolve(),
    identity,
    permissions: {},
    refreshUser: async () => undefined,
    dispose() {
      manager.isDisposed = true;
    },
  } as unknown as User.IManager & { isDisposed: boolean };
  const signals = manager as unknown as { userChanged: Signal<unknown, unknown>; connectionFailure: Signal<unknown, unknown> };
  signals.userChanged = new Signal(manager);
  signals.connectionFailure = new Signal(manager);
  return manager;
}

function notebookServices(serverSettings: ServerConnection.ISettings) {
  const languages = new EditorLanguageRegistry();
  for (const language of EditorLanguageRegistry.getDefaultLanguages()) languages.addLanguage(language);
  const extensions = new EditorExtensionRegistry();
  for (const extension of EditorExtensionRegistry.getDefaultExtensions()) extensions.addExtension(extension);
  extensions.addExtension({
    name: 'shared-model-binding',
    factory: (options) => {
      const sharedModel = options.model.sharedModel as unknown as { ysource: Parameters<typeof ybinding>[0]['ytext']; undoManager: unknown };
      return EditorExtensionRegistry.createImmutableExtension(
        ybinding({ ytext: sharedModel.ysource, undoManager: (sharedModel.undoManager ?? undefined) as Parameters<typeof ybinding>[0]['undoManager'] }),
      );
    },
  });
  const editorServices = new CodeMirrorEditorFactory({ extensions, languages });
  const mimeTypeService = new CodeMirrorMimeTypeService(languages);
  // JupyterLab's standard renderers plus its vega/vega-lite one (script cells display vega-lite v5 plots), at the
  // rank JupyterLab's vega5-extension gives it (ahead of image/png fallbacks in the same bundle).
  const rendermime = new RenderMimeRegistry({ initialFactories: standardRendererFactories, markdownParser: createMarkdownParser(languages) });
  rendermime.addFactory(vegaRendererFactory, 57);
  const manager = new ServiceManager({ serverSettings, standby: 'never', events: quietEvents(serverSettings), user: localUser(serverSettings) });
  return { editorServices, mimeTypeService, rendermime, manager };
}

async function main(): Promise<void> {
  const serverSettings = ServerConnection.makeSettings({ baseUrl, wsUrl, token, appendToken: true });
  const { editorServices, mimeTypeService, rendermime, manager } = notebookServices(serverSettings);
  const shell = new PageShell();
  const docRegistry = new DocumentRegistry();
  const app = new MultipletPage({ shell, serviceManager: manager, docRegistry });
  const tracker = new NotebookTracker({ namespace: 'notebook' });
  // JupyterLab's own default executor (what its notebook-extension installs).
  setCellExecutor({ runCell });

  const commandPalette = new CommandPalette({ commands: app.commands });
  commandPalette.id = 'multiplet-page-palette';
  const modalPalette = new ModalCommandPalette({ commandPalette });
  modalPalette.attach();
  const palette: ICommandPalette = {
    get placeholder() {
      return commandPalette.inputNode.placeholder;
    },
    set placeholder(text: string) {
      commandPalette.inputNode.placeholder = text;
    },
    activate: () => modalPalette.activate(),
    addItem: (options) => {
      const item = commandPalette.addItem({ ...options, category: options.category ?? 'General' } as CommandPalette.IItemOptions);
      return { isDisposed: false, dispose: () => commandPalette.removeItem(item) };
    },
  };

  const pagePlugins: JupyterFrontEndPlugin<unknown>[] = [
    { id: 'multiplet-page:rendermime', autoStart: true, provides: IRenderMimeRegistry, activate: () => rendermime },
    { id: 'multiplet-page:notebook-tracker', autoStart: true, provides: INotebookTracker, activate: () => tracker },
    { id: 'multiplet-page:palette', autoStart: true, provides: ICommandPalette, activate: () => palette },
  ];
  const extension = await loadFederatedExtension(new URL('labextension/', window.location.href).href);
  app.registerPlugins([...pagePlugins, ...extension.plugins]);
  await manager.ready;
  await app.start({ bubblingKeydown: true });
  await addPageCommands(app.commands, tracker, palette);
  for (const url of Object.values(extension.schemaUrls)) await addShortcutsFromSchema(app.commands, url);

  const docManager = new DocumentManager({
    registry: docRegistry,
    manager,
    opener: {
      open: (widget: IDocumentWidget) => shell.add(widget, 'main'),
      opened: new Signal<unknown, IDocumentWidget>({}) as never,
    },
    sessionDialogs: new SessionContextDialogs(),
  });
  docRegistry.addModelFactory(new NotebookModelFactory({}));
  const widgetFactory = new NotebookWidgetFactory({
    name: 'Notebook',
    modelName: 'notebook',
    fileTypes: ['notebook'],
    defaultFor: ['notebook'],
    preferKernel: true,
    canStartKernel: true,
    rendermime,
    contentFactory: new NotebookPanel.ContentFactory({ editorFactory: editorServices.newInlineEditor }),
    mimeTypeService,
    toolbarFactory: () => pageToolbar(app.commands),
  });
  widgetFactory.widgetCreated.connect((_, panel) => void tracker.add(panel));
  docRegistry.addWidgetFactory(widgetFactory);

  Object.assign(window, { multipletPage: { app, tracker, docManager, extension } });
  if (!notebookPath) throw new Error('no notebook given: add ?path=<notebook.ipynb> to the page address');
  const panel = docManager.open(notebookPath) as NotebookPanel | undefined;
  if (!panel) throw new Error(`could not open ${notebookPath}`);
  await panel.context.ready;
  await panel.sessionContext.ready;
  document.body.dataset.multipletReady = 'true';
}

function pageToolbar(commands: CommandRegistry): DocumentRegistry.IToolbarItem[] {
  const items: Array<[string, string]> = [
    ['save', 'notebook:save'],
    ['run', 'notebook:run-cell-and-select-next'],
    ['run-all', 'notebook:run-all-cells'],
    ['rerun-stale', 'multiplet:rerun-stale'],
  ];
  return [
    ...items.map(([name, id]) => ({ name, widget: new CommandToolbarButton({ commands, id, label: commands.label(id) }) as Widget })),
    { name: 'spacer', widget: Toolbar.createSpacerItem() },
  ];
}

async function addPageCommands(commands: CommandRegistry, tracker: NotebookTracker, palette: ICommandPalette): Promise<void> {
  const current = () => tracker.currentWidget;
  const add = (id: string, label: string, run: (panel: NotebookPanel) => unknown, keys?: string[], selector = '.jp-Notebook') => {
    commands.addCommand(id, { label, isEnabled: () => current() !== null, execute: () => { const panel = current(); return panel ? run(panel) : undefined; } });
    palette.addItem({ command: id, category: 'Notebook' });
    if (keys) commands.addKeyBinding({ command: id, keys, selector });
  };
  add('notebook:run-cell-and-select-next', 'Run Cell and Select Next', (p) => NotebookActions.runAndAdvance(p.content, p.sessionContext), ['Shift Enter']);
  add('notebook:run-cell', 'Run Cell', (p) => NotebookActions.run(p.content, p.sessionContext), ['Accel Enter']);
  add('notebook:run-all-cells', 'Run All Cells', (p) => NotebookActions.runAll(p.content, p.sessionContext));
  add('notebook:save', 'Save Notebook', (p) => p.context.save(), ['Accel S'], 'body');
  add('notebook:enter-command-mode', 'Enter Command Mode', (p) => { p.content.mode = 'command'; }, ['Escape'], '.jp-Notebook.jp-mod-editMode');
  add('notebook:enter-edit-mode', 'Enter Edit Mode', (p) => { p.content.mode = 'edit'; }, ['Enter'], '.jp-Notebook.jp-mod-commandMode:focus');
  add('notebook:insert-cell-below', 'Insert Cell Below', (p) => NotebookActions.insertBelow(p.content), ['B'], '.jp-Notebook.jp-mod-commandMode:focus');
  commands.addCommand('apputils:activate-command-palette', { label: 'Activate Command Palette', execute: () => palette.activate() });
  commands.addKeyBinding({ command: 'apputils:activate-command-palette', keys: ['Accel Shift C'], selector: 'body' });
}

/** Key bindings declared by a plugin's settings schema (`jupyter.lab.shortcuts`), as JupyterLab reads them. */
async function addShortcutsFromSchema(commands: CommandRegistry, url: string): Promise<void> {
  const response = await fetch(url);
  if (!response.ok) return;
  const schema = (await response.json()) as { 'jupyter.lab.shortcuts'?: Array<{ command: string; keys: string[]; selector: string }> };
  for (const shortcut of schema['jupyter.lab.shortcuts'] ?? []) commands.addKeyBinding(shortcut);
}

function showTheme(): void {
  const dark = params.get('theme') === 'dark';
  document.body.dataset.jpThemeLight = String(!dark);
  document.body.dataset.jpThemeName = dark ? 'JupyterLab Dark' : 'JupyterLab Light';
  document.body.classList.add('jp-ThemedContainer');
}

showTheme();
main().catch((reason: unknown) => {
  const message = reason instanceof Error ? reason.message : String(reason);
  document.body.dataset.multipletError = message;
  const banner = document.createElement('pre');
  banner.className = 'multiplet-PageError';
  banner.textContent = `The Multiplet page could not start: ${message}`;
  document.body.appendChild(banner);
  console.error(reason);
});
