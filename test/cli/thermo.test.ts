import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

const root = fileURLToPath(new URL('../..', import.meta.url));
const cli = join(root, 'packages/cli/bin/multiplet.mjs');

function compute(kind: string, input: unknown) {
  const r = spawnSync(process.execPath, [cli, 'compute', kind, '-'], { input: JSON.stringify(input), encoding: 'utf8', cwd: root });
  return { code: r.status, out: r.status === 0 ? JSON.parse(r.stdout) : undefined, stderr: r.stderr };
}

const R = 8.314462618; // J/(mol K), CODATA (exact: N_A k_B)
const brillouin = (J: number, x: number) => {
  const a = (2 * J + 1) / (2 * J), b = 1 / (2 * J);
  return a / Math.tanh(a * x) - b / Math.tanh(b * x);
};

describe('multiplet compute magnetization | susceptibility | heat-capacity | entropy (built CLI)', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('magnetization of Gd3+ (L = 0, no CEF) is the Brillouin curve g J B_J(x) (Kittel ch. 14), powder or not', () => {
    const input = { ion: 'Gd3+', B: {}, temperaturesK: [2, 10], fieldsT: [0.5, 5], direction: [0, 0, 1] };
    const r = compute('magnetization', input);
    expect(r.code).toBe(0);
    // μB/k_B = 0.6717 K/T (CODATA; from memory)
    [2, 10].forEach((t, i) =>
      [0.5, 5].forEach((b, j) => expect(r.out.magnetizationMuB[i][j]).toBeCloseTo(7 * brillouin(3.5, (2 * 0.67171 * 3.5 * b) / t), 3)),
    );
    const powder = compute('magnetization', { ...input, direction: 'powder', powderDegree: 11 });
    expect(powder.out.magnetizationMuB[0][0]).toBeCloseTo(r.out.magnetizationMuB[0][0], 10);
    expect(powder.out.powder.degree).toBe(11);
  });

  it('saturated Ising Dy3+ on the pyrochlore ⟨111⟩ frames: M = m/2 along [111] and m/√3 along [001], m = 10 μB (common practice)', () => {
    const base = { ion: 'Dy3+', B: { B20: -1000 }, temperaturesK: [0.5], fieldsT: [3], sites: 'pyrochlore' };
    expect(compute('magnetization', { ...base, direction: [1, 1, 1] }).out.magnetizationMuB[0][0]).toBeCloseTo(5, 3);
    expect(compute('magnetization', { ...base, direction: [0, 0, 1] }).out.magnetizationMuB[0][0]).toBeCloseTo(10 / Math.sqrt(3), 3);
  });

  it('susceptibility: T·χ tends to the free-ion Curie constant 0.12505 g² J(J+1) (Van Vleck theorem); per formula unit and SI', () => {
    const r = compute('susceptibility', { ion: 'Er3+', B: { B20: -0.05, B40: 4e-4, B43: -3e-3 }, temperaturesK: [5, 1e6], direction: 'powder', ionsPerFormulaUnit: 2 });
    expect(r.code).toBe(0);
    const curie = 0.12505 * 1.2 ** 2 * 7.5 * 8.5;
    expect((1e6 * r.out.chiEmuPerMol[1]) / curie).toBeCloseTo(1, 3);
    expect(r.out.freeIonMomentMuB).toBeCloseTo(9.58, 2); // Er3+: g√(J(J+1)) = 9.58 μB (Kittel table: 9.5)
    expect(r.out.inverseChiMolPerEmu[0]).toBeCloseTo(1 / r.out.chiEmuPerMol[0], 10);
    expect(r.out.chiEmuPerMolFormulaUnit[0]).toBeCloseTo(2 * r.out.chiEmuPerMol[0], 10);
    expect(r.out.chiM3PerMol[0]).toBeCloseTo(4 * Math.PI * 1e-6 * r.out.chiEmuPerMol[0], 14);
  });

  it('heat-capacity: statistical entropy → R ln(2J+1), released entropy above a Kramers doublet → R ln 8 for J = 15/2', () => {
    const r = compute('heat-capacity', { ion: 'Er3+', B: { B20: -0.05, B40: 4e-4 }, temperaturesK: [1, 1e6] });
    expect(r.code).toBe(0);
    expect(r.out.totalEntropyJPerMolK[1]).toBeCloseTo(R * Math.log(16), 2);
    expect(r.out.entropyJPerMolK[1]).toBeCloseTo(R * Math.log(8), 2);
    expect(r.out.levelsMeV).toHaveLength(16);
  });

  it('entropy: trapezoidal ∫C/T dT with comparison lines R ln 2 and R[ln 2 − ½ ln(3/2)] (Pauling 1935)', () => {
    const r = compute('entropy', { temperaturesK: [1, 2, 4], heatCapacityJPerMolK: [1, 2, 4] });
    expect(r.code).toBe(0);
    expect(r.out.entropyJPerMolK).toEqual([0, 1, 3]);
    expect(r.out.rLn2JPerMolK).toBeCloseTo(5.763, 3);
    expect(r.out.spinIceJPerMolK).toBeCloseTo(4.078, 3);
  });

  const bad: Array<[string, string, unknown, RegExp]> = [
    ['zero temperature', 'magnetization', { ion: 'Dy3+', temperaturesK: [0], fieldsT: [1], direction: [0, 0, 1] }, /temperaturesK\[0\]: got 0, expected a temperature > 0 K/],
    ['empty field list', 'magnetization', { ion: 'Dy3+', temperaturesK: [2], fieldsT: [], direction: [0, 0, 1] }, /fieldsT: got \[\], expected a non-empty array/],
    ['unknown direction', 'susceptibility', { ion: 'Dy3+', temperaturesK: [2], direction: 'c' }, /direction: got "c", expected a direction \[x, y, z\]/],
    ['unknown sites', 'magnetization', { ion: 'Dy3+', temperaturesK: [2], fieldsT: [1], direction: 'powder', sites: 'kagome' }, /sites: got "kagome"/],
    ['negative temperature', 'heat-capacity', { ion: 'Dy3+', temperaturesK: [-3] }, /temperaturesK\[0\]: got -3/],
    ['mismatched lengths', 'entropy', { temperaturesK: [1, 2, 3], heatCapacityJPerMolK: [1, 1] }, /heatCapacityJPerMolK: got "2 values", expected 3 values/],
    ['non-monotonic data', 'entropy', { temperaturesK: [1, 3, 2], heatCapacityJPerMolK: [1, 1, 1] }, /temperaturesK\[2\]: got 2, expected a value > 3/],
    ['unknown field', 'susceptibility', { ion: 'Dy3+', temperaturesK: [2], direction: 'powder', lambda: 1 }, /lambda: .*no such field/],
    ['bad extrapolation', 'entropy', { temperaturesK: [1, 2], heatCapacityJPerMolK: [1, 1], extrapolation: 'debye' }, /extrapolation: got "debye"/],
  ];
  for (const [what, kind, input, message] of bad)
    it(`rejects ${what} with one line on stderr and exit code 2`, () => {
      const r = compute(kind, input);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    });
});
