import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { cefTransitions, levelStrengths } from '@multiplet/physics/neutron/cefTransitions';
import { getIon } from '@multiplet/physics/ions';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';

const root = fileURLToPath(new URL('../..', import.meta.url));
const cli = join(root, 'packages/cli/bin/multiplet.mjs');

function compute(kind: string, input: unknown) {
  const r = spawnSync(process.execPath, [cli, 'compute', kind, '-'], { input: JSON.stringify(input), encoding: 'utf8', cwd: root });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr, json: r.status === 0 ? JSON.parse(r.stdout) : undefined };
}

const B = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };

describe('multiplet compute neutron-spectrum and cef-fit (built CLI)', () => {
  beforeAll(() => {
    execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'pipe' });
  });

  it('neutron-spectrum: one intensity per energy in mb/sr/meV, transitions with level-summed powder strengths', () => {
    const energies = Array.from({ length: 2001 }, (_, k) => -20 + k * 0.05);
    const r = compute('neutron-spectrum', { ion: 'Er3+', B, symmetry: 'D3d', temperatureK: 10, energiesMeV: energies, qInvAngstrom: 0, resolution: { fwhmPolynomialMeV: [0.8, -0.005] }, lineShape: 'gaussian' });
    expect(r.stderr).toBe('');
    const out = r.json;
    expect(out.intensity).toHaveLength(energies.length);
    expect(out.intensityUnit).toBe('mb/sr/meV per ion');
    const ground = out.transitions.filter((t: { fromMeV: number }) => Math.abs(t.fromMeV) < 1e-9);
    expect(ground).toHaveLength(out.levelsMeV.length - 1);
    // Sum rule per level: Σ over final levels of the strengths + the within-level part = degeneracy × (2/3) J(J+1).
    const J = getIon('Er3+').J;
    const ls = levelStrengths(getIon('Er3+'), B);
    const withinGround = ls.pairStrengths[0];
    const total = ground.reduce((s: number, t: { strength: number }) => s + t.strength, 0);
    expect(total + withinGround).toBeCloseTo(2 * (2 / 3) * J * (J + 1), 8);
    // integrated intensity of a line = 72.65 mb × g_J² × population × strength (f = 1 at Q = 0)
    const t0 = ground[0];
    expect(t0.integratedIntensityMbSr).toBeCloseTo(MAGNETIC_PREFACTOR_MB * getIon("Er3+").gJ ** 2 * out.formFactor ** 2 * (out.populations[0] / 2) * t0.strength, 8);
  });

  it('cef-fit: recovers B from its own peaks, reports best {B, chi2Reduced, errors} and minima', () => {
    const peaks = [] as unknown[];
    for (const T of [5, 60]) {
      const t = cefTransitions('Er3+', B, T);
      for (const v of t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5))
        peaks.push({ energyMeV: v.energyMeV, errorMeV: 0.1, intensity: v.weight, intensityError: 0.05 * v.weight + 0.01, temperatureK: T });
    }
    const start = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };
    const r = compute('cef-fit', { ion: 'Er3+', symmetry: 'D3d', start, free: Object.keys(start), peaks, seed: 1, starts: 2 });
    expect(r.stderr).toBe('');
    const out = r.json;
    expect(out.best.chi2Reduced).toBeLessThan(1e-8);
    for (const [key, value] of Object.entries(B)) expect(out.best.B[key]).toBeCloseTo(value, 7);
    expect(Object.keys(out.best.errors)).toEqual(Object.keys(start));
    expect(out.minima.length).toBeGreaterThanOrEqual(1);
    expect(out.startsRun).toBe(3);
  });

  it('cef-fit: three energy-only peaks and six free parameters (ν < 0) give the best point, null errors and a warning, exit 0', () => {
    const start = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };
    const peaks = [3.68, 12.84, 25.69].map((energyMeV) => ({ energyMeV, errorMeV: 0.1, temperatureK: 5 }));
    const r = compute('cef-fit', { ion: 'Er3+', symmetry: 'D3d', start, peaks, starts: 0 });
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.json.best.degreesOfFreedom).toBe(-3);
    expect(Object.values(r.json.best.errors)).toEqual([null, null, null, null, null, null]);
    for (const v of Object.values(r.json.best.B)) expect(Number.isFinite(v)).toBe(true);
    expect(r.json.warnings.join('\n')).toMatch(/under-determined: 3 data for 6 free parameters/);
  });

  const bad: [string, unknown, RegExp][] = [
    ['zero peak error', { ion: 'Er3+', symmetry: 'D3d', start: { B20: -0.04 }, peaks: [{ energyMeV: 5, errorMeV: 0, temperatureK: 5 }] }, /peaks\[0\]\.errorMeV: got 0, expected a positive error/],
    ['forbidden parameter', { ion: 'Er3+', symmetry: 'D3d', start: { B22: 0.01 }, peaks: [{ energyMeV: 5, errorMeV: 0.1, temperatureK: 5 }] }, /start\.B22/],
    ['bounds excluding the start', { ion: 'Er3+', symmetry: 'D3d', start: { B20: -0.04 }, free: ['B20'], bounds: { B20: [0, 1] }, peaks: [{ energyMeV: 5, errorMeV: 0.1, temperatureK: 5 }] }, /bounds\.B20: .*contain the start/],
    ['no data', { ion: 'Er3+', symmetry: 'D3d', start: { B20: -0.04 }, peaks: [] }, /no data/],
  ];
  for (const [name, input, message] of bad)
    it(`cef-fit rejects ${name} with exit code 2 and one clear line`, () => {
      const r = compute('cef-fit', input);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    });

  it('neutron-spectrum rejects a bad line shape and a missing temperature', () => {
    expect(compute('neutron-spectrum', { ion: 'Er3+', B, temperatureK: 5, energiesMeV: [1], lineShape: 'voigt' }).stderr).toMatch(/lineShape/);
    expect(compute('neutron-spectrum', { ion: 'Er3+', B, energiesMeV: [1] }).stderr).toMatch(/temperatureK/);
  });
});
