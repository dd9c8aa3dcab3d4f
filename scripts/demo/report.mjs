// Writes one self-contained HTML report from executed notebooks: markdown rendered with `marked`, tables from the
// cells' text/html outputs, and plots from their vega-lite v5 specs rendered in the browser by vega-embed, whose
// scripts (vega, vega-lite, vega-embed) are inlined so the file reads offline.
//
// Usage: node scripts/demo/report.mjs OUT.html TITLE NOTEBOOK.ipynb... [--summary SUMMARY.html]
import { readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { basename, dirname, join } from 'node:path';
import { existsSync } from 'node:fs';
import { marked } from 'marked';

const require = createRequire(import.meta.url);
const VEGA_LITE_MIME = 'application/vnd.vegalite.v5+json';

/** The installed package's directory: the nearest node_modules/<name> above the resolved entry point. */
function packageDir(name) {
  let dir = dirname(require.resolve(name));
  while (!dir.endsWith(join('node_modules', name)) || !existsSync(join(dir, 'package.json'))) {
    const up = dirname(dir);
    if (up === dir) throw new Error(`report: cannot find the package directory of ${name}`);
    dir = up;
  }
  return dir;
}

const escapeHtml = (s) => String(s).replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]);
const joinSource = (src) => (Array.isArray(src) ? src.join('') : String(src ?? ''));
// Strip ANSI colour codes from tracebacks.
const stripAnsi = (s) => s.replace(/\u001b\[[0-9;]*m/g, '');

function renderOutput(output, plots) {
  if (output.output_type === 'stream') return `<pre class="stream ${output.name}">${escapeHtml(joinSource(output.text))}</pre>`;
  if (output.output_type === 'error') {
    return `<pre class="error">${escapeHtml(stripAnsi((output.traceback ?? [`${output.ename}: ${output.evalue}`]).join('\n')))}</pre>`;
  }
  const data = output.data ?? {};
  const parts = [];
  if (data[VEGA_LITE_MIME]) {
    const id = `plot-${plots.length}`;
    plots.push({ id, spec: data[VEGA_LITE_MIME] });
    parts.push(`<div class="plot" id="${id}"></div>`);
  }
  if (data['text/html']) parts.push(`<div class="html-output">${joinSource(data['text/html'])}</div>`);
  else if (data['text/plain'] && !data[VEGA_LITE_MIME]) parts.push(`<pre>${escapeHtml(joinSource(data['text/plain']))}</pre>`);
  return parts.join('\n');
}

function renderNotebook(path, index, plots) {
  const nb = JSON.parse(readFileSync(path, 'utf8'));
  const cells = nb.cells.map((cell) => {
    const source = joinSource(cell.source);
    if (cell.cell_type === 'markdown') return `<div class="markdown">${marked.parse(source)}</div>`;
    if (cell.cell_type !== 'code') return '';
    const outputs = (cell.outputs ?? []).map((o) => renderOutput(o, plots)).join('\n');
    return `<div class="code-cell"><pre class="source">${escapeHtml(source)}</pre>${outputs ? `<div class="outputs">${outputs}</div>` : ''}</div>`;
  });
  const title = nb.metadata?.title ?? basename(path, '.ipynb');
  return `<section id="nb-${index}"><h1 class="notebook-title">${escapeHtml(title)}</h1>\n${cells.join('\n')}</section>`;
}

export function buildReport({ title, notebooks, summaryHtml = '' }) {
  const plots = [];
  const sections = notebooks.map((p, i) => renderNotebook(p, i, plots));
  const nav = notebooks.map((p, i) => `<li><a href="#nb-${i}">${escapeHtml(basename(p, '.ipynb'))}</a></li>`).join('');
  // The packages' build files are read from node_modules directly: vega-embed's "exports" map does not expose them.
  const script = (name, file) => readFileSync(join(packageDir(name), 'build', file), 'utf8').replace(/<\/script/gi, '<\\/script');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title>
<style>
body { font-family: system-ui, sans-serif; max-width: 1100px; margin: 2em auto; padding: 0 1em; color: #1d232a; line-height: 1.45; }
nav ul { columns: 2; } h1.notebook-title { border-top: 3px solid #3a6f8f; padding-top: .6em; margin-top: 2em; }
pre { background: #f4f6f8; padding: .6em; overflow-x: auto; font-size: 12.5px; }
pre.source { border-left: 3px solid #3a6f8f; } pre.error { background: #fdecec; border-left: 3px solid #b3261e; }
pre.stream { background: #fbfbf4; } .outputs { margin: .3em 0 1.2em 1.2em; }
table { border-collapse: collapse; font-size: 13px; margin: .4em 0; } td, th { border: 1px solid #ccd3da; padding: 2px 8px; text-align: right; }
th { background: #eef2f5; } .plot { margin: .5em 0; } .summary { background: #eef5ee; padding: .8em 1.2em; border-radius: 6px; }
</style>
<script>${script('vega', 'vega.min.js')}</script>
<script>${script('vega-lite', 'vega-lite.min.js')}</script>
<script>${script('vega-embed', 'vega-embed.min.js')}</script>
</head><body>
<h1>${escapeHtml(title)}</h1>
${summaryHtml ? `<div class="summary">${summaryHtml}</div>` : ''}
<nav><ul>${nav}</ul></nav>
${sections.join('\n')}
<script>
const plots = ${JSON.stringify(plots)};
Promise.all(plots.map((p) => vegaEmbed('#' + p.id, p.spec, { actions: false, renderer: 'svg' })))
  .then(() => document.body.setAttribute('data-plots-rendered', String(plots.length)))
  .catch((err) => { console.error('plot failed: ' + err); document.body.setAttribute('data-plots-failed', String(err)); });
</script>
</body></html>`;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const args = process.argv.slice(2);
  const summaryAt = args.indexOf('--summary');
  let summaryHtml = '';
  if (summaryAt >= 0) {
    summaryHtml = readFileSync(args[summaryAt + 1], 'utf8');
    args.splice(summaryAt, 2);
  }
  const [out, title, ...notebooks] = args;
  writeFileSync(out, buildReport({ title, notebooks, summaryHtml }));
  console.log(`report: ${out}`);
}
