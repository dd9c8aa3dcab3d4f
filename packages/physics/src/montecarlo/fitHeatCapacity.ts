/**
 * Fit exchange constants (and optionally the dipolar strength D) of the spin-ice model to a measured magnetic heat
 * capacity, with the Monte Carlo as the model. Each outer iteration runs one parallel-tempering simulation at the
 * current parameters, recording the energy split into its parts (shell sums Σ ẑ_i·ẑ_j σ_i σ_j, dipolar and Zeeman
 * energy); Levenberg–Marquardt then moves the parameters with C(T) predicted by multiple-histogram reweighting in
 * both temperature and couplings (Ferrenberg & Swendsen, PRL 63, 1195 (1989)):
 *   E'_n = Σ_s J'_s e_{s,n} + (D'/D) E_dip,n + (D'/D)^{1/2} E_Z,n,  C'(T) = (⟨E'²⟩' − ⟨E'⟩'²)/(N k_B T²),
 * inside a trust box around the simulated point (reweighting is only accurate nearby). The next iteration
 * re-simulates at the new point; the fit stops when a step stays inside the box and changes χ² by < 1 %.
 * χ² uses the data errors only. The quoted parameter errors add the Monte Carlo noise of the model to the data part
 * (from the final Jacobian): after the fit, `noiseReplicates` more simulations at the fitted point with independent
 * seeds are each refitted by the same reweighting step, and the sample variance of the fitted values (the main fit
 * and the replicates, R degrees of freedom) is added to the data variance. The data are the same in every refit, so
 * that spread is the model's noise alone. (A block jackknife of the reweighted C with fixed reweighting free energies
 * was tried first and underestimated the seed-to-seed spread of J1 about six-fold; independent runs capture the noise of the
 * free energies and the autocorrelation without assumptions.) With R = 3 the noise part is itself uncertain by
 * roughly ±40 % (a σ from 3 degrees of freedom).
 */
import { runSpinIceMonteCarlo } from './runSpinIceMonteCarlo';
import { spinIceRunData, type SpinIceRunData } from './spinIceRunData';
import type { SpinIceRunOptions } from './spinIceSimulation';
import { multiHistogramReweighting } from './multiHistogramReweighting';
import { BOHR_MAGNETON_K_PER_T, type SpinIceModel } from './spinIceCouplings';
import { SHELL_NAMES, type ShellName } from '../lattice/neighbourShells';
import { levenbergMarquardt } from '../fit/levenbergMarquardt';
import { GAS_CONSTANT_J_PER_MOL_K } from '../units';
import { InputError } from '../errors';
import { NO_TASK, type LongTask } from '../progress';

/** A fitted parameter: an exchange shell or the dipolar strength. */
export type FitParameter = ShellName | 'D';

/** Options of the fit. */
export interface HeatCapacityFitOptions {
  /** The model at the starting point (its exchangeK are the initial values; D from the moment if dipolar). */
  model: SpinIceModel;
  data: { temperaturesK: readonly number[]; heatCapacityJPerMolK: readonly number[]; errorJPerMolK: readonly number[] };
  parameters: readonly FitParameter[];
  /** Simulated temperatures; default 16 geometric points from 0.8 × to 1.25 × the data range. */
  simulationTemperaturesK?: readonly number[];
  sweeps: number;
  seed: number;
  /** Outer iterations (simulations); default 4. */
  maxSimulations?: number;
  /** Extra simulations at the fitted point with independent seeds for the model-noise error; default 3, 0 = none. */
  noiseReplicates?: number;
  /** Half-width of the trust box per iteration in K; default max(0.3 K, 30 % of |value|). */
  trustK?: number;
  loopMovesPerSweep?: number;
}

