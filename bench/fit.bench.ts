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

// Two-stage search, measured (not used by fitCef): every distinct minimum of the energies-only search starts a local
// fit to energies and intensities. Five observed levels fix five level energies of a 6-parameter model, so the exact
// energy solutions lie on one-parameter families; the branch of the truth is rarely reached from random starts
// (measured while writing this: 0 of 160 energies-only starts ended within 6.7 scaled units of the truth or its twin;
// two-stage from seeds 1, 2, 3 gave best χ² 393, 212, 375; screening 3200 candidates by χ² and differential evolution
// with 8000 evaluations gave 110 … 710; intensity weights brought in gradually (errors ×30, ×10, ×3, ×1) gave 897, 212,
// 375; 150 basin-hopping steps (Wales & Doye 1997) from the multi-start best gave 52, 191, 235 in 3.5–7 s), so the
// search keeps plain multi-start and users must supply a start or look at the alternatives.
{
  const t = performance.now();
  const energiesOnly = fitCef({ ...spec, start: {}, peaks: peaks.map(({ energyMeV, errorMeV, temperatureK }) => ({ energyMeV, errorMeV, temperatureK })) }, { starts: 32, seed: 1, chi2Margin: Infinity });
  let best = Infinity;
  let evaluations = energiesOnly.hamiltonianEvaluations;
  for (const m of energiesOnly.minima) {
    const local = fitCef({ ...spec, start: m.parametersMeV });
    evaluations += local.hamiltonianEvaluations;
    best = Math.min(best, local.best.chi2);
  }
  console.log('two-stage (energies only from 32 random starts + zero, then energies + intensities from each of its minima):');
  console.log(`  time ${((performance.now() - t) / 1000).toFixed(2)} s, Hamiltonian evaluations ${evaluations}, stage-1 minima ${energiesOnly.minima.length}, best χ² ${best.toExponential(2)} (plain multi-start above: see the second run)`);
}
