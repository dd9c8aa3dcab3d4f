import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { RESULT_MIME_TYPE, VEGALITE_MIME_TYPE, SampleState, type ResultPayload, type ResultRecord } from '@multiplet/cells';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL, CEF_CELL } from './helpers';

describe('sample and data cells', () => {
  it('stores the sample with normalized units and renders text, html and the result JSON', async () => {
    const s = createCellSession();
    const { data, outcome } = await runOk(s, SAMPLE_CELL);
    expect(data['text/plain']).toContain('DyQ-1');
    expect(data['text/html']).toContain('<table');
    const payload = data[RESULT_MIME_TYPE] as ResultPayload;
    expect(payload).toMatchObject({ version: 1, kind: 'sample', name: 'host' });
    expect(payload.result).toMatchObject({ ion: 'Dy3+', siteSymmetry: 'D3d', latticeConstantAngstrom: 10.12, ionsPerFormulaUnit: 2 });
    expect(payload.provenance).toMatchObject({ kind: 'sample', package: '@multiplet/cells@0.1.0', inputsGiven: { latticeConstant: '10.12 angstrom' } });
    expect(outcome.status === 'ok' && outcome.result?.displayId).toMatch(/^multiplet-host-\d+$/);
    expect(s.state.sampleName).toBe('host');
  });

  it('reads an inline table and a CSV file with units in the header', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'multiplet-data-'));
    writeFileSync(join(dir, 'cp.csv'), '# heat capacity\nT (K)\tC (J/mol/K)\n2\t0.5\n4\t1.9\n6\t2.5\n');
    const s = createCellSession({ notebookDir: dir });
    const file = await runOk(s, '[data] cp\nfile: cp.csv\n');
    const payload = file.data[RESULT_MIME_TYPE] as ResultPayload;
    expect(payload.result).toMatchObject({ rows: 3, columns: [{ name: 'T', unit: 'K', values: [2, 4, 6] }, { name: 'C', unit: 'J/mol/K', values: [0.5, 1.9, 2.5] }] });
    compile(file.data[VEGALITE_MIME_TYPE] as never);
    const inline = await runOk(s, '[data] mt\ntable: |\n  T (K), M (emu/mol)\n  2, 0.1\n');
    expect(inline.data['text/plain']).toContain('1 rows');
    expect(s.state.datasets()).toEqual(['cp', 'mt']);
  });

  it('points at the bad number inside an inline table and leaves the state as it was', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const before = s.state.serialize();
    const e = errorOf(await run(s, '[data] cp\ntable: |\n  T (K), C (J/mol/K)\n  2, 0.5\n  4, 1.9x\n'));
    expect(e.ename).toBe('CellInputError');
    expect(e.evalue).toBe('line 5, column 6: column "C": got "1.9x", expected a finite number');
    expect(e.traceback.slice(1)).toEqual(['5 |   4, 1.9x', '  |      ^']);
    expect(s.state.serialize()).toBe(before);
    const unit = errorOf(await run(s, '[data] cp\ntable: |\n  T (K), C (furlongs)\n  2, 0.5\n'));
    expect(unit.evalue).toMatch(/^line 3, column \d+: column "C" unit: got "furlongs", expected a unit mathjs knows/);
    const missing = errorOf(await run(s, '[data] cp\nfile: nowhere.csv\n'));
    expect(missing.evalue).toMatch(/^line 2, column 7: file: got "nowhere.csv", expected a readable file/);
    expect(s.state.serialize()).toBe(before);
  });

  it('names field, value and expectation for bad input, with line and column', async () => {
    const s = createCellSession();
    const cases: [string, RegExp][] = [
      ['[sample] h\ncompound: X\nion: Qq3+\n', /^line 3, column 6: ion: got "Qq3\+", expected one of Ce3\+/],
      ['[sample] h\ncompound: X\nion: Dy\nlatticeConstant: 10 K\n', /^line 4, column 18: latticeConstant: got "10 K", expected a quantity convertible to angstrom/],
      ['[sample] h\ncompound: X\nion: Dy\nsiteSymetry: D3d\n', /^line 4, column 1: siteSymetry: unknown field \(did you mean siteSymmetry\?\)/],
      ['[sample] h\nion: Dy\n', /compound: got nothing, expected text \(required field/],
      ['[sample] h\ncompound: [1, 2\n', /^line \d+, column \d+: YAML body: /],
      ['[sampel] h\ncompound: X\n', /^line 1, column 2: header: unknown cell kind "sampel" \(did you mean sample\?\)/],
      ['[crystal-field] c\nion: Dy\nB:\n  B20: 0.35 mV\n', /^line 4, column 8: B.B20: got "0.35 mV", expected a quantity convertible to meV/],
      ['[crystal-field] c\nion: Dy\nB:\n  B25: 0.35 meV\n', /^line 4, column 3: B.B25: got "B25", expected a Stevens parameter name/],
    ];
    for (const [cell, message] of cases) {
      const e = errorOf(await run(s, cell));
      expect(e.evalue).toMatch(message);
    }
    expect(s.state.names()).toEqual([]);
  });
});

