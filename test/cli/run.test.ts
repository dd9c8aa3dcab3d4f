import { describe, expect, it, vi, afterEach } from 'vitest';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCommand } from '@multiplet/cli/run/command';
import { OutputCollector, type Notebook } from '@multiplet/cli/run/notebook';
import { compareText, compareOutputs } from '@multiplet/cli/run/compare';

const SAMPLE = '[sample] host\ncompound: DyQ-1\nion: Dy3+\nsiteSymmetry: D3d\nmolarMass: 532.8 g/mol\n';
const CEF = '[crystal-field] cefA\nB:\n  B20: -0.35 meV\n  B40: 1.2e-3 meV\n  B43: 0.01 meV\n';

function notebook(sources: string[]): Notebook {
  return {
    nbformat: 4,
    nbformat_minor: 4,
    metadata: {},
    cells: [
      { cell_type: 'markdown', source: '# test', metadata: {} },
      ...sources.map((s) => ({ cell_type: 'code' as const, source: s.split(/(?<=\n)/), metadata: {}, outputs: [], execution_count: null })),
    ],
  };
}

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  vi.spyOn(process.stdout, 'write').mockImplementation((chunk) => (out.push(String(chunk)), true));
  vi.spyOn(process.stderr, 'write').mockImplementation((chunk) => (err.push(String(chunk)), true));
  return { out, err };
}

afterEach(() => vi.restoreAllMocks());

function setup(sources: string[]) {
  const dir = mkdtempSync(join(tmpdir(), 'multiplet-run-'));
  writeFileSync(join(dir, 'cp.csv'), 'T (K),C (J/mol/K)\n2,0.5\n4,1.9\n');
  const path = join(dir, 'in.ipynb');
  writeFileSync(path, JSON.stringify(notebook(sources)));
  return { dir, path, out: join(dir, 'out.ipynb') };
}

describe('multiplet run', () => {
  it('executes in-process and writes a notebook that nbformat validates', async () => {
    const { path, out } = setup([SAMPLE, '[data] cp\nfile: cp.csv\n', CEF, '   \n', 'console.log("n", state.names.length);\nstate.results.cefA.levels.length']);
    const io = capture();
    expect(await runCommand([path, '--out', out])).toBe(0);
    expect(io.out.join('')).toMatch(/4 code cells executed, 0 failed; wrote /);
    const nb = JSON.parse(readFileSync(out, 'utf8')) as Notebook;
    expect(nb.nbformat_minor).toBe(5);
    const code = nb.cells.filter((c) => c.cell_type === 'code');
    expect(code.map((c) => c.execution_count)).toEqual([1, 2, 3, null, 4]);
    expect(code[2]!.outputs![0]).toMatchObject({ output_type: 'execute_result', execution_count: 3 });
    expect(code[2]!.metadata.multiplet).toMatchObject({ kind: 'crystal-field', name: 'cefA', version: '0.1.0', inputs: { B: { B20: '-0.35 meV' } } });
    expect(code[4]!.outputs).toEqual([
      { output_type: 'stream', name: 'stdout', text: 'n 3\n' },
      { output_type: 'execute_result', execution_count: 4, data: { 'text/plain': '8' }, metadata: {} },
    ]);
    expect(nb.cells.every((c) => typeof c.id === 'string')).toBe(true);
    // Debian's python3-nbformat validator (outside check).
    const validate = spawnSync('/usr/bin/python3', ['-c', 'import sys, nbformat; nbformat.validate(nbformat.read(sys.argv[1], as_version=4)); print("valid")', out], { encoding: 'utf8' });
    expect(validate.stderr).toBe('');
    expect(validate.stdout.trim()).toBe('valid');
  });

  it('clearOutput() from script cells clears as nbclient does: at once, or with wait just before the next output', async () => {
    const { path, out } = setup([
      'console.log("working");\nclearOutput(true);\ndisplay("step 2");\nconsole.log("tail");\nclearOutput();\ndisplay("final");\n"done"',
      'console.log("kept");\nclearOutput(true);',
      'console.log("next cell");',
    ]);
    capture();
    expect(await runCommand([path, '--out', out])).toBe(0);
    const code = (JSON.parse(readFileSync(out, 'utf8')) as Notebook).cells.filter((c) => c.cell_type === 'code');
    expect(code[0]!.outputs).toEqual([
      { output_type: 'display_data', data: { 'text/plain': 'final' }, metadata: {} },
      { output_type: 'execute_result', execution_count: 1, data: { 'text/plain': 'done' }, metadata: {} },
    ]);
    // A pending clear with no later output in its cell clears nothing, and never reaches the next cell.
    expect(code[1]!.outputs).toEqual([{ output_type: 'stream', name: 'stdout', text: 'kept\n' }]);
    expect(code[2]!.outputs).toEqual([{ output_type: 'stream', name: 'stdout', text: 'next cell\n' }]);
  });

  it('stops at a failing cell and names it (index and first line), exit 1', async () => {
    const { path, out } = setup([SAMPLE, '[crystal-field] bad\nB:\n  B22: 1 meV\n', CEF]);
    const io = capture();
    expect(await runCommand([path, '--out', out])).toBe(1);
    expect(io.err.join('')).toMatch(/cell 2 \(\[crystal-field\] bad\) failed: CellInputError: line 3, column 8: B.B22/);
    const nb = JSON.parse(readFileSync(out, 'utf8')) as Notebook;
    expect(nb.cells[2]!.outputs![0]).toMatchObject({ output_type: 'error', ename: 'CellInputError' });
    expect(nb.cells[3]!.execution_count).toBeNull();
  });

  it('--check reports each cell, tolerates round-off and catches real differences', async () => {
    const { path, out } = setup([SAMPLE, CEF]);
    capture();
    expect(await runCommand([path, '--out', out])).toBe(0);
    vi.restoreAllMocks();
    let io = capture();
    expect(await runCommand([out, '--check'])).toBe(0);
    expect(io.out.join('')).toMatch(/cell 1 \(\[sample\] host\): reproduced\ncell 2 \(\[crystal-field\] cefA\): reproduced\ncheck: 2 of 2 code cells reproduced/);

    const nb = JSON.parse(readFileSync(out, 'utf8')) as Notebook;
    const payload = (nb.cells[2]!.outputs![0]!.data as Record<string, { result: { energiesMeV: number[] } }>)['application/vnd.multiplet.result+json']!;
    payload.result.energiesMeV[3] *= 1 + 1e-12;
    writeFileSync(out, JSON.stringify(nb));
    vi.restoreAllMocks();
    io = capture();
    expect(await runCommand([out, '--check'])).toBe(0);

    payload.result.energiesMeV[3] *= 1 + 1e-6;
    writeFileSync(out, JSON.stringify(nb));
    vi.restoreAllMocks();
    io = capture();
    expect(await runCommand([out, '--check'])).toBe(1);
    expect(io.out.join('')).toMatch(/cell 2 \(\[crystal-field\] cefA\): DIFFERS: output 1 \(execute_result\): data.application\/vnd.multiplet.result\+json.result.energiesMeV\[3\]: stored/);

    vi.restoreAllMocks();
    io = capture();
    expect(await runCommand([path, '--check'])).toBe(1);
    expect(io.out.join('')).toMatch(/not executed in the stored notebook/);
  });

  it('refuses bad arguments and files with exit 2', async () => {
    const io = capture();
    expect(await runCommand([])).toBe(2);
    expect(await runCommand(['a.ipynb', '--frobnicate'])).toBe(2);
    expect(await runCommand(['/nonexistent/x.ipynb'])).toBe(2);
    const dir = mkdtempSync(join(tmpdir(), 'multiplet-run-'));
    writeFileSync(join(dir, 'bad.ipynb'), JSON.stringify({ nbformat: 3, cells: [] }));
    expect(await runCommand([join(dir, 'bad.ipynb')])).toBe(2);
    expect(io.err.join('')).toMatch(/expected an nbformat 4 notebook/);
  });
});

