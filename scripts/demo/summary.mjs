// Reads the executed demo notebooks and the hidden truth, and prints (and writes as HTML) a short summary:
// fitted crystal field vs the hidden parameters, the ground doublet, bulk checks, the entropy plateau and the couplings.
// The notebooks never read the truth file; only this summary and the tests do.
//
// Usage: node scripts/demo/summary.mjs OUT_DIR   (writes OUT_DIR/summary.html and OUT_DIR/summary.json)
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';

const RESULT_MIME = 'application/vnd.multiplet.result+json';
const root = new URL('../../', import.meta.url).pathname;

/** Every output bundle of a cell whose id ends with `suffix`, in a notebook. */
function cellOutputs(notebookPath, suffix) {
  if (!existsSync(notebookPath)) return [];
  const nb = JSON.parse(readFileSync(notebookPath, 'utf8'));
  const cell = nb.cells.find((c) => c.id.endsWith(suffix));
  return (cell?.outputs ?? []).filter((o) => o.data).map((o) => o.data);
}
const jsonOf = (path, suffix) => cellOutputs(path, suffix).map((d) => d['application/json']).filter(Boolean).at(-1);
const resultOf = (path, suffix) => cellOutputs(path, suffix).map((d) => d[RESULT_MIME]?.result).filter(Boolean).at(-1);

