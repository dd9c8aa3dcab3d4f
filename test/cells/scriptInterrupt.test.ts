// Script cells stop on the cancel flag wherever their own code runs: in loops, in functions (promise-chain
// callbacks) and after every await, so async loops that never call task.checkpoint() and never give the event
// loop a turn are stopped too. The flag is set from another thread, as the kernel's control worker does: a
// timer on this thread could not fire while such a loop runs.
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { compileScript } from '../../packages/cells/src/script/runScript';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from './helpers';

/** A flag that another thread sets to 1 after `ms` milliseconds. */
function flagSetFromAnotherThread(ms: number): Int32Array {
  const flag = new Int32Array(new SharedArrayBuffer(4));
  const worker = new Worker(
    `const { workerData } = require('node:worker_threads');
     Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, workerData.ms);
     Atomics.store(workerData.flag, 0, 1);`,
    { eval: true, workerData: { flag, ms } },
  );
  worker.unref();
  return flag;
}

const STARVING = {
  'an await loop on resolved promises': 'let n = 0;\nfor (;;) { await Promise.resolve(); n++; }',
  'a promise chain with no await in the loop': 'const again = (): Promise<void> => Promise.resolve().then(again);\nagain().catch(console.error);\nawait new Promise(() => {});',
  'a synchronous loop after the first await': 'await null;\nlet n = 0;\nwhile (true) n++;',
  'an async function calling itself': 'async function spin(n: number): Promise<number> { await 0; return spin(n + 1); }\nawait spin(0);',
  'an await on a promise that never settles': 'await new Promise(() => {});',
};

describe('interrupting script cells that never checkpoint', () => {
  for (const [what, code] of Object.entries(STARVING)) {
    it(`stops ${what} within a second, state unchanged, next cell runs`, async () => {
      const s = createCellSession();
      await runOk(s, SAMPLE_CELL);
      const before = s.state.serialize();
      const started = performance.now();
      const r = await run(s, code, flagSetFromAnotherThread(150));
      expect(performance.now() - started).toBeLessThan(1000);
      expect(errorOf(r).ename).toBe('CellInterrupted');
      expect(s.state.serialize()).toBe(before);
      const next = await run(s, 'state.sample.compound', new Int32Array(new SharedArrayBuffer(4)));
      expect(next.outcome).toMatchObject({ status: 'ok', result: { data: { 'text/plain': 'DyQ-1' } } });
    });
  }

  it('code of an interrupted cell stays stopped (a chain it left behind does not resume in the next cell)', async () => {
    const s = createCellSession();
    // The chain's rejection goes to console.error (a host function), so nothing is left unhandled.
    const r = await run(s, '(globalThis as any).ticks = 0;\nconst tick = (): Promise<void> => Promise.resolve().then(() => { (globalThis as any).ticks++; return tick(); });\ntick().catch(console.error);\nawait new Promise(() => {});', flagSetFromAnotherThread(100));
    expect(errorOf(r).ename).toBe('CellInterrupted');
    const next = await run(s, 'const a = (globalThis as any).ticks;\nawait new Promise<void>((resolve) => { let k = 0; const step = (): void => { if (++k < 50) Promise.resolve().then(step); else resolve(); }; step(); });\nawait physics.progress.NO_TASK && null;\n[a > 1000, (globalThis as any).ticks === a]', new Int32Array(new SharedArrayBuffer(4)));
    expect(next.outcome).toMatchObject({ status: 'ok', result: { data: { 'text/plain': '[ true, true ]' } } });
  });
});

describe('interrupt points keep the meaning of the code', () => {
  it('results, directives, arrows, classes, labels and for-await behave as written', async () => {
    const s = createCellSession();
    const cases: [string, string][] = [
      ['({ a: 1, b: [2, 3] })', '{ a: 1, b: [ 2, 3 ] }'],
      ['"use strict";\nfunction f(this: unknown) { return this === undefined; }\nf()', 'true'],
      ['function g() { "use strict"; return (function (this: unknown) { return this; })(); }\ng() === undefined', 'true'],
      ['const sq = (x: number) => x * x;\nconst obj = () => ({ k: sq(3) });\nobj().k', '9'],
      ['class A { v = 2; get w() { return this.v * 10; } m() { let s = 0; for (let i = 0; i < 3; i++) s += i; return s + this.w; } }\nnew A().m()', '23'],
      ['let out = 0;\nouter: for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) { if (j === 2) continue outer; if (i === 3) break outer; out++; }\nout', '6'],
      ['let k = 0;\ndo k += 2; while (k < 7)\nk', '8'],
      ['async function* gen() { for (let i = 1; i <= 3; i++) yield await Promise.resolve(i); }\nlet t = 0;\nfor await (const v of gen()) t += v;\nt', '6'],
      ['const f = async () => await Promise.resolve(4);\n(await f()) + (await 1)', '5'],
      ['for (const k in { p: 1, q: 2 }) if (k === "q") console.log(k);\n[1, 2, 3].map((x) => x + 1).filter(function (x) { return x > 2; })', '[ 3, 4 ]'],
    ];
    for (const [code, text] of cases) {
      const r = await runOk(s, code);
      expect(r.data['text/plain'], code).toBe(text);
    }
  });

  it('every loop body, function body and await gets a check; line numbers are kept', () => {
    const source = 'const a = await Promise.resolve(1);\nwhile (a < 0) {}\nconst f = (x: number) => x;\nfunction g() { return f(a); }\nthrow new Error("line 5");';
    const { code } = compileScript(source);
    expect(code.match(/__multipletCheck\(\)/g)).toHaveLength(3);
    expect(code.match(/__multipletAfterAwait\(/g)).toHaveLength(1);
    const lines = code.split('\n');
    expect(lines[1]).toMatch(/__multipletAfterAwait\(await Promise\.resolve\(1\)\)/);
    expect(lines[2]).toMatch(/^while \(a < 0\) \{\s*__multipletCheck\(\);/);
    expect(lines.at(-3)).toContain('throw new Error("line 5")');
  });

  it('a runtime error after instrumentation still names the cell line', async () => {
    const s = createCellSession();
    const e = errorOf(await run(s, 'const xs = [1, 2];\nfor (const x of xs) {\n  if (x === 2) (null as any).boom;\n}'));
    expect(e.evalue).toMatch(/^line 3, column 1: TypeError/);
  });
});