describe('output collection mirrors nbclient', () => {
  it('a display id shown again updates earlier outputs; update_display_data replaces in place; clear_output(wait)', () => {
    const nb: Notebook = { nbformat: 4, nbformat_minor: 5, metadata: {}, cells: [0, 1].map(() => ({ cell_type: 'code' as const, source: '', metadata: {}, outputs: [] })) };
    const c = new OutputCollector(nb);
    c.add(0, { type: 'display_data', data: { 'text/plain': 'a' }, metadata: {}, displayId: 'd1' });
    c.add(1, { type: 'update_display_data', data: { 'text/plain': 'b' }, metadata: {}, displayId: 'd1' });
    expect(nb.cells[0]!.outputs![0]!.data).toEqual({ 'text/plain': 'b' });
    c.finish(1, { status: 'ok', result: { data: { 'text/plain': 'c' }, metadata: {}, displayId: 'd1' } }, 2);
    expect(nb.cells[0]!.outputs![0]!.data).toEqual({ 'text/plain': 'c' });
    expect(nb.cells[1]!.outputs).toEqual([{ output_type: 'execute_result', execution_count: 2, data: { 'text/plain': 'c' }, metadata: {} }]);
    c.add(1, { type: 'clear_output', wait: true });
    expect(nb.cells[1]!.outputs).toHaveLength(1);
    c.add(1, { type: 'stream', name: 'stdout', text: 'x' });
    expect(nb.cells[1]!.outputs).toEqual([{ output_type: 'stream', name: 'stdout', text: 'x' }]);
  });

  it('treats text stored as a list of lines (as Jupyter writes it) like the joined string', () => {
    const stored = [{ output_type: 'display_data' as const, data: { 'text/plain': ['a 1\n', 'b 2'] }, metadata: {} }, { output_type: 'stream' as const, name: 'stdout', text: ['x\n', 'y\n'] }];
    const fresh = [{ output_type: 'display_data' as const, data: { 'text/plain': 'a 1\nb 2' }, metadata: {} }, { output_type: 'stream' as const, name: 'stdout', text: 'x\ny\n' }];
    expect(compareOutputs(stored, fresh, 1e-9)).toBeUndefined();
    expect(compareOutputs(stored, [fresh[0]!], 1e-9)).toMatch(/stored 2 outputs \(display_data, stream\), now 1/);
  });

  it('compares text with numbers to a relative tolerance', () => {
    expect(compareText('E = 1.000000000001 meV', 'E = 1 meV', 1e-9)).toBeUndefined();
    expect(compareText('E = 1.001 meV', 'E = 1 meV', 1e-9)).toMatch(/number 1 differs/);
    expect(compareText('E = 1 meV', 'E = 1 K', 1e-9)).toMatch(/text differs/);
    expect(compareText('a  \r\nb\n', 'a\nb', 1e-9)).toBeUndefined();
  });
});