/** Result of the fit. */
export interface HeatCapacityFitResult {
  parametersK: Partial<Record<FitParameter, number>>;
  /** 1σ errors from the data errors and the Monte Carlo noise of the model together (variances added). */
  uncertaintiesK: Partial<Record<FitParameter, number>>;
  /** 1σ errors from the data errors alone (what the fit would quote for a noiseless model). */
  uncertaintiesDataOnlyK: Partial<Record<FitParameter, number>>;
  /** 1σ Monte Carlo noise of the fitted values: spread of the refits of the independent replicate simulations. */
  uncertaintiesModelNoiseK: Partial<Record<FitParameter, number>>;
  /** Fitted values from each replicate simulation (same data, independent seeds). */
  replicateParametersK: Partial<Record<FitParameter, number>>[];
  /** χ² with the data errors only. */
  chiSquare: number;
  reducedChiSquare: number;
  degreesOfFreedom: number;
  /** Model C(T) at the data temperatures (reweighted from the last simulation). */
  modelHeatCapacityJPerMolK: number[];
  /** Parameters and χ² of each simulation. */
  history: { parametersK: Partial<Record<FitParameter, number>>; chiSquare: number }[];
  converged: boolean;
  /** The final model (exchangeK and moment updated). */
  model: SpinIceModel;
}

/**
 * Fit the chosen parameters to C(T) data (K, J/(mol K) per mole of spins, errors > 0).
 * @example fitHeatCapacity({ model, data, parameters: ['J2', 'J3a'], sweeps: 2000, seed: 1 }).parametersK
 * See also: multiHistogramReweighting, runSpinIceMonteCarlo
 */
export function fitHeatCapacity(options: HeatCapacityFitOptions, task: LongTask = NO_TASK): HeatCapacityFitResult {
  const fit = fitSimulations(options);
  let next = fit.next();
  while (!next.done) {
    const { runOptions, done, total, phase } = next.value;
    task.report(done, total, phase);
    next = fit.next(spinIceRunData(runSpinIceMonteCarlo(runOptions, task).raw));
  }
  task.report(next.value.total, next.value.total, 'done');
  return next.value.result;
}

/**
 * The same fit with the simulations run by `simulate` (e.g. in a worker thread through
 * `runSpinIceMonteCarloAsync`), so that the caller stays responsive and can cancel.
 * @example await fitHeatCapacityAsync(options, (o) => runSpinIceMonteCarloAsync(o).promise.then((r) => r.data))
 */
export async function fitHeatCapacityAsync(
  options: HeatCapacityFitOptions,
  simulate: (runOptions: SpinIceRunOptions, iteration: number) => Promise<SpinIceRunData>,
): Promise<HeatCapacityFitResult> {
  const fit = fitSimulations(options);
  let next = fit.next();
  while (!next.done) next = fit.next(await simulate(next.value.runOptions, next.value.iteration));
  return next.value.result;
}

/** One simulation the fit asks for: its options, its index, and progress counts for the report. */
interface SimulationRequest {
  runOptions: SpinIceRunOptions;
  iteration: number;
  done: number;
  total: number;
  phase: string;
}

/**
 * The fit written once: it yields each simulation it needs and receives its data, so the synchronous and the
 * worker-driven entry points run exactly the same steps.
 */
function* fitSimulations(
  options: HeatCapacityFitOptions,
): Generator<SimulationRequest, { result: HeatCapacityFitResult; total: number }, SpinIceRunData> {
  const plan = planFit(options);
  let model = plan.model;
  const history: HeatCapacityFitResult['history'] = [];
  let last: FitStep | undefined;
  let converged = false;
  for (let it = 0; it < plan.maxSimulations; it++) {
    const data = yield { runOptions: plan.runOptions(model, it), iteration: it, done: it, total: plan.maxSimulations, phase: 'simulate' };
    last = fitStep(data, model, options);
    history.push(last.history);
    model = last.model;
    if (last.settled) {
      converged = true;
      break;
    }
  }
  const total = plan.maxSimulations + plan.noiseReplicates;
  const replicates: Float64Array[] = [];
  for (let r = 0; r < plan.noiseReplicates; r++) {
    const iteration = plan.maxSimulations + r;
    const data = yield { runOptions: plan.runOptions(model, iteration), iteration, done: iteration, total, phase: 'noise replicate' };
    replicates.push(fitStep(data, model, options).values);
  }
  return { result: finish(options, last!, history, converged, model, replicates), total };
}

interface FitStep {
  values: Float64Array;
  chi2: number;
  errors: Float64Array;
  modelC: number[];
  history: { parametersK: Partial<Record<FitParameter, number>>; chiSquare: number };
  model: SpinIceModel;
  settled: boolean;
}

