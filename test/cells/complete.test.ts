import { describe, expect, it } from 'vitest';
import { createCellSession, runOk, SAMPLE_CELL } from './helpers';

describe('completion', () => {
  it('completes kinds after "[", field names, values, ions and units', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const kinds = s.complete('[cr', 3);
    expect(kinds).toMatchObject({ matches: ['crystal-field'], cursorStart: 1, cursorEnd: 3 });
    const fields = s.complete('[sample] x\nla', 13);
    expect(fields.matches).toEqual(['latticeConstant']);
    expect(fields.cursorStart).toBe(11);
    const ion = '[sample] x\nion: D';
    expect(s.complete(ion, ion.length).matches).toEqual(['Dy3+']);
    const sym = '[sample] x\nsiteSymmetry: D3';
    expect(s.complete(sym, sym.length).matches).toEqual(['D3d', 'D3', 'D3h']);
    const unit = '[sample] x\nlatticeConstant: 10.1 ang';
    expect(s.complete(unit, unit.length)).toMatchObject({ matches: ['angstrom'], cursorStart: unit.length - 3 });
    const stevens = '[crystal-field] c\nB:\n  B4';
    expect(s.complete(stevens, stevens.length).matches).toContain('B43');
    const energy = '[crystal-field] c\nB:\n  B20: 0.3 c';
    expect(s.complete(energy, energy.length).matches).toEqual(['cm^-1']);
    const script = 'state.results.h';
    expect(s.complete(script, script.length).matches).toEqual(['host']);
    expect(s.complete('physics.io', 10).matches).toEqual(['ions']);
  });

  it('inspects fields, kinds and results', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const field = s.inspect('[sample] x\nlatticeConstant: 3 angstrom', 14, 0);
    expect(field.found).toBe(true);
    expect(field.data['text/plain']).toMatch(/^latticeConstant: a quantity in angstrom.*unit: angstrom\nCubic lattice constant/s);
    const kind = s.inspect('[crystal-field] c', 5, 0);
    expect(kind.data['text/plain']).toMatch(/^\[crystal-field\]: crystal-field levels/);
    expect(s.inspect('state.results.host', 17, 0).data['text/plain']).toMatch(/^host: sample result/);
    expect(s.inspect('', 0, 0).found).toBe(false);
  });

  it('is_complete: open YAML blocks and unbalanced scripts are incomplete', () => {
    const s = createCellSession();
    expect(s.isComplete('[sample] x\ncompound: X\n')).toEqual({ status: 'complete' });
    expect(s.isComplete('[crystal-field] c\nB:')).toEqual({ status: 'incomplete', indent: '  ' });
    expect(s.isComplete('[data] d\ntable: |')).toMatchObject({ status: 'incomplete' });
    expect(s.isComplete('[sample] x\ncompound: [a, b')).toMatchObject({ status: 'incomplete' });
    expect(s.isComplete('const a = [1, 2];')).toEqual({ status: 'complete' });
    expect(s.isComplete('for (const x of y) {')).toMatchObject({ status: 'incomplete' });
    expect(s.isComplete('a)')).toEqual({ status: 'invalid' });
    expect(s.isComplete('const s = "}"; // {')).toEqual({ status: 'complete' });
  });
});