describe('crystal-field cells', () => {
  it('takes ion and symmetry from the sample, gives levels, g-tensor and a compilable level diagram', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const { data } = await runOk(s, CEF_CELL);
    const payload = data[RESULT_MIME_TYPE] as ResultPayload & { result: { levels: { degeneracy: number }[]; groundDoublet: { gParallel: number }; energiesMeV: number[]; eigenvectors: unknown[] } };
    expect(payload.result.levels).toHaveLength(8);
    expect(payload.result.levels.every((l) => l.degeneracy === 2)).toBe(true);
    expect(payload.result.energiesMeV).toHaveLength(16);
    expect(payload.result.eigenvectors).toHaveLength(16);
    expect(payload.result.groundDoublet.gParallel).toBeGreaterThan(10);
    expect(payload.provenance.reads).toEqual(['host']);
    expect(payload.controls?.map((c) => c.field)).toEqual(['B.B20', 'B.B40', 'B.B43']);
    const spec = compile(data[VEGALITE_MIME_TYPE] as never);
    expect(spec.spec).toBeTruthy();
    expect(data['text/html']).toContain('E (meV)');
  });

  it('refuses a parameter the sample symmetry forbids, at its line', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const e = errorOf(await run(s, '[crystal-field] c\nB:\n  B20: -0.35 meV\n  B22: 0.1 meV\n'));
    expect(e.evalue).toMatch(/^line 4, column 8: B.B22: got 0.1, expected no B22 term in D3d site symmetry .*the symmetry is the sample's/);
  });

  it('accepts bare numbers in the unit field and needs an ion without a sample', async () => {
    const s = createCellSession();
    expect(errorOf(await run(s, '[crystal-field] c\nB:\n  B20: 1\n')).evalue).toMatch(/ion: got nothing, expected an ion/);
    const k = await runOk(s, '[crystal-field] c\nion: Ce3+\nunit: K\nB:\n  B20: 10\n');
    const m = await runOk(s, '[crystal-field] d\nion: Ce3+\nB:\n  B20: 10 K\n');
    const a = (k.data[RESULT_MIME_TYPE] as ResultPayload).result as { energiesMeV: number[] };
    const b = (m.data[RESULT_MIME_TYPE] as ResultPayload).result as { energiesMeV: number[] };
    expect(a.energiesMeV).toEqual(b.energiesMeV);
  });
});

