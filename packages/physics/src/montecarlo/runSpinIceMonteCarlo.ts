/**
 * Run a spin-ice Monte Carlo simulation to the end on the calling thread, with progress and cancellation through a
 * `LongTask` (checked after every step). For runs off the main thread see `runSpinIceMonteCarloAsync`.
 */
import { createSpinIceSimulation, type SpinIceRunOptions, type SpinIceRawResult } from './spinIceSimulation';
import { summarizeSpinIceRun, type SpinIceRunResult } from './summarizeSpinIceRun';
import { NO_TASK, type LongTask } from '../progress';

/** Summary plus the raw series (for reweighting, fits and structure factors). */
export interface SpinIceRun {
  result: SpinIceRunResult;
  raw: SpinIceRawResult;
}

/**
 * Run all steps, reporting (step, total, 'thermalize' | 'measure') and calling `task.checkpoint()` every step.
 * The same options and seed give identical numbers.
 * @example runSpinIceMonteCarlo({ model, temperaturesK: [5, 2, 1, 0.5], sweeps: 2000, seed: 3 }).result.heatCapacityJPerMolK
 * See also: createSpinIceSimulation, summarizeSpinIceRun, runSpinIceMonteCarloAsync
 */
export function runSpinIceMonteCarlo(options: SpinIceRunOptions, task: LongTask = NO_TASK): SpinIceRun {
  const sim = createSpinIceSimulation(options);
  const therm = sim.totalSteps - options.sweeps;
  while (sim.stepsDone < sim.totalSteps) {
    task.checkpoint();
    sim.step(() => task.checkpoint());
    task.report(sim.stepsDone, sim.totalSteps, sim.stepsDone <= therm ? 'thermalize' : 'measure');
  }
  const raw = sim.raw();
  return { result: summarizeSpinIceRun(raw), raw };
}
