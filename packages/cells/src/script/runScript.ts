/**
 * Script cells: TypeScript, transpiled with esbuild's transform API (types stripped, never type-checked per run),
 * wrapped in an async function so top-level await works, and run in a `vm` context with:
 *   physics   the @multiplet/physics API (see script/scope.ts)
 *   state     a read-only view of the sample state (sample, datasets, results by name)
 *   display   display(x): rich output (a MIME bundle object, an array of records → table, anything → text)
 *   console   log/info/debug → stdout stream, warn/error → stderr stream
 *   task      task.report(done, total) shows progress in one updating display; task.checkpoint() stops the
 *             script when the kernel is interrupted (call it in long loops)
 * If the last statement is an expression, its value is the cell's execute_result (as in other notebooks).
 * Variables live for one cell: what is shared between cells is the sample state.
 * Math.random is replaced by an error pointing to physics.random.createRandom(seed): reruns must be identical.
 */
import vm from 'node:vm';
import { inspect, format } from 'node:util';
import { transformSync } from 'esbuild';
import { parse, type Node as AcornNode } from 'acorn';
import { CellError } from '../errors';
import type { CellOutput, MimeBundle } from '../protocol';
import { lineMap } from './sourceMap';
import { htmlTable } from '../render/format';
import type { ProgressTask } from '../session/progress';
import { CancelledError } from '@multiplet/physics/errors';

export interface ScriptEnv {
  physics: unknown;
  state: unknown;
  /** Progress display and cooperative cancellation: task.report(done, total), task.checkpoint(). */
  task: ProgressTask;
  emit(output: CellOutput): void;
  /** Allocates a display id for display(x, { id: true }) style updates. */
  nextDisplayId(): string;
}

const FILENAME = 'cell.ts';

interface Compiled {
  code: string;
  /** generated (wrapped) line index → original 0-based line. */
  lines: ([number, number] | undefined)[];
}

/** Transpile and wrap; syntax errors become CellSyntaxError with the cell's line and column. */
export function compileScript(source: string): Compiled {
  let js: string;
  let map: string;
  try {
    const out = transformSync(source, { loader: 'ts', target: 'es2022', sourcemap: 'external', sourcefile: FILENAME, logLevel: 'silent' });
    js = out.code;
    map = out.map;
  } catch (error) {
    const first = (error as { errors?: { text: string; location?: { line: number; column: number; lineText?: string } | null }[] }).errors?.[0];
    throw new CellError('CellSyntaxError', `script: ${first?.text ?? (error as Error).message}`, {
      position: first?.location ? { line: first.location.line, column: first.location.column + 1 } : undefined,
      expected: 'TypeScript',
    });
  }
  let program: AcornNode & { body: (AcornNode & { type: string; expression?: AcornNode })[] };
  try {
    program = parse(js, {
      ecmaVersion: 'latest',
      sourceType: 'script',
      allowAwaitOutsideFunction: true,
      allowReturnOutsideFunction: true,
    }) as typeof program;
  } catch (error) {
    const message = (error as Error).message;
    const hint = /import|export/.test(js.slice(0, 2000)) && /'import' and 'export'/.test(message) ? ' (import/export are not available in script cells: physics and state are already in scope)' : '';
    throw new CellError('CellSyntaxError', `script: ${message}${hint}`, { expected: 'a script without import or export' });
  }
  const last = program.body[program.body.length - 1];
  if (last && last.type === 'ExpressionStatement' && last.expression) {
    // From the statement's start (not the expression's): a parenthesised last expression, `({ a: 1 })`, starts
    // before its expression node.
    const body = js.slice(last.start, last.end).replace(/;\s*$/, '');
    js = `${js.slice(0, last.start)}return (${body});${js.slice(last.end)}`;
  }
  let lines: ([number, number] | undefined)[] = [];
  try {
    lines = lineMap((JSON.parse(map) as { mappings: string }).mappings);
  } catch {
    lines = [];
  }
  // One wrapper line precedes the code.
  return { code: `(async () => {\n${js}\n})()`, lines: [undefined, ...lines] };
}

function isMimeBundle(value: unknown): value is MimeBundle {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return false;
  const keys = Object.keys(value);
  return keys.length > 0 && keys.every((k) => /^[a-z]+\/[-+.\w]+$/.test(k));
}

