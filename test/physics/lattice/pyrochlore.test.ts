import { describe, it, expect } from 'vitest';
import { pyrochloreCubicCell, UP_TETRAHEDRON_CENTRE_FRACTIONAL } from '@multiplet/physics/lattice/pyrochlore';
import { pyrochloreLocalFrames } from '@multiplet/physics/lattice/localFrames';

const dot = (a: readonly number[], b: readonly number[]) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: readonly number[], b: readonly number[]) => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];

describe('pyrochlore cubic cell (16d, origin choice 2)', () => {
  it('has 16 distinct sites, four per sublattice, with the 16d coordinate (1/2,1/2,1/2) present', () => {
    const sites = pyrochloreCubicCell(10);
    expect(sites).toHaveLength(16);
    const keys = new Set(sites.map((s) => s.fractional.map((v) => v.toFixed(4)).join(',')));
    expect(keys.size).toBe(16);
    expect(keys.has('0.5000,0.5000,0.5000')).toBe(true);
    for (let mu = 0; mu < 4; mu++) expect(sites.filter((s) => s.sublattice === mu)).toHaveLength(4);
  });
  it('local frames are orthonormal, right-handed, and ẑ_μ points from the up-tetrahedron centre to site μ', () => {
    const frames = pyrochloreLocalFrames();
    const sites = pyrochloreCubicCell(1).slice(0, 4);
    for (let mu = 0; mu < 4; mu++) {
      const { x, y, z } = frames[mu];
      expect(dot(x, x)).toBeCloseTo(1, 14);
      expect(dot(y, y)).toBeCloseTo(1, 14);
      expect(dot(z, z)).toBeCloseTo(1, 14);
      expect(dot(x, y)).toBeCloseTo(0, 14);
      expect(dot(x, z)).toBeCloseTo(0, 14);
      const zx = cross(z, x);
      for (let k = 0; k < 3; k++) expect(zx[k]).toBeCloseTo(y[k], 14);
      const d = [0, 1, 2].map((k) => sites[mu].fractional[k] - UP_TETRAHEDRON_CENTRE_FRACTIONAL[k]);
      const n = Math.sqrt(dot(d, d));
      expect(n).toBeCloseTo(Math.sqrt(3) / 8, 14);
      for (let k = 0; k < 3; k++) expect(d[k] / n).toBeCloseTo(z[k], 14);
    }
    // ẑ sum to zero over a tetrahedron (common practice: the 2-in-2-out states carry no net moment on average).
    for (let k = 0; k < 3; k++) expect(frames.reduce((s, f) => s + f.z[k], 0)).toBeCloseTo(0, 14);
  });
});
