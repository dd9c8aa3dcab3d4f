/**
 * Script cells: TypeScript, transpiled with esbuild's transform API (types stripped, never type-checked per run),
 * wrapped in an async function so top-level await works, and run in a `vm` context with:
 *   physics   the @multiplet/physics API (see script/scope.ts)
 *   state     a read-only view of the sample state (sample, datasets, results by name)
 *   display   display(x): rich output (a MIME bundle object, an array of records → table, anything → text)
 *   console   log/info/debug → stdout stream, warn/error → stderr stream
 *   clearOutput  clearOutput(wait?) clears the cell's outputs so far (IOPub clear_output); with wait = true the
 *             front end clears just before the next output arrives (no flicker in animations and progress loops)
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
import { AFTER_AWAIT, CHECK, applyInsertions, interruptPoints } from './instrument';

export interface ScriptEnv {
  physics: unknown;
  state: unknown;
  /** Progress display and cooperative cancellation: task.report(done, total), task.checkpoint(). */
  task: ProgressTask;
  emit(output: CellOutput): void;
  /** Allocates a display id for display(x, { id: true }) style updates. */
  nextDisplayId(): string;
  /** The host's cancel flag (index 0 set to 1 on interrupt); checked in the cell's loops, calls and awaits. */
  cancelFlag?: Int32Array;
}

const FILENAME = 'cell.ts';
/** Context global holding the running cell's interrupt checks (read once, when the cell starts). */
const CELL_HOOKS = '__multipletCell';
/** How often a running cell's cancel flag is polled while the cell awaits. */
const WATCH_INTERVAL_MS = 20;
/** Context global: makes one cell's interrupt checks (defined in the context by createScriptContext). */
const HOOKS_FACTORY = '__multipletHooks';

interface CellHooks {
  check(): void;
  afterAwait(value: unknown): unknown;
  /** Mark the cell stopped: its code throws at every later check, whatever the flag says then. */
  stop(): void;
}

/**
 * Once a cell was interrupted its code stays stopped (a promise chain it left behind cannot resume later), whatever
 * the shared flag says later (the kernel clears it for the next cell). Defined inside the context, with `Atomics`
 * captured once (a global lookup in a vm context goes through its interceptor and costs ~100 ns): ~10 ns per check,
 * nothing without a flag (the headless runner), where V8 inlines the empty check away.
 */
const HOOKS_SOURCE = `globalThis.${HOOKS_FACTORY} = (hostFlag, cancelled) => {
  const flag = hostFlag && new Int32Array(hostFlag.buffer, hostFlag.byteOffset, 1);
  const atomics = Atomics;
  let stopped = false;
  const check = flag
    ? () => {
        if (stopped) cancelled();
        if (atomics.load(flag, 0) !== 0) {
          stopped = true;
          cancelled();
        }
      }
    : () => {};
  return { check, afterAwait: (value) => (check(), value), stop: () => { stopped = true; } };
};`;

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
  const insertions = interruptPoints(program);
  const last = program.body[program.body.length - 1];
  if (last && last.type === 'ExpressionStatement' && last.expression) {
    // From the statement's start (not the expression's): a parenthesised last expression, `({ a: 1 })`, starts
    // before its expression node. Outermost of all insertions (depth -1).
    const end = /;\s*$/.test(js.slice(last.start, last.end)) ? js.lastIndexOf(';', last.end) : last.end;
    insertions.push({ at: last.start, text: 'return (', closing: 0, depth: -1 }, { at: end, text: ')', closing: 1, depth: -1 });
  }
  js = applyInsertions(js, insertions);
  let lines: ([number, number] | undefined)[] = [];
  try {
    lines = lineMap((JSON.parse(map) as { mappings: string }).mappings);
  } catch {
    lines = [];
  }
  // One wrapper line precedes the code. The interrupt checks are bound per cell (CELL_HOOKS is set before each run).
  return { code: `(async (${CHECK}, ${AFTER_AWAIT}) => {\n${js}\n})(${CELL_HOOKS}.check, ${CELL_HOOKS}.afterAwait)`, lines: [undefined, ...lines] };
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
  context.clearOutput = (wait?: unknown) => {
    if (wait !== undefined && typeof wait !== 'boolean') throw new TypeError(`clearOutput(wait): wait must be true or false, got ${inspect(wait)}`);
    env.emit({ type: 'clear_output', wait: wait === true });
  };
  const flag = env.cancelFlag;
  // The checks are made inside the context (see HOOKS_FACTORY) so that V8 can inline them into the cell's loops.
  const hooks = (context[HOOKS_FACTORY] as (flag: Int32Array | undefined, stop: () => never) => CellHooks)(flag, () => {
    throw new CancelledError();
  });
  context[CELL_HOOKS] = hooks;
  let value: unknown;
  let watcher: NodeJS.Timeout | undefined;
  try {
    const script = new vm.Script(compiled.code, { filename: FILENAME });
    const running = script.runInContext(context, { breakOnSigint: true }) as Promise<unknown>;
    context[CELL_HOOKS] = undefined;
    if (flag) {
      // A cell awaiting something that never settles (or whose code was stopped inside a promise chain it did not
      // await) ends when the flag is set, whoever sets it (the kernel's control handler or its control worker).
      const interrupted = new Promise<never>((_resolve, reject) => {
        watcher = setInterval(() => {
          if (Atomics.load(flag, 0) !== 0) {
            hooks.stop();
            reject(new CancelledError());
          }
        }, WATCH_INTERVAL_MS);
      });
      // The losing side must not surface later as an unhandled rejection.
      running.catch(() => undefined);
      value = await Promise.race([running, interrupted]);
    } else value = await running;
  } catch (error) {
    throw scriptError(error, compiled, source);
  } finally {
    context[CELL_HOOKS] = undefined;
    if (watcher) clearInterval(watcher);
  }
  env.task.finish();
  return value === undefined ? undefined : bundleFor(value);
}

function scriptError(error: unknown, compiled: Compiled, source: string): CellError {
  if (error instanceof CellError) return error;
  if (error instanceof CancelledError) return new CellError('CellInterrupted', 'interrupted: the script was stopped by the kernel interrupt');
  if ((error as { code?: unknown } | null)?.code === 'ERR_SCRIPT_EXECUTION_INTERRUPTED') {
    return new CellError('CellInterrupted', 'interrupted: the script was stopped by the kernel interrupt (SIGINT)');
  }
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
  vm.runInContext(HOOKS_SOURCE, context);
  return context;
}
