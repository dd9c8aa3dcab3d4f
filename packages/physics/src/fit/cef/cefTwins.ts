/**
 * Symmetry twins of a fitted crystal field, and the sign convention that picks one of them.
 *
 * Rotating the CEF frame by a rotation R that maps the site symmetry's allowed Stevens operators onto themselves
 * gives a second parameter set with the same levels and eigenstates (H' = D(R)† H D(R), a unitary transform), so the
 * same powder spectra, powder χ(T) and M(B), and the same single-crystal data along z or in the xy plane. Dipole
 * neutron strengths summed over degenerate levels are Q̂ᵀ M Q̂ with a rank-2 tensor M (uniaxial for a trigonal or
 * tetragonal site), and χ is rank 2 as well, so these never see the twins; M(B) at high field along a direction off z
 * and off the xy plane can (test/physics/fit/cefTwins.test.ts). In D3d/D3/C3v (z ∥ 3-fold, y along a two-fold axis) the 180° (equivalently 60°)
 * rotation about z maps B_n^m → (−1)^m B_n^m: B43 and B63 change sign together; in D4h-type frames the 45° rotation
 * flips B44 and B64; in D6h-type frames the 30° rotation flips B66; in D2h-type frames the 90° rotation flips
 * B22, B42, B62, B66. These sign maps are not typed in here: they are derived from rotateCefParameters (Wigner
 * rotation of the operator equivalents, cef/rotateCefParameters.ts) for the candidate rotations below, keeping those
 * that send every free key to ± itself and leave the fixed and tied parameters as they are.
 *
 * A fitted minimum and its twin are merged only when the model's residuals agree at both (data that tell the twins
 * apart keep them as two minima). The reported representative
 * follows this convention: for the flipped keys in the model's key order (B43 first in D3d), the first one that is
 * not zero has the sign of the start's value of that key, or is positive when the start has it at zero. A start from
 * a point-charge estimate thus keeps the frame of the ligand positions; a start without it reports B43 ≥ 0.
 *
 * Not covered: the continuous frame freedom of groups with sine terms (C3, S6, C4h, C6h, C2h, none: a rotation about z
 * by any angle mixes B_n^m and B_n^−m) and the axis permutations of orthorhombic frames; such minima can still appear
 * as distinct entries.
 */
import { rotateCefParameters } from '../../cef/rotateCefParameters';
import type { EulerAngles } from '../../cef/wignerRotation';
import type { LevenbergMarquardtResult } from '../levenbergMarquardt';
import type { CefFitModel } from './cefFitModel';

/** One twin map: the sign of every entry of the model's parameter vector (the fitted width keeps +1). */
export interface CefTwinMap {
  readonly signs: Float64Array;
  /** Free keys that change sign. */
  readonly flippedKeys: readonly string[];
}

const TOLERANCE = 1e-9;

/** Candidate frame rotations: about z by π/k (k = 1 … 6), and 180° about x and about y. */
function candidateRotations(): (EulerAngles | number[][])[] {
  const out: (EulerAngles | number[][])[] = [];
  for (let k = 1; k <= 6; k++) out.push({ alpha: Math.PI / k, beta: 0, gamma: 0 });
  out.push([[1, 0, 0], [0, -1, 0], [0, 0, -1]]);
  out.push([[-1, 0, 0], [0, 1, 0], [0, 0, -1]]);
  return out;
}

/** The sign of key under a rotation, or undefined when the rotated operator is not ± the same operator. */
function signUnder(key: string, J: number, rotation: EulerAngles | number[][]): number | undefined {
  const image = rotateCefParameters({ [key]: 1 }, J, rotation);
  for (const [k, v] of Object.entries(image)) if (k !== key && Math.abs(v) > TOLERANCE) return undefined;
  const v = image[key] ?? 0;
  if (Math.abs(Math.abs(v) - 1) > TOLERANCE) return undefined;
  return Math.sign(v);
}

