import { describe, expect, it } from 'vitest';
import { siteFrames, toLocal } from '@multiplet/physics/thermo/siteFrames';
import { InputError } from '@multiplet/physics/errors';

describe('siteFrames', () => {
  it('pyrochlore: four proper rotations whose local z are the ⟨111⟩ axes [111], [1−1−1], [−11−1], [−1−11] (common practice)', () => {
    const frames = siteFrames('pyrochlore');
    const axes = [[1, 1, 1], [1, -1, -1], [-1, 1, -1], [-1, -1, 1]];
    frames.forEach((r, s) => {
      expect(siteFrames([r])).toHaveLength(1); // passes the orthonormality and det = +1 checks
      for (let i = 0; i < 3; i++) expect(r[i][2]).toBeCloseTo(axes[s][i] / Math.sqrt(3), 14);
      // the global field along the site's own axis is local z
      const local = toLocal(r, axes[s].map((x) => x / Math.sqrt(3)));
      expect(local[2]).toBeCloseTo(1, 14);
    });
  });

  it('sites 1–3 are site 0 turned by the two-fold rotations about [100], [010], [001]', () => {
    const [r0, ...rest] = siteFrames('pyrochlore');
    const twofold = [[1, -1, -1], [-1, 1, -1], [-1, -1, 1]];
    rest.forEach((r, k) => {
      for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(r[i][j]).toBeCloseTo(twofold[k][i] * r0[i][j], 14);
    });
  });

  it('rejects unknown names, improper rotations and non-orthonormal matrices', () => {
    expect(() => siteFrames('spinel-B' as never)).toThrow(InputError);
    expect(() => siteFrames([[[1, 0, 0], [0, 1, 0], [0, 0, -1]]])).toThrow(InputError);
    expect(() => siteFrames([[[1, 0, 0], [0, 2, 0], [0, 0, 1]]])).toThrow(InputError);
  });
});
