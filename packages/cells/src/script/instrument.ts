/**
 * Interrupt points in a script cell's own code. A kernel interrupt sets a cancel flag; code that never looks at it
 * cannot be stopped while it keeps the thread busy. Synchronous code in the cell's first segment is stopped by
 * SIGINT (`vm` `breakOnSigint`), but after the first `await` the cell runs as microtasks, where neither SIGINT
 * nor any message handler gets a turn: `for (;;) { await Promise.resolve(); }` would hold the kernel forever.
 *
 * So the transpiled cell is rewritten (insertions only, never a new line, so line numbers stay) to check the flag
 *   - at the start of every loop body (while, do-while, for, for-in, for-of, for-await),
 *   - at the start of every function body (callbacks of promise chains, recursion),
 *   - right after every `await` resumes.
 * The check is `CHECK()` (a cheap Atomics.load); `AFTER_AWAIT(value)` checks and passes the awaited value on.
 * Both names are parameters of the cell's wrapper, bound per cell (see runScript.ts).
 */
import type { Node as AcornNode } from 'acorn';

export const CHECK = '__multipletCheck';
export const AFTER_AWAIT = '__multipletAfterAwait';

interface Insertion {
  at: number;
  text: string;
  /** 0 for an opening insertion (placed outer first), 1 for a closing one (placed inner first). */
  closing: 0 | 1;
  depth: number;
}

type AnyNode = AcornNode & Record<string, unknown>;

const LOOPS = new Set(['WhileStatement', 'DoWhileStatement', 'ForStatement', 'ForInStatement', 'ForOfStatement']);
const FUNCTIONS = new Set(['FunctionDeclaration', 'FunctionExpression', 'ArrowFunctionExpression']);

function isNode(value: unknown): value is AnyNode {
  return value !== null && typeof value === 'object' && typeof (value as { type?: unknown }).type === 'string' && typeof (value as { start?: unknown }).start === 'number';
}

/** Where a statement goes at the start of a block body: after its directive prologue ("use strict"). */
function blockEntry(block: AnyNode): number {
  let at = block.start + 1;
  for (const statement of block.body as AnyNode[]) {
    if (statement.type === 'ExpressionStatement' && typeof statement.directive === 'string') at = statement.end;
    else break;
  }
  return at;
}

/** Insertions that put interrupt checks into `program` (parsed from `js` by acorn). */
export function interruptPoints(program: AcornNode): Insertion[] {
  const out: Insertion[] = [];
  const visit = (node: AnyNode, depth: number) => {
    if (LOOPS.has(node.type)) {
      const body = node.body as AnyNode;
      if (body.type === 'BlockStatement') out.push({ at: body.start + 1, text: `${CHECK}();`, closing: 0, depth: depth + 1 });
      else {
        out.push({ at: body.start, text: `{${CHECK}();`, closing: 0, depth });
        out.push({ at: body.end, text: '}', closing: 1, depth });
      }
    } else if (FUNCTIONS.has(node.type)) {
      const body = node.body as AnyNode;
      if (body.type === 'BlockStatement') out.push({ at: blockEntry(body), text: `${CHECK}();`, closing: 0, depth: depth + 1 });
      else {
        out.push({ at: body.start, text: `(${CHECK}(), `, closing: 0, depth });
        out.push({ at: body.end, text: ')', closing: 1, depth });
      }
    } else if (node.type === 'AwaitExpression') {
      out.push({ at: node.start, text: `${AFTER_AWAIT}(`, closing: 0, depth });
      out.push({ at: node.end, text: ')', closing: 1, depth });
    }
    for (const [key, value] of Object.entries(node)) {
      if (key === 'type' || key === 'start' || key === 'end' || key === 'loc' || key === 'range') continue;
      if (Array.isArray(value)) for (const item of value) if (isNode(item)) visit(item, depth + 1);
      if (isNode(value)) visit(value, depth + 1);
    }
  };
  visit(program as AnyNode, 0);
  return out;
}

/** Apply insertions (and any extra ones) to `js`. Closing text goes before opening text at the same offset. */
export function applyInsertions(js: string, insertions: Insertion[]): string {
  const sorted = insertions
    .map((insertion, order) => ({ ...insertion, order }))
    .sort((a, b) => a.at - b.at || b.closing - a.closing || (a.closing ? b.depth - a.depth : a.depth - b.depth) || a.order - b.order);
  let out = '';
  let from = 0;
  for (const insertion of sorted) {
    out += js.slice(from, insertion.at) + insertion.text;
    from = insertion.at;
  }
  return out + js.slice(from);
}

export type { Insertion };