/** The MIME bundle for a displayed or returned value. */
export function bundleFor(value: unknown): MimeBundle {
  if (isMimeBundle(value)) {
    const bundle: MimeBundle = {};
    for (const [mime, data] of Object.entries(value)) {
      if (mime.startsWith('text/') || mime === 'image/svg+xml') bundle[mime] = typeof data === 'string' ? data : String(data);
      else bundle[mime] = JSON.parse(JSON.stringify(data ?? null));
    }
    if (!('text/plain' in bundle)) bundle['text/plain'] = `[${Object.keys(bundle).join(', ')}]`;
    return bundle;
  }
  if (typeof value === 'string') return { 'text/plain': value };
  const text = inspect(value, { depth: 4, colors: false, breakLength: 100, maxArrayLength: 50, sorted: false });
  if (Array.isArray(value) && value.length > 0 && value.every((r) => r !== null && typeof r === 'object' && !Array.isArray(r))) {
    const keys = [...new Set(value.flatMap((r) => Object.keys(r as object)))];
    const rows = value.map((r) => keys.map((k) => {
      const cell = (r as Record<string, unknown>)[k];
      return typeof cell === 'number' ? cell : cell === undefined ? '' : String(cell);
    }));
    return { 'text/plain': text, 'text/html': htmlTable('', keys.map((k) => ({ name: k })), rows) };
  }
  return { 'text/plain': text };
}

function makeConsole(emit: (o: CellOutput) => void): Record<string, (...args: unknown[]) => void> {
  const out = (...args: unknown[]) => emit({ type: 'stream', name: 'stdout', text: format(...args) + '\n' });
  const err = (...args: unknown[]) => emit({ type: 'stream', name: 'stderr', text: format(...args) + '\n' });
  return { log: out, info: out, debug: out, warn: err, error: err };
}

/**
 * Run a script cell. Returns the bundle of the last expression's value, or undefined.
 * `context` is reused across cells (its built-ins), but every cell's variables are local to its wrapper.
 */
export async function runScript(source: string, context: vm.Context, env: ScriptEnv): Promise<MimeBundle | undefined> {
  const compiled = compileScript(source);
  context.physics = env.physics;
  context.state = env.state;
  context.task = { report: env.task.report, checkpoint: env.task.checkpoint };
  context.console = makeConsole(env.emit);
  context.display = (value: unknown) => {
    env.emit({ type: 'display_data', data: bundleFor(value), metadata: {}, displayId: env.nextDisplayId() });
  };
  let value: unknown;
  try {
    const script = new vm.Script(compiled.code, { filename: FILENAME });
    value = await script.runInContext(context, { breakOnSigint: true });
  } catch (error) {
    throw scriptError(error, compiled, source);
  }
  env.task.finish();
  return value === undefined ? undefined : bundleFor(value);
}

function scriptError(error: unknown, compiled: Compiled, source: string): CellError {
  if (error instanceof CellError) return error;
  if (error instanceof CancelledError) return new CellError('CellInterrupted', 'interrupted: the script was stopped at task.checkpoint()');
  const e = error as { name?: unknown; message?: unknown; stack?: unknown };
  const name = typeof e?.name === 'string' ? e.name : 'Error';
  const message = typeof e?.message === 'string' ? e.message : String(error);
  let position: { line: number; column: number } | undefined;
  if (typeof e?.stack === 'string') {
    const m = new RegExp(`${FILENAME.replace('.', '\\.')}:(\\d+):(\\d+)`).exec(e.stack);
    if (m) {
      const original = compiled.lines[Number(m[1]) - 1];
      if (original) position = { line: original[0] + 1, column: 1 };
    }
  }
  const lineText = position ? source.split('\n')[position.line - 1]?.trim() : undefined;
  return new CellError('ScriptError', `${name}: ${message}${lineText ? `  (in: ${lineText.slice(0, 80)})` : ''}`, { position });
}

/** A fresh context for script cells. */
export function createScriptContext(): vm.Context {
  const context = vm.createContext({});
  vm.runInContext(
    `Math.random = function () { throw new Error('Math.random is disabled in Multiplet cells (reruns must be identical): use physics.random.createRandom(seed)'); };`,
    context,
  );
  return context;
}
