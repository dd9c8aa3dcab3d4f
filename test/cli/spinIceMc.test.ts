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

describe('multiplet compute spin-ice-mc (built CLI)', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('returns one value per temperature for the documented keys, reproducibly; saturates along [111]', () => {
    const input = { L: 1, temperaturesK: [0.2, 1, 5], J1K: -3, fieldT: 20, fieldDirection: [1, 1, 1], momentMuB: 1, sweeps: 100, seed: 4 };
    const a = compute('spin-ice-mc', input);
    expect(a.code).toBe(0);
    for (const key of ['energyKPerSpin', 'heatCapacityJPerMolK', 'entropyJPerMolK', 'magnetizationMuBPerSpin']) expect(a.out[key]).toHaveLength(3);
    expect(a.out.numberOfSpins).toBe(16);
    // 3-in-1-out saturation along [111]: M = μ/2 per spin (common practice: geometry)
    expect(a.out.magnetizationMuBPerSpin[0]).toBeCloseTo(0.5, 3);
    expect(compute('spin-ice-mc', input).out).toEqual(a.out);
  });

  it('runs with the dipolar sum', () => {
    const r = compute('spin-ice-mc', { L: 1, temperaturesK: [2, 5], J1K: 3.72, dipolar: { momentMuB: 10, latticeConstantAngstrom: 10.124 }, sweeps: 60, seed: 1 });
    expect(r.code).toBe(0);
    expect(r.out.dipolarDK).toBeGreaterThan(1.3);
    expect(r.out.dipolarDK).toBeLessThan(1.45);
  });

  it('bad input exits 2 with the field named', () => {
    const r = compute('spin-ice-mc', { L: 1, temperaturesK: [1], sweeps: 100, seed: 1, dipolar: { momentMuB: -1, latticeConstantAngstrom: 10 } });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('dipolar.momentMuB');
    expect(compute('spin-ice-mc', { L: 1, temperaturesK: [1], sweeps: 100, seed: 1, J4K: 2 }).stderr).toContain('J4K');
  });
});

describe('multiplet compute structure-factor (built CLI)', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('powder I(Q) in barn/sr per ion: the high-temperature curve is the paramagnet, spin-ice correlations reshape it', () => {
    const r = compute('structure-factor', {
      L: 2, temperaturesK: [0.3, 300], J1K: -3, momentMuB: 10, latticeConstantAngstrom: 10.1, sweeps: 200, seed: 2,
      QInvAngstrom: [0.4, 1.0, 1.6, 2.4], ion: 'Ho3+', snapshots: 40,
    });
    expect(r.code).toBe(0);
    const hi = r.out.intensityBarnPerSrPerIon[1];
    r.out.paramagnetBarnPerSrPerIon.forEach((p: number, k: number) => expect(Math.abs(hi[k] / p - 1)).toBeLessThan(0.1));
    // Ice correlations at 0.3 K reshape the pattern: somewhere it differs from the paramagnet by more than 10 %.
    const diff = r.out.differenceBarnPerSrPerIon[0].map((d: number, k: number) => Math.abs(d) / r.out.paramagnetBarnPerSrPerIon[k]);
    expect(Math.max(...diff)).toBeGreaterThan(0.1);
    expect(r.out.differenceBarnPerSrPerIon[1].every((d: number) => d === 0)).toBe(true);
  });

  it('rejects a negative Q', () => {
    const r = compute('structure-factor', { L: 1, temperaturesK: [1], sweeps: 40, seed: 1, QInvAngstrom: [-1] });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('QInvAngstrom[0]');
  });
});
