/**
 * Levenberg–Marquardt minimisation of χ² = Σ r_i(p)² with Moré's diagonal scaling, Nielsen's damping update and
 * box bounds by projection.
 *
 * The subproblem min ‖J δ + r‖² + λ‖D δ‖² is solved on the QR factor of J (Moré 1978, "The Levenberg–Marquardt
 * algorithm: implementation and theory", Lecture Notes in Mathematics 630); D_j is the running maximum of the
 * Jacobian column norms (Moré's scaling, which makes the method invariant to parameter units). The damping follows
 * Nielsen (1999, IMM-REP-1999-05): λ ← λ·max(1/3, 1 − (2ρ − 1)³) on success, λ ← λν, ν ← 2ν on failure. With bounds,
 * the trial point is projected onto the box and the gain ratio ρ uses the projected step.
 *
 * Written here rather than taken from npm because it must pass the NIST StRD checks to 6 digits with
 * certified standard errors, respect bounds and report evaluation counts (test/physics/fit/levenbergMarquardt.test.ts).
 *
 * @example
 *   const fit = levenbergMarquardt({ parameterCount: 2, residuals: (p) => ... }, [500, 1e-4]);
 *   fit.parameters; fit.standardErrors; fit.chi2;
 * See also: covarianceFromJacobian, multiStartSearch, ensembleSampler.
 */
import { InputError } from '../errors';
import { covarianceFromJacobian, undeterminedCovariance } from './covariance';
import { finiteDifferenceJacobian } from './finiteDifferenceJacobian';
import { applyQTranspose, householderQr, solveDampedTriangular } from './numerics/denseLinearAlgebra';
import type { CovarianceSummary, LeastSquaresProblem } from './types';
import type { LongTask } from '../progress';
import { runSteps, type Steps } from '../progress/steps';

export interface LevenbergMarquardtOptions {
  readonly lower?: ArrayLike<number>;
  readonly upper?: ArrayLike<number>;
  /** Maximum accepted + rejected iterations. Default 1000. */
  readonly maxIterations?: number;
  /** Relative step tolerance: stop when ‖D δ‖ ≤ xTolerance (‖D p‖ + xTolerance). Default 1e-12. */
  readonly xTolerance?: number;
  /** Relative χ² decrease tolerance on an accepted step. Default 1e-15. */
  readonly chi2Tolerance?: number;
  /** Scaled gradient tolerance ‖Jᵀr / D‖∞. Default 1e-14. */
  readonly gradientTolerance?: number;
  /** Typical parameter magnitudes for finite-difference steps. */
  readonly typicalScale?: ArrayLike<number>;
  /**
   * Covariance scaling: 'data' trusts the σ inside the residuals (s² = 1); 'residual' uses s² = χ²/(n − p), the NIST
   * StRD convention for unweighted fits. Default 'residual'.
   */
  readonly errorScaling?: 'data' | 'residual';
  readonly task?: LongTask;
}

export type LevenbergMarquardtStop = 'step' | 'chi2' | 'gradient' | 'max-iterations' | 'damping-overflow';

export interface LevenbergMarquardtResult extends CovarianceSummary {
  readonly parameters: Float64Array;
  readonly residuals: Float64Array;
  readonly chi2: number;
  /**
   * χ² / (n − p); equal to χ² when n ≤ p (no degrees of freedom). Then every standard error is Infinity (undetermined)
   * when n < p, and also when n = p with errorScaling 'residual'.
   */
  readonly chi2Reduced: number;
  readonly degreesOfFreedom: number;
  readonly iterations: number;
  /** Residual-function evaluations, including finite-difference ones. */
  readonly evaluations: number;
  /** True for a stop on the step, χ² or gradient criterion. */
  readonly converged: boolean;
  readonly stop: LevenbergMarquardtStop;
  /** Final Jacobian (row-major n×p). */
  readonly jacobian: Float64Array;
}

/** Minimise Σ r_i(p)² from `start`. Throws InputError for a start outside the bounds or non-finite residuals there. */
export function levenbergMarquardt(
  problem: LeastSquaresProblem,
  start: ArrayLike<number>,
  options: LevenbergMarquardtOptions = {},
): LevenbergMarquardtResult {
  return runSteps(levenbergMarquardtSteps(problem, start, options));
}

