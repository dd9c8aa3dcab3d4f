/**
 * The local ⟨111⟩ frames of the four pyrochlore sublattices (convention stated in `pyrochlore.ts`).
 */
import type { Vector3 } from './pyrochlore';

/** Orthonormal right-handed local frame of one sublattice: ẑ along the local ⟨111⟩ easy axis. */
export interface LocalFrame {
  x: Vector3;
  y: Vector3;
  z: Vector3;
}

const S3 = Math.sqrt(3);
const S6 = Math.sqrt(6);
const S2 = Math.sqrt(2);

// Phys. Rev. X 1, 021002 (2011), Appendix (from memory); ŷ = ẑ × x̂.
const FRAMES: readonly LocalFrame[] = [
  { z: [1 / S3, 1 / S3, 1 / S3], x: [-2 / S6, 1 / S6, 1 / S6], y: [0, -1 / S2, 1 / S2] },
  { z: [1 / S3, -1 / S3, -1 / S3], x: [-2 / S6, -1 / S6, -1 / S6], y: [0, 1 / S2, -1 / S2] },
  { z: [-1 / S3, 1 / S3, -1 / S3], x: [2 / S6, 1 / S6, -1 / S6], y: [0, -1 / S2, -1 / S2] },
  { z: [-1 / S3, -1 / S3, 1 / S3], x: [2 / S6, -1 / S6, 1 / S6], y: [0, 1 / S2, 1 / S2] },
];

/**
 * The four local frames {x̂_μ, ŷ_μ, ẑ_μ}, μ = 0..3, in cubic Cartesian coordinates (dimensionless unit vectors).
 * ẑ_μ points out of the up tetrahedron; an Ising moment is m_i = μ σ_i ẑ_μ(i).
 * For J_zz / J_± / J_±± bond phases use x̂_μ + i ŷ_μ as the local e^{iφ} reference.
 * @example pyrochloreLocalFrames()[0].z // [0.577, 0.577, 0.577]
 * See also: pyrochloreCubicCell
 */
export function pyrochloreLocalFrames(): readonly LocalFrame[] {
  return FRAMES;
}