/** The distinct non-trivial twin maps of a fit model (a group under element-wise products, identity left out). */
export function cefTwinMaps(model: CefFitModel): CefTwinMap[] {
  const p = model.parameterCount;
  const found = new Map<string, Float64Array>();
  for (const rotation of candidateRotations()) {
    const signs = new Float64Array(p).fill(1);
    let ok = true;
    model.freeKeys.forEach((key, k) => {
      const s = ok ? signUnder(key, model.ion.J, rotation) : undefined;
      if (s === undefined) ok = false;
      else signs[k] = s;
    });
    if (!ok) continue;
    // Fixed parameters must stay as they are (a fixed non-zero B43 cannot flip); tied ones must follow their source.
    for (const [key, value] of Object.entries(model.fixed)) {
      if (value === 0 || !ok) continue;
      if (signUnder(key, model.ion.J, rotation) !== 1) ok = false;
    }
    for (const [key, [source]] of Object.entries(model.ties)) {
      if (!ok) continue;
      const k = model.freeKeys.indexOf(source);
      const s = signUnder(key, model.ion.J, rotation);
      if (s === undefined || s !== (k >= 0 ? signs[k] : signUnder(source, model.ion.J, rotation))) ok = false;
    }
    if (!ok || signs.every((s) => s === 1)) continue;
    found.set(Array.from(signs).join(','), signs);
  }
  // Close under products (two twins in a row are a twin too).
  let grew = true;
  while (grew) {
    grew = false;
    for (const a of [...found.values()])
      for (const b of [...found.values()]) {
        const c = a.map((v, j) => v * b[j]);
        const key = Array.from(c).join(',');
        if (!c.every((v) => v === 1) && !found.has(key)) {
          found.set(key, c);
          grew = true;
        }
      }
  }
  return [...found.values()].map((signs) => ({ signs, flippedKeys: model.freeKeys.filter((_, k) => signs[k] === -1) }));
}

/** The parameter vector of a twin. */
function apply(x: ArrayLike<number>, signs: Float64Array): Float64Array {
  return Float64Array.from({ length: signs.length }, (_, j) => signs[j] * x[j]);
}

/**
 * A LevenbergMarquardtResult carried to the twin: parameters, correlation, covariance and Jacobian columns flip.
 * `signs` may be longer than the fit's parameter vector (a fit of the leading parameters only, e.g. the B's).
 */
export function flipFit(fit: LevenbergMarquardtResult, signs: ArrayLike<number>): LevenbergMarquardtResult {
  const p = fit.parameters.length;
  const matrix = (m: Float64Array) => m.map((v, i) => v * signs[Math.floor(i / p)] * signs[i % p]);
  return {
    ...fit,
    parameters: fit.parameters.map((v, j) => v * signs[j]),
    covariance: matrix(fit.covariance),
    correlation: matrix(fit.correlation),
    jacobian: fit.jacobian.map((v, i) => v * signs[i % p]),
  };
}

/** Twin maps plus the data-aware equivalence test and the sign convention for one model. */
export class CefTwins {
  readonly maps: CefTwinMap[];
  /** Free keys flipped by some twin, in the model's key order, with the reference sign of each. */
  private readonly convention: { index: number; sign: number }[];

  constructor(private readonly model: CefFitModel) {
    this.maps = cefTwinMaps(model);
    const flipped = new Set(this.maps.flatMap((m) => m.flippedKeys));
    this.convention = model.freeKeys
      .map((key, index) => ({ key, index }))
      .filter(({ key }) => flipped.has(key))
      .map(({ index }) => ({ index, sign: model.startScaled[index] < 0 ? -1 : 1 }));
  }

  /** Twins of x that lie inside the bounds and give the same residuals (to 1e-6 relative) for this model's data. */
  equivalentTwins(x: ArrayLike<number>, residuals?: Float64Array): CefTwinMap[] {
    if (this.maps.length === 0) return [];
    const r0 = residuals ?? this.model.residuals(Float64Array.from(x));
    let scale = 1;
    for (const v of r0) scale = Math.max(scale, Math.abs(v));
    return this.maps.filter((map) => {
      const y = apply(x, map.signs);
      for (let j = 0; j < y.length; j++) if (y[j] < this.model.lowerScaled[j] || y[j] > this.model.upperScaled[j]) return false;
      const r1 = this.model.residuals(y);
      for (let i = 0; i < r0.length; i++) if (Math.abs(r1[i] - r0[i]) > 1e-6 * scale) return false;
      return true;
    });
  }

  /** The representative of x's equivalent twins under the sign convention (x itself when it already is one). */
  canonicalSigns(x: ArrayLike<number>, residuals?: Float64Array): Float64Array | undefined {
    const images: { signs: Float64Array | undefined; y: Float64Array }[] = [{ signs: undefined, y: Float64Array.from(x) }];
    for (const map of this.equivalentTwins(x, residuals)) images.push({ signs: map.signs, y: apply(x, map.signs) });
    if (images.length === 1) return undefined;
    let remaining = images;
    for (const { index, sign } of this.convention) {
      const floor = TOLERANCE * (this.model.upperScaled[index] - this.model.lowerScaled[index]);
      const matching = remaining.filter(({ y }) => Math.abs(y[index]) > floor && Math.sign(y[index]) === sign);
      if (matching.length > 0) remaining = matching;
      if (remaining.length === 1) break;
    }
    return remaining[0].signs;
  }

  /** A local fit result moved to its canonical twin (unchanged when it already is the representative). */
  canonicalFit(fit: LevenbergMarquardtResult): LevenbergMarquardtResult {
    const signs = this.canonicalSigns(fit.parameters, fit.residuals);
    return signs ? flipFit(fit, signs) : fit;
  }
}
