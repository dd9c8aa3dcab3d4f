/**
 * Loads the prebuilt (federated) Multiplet extension the way JupyterLab 4 does: read labextension/package.json,
 * load its remoteEntry, initialise the container with the shared singletons this page bundles, and get
 * `./extension` (the plugins) and `./style`. The set of shared packages is core-meta/package.json's.
 */
import * as jupyterlabApplication from '@jupyterlab/application';
import * as jupyterlabApputils from '@jupyterlab/apputils';
import * as jupyterlabCoreutils from '@jupyterlab/coreutils';
import * as jupyterlabNbformat from '@jupyterlab/nbformat';
import * as jupyterlabNotebook from '@jupyterlab/notebook';
import * as jupyterlabRendermime from '@jupyterlab/rendermime';
import * as jupyterlabRendermimeInterfaces from '@jupyterlab/rendermime-interfaces';
import * as jupyterlabServices from '@jupyterlab/services';
import * as jupyterlabTranslation from '@jupyterlab/translation';
import * as jupyterlabUiComponents from '@jupyterlab/ui-components';
import * as luminoCommands from '@lumino/commands';
import * as luminoCoreutils from '@lumino/coreutils';
import * as luminoDisposable from '@lumino/disposable';
import * as luminoMessaging from '@lumino/messaging';
import * as luminoSignaling from '@lumino/signaling';
import * as luminoWidgets from '@lumino/widgets';
import type { JupyterFrontEndPlugin } from '@jupyterlab/application';

/** Versions of the bundled packages, written in by the page build (scripts/build.mjs). */
declare const MULTIPLET_SHARED_VERSIONS: Record<string, string>;

const SHARED_MODULES: Record<string, unknown> = {
  '@jupyterlab/application': jupyterlabApplication,
  '@jupyterlab/apputils': jupyterlabApputils,
  '@jupyterlab/coreutils': jupyterlabCoreutils,
  '@jupyterlab/nbformat': jupyterlabNbformat,
  '@jupyterlab/notebook': jupyterlabNotebook,
  '@jupyterlab/rendermime': jupyterlabRendermime,
  '@jupyterlab/rendermime-interfaces': jupyterlabRendermimeInterfaces,
  '@jupyterlab/services': jupyterlabServices,
  '@jupyterlab/translation': jupyterlabTranslation,
  '@jupyterlab/ui-components': jupyterlabUiComponents,
  '@lumino/commands': luminoCommands,
  '@lumino/coreutils': luminoCoreutils,
  '@lumino/disposable': luminoDisposable,
  '@lumino/messaging': luminoMessaging,
  '@lumino/signaling': luminoSignaling,
  '@lumino/widgets': luminoWidgets,
};

type ModuleFactory = () => unknown;
interface Container {
  init(shareScope: Record<string, unknown>): Promise<void> | void;
  get(module: string): Promise<ModuleFactory>;
}

export interface LoadedExtension {
  name: string;
  version: string;
  plugins: JupyterFrontEndPlugin<unknown>[];
  /** URLs of the extension's settings schemas, by plugin id. */
  schemaUrls: Record<string, string>;
}

function loadScript(url: string): Promise<void> {
  return new Promise((resolve, reject) => {
    const script = document.createElement('script');
    script.src = url;
    script.async = true;
    script.onload = () => resolve();
    script.onerror = () => reject(new Error(`could not load ${url}`));
    document.head.appendChild(script);
  });
}

/** Load the prebuilt extension whose labextension/ directory is served at `baseUrl`. */
export async function loadFederatedExtension(baseUrl: string): Promise<LoadedExtension> {
  const response = await fetch(new URL('package.json', baseUrl));
  if (!response.ok) throw new Error(`no prebuilt extension at ${baseUrl} (HTTP ${response.status})`);
  const meta = (await response.json()) as { name: string; version: string; jupyterlab: { _build: { load: string; extension?: string; style?: string }; schemaDir?: string } };
  const build = meta.jupyterlab._build;
  const host = window as unknown as { _JUPYTERLAB?: Record<string, Container> };
  host._JUPYTERLAB ??= {};
  await loadScript(new URL(build.load, baseUrl).href);
  const container = host._JUPYTERLAB[meta.name];
  if (!container) throw new Error(`${build.load} did not register the container ${meta.name}`);

  const shareScope: Record<string, Record<string, unknown>> = {};
  for (const [name, module] of Object.entries(SHARED_MODULES)) {
    const version = MULTIPLET_SHARED_VERSIONS[name];
    shareScope[name] = { [version]: { get: () => Promise.resolve(() => module), from: 'multiplet-page', eager: true, loaded: 1 } };
  }
  await container.init(shareScope);
  if (build.style) (await container.get(build.style))();
  const exported = (await container.get(build.extension ?? './extension'))() as { default?: unknown };
  const plugins = (Array.isArray(exported.default) ? exported.default : [exported.default]) as JupyterFrontEndPlugin<unknown>[];
  const schemaUrls: Record<string, string> = {};
  for (const plugin of plugins) {
    const [pkg, id] = plugin.id.split(':');
    schemaUrls[plugin.id] = new URL(`schemas/${pkg}/${id}.json`, baseUrl).href;
  }
  return { name: meta.name, version: meta.version, plugins, schemaUrls };
}
