/**
 * Speed target (issue 4): fit a 6-parameter trigonal (D3d) model to 10 peak energies and intensities at two
 * temperatures from 32 random starts; print time, Hamiltonian evaluations and minima found. Target: < 5 s, one core.
 */
import { fitCef, type CefFitSpec, type PeakObservation } from '../packages/physics/src/fit/fitCef';
import { cefTransitions } from '../packages/physics/src/neutron/cefTransitions';
import { CefFitModel } from '../packages/physics/src/fit/cef/cefFitModel';

const TRUTH = { B20: -0.04, B40: 1.2e-3, B43: -1.1e-2, B60: 8e-6, B63: -7e-5, B66: 9e-5 };
const START = { B20: -0.03, B40: 1e-3, B43: -0.009, B60: 1e-5, B63: -5e-5, B66: 1e-4 };
const peaks: PeakObservation[] = [];
for (const T of [5, 60]) {
  const t = cefTransitions('Er3+', TRUTH, T);
  for (const v of t.transitions.filter((x) => x.energyMeV > 0).sort((a, b) => b.weight - a.weight).slice(0, 5))
    peaks.push({ energyMeV: v.energyMeV, errorMeV: 0.1, intensity: v.weight, intensityError: 0.05 * v.weight + 0.01, temperatureK: T });
}
const spec: CefFitSpec = { ion: 'Er3+', symmetry: 'D3d', start: START, peaks };

const model = new CefFitModel(spec);
const x = model.startScaled;
let t0 = performance.now();
for (let k = 0; k < 2000; k++) model.evaluate(x);
console.log(`one model evaluation (diagonalisation, strengths, two assignments): ${((performance.now() - t0) / 2000 * 1000).toFixed(1)} µs`);

function run(label: string, fitSpec: CefFitSpec): void {
  const t = performance.now();
  const report = fitCef(fitSpec, { starts: 32, seed: 1 });
  const seconds = (performance.now() - t) / 1000;
  console.log(label);
  console.log(`  time ${seconds.toFixed(2)} s (target < 5 s) ${seconds < 5 ? 'OK' : 'SLOW'}`);
  console.log(`  Hamiltonian evaluations ${report.hamiltonianEvaluations}`);
  console.log(`  distinct minima found ${report.distinctMinimaFound}, within the χ² margin ${report.minima.length}`);
  console.log(`  χ² of the minima within the margin: ${report.minima.map((m) => `${m.chi2.toExponential(2)} (${m.hits} hits)`).join(', ')}`);
}

run('fitCef D3d Er3+, 10 peaks (energies + intensities) at 5 K and 60 K, 32 random starts + the start 20–25 % off:', spec);
run('same, 32 random starts + an all-zero start (no prior knowledge):', { ...spec, start: {} });
run('10 peak energies only, 32 random starts + an all-zero start:', {
  ...spec,
  start: {},
  peaks: peaks.map(({ energyMeV, errorMeV, temperatureK }) => ({ energyMeV, errorMeV, temperatureK })),
});
