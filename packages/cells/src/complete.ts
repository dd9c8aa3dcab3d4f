/**
 * Completion, inspection and completeness for the kernel's complete_request, inspect_request and
 * is_complete_request. Typed cells: kinds after `[`, field names of the cell's kind, allowed values, ion names,
 * units after a number, result names for reference fields. Script cells: members of `physics` and result names
 * under `state.results`.
 */
import type { CompletenessReply, CompletionReply, InspectionReply } from './protocol';
import { CELL_KINDS, getKind, kindNames } from './kinds';
import { COMMON_FIELDS } from './session/typed';
import { describeField, fieldUnit, specAt, type FieldSpec, type Schema } from './schema';
import { unitSuggestions } from './syntax/quantity';
import { PHYSICS_SCOPE } from './script/scope';
import type { SampleState } from './state';

const HEADER = /^(\s*)\[([a-z0-9-]*)(\]?)/;

interface TypedContext {
  kind: string | undefined;
  headerLine: number;
}

function lineAt(code: string, cursor: number): { lineIndex: number; lineStart: number; before: string; lineText: string } {
  const before = code.slice(0, cursor);
  const lineIndex = before.split('\n').length - 1;
  const lineStart = before.lastIndexOf('\n') + 1;
  const lineEnd = code.indexOf('\n', cursor);
  return { lineIndex, lineStart, before: before.slice(lineStart), lineText: code.slice(lineStart, lineEnd < 0 ? code.length : lineEnd) };
}

function typedContext(code: string): TypedContext | undefined {
  const lines = code.split('\n');
  const headerLine = lines.findIndex((l) => l.trim() !== '');
  if (headerLine < 0) return undefined;
  const m = HEADER.exec(lines[headerLine]!);
  if (!m) return undefined;
  return { kind: m[2], headerLine };
}

/** Field path of the parents of line `lineIndex`, from indentation (block YAML). */
function parentPath(lines: string[], lineIndex: number, indent: number, headerLine: number): string[] {
  const path: string[] = [];
  let current = indent;
  for (let i = lineIndex - 1; i > headerLine && current > 0; i--) {
    const line = lines[i]!;
    if (line.trim() === '' || line.trimStart().startsWith('#')) continue;
    const lineIndent = line.length - line.trimStart().length;
    const m = /^\s*([\w-]+):\s*$/.exec(line);
    if (lineIndent < current && m) {
      path.unshift(m[1]!);
      current = lineIndent;
    } else if (lineIndent < current) break;
  }
  return path;
}

function fieldsAt(schema: Schema, path: string[]): { fields?: Schema; keys?: readonly string[] } {
  let fields: Schema | undefined = schema;
  for (const part of path) {
    const spec: FieldSpec | undefined = fields?.[part];
    if (!spec) return {};
    if (spec.type === 'record') fields = spec.fields;
    else if (spec.type === 'map') return { keys: spec.keySuggestions ?? [] };
    else return {};
  }
  return { fields };
}


function valueSuggestions(spec: FieldSpec, valueText: string, state: SampleState): { matches: string[]; start: number } {
  if (spec.type === 'choice') return { matches: [...spec.values], start: 0 };
  if (spec.type === 'boolean') return { matches: ['true', 'false'], start: 0 };
  if (spec.type === 'reference') {
    return { matches: state.names().filter((n) => spec.kinds.length === 0 || spec.kinds.includes(state.get(n)!.kind)), start: 0 };
  }
  if (spec.suggestions) return { matches: [...spec.suggestions], start: 0 };
  if (spec.type === 'quantity' || spec.type === 'range' || ((spec.type === 'map' || spec.type === 'list') && fieldUnit(spec) !== '')) {
    const m = /^(.*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s+)([\w^/-]*)$/.exec(valueText);
    if (m) return { matches: unitSuggestions(fieldUnit(spec)), start: m[1]!.length };
  }
  return { matches: [], start: 0 };
}

