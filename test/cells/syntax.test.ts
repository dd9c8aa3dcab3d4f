import { describe, expect, it } from 'vitest';
import { splitCell, parseQuantity, parseRange, convertValue, CellError } from '@multiplet/cells';
import { INVERSE_CM_IN_MEV, KELVIN_IN_MEV, THZ_IN_MEV } from '@multiplet/physics/units';

describe('cell header', () => {
  it('splits "[kind] name" from the YAML body, keeping line numbers', () => {
    const split = splitCell('\n[crystal-field] cefA\nB:\n  B20: 1 meV\n');
    expect(split.type).toBe('typed');
    if (split.type !== 'typed') return;
    expect(split.header).toMatchObject({ kind: 'crystal-field', name: 'cefA', lineIndex: 1 });
    expect(split.body.split('\n')[2]).toBe('B:');
    expect(split.body.split('\n')[1]!.trim()).toBe('');
  });
  it('treats other text as a script', () => {
    expect(splitCell('const a = [1, 2];').type).toBe('script');
    expect(splitCell('[1, 2].map((x) => x)').type).toBe('script');
    expect(splitCell('').type).toBe('script');
  });
  it('refuses a header without a name or with a bad name, with the column', () => {
    expect(() => splitCell('[sample]\ncompound: x')).toThrow(/line 1, column 9: header: got "\[sample\]", expected "\[sample\] resultName"/);
    expect(() => splitCell('[sample] 2host')).toThrow(/column 10: header: got result name "2host", expected an identifier/);
    expect(() => splitCell('[Sample] host')).toThrow(CellError);
  });
});

describe('quantities (mathjs units)', () => {
  it('converts to the schema unit', () => {
    expect(parseQuantity('4.2 K', 'K')).toBe(4.2);
    expect(parseQuantity('10.1 angstrom', 'angstrom')).toBeCloseTo(10.1, 12);
    expect(parseQuantity('1 nm', 'angstrom')).toBeCloseTo(10, 12);
    expect(parseQuantity('0.5 T', 'T')).toBe(0.5);
    expect(parseQuantity('5000 Oe', 'T')).toBeCloseTo(0.5, 12);
    expect(parseQuantity('0.35 meV', 'meV')).toBeCloseTo(0.35, 14);
    expect(parseQuantity('350 ueV', 'meV')).toBeCloseTo(0.35, 14);
    expect(parseQuantity('350 μeV', 'meV')).toBeCloseTo(0.35, 14);
    expect(parseQuantity('532.8 g/mol', 'g/mol')).toBeCloseTo(532.8, 12);
  });
  it('converts energies across k_B T, h c / λ and h ν with the physics/units constants', () => {
    expect(parseQuantity('12 cm^-1', 'meV')).toBeCloseTo(12 * INVERSE_CM_IN_MEV, 12);
    expect(parseQuantity('12 cm-1', 'meV')).toBeCloseTo(12 * INVERSE_CM_IN_MEV, 12);
    expect(parseQuantity('10 K', 'meV')).toBeCloseTo(10 * KELVIN_IN_MEV, 12);
    expect(parseQuantity('1 THz', 'meV')).toBeCloseTo(THZ_IN_MEV, 12);
    // 1 meV ≈ 11.6045 K ≈ 8.06554 cm^-1 (CODATA; common practice)
    expect(1 / KELVIN_IN_MEV).toBeCloseTo(11.6045, 3);
    expect(parseQuantity('1 meV', 'meV') / INVERSE_CM_IN_MEV).toBeCloseTo(8.06554, 4);
  });
  it('refuses missing or wrong units with what was expected', () => {
    expect(() => parseQuantity(4.2, 'K')).toThrow();
    expect(() => parseQuantity('4.2 T', 'K')).toThrow();
    expect(() => parseQuantity('4.2 furlongs', 'K')).toThrow();
    expect(() => parseQuantity('K', 'K')).toThrow();
    expect(() => parseQuantity('1e400 K', 'K')).toThrow();
    expect(() => parseQuantity('0.35 mV', 'meV')).toThrow(/convertible to meV.*"mV" is not/);
    expect(() => parseQuantity(4.2, 'K')).toThrow(/the unit is required/);
  });
  it('accepts bare numbers when the kind names their unit', () => {
    expect(parseQuantity(2, 'meV', 'meV')).toBe(2);
    expect(parseQuantity(10, 'meV', 'K')).toBeCloseTo(10 * KELVIN_IN_MEV, 12);
    expect(convertValue(1500, 'mJ/mol/K', 'J/mol/K')).toBeCloseTo(1.5, 12);
  });
});

describe('scan ranges', () => {
  it('linear and log scans include both ends', () => {
    expect(parseRange('2 K .. 300 K / 3', 'K').values).toEqual([2, 151, 300]);
    const log = parseRange('0.1 K .. 1000 K / 5 log', 'K');
    expect(log.values[0]).toBe(0.1);
    expect(log.values[4]).toBe(1000);
    expect(log.values[2]).toBeCloseTo(10, 10);
    expect(parseRange('1 meV .. 10 K / 2', 'meV').values[1]).toBeCloseTo(10 * KELVIN_IN_MEV, 12);
  });
  it('refuses malformed scans', () => {
    expect(() => parseRange('2 K .. 300 K', 'K')).toThrow();
    expect(() => parseRange('2 K .. 300 K / 0', 'K')).toThrow();
    expect(() => parseRange('0 K .. 300 K / 10 log', 'K')).toThrow();
    expect(() => parseRange('2 .. 300 K / 10', 'K')).toThrow();
  });
});
