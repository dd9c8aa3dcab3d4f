/** The `point-charge` cell kind: an octahedron gives cubic ratios; symmetry-breaking ligands are reported. */
import { describe, it, expect } from 'vitest';
import { createCellSession, run, runOk, errorOf } from '../helpers';

const MULTIPLET_MIME = 'application/vnd.multiplet.result+json';
const octahedron = (a: number) =>
  [[a, 0, 0], [-a, 0, 0], [0, a, 0], [0, -a, 0], [0, 0, a], [0, 0, -a]]
    .map(([x, y, z]) => `  - { x: ${x} angstrom, y: ${y} angstrom, z: ${z} angstrom, charge: -2 }`)
    .join('\n');

describe('[point-charge] cell', () => {
  it('an O2- octahedron around Yb3+ gives B44 = 5 B40 and B64 = −21 B60 and cubic levels (Γ6, Γ7, Γ8)', async () => {
    const session = createCellSession({ notebookDir: '.' });
    const r = await runOk(session, `[point-charge] pcA\nion: Yb3+\nsymmetry: Oh\nligands:\n${octahedron(2.25)}\n`);
    const result = (r.data[MULTIPLET_MIME] as { result: { parametersMeV: Record<string, number>; degeneracies: number[]; warnings: string[] } }).result;
    expect(result.parametersMeV.B44! / result.parametersMeV.B40!).toBeCloseTo(5, 10);
    expect(result.parametersMeV.B64! / result.parametersMeV.B60!).toBeCloseTo(-21, 10);
    expect([...result.degeneracies].sort()).toEqual([2, 2, 4]);
    expect(result.warnings.filter((w) => /break/.test(w))).toEqual([]);
  });

  it('warns when ligands break the stated symmetry, and needs an ion', async () => {
    const session = createCellSession({ notebookDir: '.' });
    const r = await runOk(session, `[point-charge] pcB\nion: Er3+\nsymmetry: D4h\nligands:\n  - { x: 1 angstrom, y: 2 angstrom, z: 2 angstrom, charge: -2 }\n`);
    expect((r.data[MULTIPLET_MIME] as { result: { warnings: string[] } }).result.warnings.join(' ')).toMatch(/break D4h/);
    const e = errorOf(await run(session, `[point-charge] pcC\nligands:\n  - { x: 0 angstrom, y: 0 angstrom, z: 2 angstrom, charge: -2 }\n`));
    expect(e.evalue).toMatch(/ion/);
  });
});
