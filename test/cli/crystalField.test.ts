import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = fileURLToPath(new URL('../..', import.meta.url));
const cli = join(root, 'packages/cli/bin/multiplet.mjs');

function run(input: string, args: string[] = ['compute', 'crystal-field', '-']) {
  const r = spawnSync(process.execPath, [cli, ...args], { input, encoding: 'utf8', cwd: root });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('multiplet compute crystal-field (built CLI)', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('answers with energies, levels and the ground doublet (Ce3+ cubic: Γ7 at 0, Γ8 at 360·B4, g = 10/7; Hutchings 1964)', () => {
    const r = run(JSON.stringify({ ion: 'Ce3+', B: { B40: 0.01 }, symmetry: 'Oh' }));
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.energiesMeV).toHaveLength(6);
    expect(out.energiesMeV[0]).toBe(0);
    expect(out.levels.map((l: { degeneracy: number }) => l.degeneracy)).toEqual([2, 4]);
    expect(out.levels[0].energyMeV).toBe(0);
    expect(out.levels[1].energyMeV).toBeCloseTo(3.6, 10);
    expect(out.groundDoublet.gParallel).toBeCloseTo(10 / 7, 10);
    expect(out.groundDoublet.gPerpendicular).toBeCloseTo(10 / 7, 10);
    expect(out.parametersMeV).toEqual({ B40: 0.01, B44: 0.05 });
    expect(out.classification).toBe('Heisenberg');
  });

  it('reads a file, converts K to meV (k_B from CODATA via mathjs) and returns null for a non-doublet ground level', () => {
    const dir = mkdtempSync(join(tmpdir(), 'multiplet-cef-'));
    const file = join(dir, 'in.json');
    writeFileSync(file, JSON.stringify({ ion: 'ce', B: { B40: -1, B44: -5 }, unit: 'K' }));
    const r = run('', ['compute', 'crystal-field', file]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.ion).toBe('Ce3+');
    expect(out.groundDoublet).toBeNull();
    // 360 K·k_B = 31.0224 meV (k_B = 0.0861733 meV/K, CODATA; from memory)
    expect(out.levels[1].energyMeV).toBeCloseTo(360 * 0.0861733, 4);
  });

  it('Dy3+ with a large negative B20 is an Ising doublet with g∥ = 20 (pure |±15/2⟩)', () => {
    const out = JSON.parse(run(JSON.stringify({ ion: 'Dy3+', B: { B20: -0.5 } })).stdout);
    expect(out.groundDoublet.gParallel).toBeCloseTo(20, 10);
    expect(out.classification).toBe('Ising');
    expect(out.levels[0].states[0].ket).toBe('1.000|15/2⟩');
  });

  const bad: [string, string, RegExp][] = [
    ['unknown ion', JSON.stringify({ ion: 'Xx3+', B: { B20: 1 } }), /ion: got "Xx3\+", expected one of Ce3\+/],
    ['forbidden parameter', JSON.stringify({ ion: 'Dy3+', B: { B22: 0.1 }, symmetry: 'D3d' }), /B\.B22: .*no B22 term in D3d site symmetry/],
    ['non-numeric value', JSON.stringify({ ion: 'Dy3+', B: { B20: 'big' } }), /B\.B20: got "big", expected a finite number/],
    ['unknown parameter name', JSON.stringify({ ion: 'Dy3+', B: { B23: 1 } }), /B\.B23:/],
    ['bad unit', JSON.stringify({ ion: 'Dy3+', B: { B20: 1 }, unit: 'eV' }), /unit: got "eV"/],
    ['unknown field', JSON.stringify({ ion: 'Dy3+', B: { B20: 1 }, symetry: 'Oh' }), /symetry: .*no such field/],
    ['cubic ratio violated', JSON.stringify({ ion: 'Yb3+', B: { B40: 1, B44: 4 }, symmetry: 'Oh' }), /B\.B44: .*B44 = 5 × B40/],
    ['malformed JSON', '{"ion": "Dy3+", ', /malformed JSON/],
  ];
  for (const [what, input, message] of bad)
    it(`bad input (${what}) → one line on stderr, exit 2`, () => {
      const r = run(input);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(message);
    });
});