function planFit(options: HeatCapacityFitOptions) {
  const { data } = options;
  const nd = data.temperaturesK.length;
  if (nd < 2) throw new InputError('data.temperaturesK', data.temperaturesK, 'at least two temperatures');
  if (data.heatCapacityJPerMolK.length !== nd) throw new InputError('data.heatCapacityJPerMolK', data.heatCapacityJPerMolK.length, `${nd} values`);
  if (data.errorJPerMolK.length !== nd) throw new InputError('data.errorJPerMolK', data.errorJPerMolK.length, `${nd} values`);
  data.temperaturesK.forEach((t, k) => {
    if (!(t > 0)) throw new InputError(`data.temperaturesK[${k}]`, t, 'a positive temperature in K');
  });
  data.errorJPerMolK.forEach((e, k) => {
    if (!(e > 0)) throw new InputError(`data.errorJPerMolK[${k}]`, e, 'a positive uncertainty');
  });
  const params = options.parameters;
  if (params.length === 0) throw new InputError('parameters', params, 'at least one of J1, J2, J3a, J3b, D');
  for (const p of params) if (p !== 'D' && !SHELL_NAMES.includes(p as ShellName)) throw new InputError('parameters', p, 'J1, J2, J3a, J3b or D');
  if (params.includes('D') && !options.model.dipolar) throw new InputError('parameters', 'D', 'a model with the dipolar interaction on');
  if (nd <= params.length) throw new InputError('data.temperaturesK', nd, `more data points than parameters (${params.length})`);
  const tMin = Math.min(...data.temperaturesK), tMax = Math.max(...data.temperaturesK);
  const simT = options.simulationTemperaturesK ?? Array.from({ length: 16 }, (_, k) => 0.8 * tMin * Math.pow((1.25 * tMax) / (0.8 * tMin), k / 15));
  const maxSimulations = options.maxSimulations ?? 4;
  if (!Number.isInteger(maxSimulations) || maxSimulations < 1) throw new InputError('maxSimulations', maxSimulations, 'a positive integer');
  const noiseReplicates = options.noiseReplicates ?? 3;
  if (!Number.isInteger(noiseReplicates) || noiseReplicates < 0) throw new InputError('noiseReplicates', noiseReplicates, 'a non-negative integer');
  return {
    maxSimulations,
    noiseReplicates,
    model: { ...options.model, exchangeK: { ...(options.model.exchangeK ?? {}) } } as SpinIceModel,
    runOptions: (model: SpinIceModel, it: number): SpinIceRunOptions => ({
      model, temperaturesK: simT, sweeps: options.sweeps, seed: options.seed + 7919 * it, recordShellSums: true, loopMovesPerSweep: options.loopMovesPerSweep,
    }),
  };
}