export function demoSummary(outDir) {
  const truth = JSON.parse(readFileSync(join(root, 'notebooks-demo/truth/hidden-truth.json'), 'utf8'));
  const nb = (name) => join(outDir, name);
  const rows = [];
  const data = { cef: [], checks: {} };
  const fit = jsonOf(nb('02-crystal-field-fit.ipynb'), '-fit-summary');
  if (fit) {
    for (const [key, trueValue] of Object.entries(truth.cefMeV)) {
      const value = fit.parametersMeV[key];
      const error = fit.errorsMeV[key];
      const z = (value - trueValue) / error;
      data.cef.push({ key, value, error, truth: trueValue, z });
    }
    data.checks.cefChi2Reduced = fit.chi2Reduced;
    data.checks.cefWithin3Sigma = data.cef.every((r) => Math.abs(r.z) < 3);
  }
  const posterior = jsonOf(nb('02-crystal-field-fit.ipynb'), '-mcmc');
  if (posterior) data.checks.gParallel = posterior.derived?.gParallel;
  const cef = resultOf(nb('02-crystal-field-fit.ipynb'), '-cef-fit');
  if (cef) {
    data.levels = cef.levels.map((l) => l.energyMeV);
    data.checks.gParallelFitted = cef.groundDoublet.gParallel;
  }
  const mb = jsonOf(nb('03-magnetization-susceptibility.ipynb'), '-mb');
  const chi = jsonOf(nb('03-magnetization-susceptibility.ipynb'), '-chi');
  if (mb) data.checks.magnetizationRatio = mb.meanRatioDataOverModel;
  if (chi) data.checks.susceptibilityRatio300K = chi.ratioDataOverModelAt300K;
  const entropy = jsonOf(nb('04-heat-capacity-entropy.ipynb'), '-entropy');
  if (entropy) data.entropy = entropy;
  const exchange = jsonOf(nb('05-effective-exchange.ipynb'), '-couplings');
  if (exchange) data.exchange = exchange;
  const mc = jsonOf(nb('06-monte-carlo-diffuse.ipynb'), '-mc-fit');
  if (mc) data.monteCarlo = { ...mc, truthJ1K: truth.exchangeK.J1 };
  const diffuse = jsonOf(nb('06-monte-carlo-diffuse.ipynb'), '-diffuse');
  if (diffuse) data.diffuse = diffuse;

  const f = (x, d = 4) => (typeof x !== 'number' ? String(x) : x !== 0 && Math.abs(x) < 1e-3 ? x.toExponential(d - 1) : Number(x.toPrecision(d)).toString());
  rows.push('Crystal field (meV): fitted ± 1σ   vs hidden truth   (z = deviation / σ)');
  for (const r of data.cef) rows.push(`  ${r.key.padEnd(4)} ${f(r.value, 5).padStart(12)} ± ${f(r.error, 2).padEnd(9)} truth ${f(r.truth, 4).padStart(10)}   z = ${r.z.toFixed(2)}`);
  if (fit) rows.push(`  χ²_red = ${f(fit.chi2Reduced, 3)}; all within 3σ: ${data.checks.cefWithin3Sigma ? 'yes' : 'NO'}; levels (meV): ${fit.levelsMeV.map((x) => x.toFixed(1)).join(', ')}`);
  rows.push(`  hidden levels (meV): ${truth.derived.levelsMeV.map((x) => x.toFixed(1)).join(', ')}; g∥ fitted ${f(data.checks.gParallelFitted, 5)} vs hidden ${truth.derived.gParallel}`);
  if (mb || chi) rows.push(`Bulk, no free parameter: M data/model = ${f(data.checks.magnetizationRatio)}, χ(300 K) data/model = ${f(data.checks.susceptibilityRatio300K)} (hidden mass-calibration factor ${truth.magnetometry.massCalibrationFactor})`);
  if (data.entropy)
    rows.push(`Entropy: S_mag plateau ${f(data.entropy.plateauJPerMolK)} ± ${f(data.entropy.plateauErrorJPerMolK, 2)} J/mol/K per Dy at ${data.entropy.plateauTemperatureK} K; R ln 2 = ${f(data.entropy.rLn2)}, spin ice R[ln 2 − ½ ln(3/2)] = ${f(data.entropy.pauling)}`);
  if (data.exchange)
    rows.push(`Effective exchange (K): J_zz = ${f(data.exchange.JzzK)}, J_± = ${f(data.exchange.JpmK, 3)}, J_±± = ${f(data.exchange.JpmpmK, 3)}, J_z± = ${f(data.exchange.JzpmK, 3)}; |J_±/J_zz| = ${f(data.exchange.transverseRatio, 2)} at a CEF gap of ${f(data.exchange.gapMeV)} meV`);
  if (data.monteCarlo)
    rows.push(`Monte Carlo fit of C(T) (J2 = J3 = 0): J1 = ${f(data.monteCarlo.J1K)} ± ${f(data.monteCarlo.J1ErrorK, 2)} K (statistical; χ²_red ${f(data.monteCarlo.chi2ReducedAtMinimum, 3)}) vs hidden J1 = ${truth.exchangeK.J1} K with J2 = ${truth.exchangeK.J2}, J3a = ${truth.exchangeK.J3a}, J3b = ${truth.exchangeK.J3b} K; D = ${truth.derived.dipolarDK} K`);
  if (data.diffuse)
    rows.push(`Diffuse scattering: χ²_red of the Monte Carlo model at ${data.diffuse.temperaturesK.join(', ')} K = ${data.diffuse.chi2Reduced.map((x) => f(x, 3)).join(', ')}; absolute scale ${f(data.diffuse.scale, 3)} ± ${f(data.diffuse.scaleError, 2)} (hidden calibration ${truth.neutron.calibrationFactor})`);
  const text = rows.join('\n');
  const esc = (s) => s.replace(/[&<>]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;' })[c]);
  const html = `<h2>Summary: the analysis against the hidden truth</h2>
<p>QX-7 and its data are invented; the generator's hidden parameters (notebooks-demo/truth/hidden-truth.json) are read
only here, never by the notebooks.</p><pre>${esc(text)}</pre>`;
  return { text, html, data };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const outDir = process.argv[2] ?? join(root, 'out/demo');
  const { text, html, data } = demoSummary(outDir);
  writeFileSync(join(outDir, 'summary.html'), html);
  writeFileSync(join(outDir, 'summary.json'), JSON.stringify(data, null, 2) + '\n');
  console.log(text);
}
