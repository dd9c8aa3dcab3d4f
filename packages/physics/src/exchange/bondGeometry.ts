/**
 * Two-site geometry for the exchange calculation (bond vector and the two local frames) and the bond-dependent
 * phases of the nearest-neighbour anisotropic pseudospin model.
 *
 * Phase convention (stated once here; README "exchange"). For a bond i → j with local frames {x̂, ŷ, ẑ}:
 *   γ_ij = e^{−i(φ_i + φ_j)}, φ_k = azimuth of n̂ = ẑ_i × ẑ_j / |ẑ_i × ẑ_j| in the local (x̂_k, ŷ_k) plane;
 *   ζ_ij = e^{−i ψ_j},        ψ_j = azimuth in frame j of ẑ_i projected on the plane ⊥ ẑ_j.
 * With these, J_±±(γ_ij S⁺_i S⁺_j + c.c.) = 2J_±±(S^n_i S^n_j − S^m_i S^m_j) (n̂ and m̂ = ẑ × n̂ in each frame) and
 * J_z± S^z_i(ζ_ij S⁺_j + c.c.) = 2J_z± S^z_i S^{ẑ_i⊥}_j: each phase is the azimuth of a bond-defined direction.
 * For the pyrochlore frames of `lattice/localFrames.ts` this reproduces the table γ = [[0,1,w,w²],[1,0,w²,w],
 * [w,w²,0,1],[w²,w,1,0]], w = e^{2πi/3}, ζ = −γ* (Phys. Rev. X 1, 021002 (2011); from
 * memory; checked in test/physics/exchange/bondGeometry.test.ts). When ẑ_i ∥ ẑ_j (other lattices) n̂ = r̂ × ẑ_i is
 * used, and the bond vector r̂ projected on the plane of j replaces ẑ_i for ζ; if that also vanishes, x̂ is used.
 */
import { InputError } from '../errors';
import type { Vector3 } from '../lattice/pyrochlore';
import { pyrochloreLocalFrames, type LocalFrame } from '../lattice/localFrames';
import { pyrochloreNeighbourShells } from '../lattice/neighbourShells';
import { cross3, dot3, norm3, scale3, sub3 } from './matrix3';

/** A bond between two magnetic ions i and j. */
export interface BondGeometry {
  /** r_j − r_i in Å (global Cartesian frame). */
  bondVectorAngstrom: Vector3;
  /** Local frame of ion i (its CEF parameters are given in this frame). */
  frameI: LocalFrame;
  /** Local frame of ion j. */
  frameJ: LocalFrame;
  /** Human label, e.g. "pyrochlore 0→1, r = 3.571 Å". */
  label: string;
}

/** A unit complex number [re, im]. */
export type Phase = [number, number];

/** The bond phases of the J_±± and J_z± terms. */
export interface BondPhases {
  gamma: Phase;
  /** ζ_ij: multiplies S^z_i S⁺_j. */
  zetaIJ: Phase;
  /** ζ_ji: multiplies S⁺_i S^z_j. */
  zetaJI: Phase;
}

/**
 * The nearest-neighbour bond between pyrochlore sublattices `from` and `to` (lattice module convention), with
 * r_nn = a√2/4.
 * @example pyrochloreBond(10.1).bondVectorAngstrom // [0, −2.525, −2.525] for 0 → 1
 * @throws InputError for a non-positive lattice constant or equal/invalid sublattices.
 * See also: generalBond, bondPhases
 */
export function pyrochloreBond(latticeConstantAngstrom: number, from = 0, to = 1, field = 'latticeConstantAngstrom'): BondGeometry {
  if (typeof latticeConstantAngstrom !== 'number' || !Number.isFinite(latticeConstantAngstrom) || latticeConstantAngstrom <= 0)
    throw new InputError(field, latticeConstantAngstrom, 'a positive lattice constant in Å');
  for (const [name, v] of [['from', from], ['to', to]] as const)
    if (!Number.isInteger(v) || v < 0 || v > 3) throw new InputError(name, v, 'a pyrochlore sublattice 0..3');
  if (from === to) throw new InputError('to', to, `a sublattice different from ${from} (nearest neighbours sit on different sublattices)`);
  const shells = pyrochloreNeighbourShells(latticeConstantAngstrom);
  const bond = shells.bonds[from].find((b) => b.shell === 'J1' && b.to === to);
  if (!bond) throw new InputError('to', to, 'a nearest-neighbour sublattice');
  const frames = pyrochloreLocalFrames();
  return {
    bondVectorAngstrom: bond.vectorAngstrom,
    frameI: frames[from],
    frameJ: frames[to],
    label: `pyrochlore ${from}→${to}, r = ${bond.distanceAngstrom.toFixed(4)} Å`,
  };
}