function fitStep(run: SpinIceRunData, model: SpinIceModel, options: HeatCapacityFitOptions): FitStep {
  const { data } = options;
  const params = options.parameters;
  const N = run.numberOfSites;
  const mh = multiHistogramReweighting(run.series.energyK, run.temperaturesK);
  const E = mh.energiesK;
  const e = Object.fromEntries(SHELL_NAMES.map((s) => [s, mh.pool(run.series.shellSums[s])])) as Record<ShellName, Float64Array>;
  const proj = mh.pool(run.series.projection);
  const B = model.fieldTesla ?? [0, 0, 0];
  const zeemanScale = -model.momentMuB * BOHR_MAGNETON_K_PER_T * Math.hypot(B[0], B[1], B[2]);
  const ex0 = model.exchangeK ?? {};
  const D0 = run.dipolarDK;
  const eZ = new Float64Array(E.length);
  const eDip = new Float64Array(E.length);
  for (let n = 0; n < E.length; n++) {
    eZ[n] = zeemanScale * proj[n];
    let ex = 0;
    for (const s of SHELL_NAMES) ex += (ex0[s] ?? 0) * e[s][n];
    eDip[n] = E[n] - run.constantK - ex - eZ[n];
  }
  const start = Float64Array.from(params.map((p) => (p === 'D' ? D0 : ex0[p] ?? 0)));
  const trust = params.map((_, k) => options.trustK ?? Math.max(0.3, 0.3 * Math.abs(start[k])));
  const Ep = new Float64Array(E.length);
  const e1 = new Float64Array(E.length);
  const e2 = new Float64Array(E.length);
  const predict = (p: Float64Array): number[] => {
    const J: Record<string, number> = { ...ex0 } as Record<string, number>;
    let Dr = 1;
    params.forEach((name, k) => {
      if (name === 'D') Dr = p[k] / D0;
      else J[name] = p[k];
    });
    const zr = Math.sqrt(Math.max(Dr, 0));
    let mean = 0;
    for (let n = 0; n < E.length; n++) {
      let v = Dr * eDip[n] + zr * eZ[n];
      for (const s of SHELL_NAMES) v += (J[s] ?? 0) * e[s][n];
      Ep[n] = v;
      mean += v / E.length;
    }
    for (let n = 0; n < E.length; n++) {
      e1[n] = Ep[n] - mean;
      e2[n] = e1[n] * e1[n];
    }
    return data.temperaturesK.map((T) => {
      const [a1, a2] = mh.average(T, [e1, e2], Ep);
      return ((a2 - a1 * a1) / (T * T * N)) * GAS_CONSTANT_J_PER_MOL_K;
    });
  };
  const residuals = (p: Float64Array) => {
    const m = predict(p);
    return Float64Array.from(m, (v, k) => (v - data.heatCapacityJPerMolK[k]) / data.errorJPerMolK[k]);
  };
  const chiStart = residuals(start).reduce((s, r) => s + r * r, 0);
  const lower = start.map((v, k) => v - trust[k]);
  const upper = start.map((v, k) => v + trust[k]);
  if (params.includes('D')) {
    const k = params.indexOf('D');
    lower[k] = Math.max(lower[k], 1e-6);
  }
  const fit = levenbergMarquardt({ parameterCount: params.length, residuals }, start, {
    lower, upper, maxIterations: 60, errorScaling: 'data', typicalScale: trust,
  });
  const atBound = Array.from(fit.parameters).some((v, k) => Math.abs(v - lower[k]) < 1e-9 * (1 + Math.abs(v)) || Math.abs(v - upper[k]) < 1e-9 * (1 + Math.abs(v)));
  const exNew = { ...ex0 };
  let moment = model.momentMuB;
  params.forEach((name, k) => {
    if (name === 'D') moment = model.momentMuB * Math.sqrt(fit.parameters[k] / D0);
    else exNew[name] = fit.parameters[k];
  });
  return {
    values: fit.parameters,
    chi2: fit.chi2,
    errors: fit.standardErrors,
    modelC: predict(fit.parameters),
    history: { parametersK: Object.fromEntries(params.map((p, k) => [p, start[k]])), chiSquare: chiStart },
    model: { ...model, exchangeK: exNew, momentMuB: moment },
    settled: !atBound && Math.abs(fit.chi2 - chiStart) <= 0.01 * Math.max(fit.chi2, 1),
  };
}

function finish(options: HeatCapacityFitOptions, last: FitStep, history: HeatCapacityFitResult['history'], converged: boolean, model: SpinIceModel, replicates: Float64Array[]): HeatCapacityFitResult {
  const params = options.parameters;
  const dof = options.data.temperaturesK.length - params.length;
  // Sample variance of the main fit and its replicates (R degrees of freedom); 0 without replicates.
  const all = [last.values, ...replicates];
  const noise = params.map((_, k) => {
    if (replicates.length === 0) return 0;
    const mean = all.reduce((s, v) => s + v[k], 0) / all.length;
    return Math.sqrt(all.reduce((s, v) => s + (v[k] - mean) ** 2, 0) / (all.length - 1));
  });
  return {
    parametersK: Object.fromEntries(params.map((p, k) => [p, last.values[k]])),
    uncertaintiesK: Object.fromEntries(params.map((p, k) => [p, Math.hypot(last.errors[k], noise[k])])),
    uncertaintiesDataOnlyK: Object.fromEntries(params.map((p, k) => [p, last.errors[k]])),
    uncertaintiesModelNoiseK: Object.fromEntries(params.map((p, k) => [p, noise[k]])),
    replicateParametersK: replicates.map((v) => Object.fromEntries(params.map((p, k) => [p, v[k]]))),
    chiSquare: last.chi2,
    reducedChiSquare: last.chi2 / dof,
    degreesOfFreedom: dof,
    modelHeatCapacityJPerMolK: last.modelC,
    history,
    converged,
    model,
  };
}