export function complete(code: string, cursorPos: number, state: SampleState): CompletionReply {
  const cursor = Math.max(0, Math.min(code.length, cursorPos));
  const { lineIndex, lineStart, before } = lineAt(code, cursor);
  const typed = typedContext(code);
  const reply = (matches: string[], start: number, prefix: string): CompletionReply => ({
    matches: [...new Set(matches.filter((m) => m.startsWith(prefix)))],
    cursorStart: start,
    cursorEnd: cursor,
    metadata: {},
  });
  if (typed) {
    const lines = code.split('\n');
    if (lineIndex === typed.headerLine) {
      const m = /^\s*\[([a-z0-9-]*)$/.exec(before);
      if (m) return reply(kindNames(), cursor - m[1]!.length, m[1]!);
      return reply([], cursor, '');
    }
    const kind = typed.kind ? getKind(typed.kind) : undefined;
    if (!kind || lineIndex < typed.headerLine) return reply([], cursor, '');
    const schema: Schema = { ...kind.fields, ...COMMON_FIELDS };
    const keyMatch = /^(\s*)([\w-]*)$/.exec(before);
    if (keyMatch) {
      const indent = keyMatch[1]!.length;
      const { fields, keys } = fieldsAt(schema, parentPath(lines, lineIndex, indent, typed.headerLine));
      const options = fields ? Object.keys(fields) : [...(keys ?? [])];
      return reply(options, cursor - keyMatch[2]!.length, keyMatch[2]!);
    }
    const valueMatch = /^(\s*)([\w-]+):\s*(.*)$/.exec(before);
    if (valueMatch) {
      const path = [...parentPath(lines, lineIndex, valueMatch[1]!.length, typed.headerLine), valueMatch[2]!];
      const spec = specAt(schema, path);
      if (!spec) return reply([], cursor, '');
      const valueText = valueMatch[3]!;
      const { matches, start } = valueSuggestions(spec, valueText, state);
      const prefix = valueText.slice(start);
      return reply(matches, cursor - prefix.length, prefix);
    }
    return reply([], cursor, '');
  }
  // Script cell.
  const word = /([A-Za-z_$][\w$]*(?:\.[A-Za-z_$][\w$]*)*\.?)$/.exec(before)?.[1] ?? '';
  const parts = word.split('.');
  const last = parts.pop() ?? '';
  const start = lineStart + before.length - last.length;
  if (parts.length === 0) return reply(['physics', 'state', 'display', 'clearOutput', 'console', 'task'], start, last);
  let target: unknown;
  if (parts[0] === 'physics') target = PHYSICS_SCOPE;
  else if (parts[0] === 'state') target = { sample: null, datasets: Object.fromEntries(state.datasets().map((n) => [n, 1])), results: Object.fromEntries(state.names().map((n) => [n, 1])), info: {}, names: [] };
  for (const part of parts.slice(1)) target = target && typeof target === 'object' ? (target as Record<string, unknown>)[part] : undefined;
  if (!target || typeof target !== 'object') return reply([], cursor, '');
  return reply(Object.keys(target).sort(), start, last);
}

function wordAt(code: string, cursor: number): { word: string; start: number } {
  let start = cursor;
  while (start > 0 && /[\w.$-]/.test(code[start - 1]!)) start--;
  let end = cursor;
  while (end < code.length && /[\w$-]/.test(code[end]!)) end++;
  return { word: code.slice(start, end), start };
}

function fieldDoc(name: string, spec: FieldSpec): string {
  const unit = fieldUnit(spec);
  const parts = [`${name}: ${describeField(spec)}`];
  if (unit) parts.push(`unit: ${unit}`);
  if (spec.default !== undefined) parts.push(`default: ${typeof spec.default === 'string' ? spec.default : JSON.stringify(spec.default)}`);
  if (spec.required) parts.push('required');
  return `${parts.join('; ')}\n${spec.doc}`;
}

export function inspect(code: string, cursorPos: number, _detailLevel: number, state: SampleState): InspectionReply {
  const cursor = Math.max(0, Math.min(code.length, cursorPos));
  const { word } = wordAt(code, cursor);
  const notFound: InspectionReply = { found: false, data: {} };
  if (word === '') return notFound;
  const typed = typedContext(code);
  const text = (t: string): InspectionReply => ({ found: true, data: { 'text/plain': t } });
  if (typed) {
    const kindHere = CELL_KINDS.get(word);
    const { lineIndex } = lineAt(code, cursor);
    if (kindHere && lineIndex === typed.headerLine) {
      const fields = Object.entries(kindHere.fields).map(([n, s]) => `  ${fieldDoc(n, s).replace('\n', '\n      ')}`);
      return text(`[${kindHere.kind}]: ${kindHere.summary}\nfields:\n${fields.join('\n')}`);
    }
    const kind = typed.kind ? getKind(typed.kind) : undefined;
    if (kind) {
      const lines = code.split('\n');
      const lineText = lines[lineIndex] ?? '';
      const indent = lineText.length - lineText.trimStart().length;
      const path = [...parentPath(lines, lineIndex, indent, typed.headerLine), word];
      const schema = { ...kind.fields, ...COMMON_FIELDS };
      const spec = specAt(schema, path) ?? (schema[word] as FieldSpec | undefined);
      if (spec) return text(fieldDoc(path.join('.'), spec));
    }
  }
  const name = word.split('.').pop()!;
  const record = state.get(name);
  if (record) return text(`${name}: ${record.kind} result${record.stale ? ' (stale)' : ''}; reads ${record.reads.join(', ') || 'nothing'}; seed ${record.seed}`);
  if (!typed && word.startsWith('physics.')) {
    let target: unknown = PHYSICS_SCOPE;
    for (const part of word.split('.').slice(1)) target = target && typeof target === 'object' ? (target as Record<string, unknown>)[part] : undefined;
    if (typeof target === 'function') return text(`${word}: function of ${target.length} argument(s)`);
    if (target !== undefined && typeof target !== 'object') return text(`${word} = ${String(target)}`);
    if (target) return text(`${word}: { ${Object.keys(target).sort().join(', ')} }`);
  }
  return notFound;
}

/** Bracket balance of script text, skipping strings, template literals and comments. */
function scriptBalance(code: string): 'complete' | 'incomplete' | 'invalid' {
  const stack: string[] = [];
  const pairs: Record<string, string> = { ')': '(', ']': '[', '}': '{' };
  for (let i = 0; i < code.length; i++) {
    const ch = code[i]!;
    if (ch === '/' && code[i + 1] === '/') {
      const end = code.indexOf('\n', i);
      if (end < 0) break;
      i = end;
    } else if (ch === '/' && code[i + 1] === '*') {
      const end = code.indexOf('*/', i + 2);
      if (end < 0) return 'incomplete';
      i = end + 1;
    } else if (ch === '"' || ch === "'" || ch === '`') {
      let j = i + 1;
      while (j < code.length && code[j] !== ch) {
        if (code[j] === '\\') j++;
        else if (ch !== '`' && code[j] === '\n') return 'invalid';
        j++;
      }
      if (j >= code.length) return ch === '`' ? 'incomplete' : 'invalid';
      i = j;
    } else if (ch === '(' || ch === '[' || ch === '{') stack.push(ch);
    else if (ch in pairs) {
      if (stack.pop() !== pairs[ch]) return 'invalid';
    }
  }
  return stack.length ? 'incomplete' : 'complete';
}

export function isComplete(code: string): CompletenessReply {
  if (!typedContext(code)) {
    const status = scriptBalance(code);
    return status === 'incomplete' ? { status, indent: '  ' } : { status };
  }
  const lines = code.replace(/\s+$/, '').split('\n');
  const last = lines[lines.length - 1] ?? '';
  const indent = last.length - last.trimStart().length;
  const withoutComment = last.replace(/\s+#.*$/, '');
  if (/:\s*$/.test(withoutComment) && lines.length > 1) return { status: 'incomplete', indent: ' '.repeat(indent + 2) };
  if (/:\s*[|>][-+0-9]*\s*$/.test(withoutComment)) return { status: 'incomplete', indent: ' '.repeat(indent + 2) };
  let depth = 0;
  let quote: string | undefined;
  for (const ch of code) {
    if (quote) {
      if (ch === quote) quote = undefined;
      continue;
    }
    if (ch === '"' || ch === "'") quote = ch;
    else if (ch === '[' || ch === '{') depth++;
    else if (ch === ']' || ch === '}') depth--;
  }
  // The header's own [kind] is balanced, so depth counts the body.
  if (quote || depth > 0) return { status: 'incomplete', indent: ' '.repeat(indent) };
  return { status: 'complete' };
}
