import { InputError } from '../errors';
import { pyrochloreLocalFrames, type LocalFrame } from '../lattice/localFrames';

/** A 3×3 rotation, row-major [[r00, r01, r02], [r10, r11, r12], [r20, r21, r22]]; its columns are the local x, y, z axes in the global (cubic) frame. */
export type Rotation3 = readonly [readonly [number, number, number], readonly [number, number, number], readonly [number, number, number]];

/** Built-in sets of site frames. */
export type SiteFrameName = 'single' | 'pyrochlore';

/** The rotation local → global whose columns are the frame's x̂, ŷ, ẑ. */
function rotationFromFrame({ x, y, z }: LocalFrame): Rotation3 {
  return [
    [x[0], y[0], z[0]],
    [x[1], y[1], z[1]],
    [x[2], y[2], z[2]],
  ];
}

/**
 * The four local frames of the pyrochlore (and spinel B) sites, in the cubic frame of the crystal: the frames of
 * `lattice/localFrames.ts` (the one source; axes, site order μ = 0..3 and handedness ŷ = ẑ × x̂ are documented in
 * `lattice/pyrochlore.ts`), written as rotations:
 *   z₀ = [ 1, 1, 1]/√3,  x₀ = [−2, 1, 1]/√6,  y₀ = [0, −1, 1]/√2 (a two-fold axis of site 0), …
 * Sites 1, 2, 3 are site 0 turned by the two-fold rotations about [100], [010], [001], so one set of CEF
 * parameters in the local frame serves all four.
 */
const PYROCHLORE: readonly Rotation3[] = pyrochloreLocalFrames().map(rotationFromFrame);

const IDENTITY: Rotation3 = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

/**
 * Site frames of a crystal: the rotations R_s (local → global, columns = local axes in the global frame) of its
 * magnetic sites. A field B given in the global frame acts on site s as B_local = R_sᵀ B; a local moment m_local
 * appears in the global frame as R_s m_local.
 *
 * 'single': one site whose local frame is the global frame. 'pyrochlore': the four ⟨111⟩ frames of lattice/localFrames.
 * A custom list of rotations is checked for orthonormality and det = +1.
 *
 * @example siteFrames('pyrochlore')[0][2][2] // z-component of local z of site 0 = 1/√3
 * @throws InputError for an unknown name or a matrix that is not a proper rotation (to 1e-8).
 * See also: magnetization, vanVleckSusceptibility.
 */
export function siteFrames(sites: SiteFrameName | readonly Rotation3[] = 'single'): readonly Rotation3[] {
  if (sites === 'single') return [IDENTITY];
  if (sites === 'pyrochlore') return PYROCHLORE;
  if (!Array.isArray(sites) || sites.length === 0)
    throw new InputError('sites', sites, '"single", "pyrochlore" or a non-empty list of 3×3 rotation matrices (local → global)');
  sites.forEach((r, s) => {
    const ok = Array.isArray(r) && r.length === 3 && r.every((row) => Array.isArray(row) && row.length === 3 && row.every((x) => typeof x === 'number' && Number.isFinite(x)));
    if (!ok) throw new InputError(`sites[${s}]`, r, 'a 3×3 array of finite numbers');
    for (let a = 0; a < 3; a++)
      for (let b = 0; b < 3; b++) {
        const dot = r[0][a] * r[0][b] + r[1][a] * r[1][b] + r[2][a] * r[2][b];
        if (Math.abs(dot - (a === b ? 1 : 0)) > 1e-8) throw new InputError(`sites[${s}]`, r, 'an orthonormal matrix (columns = local axes)');
      }
    const det =
      r[0][0] * (r[1][1] * r[2][2] - r[1][2] * r[2][1]) - r[0][1] * (r[1][0] * r[2][2] - r[1][2] * r[2][0]) + r[0][2] * (r[1][0] * r[2][1] - r[1][1] * r[2][0]);
    if (Math.abs(det - 1) > 1e-8) throw new InputError(`sites[${s}]`, r, 'a proper rotation (determinant +1)');
  });
  return sites;
}

/** v_local = Rᵀ v_global. */
export function toLocal(r: Rotation3, v: readonly number[]): [number, number, number] {
  return [
    r[0][0] * v[0] + r[1][0] * v[1] + r[2][0] * v[2],
    r[0][1] * v[0] + r[1][1] * v[1] + r[2][1] * v[2],
    r[0][2] * v[0] + r[1][2] * v[1] + r[2][2] * v[2],
  ];
}
