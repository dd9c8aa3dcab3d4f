import { describe, it, expect } from 'vitest';
import { normalizeCefParameters } from '@multiplet/physics/cef';

describe('normalizeCefParameters', () => {
  it('converts K and cm⁻¹ to meV (1 K = 0.0861733 meV, 1 cm⁻¹ = 0.123984 meV; CODATA 2018, from memory)', () => {
    expect(normalizeCefParameters({ B20: 1 }, { unit: 'K' }).B20).toBeCloseTo(0.0861733, 7);
    expect(normalizeCefParameters({ B20: 1 }, { unit: 'cm-1' }).B20).toBeCloseTo(0.123984, 6);
    expect(normalizeCefParameters({ B20: 1 })).toEqual({ B20: 1 });
  });

  it('canonicalises aliases, drops zeros, refuses duplicates', () => {
    expect(normalizeCefParameters({ B4m3: 2, B20: 0 })).toEqual({ 'B4-3': 2 });
    expect(() => normalizeCefParameters({ 'B4-3': 1, B4m3: 2 })).toThrow(/^B\.B4m3: .*given twice/);
  });

  it('names the parameter and the symmetry for a forbidden term', () => {
    expect(() => normalizeCefParameters({ B20: 1, B22: 0.1 }, { symmetry: 'D4h' })).toThrow(/^B\.B22: got 0\.1, expected no B22 term in D4h site symmetry \(allowed: B20, B40, B44, B60, B64\)/);
    expect(normalizeCefParameters({ B20: 1, B22: 0 }, { symmetry: 'D4h' })).toEqual({ B20: 1 });
  });

  it('cubic: fills B44 = 5 B40 and B64 = −21 B60, checks them when given', () => {
    expect(normalizeCefParameters({ B40: 2, B60: 1 }, { symmetry: 'Oh' })).toEqual({ B40: 2, B44: 10, B60: 1, B64: -21 });
    expect(normalizeCefParameters({ B40: 2, B44: 10 }, { symmetry: 'Td' })).toEqual({ B40: 2, B44: 10 });
    expect(() => normalizeCefParameters({ B40: 2, B44: 9 }, { symmetry: 'Oh' })).toThrow(/^B\.B44: got 9, expected B44 = 5 × B40/);
    expect(() => normalizeCefParameters({ B20: 1 }, { symmetry: 'Oh' })).toThrow(/no B20 term in Oh/);
  });

  it('rejects bad names, values, units and symmetries', () => {
    expect(() => normalizeCefParameters({ B23: 1 })).toThrow(/^B\.B23: got "B23", expected a Stevens parameter name/);
    expect(() => normalizeCefParameters({ B20: '1' })).toThrow(/^B\.B20: got "1", expected a finite number/);
    expect(() => normalizeCefParameters({ B20: Infinity })).toThrow(/^B\.B20/);
    expect(() => normalizeCefParameters({ B20: 1 }, { unit: 'eV' })).toThrow(/^unit: got "eV"/);
    expect(() => normalizeCefParameters({ B20: 1 }, { symmetry: 'Z9' })).toThrow(/^symmetry:/);
    expect(() => normalizeCefParameters([] as never)).toThrow(/^B: /);
    expect(() => normalizeCefParameters({ B20: null }, { field: 'cef.B' })).toThrow(/^cef\.B\.B20:/);
  });
});
