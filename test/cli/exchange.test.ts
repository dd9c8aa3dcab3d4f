/** `multiplet compute exchange` through the built CLI: JSON keys, an exact limit, and bad input (exit 2). */
import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

const root = fileURLToPath(new URL('../..', import.meta.url));
const cli = join(root, 'packages/cli/bin/multiplet.mjs');

function run(input: unknown) {
  const r = spawnSync(process.execPath, [cli, 'compute', 'exchange', '-'], { input: JSON.stringify(input), encoding: 'utf8', cwd: root });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('multiplet compute exchange (built CLI)', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('pure |±15/2⟩ Dy3+ doublet with isotropic exchange: J_zz = 4J²(−1/3)J_ex at first order, no transverse terms', () => {
    // Derivation in test/physics/exchange/effectiveExchange.test.ts (P J^z P = 2J S^z, ẑ_i·ẑ_j = −1/3).
    const r = run({ ion: 'Dy3+', B: { B20: -0.1 }, latticeConstantAngstrom: 10.1, coupling: { isotropicMeV: 0.001 }, order: 2, furtherNeighbours: true });
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.first.Jzz).toBeCloseTo(4 * 7.5 * 7.5 * (-1 / 3) * 0.001, 12);
    for (const key of ['Jpm', 'Jpmpm', 'Jzpm']) expect(Math.abs(out.first[key])).toBeLessThan(1e-14);
    expect(Object.keys(out.second)).toEqual(expect.arrayContaining(['Jzz', 'Jpm', 'Jpmpm', 'Jzpm']));
    expect(typeof out.twoSiteCheck).toBe('number');
    expect(out.twoSiteCheck).toBeLessThan(1e-6);
    expect(out.ratios.first.JpmOverJzz).toBeCloseTo(0, 12);
    expect(out.interpretation).toMatch(/Ising limit/);
    // pyrochlore geometry: J1 has two common nearest neighbours, J2 and J3b one, J3a none
    expect(out.furtherNeighbours.map((c: { shell: string; middleIons: number }) => [c.shell, c.middleIons])).toEqual([['J1', 2], ['J2', 1], ['J3a', 0], ['J3b', 1]]);
  });

  it('order 1 gives second = null; K units and a general geometry are accepted', () => {
    const frame = { x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] };
    const r = run({
      ion: 'Yb3+',
      B: { B20: 4.6, B40: 0.23 },
      unit: 'K',
      geometry: { positionIAngstrom: [1, 1, 1], positionJAngstrom: [4.5, 1, 1], frameI: frame, frameJ: frame },
      coupling: { matrixMeV: [[0.01, 0, 0], [0, 0.01, 0], [0, 0, 0.02]], dipolar: true },
      order: 1,
    });
    expect(r.stderr).toBe('');
    const out = JSON.parse(r.stdout);
    expect(out.second).toBeNull();
    expect(out.bondVectorAngstrom).toEqual([3.5, 0, 0]);
    expect(out.first.Jzz).not.toBe(0);
  });

  it('bad input: no doublet ground state, zero lattice constant, wrong coupling matrix shape → one line, exit 2', () => {
    const cases: Array<[unknown, RegExp]> = [
      [{ ion: 'Pr3+', B: { B20: 0.3 }, latticeConstantAngstrom: 10.1, coupling: { isotropicMeV: 0.01 } }, /doublet ground state/],
      [{ ion: 'Yb3+', B: { B20: 0.4 }, latticeConstantAngstrom: 0, coupling: { isotropicMeV: 0.01 } }, /latticeConstantAngstrom/],
      [{ ion: 'Yb3+', B: { B20: 0.4 }, latticeConstantAngstrom: 10, coupling: { matrixMeV: [[1, 0], [0, 1]] } }, /coupling\.matrixMeV/],
    ];
    for (const [input, pattern] of cases) {
      const r = run(input);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(pattern);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
  });
});