describe('references between results', () => {
  it('a crystal field based on another reads it, goes stale with it, and reruns after it', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const varied = await runOk(s, '[crystal-field] cefB\nbase: cefA\nB:\n  B20: -0.5 meV\n');
    const payload = varied.data[RESULT_MIME_TYPE] as ResultPayload & { result: { parametersMeV: Record<string, number> } };
    expect(payload.result.parametersMeV).toEqual({ B20: -0.5, B40: 1.2e-3, B43: 0.01 });
    expect(payload.provenance.reads).toEqual(['cefA', 'host']);
    await runOk(s, CEF_CELL.replace('B43: 0.01 meV', 'B43: 0.02 meV'));
    expect(s.state.get('cefB')!.stale).toBe(true);
    expect(await s.rerunStale({ emit: () => {} })).toEqual([{ name: 'cefB', status: 'ok' }]);
    expect((s.state.get('cefB')!.result as { parametersMeV: Record<string, number> }).parametersMeV.B43).toBe(0.02);
  });

  it('unknown or wrong-kind references are positioned errors naming the known results', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const unknown = errorOf(await run(s, '[crystal-field] c\nbase: cefX\n'));
    expect(unknown.ename).toBe('CellReferenceError');
    expect(unknown.evalue).toBe('line 2, column 7: base: got "cefX", expected the name of an earlier crystal-field result (known: cefA) (did you mean cefA?)');
    const wrongKind = errorOf(await run(s, '[crystal-field] c\nbase: host\n'));
    expect(wrongKind.evalue).toMatch(/^line 2, column 7: base: got "host", expected the name of an earlier crystal-field result, not a sample result/);
    await runOk(s, '[crystal-field] cefB\nbase: cefA\n');
    const before = s.state.serialize();
    const cycle = errorOf(await run(s, '[crystal-field] cefA\nbase: cefB\n'));
    expect(cycle.evalue).toBe('line 2, column 7: cefA would read cefB, which itself depends on cefA: a dependency cycle');
    expect(s.state.serialize()).toBe(before);
    const self = errorOf(await run(s, '[crystal-field] cefA\nbase: cefA\n'));
    expect(self.evalue).toBe('line 2, column 7: cefA cannot read itself');
  });
});

describe('sample state', () => {
  it('marks dependants stale when an upstream cell reruns and reruns them in order', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    expect(s.state.get('cefA')!.stale).toBe(false);
    const changed = await runOk(s, SAMPLE_CELL.replace('D3d', 'none'));
    expect(s.state.get('cefA')!.stale).toBe(true);
    // The crystal-field display is refreshed in place with its stale flag.
    const update = changed.outputs.find((o) => o.type === 'update_display_data');
    expect(update && update.type === 'update_display_data' && update.displayId).toBe(s.displayIdsOf('cefA')[0]);
    const outputs: unknown[] = [];
    const reports = await s.rerunStale({ emit: (o) => outputs.push(o) });
    expect(reports).toEqual([{ name: 'cefA', status: 'ok' }]);
    expect(s.state.get('cefA')!.stale).toBe(false);
    expect((s.state.get('cefA')!.result as { symmetry: string }).symmetry).toBe('none');
    expect(outputs.length).toBeGreaterThan(0);
  });

  it('refuses dependency cycles', () => {
    const state = new SampleState();
    const record = (name: string, reads: string[]): ResultRecord => ({
      name, kind: 'data', role: 'result', source: '', inputsGiven: {}, inputs: {}, result: 1, reads, seed: 1, version: '0', stale: false, executionCount: null,
    });
    state.commit(record('a', []));
    state.commit(record('b', ['a']));
    state.commit(record('c', ['b']));
    expect(state.dependantsOf('a')).toEqual(['b', 'c']);
    expect(() => state.checkAcyclic('a', ['c'])).toThrow(/a would read c, which itself depends on a: a dependency cycle/);
    expect(() => state.checkAcyclic('a', ['a'])).toThrow(/cannot read itself/);
    expect(state.commit(record('a', []))).toEqual(['b', 'c']);
    expect(state.staleInOrder()).toEqual(['b', 'c']);
  });

  it('gives byte-identical state for two runs and round-trips save/load', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'multiplet-state-'));
    const serialize = async () => {
      const s = createCellSession({ notebookDir: dir });
      await runOk(s, SAMPLE_CELL);
      await runOk(s, CEF_CELL);
      await runOk(s, '[data] cp\ntable: |\n  T (K), C (J/mol/K)\n  2, 0.5\n');
      return s;
    };
    const a = await serialize();
    const b = await serialize();
    expect(a.state.serialize()).toBe(b.state.serialize());
    a.save('saved/state.json');
    const text = readFileSync(join(dir, 'saved/state.json'), 'utf8');
    expect(JSON.parse(text)).toMatchObject({ format: 'multiplet-state', version: 1, sample: 'host', order: ['host', 'cefA', 'cp'] });
    const c = createCellSession({ notebookDir: dir });
    c.load('saved/state.json');
    expect(c.state.serialize()).toBe(a.state.serialize());
    writeFileSync(join(dir, 'bad.json'), JSON.stringify({ format: 'multiplet-state', version: 2 }));
    expect(() => c.load('bad.json')).toThrow(/version: got 2, expected 1/);
    expect(c.state.serialize()).toBe(a.state.serialize());
  });
});
