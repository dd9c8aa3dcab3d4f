/**
 * The YAML 1.2 body of a typed cell, parsed with the `yaml` package. We keep the parsed Document so that any
 * field path can be mapped back to a line and column in the cell (for errors, completion and write-back).
 */
import { parseDocument, LineCounter, isMap, isSeq, isScalar, isNode, type Document, type Node } from 'yaml';
import { CellError, type SourcePosition } from '../errors';

export type FieldPath = (string | number)[];

export interface ParsedBody {
  /** The body as plain JavaScript values (mapping → object). Empty body → {}. */
  value: Record<string, unknown>;
  document: Document;
  lineCounter: LineCounter;
  /** Position of the node at `path` (or of its nearest existing ancestor); undefined for the empty root. */
  positionOf(path: FieldPath): SourcePosition | undefined;
  /** Source range [start, end) of the value node at `path`, if that node exists. */
  rangeOf(path: FieldPath): [number, number] | undefined;
}

/** Render a field path as `B.B20` / `columns[2]`. */
export function formatPath(path: FieldPath): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out === '' ? part : `.${part}`;
  }
  return out;
}

export function parseBody(text: string, fallback: SourcePosition): ParsedBody {
  const lineCounter = new LineCounter();
  const document = parseDocument(text, {
    version: '1.2',
    lineCounter,
    prettyErrors: false,
    uniqueKeys: true,
    strict: true,
  });
  const toPosition = (offset: number): SourcePosition => {
    const p = lineCounter.linePos(offset);
    return { line: p.line, column: p.col };
  };
  const problem = document.errors[0];
  if (problem) {
    const position = toPosition(problem.pos[0]);
    const message = problem.message.split('\n')[0]!.replace(/ at line \d+, column \d+:?$/, '');
    throw new CellError('CellSyntaxError', `YAML body: ${message}`, {
      position,
      field: '',
      expected: 'a YAML 1.2 mapping of field: value',
    });
  }
  const root = document.contents;
  let value: unknown;
  try {
    value = document.toJS({ maxAliasCount: 10 });
  } catch (error) {
    throw new CellError('CellSyntaxError', `YAML body: ${(error as Error).message}`, { position: fallback, field: '' });
  }
  if (value === null || value === undefined) value = {};
  if (!isMap(root) && root !== null) {
    const position = root && isNode(root) && root.range ? toPosition(root.range[0]) : fallback;
    throw new CellError('CellSyntaxError', `cell body: got ${describeKindOf(value)}, expected a mapping of field: value lines`, {
      position,
      field: '',
      given: value,
      expected: 'a mapping of field: value lines',
    });
  }
  const nodeAt = (path: FieldPath): Node | undefined => {
    let node: unknown = root;
    let found: Node | undefined = isNode(root) ? root : undefined;
    for (const key of path) {
      if (isMap(node)) {
        const pair = node.items.find((item) => isScalar(item.key) && String(item.key.value) === String(key));
        if (!pair) break;
        node = pair.value;
        if (isNode(node)) found = node;
        else if (isNode(pair.key)) return pair.key;
      } else if (isSeq(node) && typeof key === 'number') {
        node = node.items[key];
        if (!isNode(node)) break;
        found = node;
      } else break;
    }
    return found;
  };
  return {
    value: value as Record<string, unknown>,
    document,
    lineCounter,
    positionOf(path) {
      const node = nodeAt(path);
      if (!node?.range) return fallback;
      return toPosition(node.range[0]);
    },
    rangeOf(path) {
      let node: unknown = root;
      for (const key of path) {
        if (isMap(node)) {
          const pair = node.items.find((item) => isScalar(item.key) && String(item.key.value) === String(key));
          node = pair?.value;
        } else if (isSeq(node) && typeof key === 'number') node = node.items[key];
        else return undefined;
      }
      if (!isNode(node) || !node.range) return undefined;
      return [node.range[0], node.range[1]];
    },
  };
}

/** Position of the key (not the value) of a top-level or nested field, for "unknown field" errors. */
export function keyPosition(body: ParsedBody, path: FieldPath): SourcePosition | undefined {
  let node: unknown = body.document.contents;
  let position: SourcePosition | undefined;
  for (const key of path) {
    if (!isMap(node)) return position;
    const pair = node.items.find((item) => isScalar(item.key) && String(item.key.value) === String(key));
    if (!pair) return position;
    if (isNode(pair.key) && pair.key.range) {
      const p = body.lineCounter.linePos(pair.key.range[0]);
      position = { line: p.line, column: p.col };
    }
    node = pair.value;
  }
  return position;
}

function describeKindOf(value: unknown): string {
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'string') return `the text ${JSON.stringify(value.length > 40 ? value.slice(0, 37) + '...' : value)}`;
  return `the value ${String(value)}`;
}
