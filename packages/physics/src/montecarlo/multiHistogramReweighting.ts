/**
 * Multiple-histogram reweighting (Ferrenberg & Swendsen, Phys. Rev. Lett. 63, 1195 (1989)), written for the
 * pooled samples directly (no energy bins). With samples E_n from runs at β_m (N_m samples each), the free
 * energies f_m = −ln Z(β_m) solve
 *   e^{−f_k} = Σ_n e^{−β_k E_n} / D_n,   D_n = Σ_m N_m e^{f_m − β_m E_n},
 * and the average of an observable at any β, for any energy function E'_n of the same configurations
 * (e.g. other coupling constants), is ⟨O⟩ = Σ_n O_n e^{−β E'_n}/D_n / Σ_n e^{−β E'_n}/D_n.
 * Reweighting is only reliable between and near the simulated temperatures (and near the simulated couplings).
 */
import { InputError } from '../errors';

/** The solved reweighting weights. */
export interface MultiHistogram {
  temperaturesK: number[];
  /** Dimensionless free energies f_k = −ln Z_k (f of the first temperature set to 0). */
  freeEnergies: Float64Array;
  /** Whether the self-consistent equations reached the tolerance (poor overlap between temperatures: no). */
  converged: boolean;
  /** Number of pooled samples. */
  numberOfSamples: number;
  /** Pool a per-temperature series (same lengths as the energies) with the same thinning. */
  pool(series: readonly Float64Array[]): Float64Array;
  /** Pooled energies in K. */
  energiesK: Float64Array;
  /**
   * Averages of the pooled observables at T (K); `energiesK` overrides the energy in the Boltzmann factor (for
   * reweighting to other couplings). Returns one average per observable.
   */
  average(temperatureK: number, observables: readonly Float64Array[], energiesK?: Float64Array): number[];
}

/** Options of the solver. */
export interface MultiHistogramOptions {
  /** Keep at most this many samples per temperature (evenly thinned); default 500. */
  maxSamplesPerTemperature?: number;
  /** Stop when the largest change of f is below this; default 1e-7. */
  tolerance?: number;
  /** Default 1000; `converged` says whether the tolerance was reached. */
  maxIterations?: number;
}

/**
 * Solve the multiple-histogram equations for energy series (K) recorded at the given temperatures (K).
 * @example const mh = multiHistogramReweighting(raw.series.energyK, raw.temperaturesK);
 *          const [e, e2] = mh.average(0.7, [mh.energiesK, mh.energiesK.map((x) => x * x)]);
 * See also: reweightedHeatCapacity, fitHeatCapacity
 */
export function multiHistogramReweighting(energiesK: readonly Float64Array[], temperaturesK: readonly number[], options: MultiHistogramOptions = {}): MultiHistogram {
  const K = temperaturesK.length;
  if (energiesK.length !== K || K === 0) throw new InputError('energiesK', energiesK.length, `${K} series, one per temperature`);
  const maxPer = options.maxSamplesPerTemperature ?? 500;
  const tol = options.tolerance ?? 1e-7;
  const maxIt = options.maxIterations ?? 1000;
  const strides = energiesK.map((e) => Math.max(1, Math.ceil(e.length / maxPer)));
  const counts = energiesK.map((e, k) => Math.ceil(e.length / strides[k]));
  const pool = (series: readonly Float64Array[]): Float64Array => {
    const total = counts.reduce((a, b) => a + b, 0);
    const out = new Float64Array(total);
    let p = 0;
    series.forEach((s, k) => {
      if (s.length !== energiesK[k].length) throw new InputError(`series[${k}]`, s.length, `${energiesK[k].length} samples`);
      for (let n = 0; n < s.length; n += strides[k]) out[p++] = s[n];
    });
    return out;
  };
  const E = pool(energiesK);
  const S = E.length;
  if (counts.some((n) => n === 0)) throw new InputError('energiesK', counts, 'at least one sample per temperature');
  const beta = temperaturesK.map((t) => 1 / t);
  let eRef = Infinity;
  for (let n = 0; n < S; n++) eRef = Math.min(eRef, E[n]);
  // Start from thermodynamic integration between neighbouring temperatures.
  const order = beta.map((_, k) => k).sort((a, b) => beta[a] - beta[b]);
  const mean = new Float64Array(K);
  {
    let p = 0;
    for (let k = 0; k < K; k++) {
      let s = 0;
      for (let n = 0; n < counts[k]; n++) s += E[p++] - eRef;
      mean[k] = s / counts[k];
    }
  }
  const f = new Float64Array(K);
  for (let r = 1; r < K; r++) {
    const a = order[r - 1], b = order[r];
    f[b] = f[a] + 0.5 * (beta[b] - beta[a]) * (mean[a] + mean[b]);
  }
  const logD = new Float64Array(S);
  const tmp = new Float64Array(K);
  const logN = counts.map((n) => Math.log(n));
  let converged = false;
  for (let it = 0; it < maxIt; it++) {
    for (let n = 0; n < S; n++) {
      const e = E[n] - eRef;
      let mx = -Infinity;
      for (let m = 0; m < K; m++) {
        tmp[m] = logN[m] + f[m] - beta[m] * e;
        if (tmp[m] > mx) mx = tmp[m];
      }
      let s = 0;
      for (let m = 0; m < K; m++) s += Math.exp(tmp[m] - mx);
      logD[n] = mx + Math.log(s);
    }
    let change = 0;
    const f0 = logSumExpNeg(E, eRef, beta[0], logD);
    for (let k = 0; k < K; k++) {
      const fk = logSumExpNeg(E, eRef, beta[k], logD) - f0;
      change = Math.max(change, Math.abs(fk - f[k]));
      f[k] = fk;
    }
    if (change < tol) {
      converged = true;
      break;
    }
  }
  return {
    temperaturesK: [...temperaturesK],
    freeEnergies: f,
    converged,
    numberOfSamples: S,
    pool,
    energiesK: E,
    average(temperatureK, observables, energies) {
      if (!(temperatureK > 0)) throw new InputError('temperatureK', temperatureK, 'a positive temperature in K');
      const b = 1 / temperatureK;
      const En = energies ?? E;
      let mx = -Infinity;
      const w = new Float64Array(S);
      for (let n = 0; n < S; n++) {
        w[n] = -b * (En[n] - eRef) - logD[n];
        if (w[n] > mx) mx = w[n];
      }
      let z = 0;
      for (let n = 0; n < S; n++) {
        w[n] = Math.exp(w[n] - mx);
        z += w[n];
      }
      return observables.map((o) => {
        let s = 0;
        for (let n = 0; n < S; n++) s += w[n] * o[n];
        return s / z;
      });
    },
  };
}

/** −ln Σ_n exp(−β (E_n − eRef) − logD_n), i.e. f = −ln Z up to the common reference. */
function logSumExpNeg(E: Float64Array, eRef: number, beta: number, logD: Float64Array): number {
  let mx = -Infinity;
  for (let n = 0; n < E.length; n++) {
    const v = -beta * (E[n] - eRef) - logD[n];
    if (v > mx) mx = v;
  }
  let s = 0;
  for (let n = 0; n < E.length; n++) s += Math.exp(-beta * (E[n] - eRef) - logD[n] - mx);
  return -(mx + Math.log(s));
}