/** levenbergMarquardt as pause points (progress/steps.ts): one pause before every iteration. */
export function* levenbergMarquardtSteps(
  problem: LeastSquaresProblem,
  start: ArrayLike<number>,
  options: LevenbergMarquardtOptions = {},
): Steps<LevenbergMarquardtResult> {
  const p = problem.parameterCount;
  if (start.length !== p) throw new InputError('start', Array.from(start), `${p} parameter values`);
  const lower = Float64Array.from({ length: p }, (_, j) => (options.lower ? options.lower[j] : -Infinity));
  const upper = Float64Array.from({ length: p }, (_, j) => (options.upper ? options.upper[j] : Infinity));
  for (let j = 0; j < p; j++) {
    if (!Number.isFinite(start[j])) throw new InputError(`start[${j}]`, start[j], 'a finite number');
    if (!(lower[j] <= upper[j])) throw new InputError(`bounds[${j}]`, [lower[j], upper[j]], 'lower ≤ upper');
    if (start[j] < lower[j] || start[j] > upper[j])
      throw new InputError(`start[${j}]`, start[j], `a value inside the bounds [${lower[j]}, ${upper[j]}]`);
  }
  const maxIterations = options.maxIterations ?? 1000;
  const xTolerance = options.xTolerance ?? 1e-12;
  const chi2Tolerance = options.chi2Tolerance ?? 1e-15;
  const gradientTolerance = options.gradientTolerance ?? 1e-14;
  const task = options.task;

  let evaluations = 0;
  const evaluate = (x: Float64Array): Float64Array => {
    evaluations++;
    return problem.residuals(x);
  };
  const jacobianAt = (x: Float64Array, r: Float64Array): Float64Array => {
    if (problem.jacobian) return problem.jacobian(x, r);
    return finiteDifferenceJacobian(evaluate, x, r, { typicalScale: options.typicalScale, lower, upper });
  };
  const sumSquares = (r: Float64Array): number => {
    let s = 0;
    for (let i = 0; i < r.length; i++) s += r[i] * r[i];
    return s;
  };

  let x = Float64Array.from(start);
  let r = evaluate(x);
  const m = r.length;
  let cost = sumSquares(r);
  if (!Number.isFinite(cost)) throw new InputError('start', Array.from(start), 'a point where every residual is finite');
  let jac = jacobianAt(x, r);

  const diag = new Float64Array(p);
  const updateScaling = (): void => {
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let i = 0; i < m; i++) s = Math.hypot(s, jac[i * p + j]);
      diag[j] = Math.max(diag[j], s);
    }
    let maxDiag = 0;
    for (let j = 0; j < p; j++) maxDiag = Math.max(maxDiag, diag[j]);
    for (let j = 0; j < p; j++) if (diag[j] === 0) diag[j] = maxDiag > 0 ? maxDiag * 1e-12 : 1;
  };
  updateScaling();

  let lambda = 1e-3;
  let nu = 2;
  let iterations = 0;
  let stop: LevenbergMarquardtStop = 'max-iterations';

  // QR of the current Jacobian and the first p components of Qᵀr (zero-padded when m < p: the problem with p − m zero
  // rows appended has the same solutions); recomputed only after an accepted step.
  const topOfQtr = (q: ReturnType<typeof householderQr>, v: Float64Array): Float64Array => {
    const out = new Float64Array(p);
    out.set(applyQTranspose(q, v).subarray(0, Math.min(m, p)));
    return out;
  };
  let qr = householderQr(jac, m, p);
  let qtr = topOfQtr(qr, r);

  while (iterations < maxIterations) {
    yield;
    iterations++;
    task?.checkpoint();
    // Scaled gradient g = Jᵀr / D.
    let gradientNorm = 0;
    for (let j = 0; j < p; j++) {
      let g = 0;
      for (let i = 0; i < m; i++) g += jac[i * p + j] * r[i];
      gradientNorm = Math.max(gradientNorm, Math.abs(g) / diag[j]);
    }
    if (gradientNorm <= gradientTolerance * Math.max(Math.sqrt(cost), Number.MIN_VALUE) || cost === 0) {
      stop = 'gradient';
      break;
    }
    const delta = solveDampedTriangular(qr.r, qtr, diag, lambda, p);
    const trial = new Float64Array(p);
    for (let j = 0; j < p; j++) trial[j] = Math.min(upper[j], Math.max(lower[j], x[j] + delta[j]));
    const step = new Float64Array(p);
    let scaledStep = 0;
    let scaledX = 0;
    for (let j = 0; j < p; j++) {
      step[j] = trial[j] - x[j];
      scaledStep = Math.hypot(scaledStep, diag[j] * step[j]);
      scaledX = Math.hypot(scaledX, diag[j] * x[j]);
    }
    if (scaledStep <= xTolerance * (scaledX + xTolerance)) {
      stop = 'step';
      break;
    }
    // Predicted χ² after the (projected) step from the linear model r + J δ.
    let predictedCost = 0;
    for (let i = 0; i < m; i++) {
      let v = r[i];
      for (let j = 0; j < p; j++) v += jac[i * p + j] * step[j];
      predictedCost += v * v;
    }
    const predictedReduction = cost - predictedCost;
    const trialResiduals = evaluate(trial);
    const trialCost = sumSquares(trialResiduals);
    const actualReduction = Number.isFinite(trialCost) ? cost - trialCost : -Infinity;
    const rho = predictedReduction > 0 ? actualReduction / predictedReduction : actualReduction > 0 ? 1 : -1;
    if (rho > 1e-4 && actualReduction > 0) {
      const previousCost = cost;
      x = trial;
      r = trialResiduals;
      cost = trialCost;
      jac = jacobianAt(x, r);
      updateScaling();
      qr = householderQr(jac, m, p);
      qtr = topOfQtr(qr, r);
      lambda *= Math.max(1 / 3, 1 - (2 * rho - 1) ** 3);
      nu = 2;
      task?.report(iterations, maxIterations, 'least squares');
      if (previousCost - cost <= chi2Tolerance * previousCost) {
        stop = 'chi2';
        break;
      }
    } else {
      lambda *= nu;
      nu *= 2;
      if (lambda > 1e30) {
        stop = 'damping-overflow';
        break;
      }
    }
  }

  const degreesOfFreedom = Math.max(0, m - p);
  const chi2Reduced = degreesOfFreedom > 0 ? cost / degreesOfFreedom : cost;
  const residualScaling = (options.errorScaling ?? 'residual') === 'residual';
  // Fewer residuals than parameters: JᵀJ is singular and no parameter error exists. With n = p, s² = χ²/(n − p) is
  // undefined, so 'residual' errors do not exist either; 'data' errors (σ trusted) still do.
  const summary =
    m < p || (residualScaling && degreesOfFreedom === 0)
      ? undeterminedCovariance(p)
      : covarianceFromJacobian(jac, m, p, { residualVariance: residualScaling ? chi2Reduced : 1 });
  return {
    ...summary,
    parameters: x,
    residuals: r,
    chi2: cost,
    chi2Reduced,
    degreesOfFreedom,
    iterations,
    evaluations,
    converged: stop === 'step' || stop === 'chi2' || stop === 'gradient',
    stop,
    jacobian: jac,
  };
}
