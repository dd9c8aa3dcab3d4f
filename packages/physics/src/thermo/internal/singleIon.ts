// The single-ion machinery shared by magnetization, susceptibility and heatCapacity: H_CEF built once, the Zeeman
// term along a unit vector added into a reused buffer, one diagonalisation per (direction, field), and thermal
// averages of the moment component along the field for any number of temperatures.
import { InputError } from '../../errors';
import { angularMomentumMatrices, cefHamiltonian, type CefParameters } from '../../cef';
import { EigenWorkspace, solveInto, zeros, type ComplexMatrix } from '../../linalg';
import { BOHR_MAGNETON_MEV_PER_T, BOLTZMANN_MEV_PER_K } from '../../units';
import { finiteNumber } from './validate';

/** A rare-earth ion in its crystal field: J, Landé g_J and Stevens parameters in meV (local frame). */
export interface SingleIonInput {
  J: number;
  gJ: number;
  parametersMeV: CefParameters;
}

/** Sparse Hermitian operator: nonzero entries (row, col, re, im). */
interface Sparse {
  rows: Int32Array;
  cols: Int32Array;
  re: Float64Array;
  im: Float64Array;
}

export class PreparedIon {
  readonly J: number;
  readonly gJ: number;
  readonly dim: number;
  readonly hCef: ComplexMatrix;
  readonly jx: ComplexMatrix;
  readonly jy: ComplexMatrix;
  readonly jz: ComplexMatrix;
  private readonly workspace: EigenWorkspace;
  private readonly buffer: ComplexMatrix;
  /** Number of diagonalisations done so far (for benchmarks and reports). */
  diagonalisations = 0;

  constructor(ion: SingleIonInput, field = 'ion') {
    if (ion === null || typeof ion !== 'object') throw new InputError(field, ion, 'an ion { J, gJ, parametersMeV }');
    this.gJ = finiteNumber(ion.gJ, `${field}.gJ`, 'a finite Landé factor');
    this.hCef = cefHamiltonian(ion.J, ion.parametersMeV, 'B');
    this.J = ion.J;
    const { Jx, Jy, Jz } = angularMomentumMatrices(ion.J);
    this.jx = Jx;
    this.jy = Jy;
    this.jz = Jz;
    this.dim = Jx.n;
    this.workspace = new EigenWorkspace(this.dim);
    this.buffer = zeros(this.dim);
  }

  /** u·J for a unit vector u (local frame), sparse. */
  projection(u: readonly number[]): Sparse {
    const n = this.dim;
    const rows: number[] = [], cols: number[] = [], re: number[] = [], im: number[] = [];
    for (let k = 0; k < n * n; k++) {
      const r = u[0] * this.jx.re[k] + u[1] * this.jy.re[k] + u[2] * this.jz.re[k];
      const i = u[0] * this.jx.im[k] + u[1] * this.jy.im[k] + u[2] * this.jz.im[k];
      if (r === 0 && i === 0) continue;
      rows.push(Math.floor(k / n));
      cols.push(k % n);
      re.push(r);
      im.push(i);
    }
    return { rows: Int32Array.from(rows), cols: Int32Array.from(cols), re: Float64Array.from(re), im: Float64Array.from(im) };
  }

  /**
   * Diagonalise H_CEF − g_J μB B (u·J) (DEVELOPERS.md § Conventions, Zeeman sign) and return the levels (meV,
   * ascending) and ⟨k|u·J|k⟩ for each eigenstate k.
   */
  levelsAlong(op: Sparse, fieldTesla: number): { energies: Float64Array; projections: Float64Array } {
    const n = this.dim;
    const h = this.buffer;
    const s = -this.gJ * BOHR_MAGNETON_MEV_PER_T * fieldTesla;
    h.re.set(this.hCef.re);
    h.im.set(this.hCef.im);
    if (s !== 0)
      for (let e = 0; e < op.rows.length; e++) {
        const k = op.rows[e] * n + op.cols[e];
        h.re[k] += s * op.re[e];
        h.im[k] += s * op.im[e];
      }
    this.diagonalisations++;
    const { values, vectors } = solveInto(this.workspace, h, { vectors: true }) as { values: Float64Array; vectors: ComplexMatrix };
    const projections = new Float64Array(n);
    const vr = vectors.re, vi = vectors.im;
    for (let e = 0; e < op.rows.length; e++) {
      const a = op.rows[e] * n, b = op.cols[e] * n, ar = op.re[e], ai = op.im[e];
      for (let k = 0; k < n; k++) {
        // conj(v_a,k) · A_ab · v_b,k, real part (the sum over all entries is real for Hermitian A)
        const xr = vr[a + k], xi = -vi[a + k];
        const yr = ar * vr[b + k] - ai * vi[b + k];
        const yi = ar * vi[b + k] + ai * vr[b + k];
        projections[k] += xr * yr - xi * yi;
      }
    }
    return { energies: values, projections };
  }
}

/** Thermal average g_J Σ p_k ⟨u·J⟩_k in μB at temperature T (K), levels in meV. */
export function thermalMoment(gJ: number, energies: Float64Array, projections: Float64Array, temperatureK: number): number {
  const kT = BOLTZMANN_MEV_PER_K * temperatureK;
  const e0 = energies[0];
  let z = 0, m = 0;
  for (let k = 0; k < energies.length; k++) {
    const w = Math.exp(-(energies[k] - e0) / kT);
    z += w;
    m += w * projections[k];
  }
  return (gJ * m) / z;
}

/** A unit vector from a 3-component direction, or InputError. */
export function unitVector(value: unknown, field: string): [number, number, number] {
  if (!Array.isArray(value) || value.length !== 3 || !value.every((x) => typeof x === 'number' && Number.isFinite(x)))
    throw new InputError(field, value, 'a direction [x, y, z] of three finite numbers, or "powder"');
  const norm = Math.hypot(value[0], value[1], value[2]);
  if (!(norm > 0)) throw new InputError(field, value, 'a non-zero direction [x, y, z]');
  return [value[0] / norm, value[1] / norm, value[2] / norm];
}
