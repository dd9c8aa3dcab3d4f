// fast-check cases beside property.test.ts: malformed script cells, malformed cells of every registered kind, and
// the interrupt checks put into script cells (they must never change what a program computes).
import vm from 'node:vm';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { kindNames } from '@multiplet/cells';
import { createCellSession, run, runOk, SAMPLE_CELL, CEF_CELL } from './helpers';

describe('malformed script cells and kinds (fast-check)', () => {
  it('random script text: ok, or a ScriptError/CellSyntaxError with a message; the state unchanged; never throws', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const before = s.state.serialize();
    const piece = fc.oneof(
      fc.string({ maxLength: 12 }),
      fc.constantFrom('await', 'for (;;', 'while', '=>', '{', '}', '(', ')', 'state.sample', 'physics.units', 'import x from "y"', 'export const a = 1', ':', '<T>', 'as any', '"use strict"', '`${', 'return', 'yield', 'class', 'new', ';', '\n'),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(piece, { maxLength: 8 }), async (pieces) => {
        const code = pieces.join(' ');
        if (code.trim().startsWith('[')) return;
        const r = await run(s, code, new Int32Array(new SharedArrayBuffer(4)));
        if (r.outcome.status === 'error') {
          expect(r.outcome.ename).toMatch(/^(ScriptError|CellSyntaxError)$/);
          expect(r.outcome.evalue.length).toBeGreaterThan(8);
          expect(r.outcome.evalue).not.toMatch(/internal error/);
        }
        expect(s.state.serialize()).toBe(before);
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });

  it('every registered kind with malformed bodies: a positioned, clear error and the state unchanged', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const value = fc.oneof(fc.string({ maxLength: 10 }), fc.constantFrom('4.2 mV', '-3 K', '1 .. 2 / 0', '[1, 2', 'cefA', 'nope', '1e999 meV', '{}', '[]', 'NaN K', '0 angstrom'));
    const line = fc.tuple(fc.constantFrom('', '  '), fc.constantFrom('cef', 'start', 'data', 'temperatures', 'energies', 'fields', 'L', 'sweeps', 'x', 'B'), value).map(([i, k, v]) => `${i}${k}: ${v}`);
    let errors = 0;
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...kindNames()), fc.array(line, { minLength: 1, maxLength: 4 }), async (kind, lines) => {
        const before = s.state.serialize();
        const r = await run(s, `[${kind}] fuzzed\n${lines.join('\n')}`);
        if (r.outcome.status === 'error') {
          errors++;
          expect(r.outcome.ename).toMatch(/^Cell(Syntax|Input|Reference)Error$/);
          expect(r.outcome.evalue).toMatch(/^line \d+, column \d+: /);
          expect(r.outcome.evalue).not.toMatch(/got NaN\b|\[object Object\]|internal error/);
          expect(s.state.serialize()).toBe(before);
        }
      }),
      { numRuns: 200, seed: 9 },
    );
    expect(errors).toBeGreaterThan(150);
  });
});

describe('interrupt checks keep what a program computes (fast-check)', () => {
  // Statements over one number x: loops, nested functions, arrows, awaits, labels, recursion, classes.
  const statement = fc.oneof(
    fc.integer({ min: 1, max: 5 }).map((n) => `for (let i = 0; i < ${n}; i++) x += i;`),
    fc.integer({ min: 1, max: 4 }).map((n) => `{ let k = 0; while (k < ${n}) { k++; x = x * 2 % 1009; } }`),
    fc.constant('do x -= 3; while (x > 500)'),
    fc.constant('x = await Promise.resolve(x + 1);'),
    fc.constant('x = (await (async () => { await null; return x * 3; })()) % 997;'),
    fc.constant('x = [1, 2, 3].map((v) => v * x).reduce((a, b) => a + b, 0) % 991;'),
    fc.constant('x = ((f) => f(f, 4))((self, n) => (n === 0 ? x : self(self, n - 1) + 1));'),
    fc.constant('outer: for (const a of [1, 2, 3]) { for (const b in { p: 1, q: 2 }) { if (a === 2) continue outer; x += b.length; } }'),
    fc.constant('x = new (class { constructor() { this.v = x; } get w() { return this.v + 7; } })().w;'),
    fc.constant('x = await new Promise((resolve) => Promise.resolve().then(() => resolve(x ^ 5)));'),
    fc.constant('for await (const v of (async function* () { yield 1; yield 2; })()) x += v;'),
    fc.constant('x = (function () { "use strict"; return this === undefined ? x + 11 : -1; })();'),
  );

  it('random programs give the same value with and without the checks', async () => {
    const s = createCellSession();
    await fc.assert(
      fc.asyncProperty(fc.array(statement, { minLength: 1, maxLength: 7 }), async (statements) => {
        const program = `let x = 1;\n${statements.join('\n')}`;
        const plain = await (new vm.Script(`(async () => {\n${program}\nreturn JSON.stringify(x);\n})()`).runInContext(vm.createContext({})) as Promise<string>);
        const r = await run(s, `${program}\nJSON.stringify(x)`, new Int32Array(new SharedArrayBuffer(4)));
        expect(r.outcome).toMatchObject({ status: 'ok', result: { data: { 'text/plain': plain } } });
      }),
      { numRuns: 120, seed: 17 },
    );
  });
});