function checkVector(v: unknown, field: string): Vector3 {
  if (!Array.isArray(v) || v.length !== 3 || v.some((x) => typeof x !== 'number' || !Number.isFinite(x)))
    throw new InputError(field, v, 'three finite numbers');
  return [v[0], v[1], v[2]];
}

/**
 * A general two-site geometry: bond vector (Å) and two right-handed orthonormal local frames (tolerance 1e-6).
 * @example generalBond([3, 0, 0], { x: [1,0,0], y: [0,1,0], z: [0,0,1] }, { x: [1,0,0], y: [0,1,0], z: [0,0,1] })
 * @throws InputError naming the field for a zero bond vector or a frame that is not orthonormal and right-handed.
 * See also: pyrochloreBond
 */
export function generalBond(bondVectorAngstrom: unknown, frameI: unknown, frameJ: unknown, field = 'geometry'): BondGeometry {
  const r = checkVector(bondVectorAngstrom, `${field}.bondVectorAngstrom`);
  if (norm3(r) <= 1e-6) throw new InputError(`${field}.bondVectorAngstrom`, bondVectorAngstrom, 'a non-zero bond vector in Å');
  const frames = [frameI, frameJ].map((f, k) => {
    const name = `${field}.${k === 0 ? 'frameI' : 'frameJ'}`;
    if (f === null || typeof f !== 'object') throw new InputError(name, f, 'an object {x, y, z} of unit vectors');
    const o = f as Record<string, unknown>;
    const x = checkVector(o.x, `${name}.x`), y = checkVector(o.y, `${name}.y`), z = checkVector(o.z, `${name}.z`);
    const c = cross3(x, y);
    const bad = [dot3(x, x) - 1, dot3(y, y) - 1, dot3(z, z) - 1, dot3(x, y), dot3(y, z), dot3(x, z), ...sub3(c, z)].some((e) => Math.abs(e) > 1e-6);
    if (bad) throw new InputError(name, f, 'orthonormal right-handed axes (x × y = z)');
    return { x, y, z } as LocalFrame;
  });
  return { bondVectorAngstrom: r, frameI: frames[0], frameJ: frames[1], label: `general bond, r = ${norm3(r).toFixed(4)} Å` };
}

/** Azimuth of v in the (x̂, ŷ) plane of a frame; null when v is (nearly) along ẑ. */
function azimuth(v: Vector3, frame: LocalFrame): number | null {
  const a = dot3(v, frame.x), b = dot3(v, frame.y);
  if (Math.hypot(a, b) < 1e-9 * Math.max(1, norm3(v))) return null;
  return Math.atan2(b, a);
}

/** The unit vector n̂ defining γ (see module comment). */
function gammaReference(g: BondGeometry): Vector3 {
  const c = cross3(g.frameI.z, g.frameJ.z);
  if (norm3(c) > 1e-9) return scale3(c, 1 / norm3(c));
  const d = cross3(g.bondVectorAngstrom, g.frameI.z);
  if (norm3(d) > 1e-9) return scale3(d, 1 / norm3(d));
  return g.frameI.x;
}

function zetaPhase(zOther: Vector3, r: Vector3, frame: LocalFrame): Phase {
  const psi = azimuth(zOther, frame) ?? azimuth(r, frame) ?? 0;
  return [Math.cos(psi), -Math.sin(psi)];
}

/**
 * Bond phases γ_ij, ζ_ij, ζ_ji of the anisotropic nearest-neighbour pseudospin model (convention: module comment).
 * @example bondPhases(pyrochloreBond(10.1, 0, 2)).gamma // [−0.5, 0.866] = e^{2πi/3}
 * See also: couplingsFromMatrix (exchange/pseudospinCouplings.ts)
 */
export function bondPhases(g: BondGeometry): BondPhases {
  const n = gammaReference(g);
  const phiI = azimuth(n, g.frameI) ?? 0;
  const phiJ = azimuth(n, g.frameJ) ?? 0;
  const r = g.bondVectorAngstrom;
  return {
    gamma: [Math.cos(phiI + phiJ), -Math.sin(phiI + phiJ)],
    zetaIJ: zetaPhase(g.frameI.z, r, g.frameJ),
    zetaJI: zetaPhase(g.frameJ.z, scale3(r, -1), g.frameI),
  };
}
