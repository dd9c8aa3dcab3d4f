/**
 * Ewald summation of the magnetic dipole–dipole interaction in a periodic cubic box with conducting ("tin-foil")
 * boundary conditions.
 *
 * For moments m_i at r_i in a cubic box of side B (volume V), the energy is E = ½ Σ_ij m_i · W(r_j − r_i) · m_j
 * (times μ0/4π), with the tensor W(r) = real + reciprocal (+ self when r = 0):
 *   real:       Σ_n' [ δ_ab B(|r+nB|) − (r+nB)_a (r+nB)_b C(|r+nB|) ],
 *               B(s) = [erfc(αs) + (2αs/√π) e^{−α²s²}] / s³,
 *               C(s) = [3 erfc(αs) + (2αs/√π)(3 + 2α²s²) e^{−α²s²}] / s⁵   (the n = 0 term is left out when r = 0);
 *   reciprocal: (4π/V) Σ_{k≠0} (k_a k_b / k²) e^{−k²/4α²} cos(k·r),  k = 2π n / B;
 *   self:       −(4α³ / 3√π) δ_ab  when r = 0.
 * References: Allen & Tildesley, Computer Simulation of Liquids, 2nd ed. (2017), §6.2 (dipolar Ewald sums);
 * Wang & Holm, J. Chem. Phys. 115, 6351 (2001) (cutoff errors). With a vacuum (spherical) boundary, add the surface
 * term (2π/3V) |Σ m_i|² to E (de Leeuw, Perram & Smith, Proc. R. Soc. Lond. A 373, 27 (1980)).
 */
import { erfc } from './erfc';
import { InputError } from '../errors';

/** Tensor components of W(r) in Å⁻³, in the order xx, yy, zz, xy, xz, yz. */
export type DipolarTensor = [number, number, number, number, number, number];

/** Options for `ewaldDipolarKernel`. */
export interface EwaldOptions {
  /** Splitting parameter α in Å⁻¹; default 6 / B. The result does not depend on it (to rounding). */
  alphaPerAngstrom?: number;
  /** α × (real-space cutoff) and (k cutoff) / (2α); default 6 (terms below e^{−36} ≈ 2e-16 are dropped). */
  cutoffFactor?: number;
}

/** The Ewald tensor as a function of a displacement, for one box. */
export interface EwaldDipolarKernel {
  boxLengthAngstrom: number;
  alphaPerAngstrom: number;
  /** W(r) for displacement r (Å), into `out` (6 components, Å⁻³). `includeSelf` for r ≡ 0 (the same site). */
  tensor(dx: number, dy: number, dz: number, out: Float64Array): void;
}

/**
 * Prepare the Ewald dipolar tensor W(r) of a periodic cubic box of side `boxLengthAngstrom` (conducting boundary).
 * The energy of moments m (μB) is E[K] = DIPOLAR_K_A3_PER_MUB2 × ½ Σ_ij m_i·W(r_j − r_i)·m_j, W in Å⁻³.
 * @example ewaldDipolarKernel(10).tensor(0, 0, 0, out) // a simple cubic lattice: out[2] = −4π/3/1000 (Lorentz)
 * See also: pyrochloreDipolarMatrix
 */
export function ewaldDipolarKernel(boxLengthAngstrom: number, options: EwaldOptions = {}): EwaldDipolarKernel {
  if (!(boxLengthAngstrom > 0) || !Number.isFinite(boxLengthAngstrom)) {
    throw new InputError('boxLengthAngstrom', boxLengthAngstrom, 'a positive length in Å');
  }
  const B = boxLengthAngstrom;
  const alpha = options.alphaPerAngstrom ?? 6 / B;
  const factor = options.cutoffFactor ?? 6;
  if (!(alpha > 0)) throw new InputError('alphaPerAngstrom', alpha, 'a positive splitting parameter in Å⁻¹');
  if (!(factor > 0)) throw new InputError('cutoffFactor', factor, 'a positive number');
  const rCut = factor / alpha;
  const kCut = 2 * alpha * factor;
  const V = B * B * B;
  // Reciprocal vectors: half space (k and −k give the same cosine), weight doubled.
  const nMax = Math.ceil((kCut * B) / (2 * Math.PI));
  const ks: number[] = [];
  for (let nx = 0; nx <= nMax; nx++)
    for (let ny = -nMax; ny <= nMax; ny++)
      for (let nz = -nMax; nz <= nMax; nz++) {
        if (nx === 0 && (ny < 0 || (ny === 0 && nz <= 0))) continue;
        const kx = (2 * Math.PI * nx) / B;
        const ky = (2 * Math.PI * ny) / B;
        const kz = (2 * Math.PI * nz) / B;
        const k2 = kx * kx + ky * ky + kz * kz;
        if (k2 > kCut * kCut) continue;
        const w = ((2 * 4 * Math.PI) / V) * (Math.exp(-k2 / (4 * alpha * alpha)) / k2);
        ks.push(kx, ky, kz, w * kx * kx, w * ky * ky, w * kz * kz, w * kx * ky, w * kx * kz, w * ky * kz);
      }
  const kData = Float64Array.from(ks);
  const nReal = Math.ceil(rCut / B) + 1;
  const twoOverSqrtPi = 2 / Math.sqrt(Math.PI);
  const selfTerm = (-4 * alpha * alpha * alpha) / (3 * Math.sqrt(Math.PI));
  return {
    boxLengthAngstrom: B,
    alphaPerAngstrom: alpha,
    tensor(dx, dy, dz, out) {
      // Bring r into the central box so that the image loop is symmetric.
      dx -= B * Math.round(dx / B);
      dy -= B * Math.round(dy / B);
      dz -= B * Math.round(dz / B);
      let xx = 0, yy = 0, zz = 0, xy = 0, xz = 0, yz = 0;
      for (let nx = -nReal; nx <= nReal; nx++)
        for (let ny = -nReal; ny <= nReal; ny++)
          for (let nz = -nReal; nz <= nReal; nz++) {
            const rx = dx + nx * B;
            const ry = dy + ny * B;
            const rz = dz + nz * B;
            const r2 = rx * rx + ry * ry + rz * rz;
            if (r2 > rCut * rCut || r2 < 1e-20) continue;
            const r = Math.sqrt(r2);
            const ar = alpha * r;
            const g = twoOverSqrtPi * ar * Math.exp(-ar * ar);
            const e = erfc(ar);
            const b = (e + g) / (r2 * r);
            const c = (3 * e + g * (3 + 2 * ar * ar)) / (r2 * r2 * r);
            xx += b - rx * rx * c;
            yy += b - ry * ry * c;
            zz += b - rz * rz * c;
            xy -= rx * ry * c;
            xz -= rx * rz * c;
            yz -= ry * rz * c;
          }
      for (let p = 0; p < kData.length; p += 9) {
        const cs = Math.cos(kData[p] * dx + kData[p + 1] * dy + kData[p + 2] * dz);
        xx += kData[p + 3] * cs;
        yy += kData[p + 4] * cs;
        zz += kData[p + 5] * cs;
        xy += kData[p + 6] * cs;
        xz += kData[p + 7] * cs;
        yz += kData[p + 8] * cs;
      }
      if (dx * dx + dy * dy + dz * dz < 1e-20) {
        xx += selfTerm;
        yy += selfTerm;
        zz += selfTerm;
      }
      out[0] = xx; out[1] = yy; out[2] = zz; out[3] = xy; out[4] = xz; out[5] = yz;
    },
  };
}
