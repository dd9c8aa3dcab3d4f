import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from './helpers';

describe('script cells', () => {
  it('runs TypeScript with top-level await, console streams and the last expression as the result', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const r = await runOk(s, 'const ion: string = state.sample.ion;\nconsole.log("ion", ion);\nconsole.warn("careful");\nconst g = await Promise.resolve(physics.ions.getIon(ion).gJ);\ng * 3');
    expect(r.outputs).toEqual([
      { type: 'stream', name: 'stdout', text: 'ion Dy3+\n' },
      { type: 'stream', name: 'stderr', text: 'careful\n' },
    ]);
    expect(r.data['text/plain']).toBe('4');
  });

  it('display() shows bundles, tables and text', async () => {
    const s = createCellSession();
    const spec = { $schema: 'https://vega.github.io/schema/vega-lite/v5.json', data: { values: [{ x: 1, y: 2 }] }, mark: 'point', encoding: { x: { field: 'x', type: 'quantitative' } } };
    const r = await runOk(s, `display({ 'application/vnd.vegalite.v5+json': ${JSON.stringify(spec)} });\ndisplay([{ T: 2, C: 0.5 }, { T: 4, C: 1.9 }]);\ndisplay('plain');`);
    const shown = r.outputs.filter((o) => o.type === 'display_data');
    expect(shown).toHaveLength(3);
    const [vl, table, text] = shown.map((o) => (o.type === 'display_data' ? o.data : {}));
    compile(vl!['application/vnd.vegalite.v5+json'] as never);
    expect(vl!['text/plain']).toBe('[application/vnd.vegalite.v5+json]');
    expect(table!['text/html']).toContain('<th>T</th>');
    expect(text).toEqual({ 'text/plain': 'plain' });
    expect(r.outcome).toEqual({ status: 'ok' });
  });

  it('clearOutput(wait?) emits clear_output in order with the other outputs; a bad argument is a clear error', async () => {
    const s = createCellSession();
    const r = await runOk(s, 'console.log("step 1");\nclearOutput(true);\ndisplay("step 2");\nclearOutput();\nclearOutput(false);\n"done"');
    expect(r.outputs.map((o) => o.type)).toEqual(['stream', 'clear_output', 'display_data', 'clear_output', 'clear_output']);
    expect(r.outputs.filter((o) => o.type === 'clear_output')).toEqual([
      { type: 'clear_output', wait: true },
      { type: 'clear_output', wait: false },
      { type: 'clear_output', wait: false },
    ]);
    expect(r.data['text/plain']).toBe('done');
    const bad = errorOf(await run(s, 'clearOutput("yes")'));
    expect(bad.evalue).toMatch(/^line 1, column 1: TypeError: clearOutput\(wait\): wait must be true or false, got 'yes'/);
  });

  it('reports syntax and runtime errors at the cell line', async () => {
    const s = createCellSession();
    const syntax = errorOf(await run(s, 'const a = 1;\nconst b = (;\n'));
    expect(syntax.ename).toBe('CellSyntaxError');
    expect(syntax.evalue).toMatch(/^line 2, column 12: script: /);
    const runtime = errorOf(await run(s, 'const x: number = 1;\n\nconst y = (null as any).foo;\n'));
    expect(runtime.ename).toBe('ScriptError');
    expect(runtime.evalue).toMatch(/^line 3, column 1: TypeError: Cannot read properties of null/);
    const imports = errorOf(await run(s, 'import fs from "node:fs";\nfs'));
    expect(imports.evalue).toMatch(/import\/export are not available/);
  });

  it('keeps the state read-only and randomness seeded', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const before = s.state.serialize();
    const frozen = errorOf(await run(s, '"use strict";\nstate.sample.ion = "Ho3+";'));
    expect(frozen.evalue).toMatch(/read only|read-only|Cannot assign/);
    expect(s.state.serialize()).toBe(before);
    expect(errorOf(await run(s, 'Math.random()')).evalue).toMatch(/use physics.random.createRandom\(seed\)/);
    const a = await runOk(s, 'physics.random.createRandom(7).next()');
    const b = await runOk(s, 'physics.random.createRandom(7).next()');
    expect(a.data['text/plain']).toBe(b.data['text/plain']);
  });

  it('task.report shows one updating progress display; an interrupt stops the script at task.checkpoint()', async () => {
    const s = createCellSession();
    const r = await runOk(s, 'for (let i = 0; i <= 4; i++) { task.checkpoint(); task.report(i, 4); }\n"finished"');
    const progress = r.outputs.filter((o) => o.type === 'display_data' || o.type === 'update_display_data');
    expect(progress[0]).toMatchObject({ type: 'display_data', data: { 'text/plain': 'script: [..............................] 0%' } });
    expect(progress.at(-1)).toMatchObject({ type: 'update_display_data', data: { 'text/plain': 'script: done' } });
    expect(new Set(progress.map((o) => (o as { displayId: string }).displayId)).size).toBe(1);
    const flag = new Int32Array(new SharedArrayBuffer(4));
    Atomics.store(flag, 0, 1);
    const stopped = errorOf(await run(s, 'let n = 0;\nwhile (true) { task.checkpoint(); n++; }', flag));
    expect(stopped.ename).toBe('CellInterrupted');
  });

  it('an interrupted typed cell commits nothing', async () => {
    const s = createCellSession();
    const flag = new Int32Array(new SharedArrayBuffer(4));
    Atomics.store(flag, 0, 1);
    expect(errorOf(await run(s, SAMPLE_CELL, flag)).ename).toBe('CellInterrupted');
    expect(s.state.names()).toEqual([]);
  });

  it('variables do not leak between cells', async () => {
    const s = createCellSession();
    await runOk(s, 'const leaked = 5;');
    expect(errorOf(await run(s, 'leaked')).evalue).toMatch(/ReferenceError: leaked is not defined/);
  });
});
