// The readable source of the demo notebooks in notebooks-demo/. Each notebook is a list of markdown and code cells;
// running this script writes the unexecuted .ipynb files (nbformat 4.5, stable cell ids, our kernelspec).
//   node scripts/demo/notebooks.mjs           write notebooks-demo/*.ipynb
//   node scripts/demo/notebooks.mjs --check   exit 1 when a committed notebook differs from this source
//
// The compound QX-7 and all its data are invented for the demo (scripts/demo/generate-data.ts makes the data).
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { NOTEBOOKS } from './notebook-cells.mjs';

const root = new URL('../../', import.meta.url).pathname;
const dir = join(root, 'notebooks-demo');

function toSource(text) {
  const lines = text.replace(/^\n+|\s+$/g, '').split('\n');
  return lines.map((l, i) => (i < lines.length - 1 ? l + '\n' : l));
}

function notebook({ title, cells }, prefix) {
  let k = 0;
  return {
    cells: cells.map((c) => {
      const id = `${prefix}-${String(++k).padStart(2, '0')}${c.id ? '-' + c.id : ''}`;
      return c.md !== undefined
        ? { cell_type: 'markdown', id, metadata: {}, source: toSource(c.md) }
        : { cell_type: 'code', execution_count: null, id, metadata: {}, outputs: [], source: toSource(c.code) };
    }),
    metadata: {
      kernelspec: { display_name: 'Multiplet', language: 'multiplet-cells', name: 'multiplet' },
      language_info: { name: 'multiplet' },
      title,
    },
    nbformat: 4,
    nbformat_minor: 5,
  };
}

const check = process.argv.includes('--check');
let differ = 0;
for (const nb of NOTEBOOKS) {
  const path = join(dir, nb.file);
  const text = JSON.stringify(notebook(nb, nb.file.slice(0, 2)), null, 1) + '\n';
  if (check) {
    if (!existsSync(path) || readFileSync(path, 'utf8') !== text) {
      differ++;
      console.error(`differs from scripts/demo/notebook-cells.mjs: ${path}`);
    }
  } else writeFileSync(path, text);
}
if (check) process.exit(differ ? 1 : 0);
console.log(`notebooks: wrote ${NOTEBOOKS.length} notebooks to notebooks-demo/`);
