// Writes src/generated/kindTemplates.json: one documented template per registered cell kind, made from the
// cells package's own schemas (packages/cells/src/kinds: each field's doc, type, unit, default, allowed values),
// so the templates never drift from what the kernel accepts. Run by scripts/build.mjs before tsc.
import * as esbuild from 'esbuild';
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { nodeBundleOptions } from '../../../scripts/esbuild-workspace.mjs';

const lab = resolve(dirname(fileURLToPath(import.meta.url)), '..');

/** A YAML scalar for a value written in a cell: plain when safe, quoted otherwise. */
function scalar(value) {
  const text = String(value);
  return /^[\w.+\-/ ^*]+$/.test(text) && !/^\s|\s$/.test(text) ? text : JSON.stringify(text);
}

/** A value that satisfies the field, for a required field or a commented-out example; null when none fits. */
function example(spec) {
  if (spec.default !== undefined) return scalar(spec.default);
  switch (spec.type) {
    case 'choice':
      return scalar(spec.values[0]);
    case 'string':
      return spec.suggestions?.length ? scalar(spec.suggestions[0]) : null;
    case 'quantity':
      return scalar(spec.unit ? `${spec.min !== undefined && spec.min > 1 ? spec.min : 1} ${spec.unit}` : String(spec.min ?? 1));
    case 'number':
    case 'integer':
      return String(spec.min !== undefined && spec.min > 1 ? spec.min : 1);
    case 'boolean':
      return 'false';
    case 'range':
      return scalar(`1 ${spec.unit} .. 10 ${spec.unit} / 10`);
    default:
      return null;
  }
}

function camel(kind) {
  return kind.replace(/-([a-z])/g, (_, c) => c.toUpperCase());
}

export function templateText(kind, describeField) {
  const lines = [`[${kind.kind}] ${camel(kind.kind)}1`, `# ${kind.kind}: ${kind.summary}`];
  for (const [key, spec] of Object.entries(kind.fields)) {
    const status = spec.required ? 'required' : spec.default !== undefined ? `default ${spec.default}` : 'optional';
    lines.push(`# ${key} (${status}): ${spec.doc} Expects ${describeField(spec)}.`.replace(/\n/g, ' '));
    if (spec.type === 'map' && spec.keySuggestions?.length && example(spec.of) !== null) {
      // A map of named parameters (the B_n^m of a crystal field) is what the kind is about: always written out.
      lines.push(`${key}:`, `  ${spec.keySuggestions[0]}: ${example(spec.of)}`);
      continue;
    }
    const value = example(spec);
    if (spec.required) lines.push(value === null ? `${key}:` : `${key}: ${value}`);
    else if (value !== null) lines.push(`# ${key}: ${value}`);
  }
  return lines.join('\n');
}

export async function writeTemplates() {
  const cache = join(lab, 'lib/.templates');
  mkdirSync(cache, { recursive: true });
  const bundle = join(cache, 'kinds.mjs');
  await esbuild.build({
    ...nodeBundleOptions,
    stdin: {
      contents: "export { CELL_KINDS } from '@multiplet/cells/kinds'; export { describeField } from '@multiplet/cells/schema';",
      resolveDir: lab,
      loader: 'ts',
    },
    sourcemap: false,
    outfile: bundle,
  });
  const { CELL_KINDS, describeField } = await import(pathToFileURL(bundle).href + `?t=${Date.now()}`);
  const templates = [...CELL_KINDS.values()].map((kind) => ({ kind: kind.kind, summary: kind.summary, text: templateText(kind, describeField) }));
  const out = join(lab, 'src/generated/kindTemplates.json');
  mkdirSync(dirname(out), { recursive: true });
  writeFileSync(out, JSON.stringify(templates, null, 2) + '\n');
  rmSync(cache, { recursive: true, force: true });
  return templates;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  for (const t of await writeTemplates()) console.log(t.text + '\n');
}
