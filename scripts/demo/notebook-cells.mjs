// Cell texts of the six demo notebooks (rendered to .ipynb by scripts/demo/notebooks.mjs). Markdown is our own
// teaching text for a new group member; code cells are Multiplet cells (typed `[kind] name` cells or TypeScript
// script cells with `physics` and `state` in scope). The compound QX-7 and its data are invented.

/** The crystal-field parameters found by notebook 2 (best minimum), carried into notebooks 3 and 5 as typed values.
 *  test/e2e/demo.test.ts checks that they agree with what notebook 2 computes. */
export const FITTED_CEF = { B20: '-0.2348 meV', B40: '-2.742e-3 meV', B43: '2.422e-2 meV', B60: '1.309e-5 meV', B63: '6.19e-5 meV', B66: '7.899e-5 meV' };

const cefCell = (name) => `[crystal-field] ${name}
B:
${Object.entries(FITTED_CEF).map(([k, v]) => `  ${k}: ${v}`).join('\n')}`;

import { readFileSync } from 'node:fs';

/** The peak list of data/ins-peaks.csv written as the peaks of a [cef-fit] cell (one flow map per peak). */
function peakLines() {
  const lines = readFileSync(new URL('../../notebooks-demo/data/ins-peaks.csv', import.meta.url), 'utf8').split('\n').filter((l) => l.trim() && !l.startsWith('#'));
  return lines.slice(1).map((line) => {
    const [T, Ei, Q, E, dE, I, dI] = line.split(',').map((x) => x.trim());
    return `  - { temperature: ${T} K, incidentEnergy: ${Ei} meV, Q: ${Q} angstrom^-1, energy: ${E} meV, error: ${dE} meV, intensity: ${I}, intensityError: ${dI} }`;
  }).join('\n');
}

const SAMPLE = `[sample] qx7
compound: QX-7 (invented Dy2M2O7)
ion: Dy3+
siteSymmetry: D3d
latticeConstant: 10.21 angstrom
ionsPerFormulaUnit: 2
molarMass: 618.4 g/mol`;

const INVENTED = `> **Invented for teaching.** QX-7 is a fictional compound and every data file in \`notebooks-demo/data/\` was
> synthesised by Multiplet itself (\`scripts/demo/generate-data.ts\`) from hidden parameters, with noise and
> imperfections added. Nothing here describes a real material or a real experiment.`;

// A helper line repeated in script cells (variables do not live across cells).
const COL = `const col = (d, name) => d.columns.find((c) => c.name === name).values;
const show = (o) => ({ 'application/json': o, 'text/plain': JSON.stringify(o, null, 1) });`;

const nb1 = {
  file: '01-sample-and-data.ipynb',
  title: '1 · The sample and its data',
  cells: [
    {
      md: `# 1 · The sample and its data

${INVENTED}

**The story.** Our group has a new powder, *QX-7*: a pyrochlore oxide Dy₂M₂O₇ in which M is a nonmagnetic 4+ ion.
Dy³⁺ (4f⁹, J = 15/2, a Kramers ion) sits on the 16d site with D3d symmetry; its local z axis is the ⟨111⟩ direction
that points into the centre of a tetrahedron. We have inelastic neutron scattering (INS) at two incident energies and
two temperatures, magnetization and susceptibility, heat capacity of QX-7 and of its nonmagnetic analogue QX-7-Lu, and
diffuse neutron scattering at low temperature.

**The workflow in six notebooks.** (1) describe the sample and load the data; (2) fit the crystal field (CEF) to the
INS peaks; (3) predict M(B) and χ(T) from that CEF with no free parameter; (4) reduce the heat capacity to the
magnetic entropy; (5) estimate the effective exchange between the ground doublets; (6) fit a Monte Carlo model of
dipolar spin ice to C(T) and compare with the diffuse scattering.

Each notebook starts with its own \`[sample]\` and \`[data]\` cells, so you can open any of them on its own.`,
    },
    {
      md: `## The sample cell

A typed cell starts with \`[kind] name\`; the body is YAML with quantities written as \`value unit\`. Everything later
cells compute is per Dy ion or per formula unit — the sample cell is where Multiplet learns how many Dy ions a formula
unit has (2) and the molar mass, so that per-mole conversions are right. **Pitfall:** half of all factor-of-two
mistakes in this field come from mixing "per mole of formula units" and "per mole of Dy".`,
    },
    { id: 'sample', code: SAMPLE },
    {
      md: `## Neutron data

The peak list \`ins-peaks.csv\` was extracted from the four spectra: energy transfer, its error, integrated intensity
(mbarn/sr per Dy) and the setting (temperature, incident energy Ei, the mean |Q| of the detector bank). Each
transition is listed once per temperature, from the setting that resolves it best. Column units are in the header,
\`E (meV)\`: Multiplet refuses a table without them.`,
    },
    { id: 'peaks', code: `[data] peaks\nfile: data/ins-peaks.csv` },
    { code: `[data] ins60cold\nfile: data/ins-Ei60-5K.csv` },
    { code: `[data] ins60warm\nfile: data/ins-Ei60-120K.csv` },
    { code: `[data] ins150cold\nfile: data/ins-Ei150-5K.csv` },
    { code: `[data] ins150warm\nfile: data/ins-Ei150-120K.csv` },
    { code: `[data] resolution\nfile: data/ins-resolution.csv` },
    {
      md: `A script cell (TypeScript, with \`state\` and \`physics\` in scope) draws the four spectra. **What to look at:** at
5 K only transitions out of the ground doublet appear; at 120 K the first excited doublets are populated and new,
weaker lines appear at low energy (transitions between excited levels). The sharp line at 0 meV is elastic
(incoherent nuclear and magnetic quasi-elastic scattering) and is *not* part of the CEF analysis; the flat floor is
background.`,
    },
    {
      id: 'spectra-plot',
      code: `${COL}
const sets = [['ins60cold', 'Ei 60 meV, 5 K'], ['ins60warm', 'Ei 60 meV, 120 K'], ['ins150cold', 'Ei 150 meV, 5 K'], ['ins150warm', 'Ei 150 meV, 120 K']];
const values = sets.flatMap(([name, label]) => {
  const d = state.datasets[name];
  const e = col(d, 'E'), y = col(d, 'I');
  return e.map((x, k) => ({ E: x, I: y[k], set: label }));
});
display({ 'application/vnd.vegalite.v5+json': {
  $schema: 'https://vega.github.io/schema/vega-lite/v5.json', width: 560, height: 260,
  data: { values }, mark: { type: 'line', strokeWidth: 1 },
  encoding: { x: { field: 'E', type: 'quantitative', title: 'energy transfer E (meV)' },
              y: { field: 'I', type: 'quantitative', title: 'I (mbarn/sr/meV per Dy)', scale: { type: 'symlog' } },
              color: { field: 'set', type: 'nominal', title: 'setting' } } } });
state.datasets.peaks.rows + ' peaks listed in ins-peaks.csv'`,
    },
    {
      md: `## Bulk data

Magnetization of the powder in μB per Dy at 2, 5 and 20 K; susceptibility M/H per mole of formula units; heat capacity
per mole of formula units of QX-7 and of the analogue QX-7-Lu; diffuse scattering differences
I(Q, T) − I(Q, 20 K) in mbarn/sr per Dy.`,
    },
    { code: `[data] magnetization\nfile: data/magnetization.csv` },
    { code: `[data] susceptibility\nfile: data/susceptibility.csv` },
    { code: `[data] cp\nfile: data/heat-capacity.csv` },
    { code: `[data] cpAnalogue\nfile: data/heat-capacity-analogue.csv` },
    { code: `[data] diffuse\nfile: data/diffuse-scattering.csv` },
    {
      id: 'cp-plot',
      code: `${COL}
const values = [
  ...col(state.datasets.cp, 'T').map((t, k) => ({ T: t, C: col(state.datasets.cp, 'C')[k], sample: 'QX-7' })),
  ...col(state.datasets.cpAnalogue, 'T').map((t, k) => ({ T: t, C: col(state.datasets.cpAnalogue, 'C')[k], sample: 'QX-7-Lu (analogue)' })),
];
display({ 'application/vnd.vegalite.v5+json': {
  $schema: 'https://vega.github.io/schema/vega-lite/v5.json', width: 480, height: 260,
  data: { values }, mark: { type: 'point', filled: true, size: 25 },
  encoding: { x: { field: 'T', type: 'quantitative', title: 'T (K)', scale: { type: 'log' } },
              y: { field: 'C', type: 'quantitative', title: 'C (J/mol/K per f.u.)', scale: { type: 'log' } },
              color: { field: 'sample', type: 'nominal' } } } });
state.names`,
    },
    {
      md: `**Common pitfalls at this stage.** Check the units in every header before any analysis (mbarn vs barn, emu/mol per
f.u. vs per Dy, μB per Dy vs per f.u.). Keep the raw files untouched and do every correction in the notebook, so that
rerunning from the top reproduces everything. Note the imperfections the data sheet mentions: an absolute neutron
calibration good to ~10 %, a sample-mass uncertainty in magnetometry, and a ~5 % secondary phase in the pellet.`,
    },
  ],
};

const nb2 = {
  file: '02-crystal-field-fit.ipynb',
  title: '2 · Crystal-field fit with uncertainties and alternative minima',
  cells: [
    {
      md: `# 2 · Crystal-field fit with uncertainties and alternative minima

${INVENTED}

**Why this step.** Everything downstream — the Ising anisotropy, the size of the moment, M(B), χ(T), the effective
exchange — follows from the crystal-field Hamiltonian H = Σ B_n^m O_n^m of Dy³⁺. For D3d symmetry six parameters are
allowed: B20, B40, B43, B60, B63, B66 (Stevens operators, energies in meV).

**What makes it hard.** Six parameters against a handful of peaks: the problem is under-determined unless energies
*and* intensities at two temperatures are used, and even then several minima can fit comparably. A fit that is only
run once, from one start, proves little.`,
    },
    { code: SAMPLE },
    { code: `[data] peaks\nfile: data/ins-peaks.csv` },
    { code: `[data] ins60cold\nfile: data/ins-Ei60-5K.csv` },
    { code: `[data] ins60warm\nfile: data/ins-Ei60-120K.csv` },
    { code: `[data] ins150cold\nfile: data/ins-Ei150-5K.csv` },
    { code: `[data] ins150warm\nfile: data/ins-Ei150-120K.csv` },
    { code: `[data] resolution\nfile: data/ins-resolution.csv` },
    {
      md: `## A starting point

A rough start: a large negative B20 (easy axis along the local ⟨111⟩) and fourth- and sixth-order terms of typical size
for a heavy rare earth in a pyrochlore oxide. The level diagram shows where this guess puts the doublets — it does not
have to be good, the global search below starts from many random points as well.

**Sign convention.** Reversing the signs of B43 and B63 together is the same crystal field seen with the local x axis
rotated by 60°: the spectrum cannot tell them apart. We fix the convention B43 ≥ 0 with a bound.`,
    },
    {
      id: 'start',
      code: `[crystal-field] cefStart
B:
  B20: -0.15 meV
  B40: -2.0e-3 meV
  B43: 1.5e-2 meV
  B60: 1.0e-5 meV
  B63: 1.0e-5 meV
  B66: 5.0e-5 meV`,
    },
    {
      md: `## Global fit to the peak list

The \`[cef-fit]\` cell fits the six parameters to the peak list (the rows of \`ins-peaks.csv\`, written into the
cell so that the fit's input is visible in the notebook). It assigns observed peaks to computed transitions
optimally (Hungarian method), profiles one intensity scale per (temperature, Ei) group (the absolute calibration is
uncertain, so only intensity *ratios* within a setting count), runs Levenberg–Marquardt from the start plus 32 random
starts, and samples the posterior with an ensemble MCMC around the best minimum. Errors are 1σ from the Jacobian with
the data errors as given. **What to look at:** χ²_red near 1; the distinct minima and how much worse they are; the
correlations; the posterior widths next to the Jacobian errors.`,
    },
    {
      id: 'peak-fit',
      code: `[cef-fit] fit
start: cefStart
bounds:
  B43: [0 meV, 0.1 meV]
starts: 32
chi2Margin: 1000000
mcmcSteps: 300
seed: 11
peaks:
${peakLines()}`,
    },
    {
      id: 'fit-summary',
      code: `${COL}
const r = state.results.fit;
const best = r.best;
display(best.freeKeys.map((key) => ({ parameter: key, 'value (meV)': best.B[key].toExponential(4), '1σ Jacobian (meV)': best.errors[key].toExponential(2),
  'posterior mean (meV)': r.posterior.parameters[key].mean.toExponential(4), 'posterior σ (meV)': r.posterior.parameters[key].standardDeviation.toExponential(2) })));
display(r.minima.slice(0, 6).map((m, i) => ({ minimum: i + 1, 'χ²': m.chi2.toFixed(1), 'χ²_red': m.chi2Reduced.toFixed(2), hits: m.hits,
  'levels (meV)': m.levelsMeV.map((x) => x.toFixed(1)).join(', ') })));
show({ chi2: Number(best.chi2.toFixed(2)), chi2Reduced: Number(best.chi2Reduced.toFixed(3)), degreesOfFreedom: best.degreesOfFreedom,
   startsRun: r.startsRun, distinctMinima: r.distinctMinimaFound, warnings: r.warnings,
   parametersMeV: best.B, errorsMeV: best.errors, levelsMeV: best.levelsMeV,
   minima: r.minima.slice(0, 6).map((m) => ({ chi2: Number(m.chi2.toFixed(2)), levelsMeV: m.levelsMeV.map((x) => Number(x.toFixed(2))) })) })`,
    },
    {
      md: `## The fitted crystal field

The best-fit parameters, rounded to the digits the errors justify, go into a typed \`[crystal-field]\` cell: this is
the result later notebooks start from (notebooks 3 and 5 contain the same cell). Look at the ground doublet: an almost
pure |±15/2⟩ state with g∥ ≈ 20 and g⊥ ≈ 0 — an Ising moment of ≈ 10 μB along the local ⟨111⟩ axis, the
precondition for spin ice. The first excited doublet is ~28 meV (~320 K) higher, so below ~30 K only the ground
doublet matters.`,
    },
    { id: 'cef-fit', code: cefCell('cefFit') },
    {
      md: `**Reading the result.** The best minimum has χ²_red ≈ 1: the peak list is described within its error bars. The
other minima found by the random starts are listed with their χ² — they are much worse here, because the 120 K lines
(transitions between excited doublets) pin the level scheme. With fewer peaks, or with intensities ignored, you
would typically find several minima with similar χ²: then report all of them, and use other data (M, χ, C) to
choose. Never quote the parameters of one minimum without saying how many you looked at.

## Posterior sampling

The Jacobian errors assume a locally quadratic χ². An ensemble MCMC (affine-invariant sampler) around the best fit
checks this and propagates the uncertainty to derived quantities — level energies and the ground-doublet g-factors —
which are often better determined than the B_n^m themselves. The \`[cef-fit]\` cell above already ran the sampler
(\`mcmcSteps: 300\`); here are the derived quantities.`,
    },
    {
      id: 'mcmc',
      code: `${COL}
const posterior = state.results.fit.posterior;
display(Object.entries(posterior.derived).map(([name, s]) => ({ quantity: name, mean: s.mean.toPrecision(5), 'std. dev.': s.standardDeviation.toPrecision(2) })));
show({ acceptanceFraction: Number(posterior.acceptanceFraction.toFixed(3)), samples: posterior.sampleCount, derived: posterior.derived,
   parameters: Object.fromEntries(Object.entries(posterior.parameters).map(([k, s]) => [k, [Number(s.mean.toPrecision(4)), Number(s.standardDeviation.toPrecision(2))]])) })`,
    },
    {
      md: `## Check against the full spectra

The peak list is a reduction of the spectra. The last check draws the four measured spectra with the spectra computed
from the fitted CEF (resolution from \`ins-resolution.csv\`, intrinsic widths of 0.2 meV at 5 K and 0.6 meV at 120 K),
each with one scale and one flat background fitted by linear least squares above 8 meV (the elastic line is left out).`,
    },
    {
      id: 'spectra-check',
      code: `${COL}
const B = state.results.cefFit.parametersMeV;
const res = state.datasets.resolution;
const polyFor = (ei) => { const k = col(res, 'Ei').indexOf(ei); return [col(res, 'c0')[k], col(res, 'c1')[k], col(res, 'c2')[k]]; };
const sets = [['ins60cold', 60, 5, 2.6], ['ins60warm', 60, 120, 2.6], ['ins150cold', 150, 5, 4.1], ['ins150warm', 150, 120, 4.1]];
const values = [];
const summary = [];
for (const [name, ei, t, q] of sets) {
  const d = state.datasets[name];
  const e = col(d, 'E'), y = col(d, 'I'), dy = col(d, 'dI');
  const model = physics.neutron.neutronSpectrum('Dy3+', B, { temperatureK: t, energiesMeV: e, qInvAngstrom: q, incidentEnergyMeV: ei,
    resolution: { fwhmPolynomialMeV: polyFor(ei) }, intrinsicFwhmMeV: t > 50 ? 0.6 : 0.2 }).intensity;
  // Weighted linear least squares for y = s·model + b over E > 8 meV.
  let sw = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
  e.forEach((x, k) => { if (x <= 8) return; const w = 1 / dy[k] ** 2; sw += w; sx += w * model[k]; sy += w * y[k]; sxx += w * model[k] ** 2; sxy += w * model[k] * y[k]; });
  const s = (sw * sxy - sx * sy) / (sw * sxx - sx * sx), b = (sy - s * sx) / sw;
  let chi2 = 0, n = 0;
  e.forEach((x, k) => { if (x <= 8) return; chi2 += ((y[k] - s * model[k] - b) / dy[k]) ** 2; n++; });
  summary.push({ spectrum: name, scale: s.toFixed(3), 'background (mbarn/sr/meV)': b.toFixed(2), 'χ²_red (E > 8 meV)': (chi2 / (n - 2)).toFixed(2) });
  const label = 'Ei ' + ei + ' meV, ' + t + ' K';
  e.forEach((x, k) => { values.push({ E: x, I: y[k], what: 'data', set: label }); if (x > 8) values.push({ E: x, I: s * model[k] + b, what: 'fitted CEF', set: label }); });
}
display(summary);
display({ 'application/vnd.vegalite.v5+json': {
  $schema: 'https://vega.github.io/schema/vega-lite/v5.json', data: { values },
  facet: { field: 'set', type: 'nominal', title: null }, columns: 2,
  spec: { width: 300, height: 170, layer: [
    { transform: [{ filter: "datum.what === 'data'" }], mark: { type: 'point', size: 6, filled: true, color: '#777', clip: true },
      encoding: { x: { field: 'E', type: 'quantitative', title: 'E (meV)' }, y: { field: 'I', type: 'quantitative', title: 'I (mbarn/sr/meV)', scale: { domain: [0, 60] } } } },
    { transform: [{ filter: "datum.what !== 'data'" }], mark: { type: 'line', color: '#c0392b', clip: true },
      encoding: { x: { field: 'E', type: 'quantitative' }, y: { field: 'I', type: 'quantitative' } } } ] },
  resolve: { scale: { x: 'independent' } } } });
summary.map((r) => r.spectrum + ': scale ' + r.scale).join('; ')`,
    },
    {
      md: `**Common pitfalls.** (1) Assigning peaks by eye and forgetting the excited-state lines at high temperature.
(2) Comparing absolute intensities across settings without a per-setting scale. (3) Reading the elastic line or a
phonon as a CEF level: phonons grow with Q, CEF lines follow the magnetic form factor and fall with Q. (4) Trusting
B_n^m to more digits than their errors; the ground-doublet g-factors and the level energies are the robust output.
This fit is a model for research use: with fewer peaks it is under-determined, so always check alternative minima.`,
    },
  ],
};

const nb3 = {
  file: '03-magnetization-susceptibility.ipynb',
  title: '3 · Magnetization and susceptibility with no free parameters',
  cells: [
    {
      md: `# 3 · Magnetization and susceptibility predicted with no free parameters

${INVENTED}

**Why this step.** The CEF was fitted to neutron data only. Bulk magnetometry is an independent test: the crystal field
alone predicts M(B, T) of the powder and χ(T) with *no* adjustable parameter. Agreement says the level scheme and the
ground-doublet wavefunctions are right; disagreement points at a wrong minimum, at interactions, or at a problem with
the data (mass, demagnetization, diamagnetic background).`,
    },
    { code: SAMPLE },
    { code: `[data] magnetization\nfile: data/magnetization.csv` },
    { code: `[data] susceptibility\nfile: data/susceptibility.csv` },
    {
      md: `The crystal field from notebook 2 (best minimum):`,
    },
    { id: 'cef', code: cefCell('cef') },
    {
      md: `## M(B) of the powder

The \`[magnetization]\` cell computes it: for each field direction the single-ion Hamiltonian H_CEF − g_J μB B·J is diagonalised exactly and the moment along B
is thermally averaged; the powder average uses a Lebedev grid on the sphere. For an Ising moment μ along the local axis
the powder saturates at μ/2 ≈ 5 μB per Dy — not at g_J J = 10 μB. **What to look at:** the shape at 2 K (fast rise to
half saturation) and the ratio data/model across fields (a constant ratio ≠ 1 is a mass or calibration error, not
physics).`,
    },
    {
      id: 'm-calc',
      code: `[magnetization] mCalc
cef: cef
temperatures: [2 K, 5 K, 20 K]
fields: 0.25 T .. 7 T / 28
powderDegree: 41`,
    },
    {
      md: `The typed cell computed the prediction; the next cell lays the data over it and measures the ratio.`,
    },
    {
      id: 'mb',
      code: `${COL}
const d = state.datasets.magnetization;
const T = col(d, 'T'), B = col(d, 'B'), M = col(d, 'M'), dM = col(d, 'dM');
const m = state.results.mCalc;
const values = [];
let chi2 = 0, ratio = 0;
T.forEach((t, k) => {
  const i = m.temperaturesK.indexOf(t), j = m.fieldsT.findIndex((b) => Math.abs(b - B[k]) < 1e-9);
  const calc = m.magnetizationMuB[i][j];
  chi2 += ((M[k] - calc) / dM[k]) ** 2; ratio += M[k] / calc;
  values.push({ B: B[k], M: M[k], T: t + ' K', what: 'data' }, { B: B[k], M: calc, T: t + ' K', what: 'CEF, no free parameter' });
});
display({ 'application/vnd.vegalite.v5+json': {
  $schema: 'https://vega.github.io/schema/vega-lite/v5.json', width: 460, height: 280, data: { values },
  layer: [
    { transform: [{ filter: "datum.what === 'data'" }], mark: { type: 'point', filled: true, size: 30 },
      encoding: { x: { field: 'B', type: 'quantitative', title: 'B (T)' }, y: { field: 'M', type: 'quantitative', title: 'M (μB per Dy)' }, color: { field: 'T', type: 'nominal' } } },
    { transform: [{ filter: "datum.what !== 'data'" }], mark: 'line',
      encoding: { x: { field: 'B', type: 'quantitative' }, y: { field: 'M', type: 'quantitative' }, color: { field: 'T', type: 'nominal' } } } ] } });
show({ points: T.length, chi2Reduced: Number((chi2 / T.length).toFixed(2)), meanRatioDataOverModel: Number((ratio / T.length).toFixed(4)) })`,
    },
    {
      md: `## χ(T)

The Van Vleck susceptibility (Curie terms within each level plus the field-induced mixing between levels), powder
averaged, per mole of formula units (2 Dy). At high temperature the excited doublets are populated and χT approaches
the free-ion value; at low temperature only the ground doublet counts. A Curie–Weiss fit of the data between 10 and
30 K (the \`[curie-weiss-fit]\` cell, per Dy) gives the effective moment of the ground doublet and a Weiss temperature; a θ_CW of order ±1 K is all the
interactions leave visible in χ of a spin ice.`,
    },
    { id: 'chi-calc', code: `[susceptibility] chiCalc\ncef: cef\ntemperatures: 2 K .. 300 K / 299` },
    {
      id: 'cw-data',
      code: `[curie-weiss-fit] cwData
data: susceptibility
chiColumn: chi
errorColumn: dchi
range: [10 K, 30 K]
perFormulaUnit: true`,
    },
    {
      id: 'chi',
      code: `${COL}
const d = state.datasets.susceptibility;
const T = col(d, 'T'), chi = col(d, 'chi');
const model = state.results.chiCalc;
const calc = T.map((t) => model.chiEmuPerMolFormulaUnit[model.temperaturesK.findIndex((x) => Math.abs(x - t) < 1e-9)]);
const values = T.flatMap((t, k) => [
  { T: t, inv: 1 / chi[k], what: 'data' }, { T: t, inv: 1 / calc[k], what: 'CEF, no free parameter' }]);
display({ 'application/vnd.vegalite.v5+json': {
  $schema: 'https://vega.github.io/schema/vega-lite/v5.json', width: 460, height: 260, data: { values },
  layer: [
    { transform: [{ filter: "datum.what === 'data'" }], mark: { type: 'point', filled: true, size: 20, color: '#333' },
      encoding: { x: { field: 'T', type: 'quantitative', title: 'T (K)' }, y: { field: 'inv', type: 'quantitative', title: '1/χ (mol/emu per f.u.)' } } },
    { transform: [{ filter: "datum.what !== 'data'" }], mark: { type: 'line', color: '#c0392b' },
      encoding: { x: { field: 'T', type: 'quantitative' }, y: { field: 'inv', type: 'quantitative' } } } ] } });
const cw = state.results.cwData;
const cwModel = physics.thermo.curieWeissFit(T, calc.map((x) => x / 2), { rangeK: [10, 30] });
const at = (t) => T.indexOf(t);
show({ ratioDataOverModelAt300K: Number((chi[at(300)] / calc[at(300)]).toFixed(4)), ratioAt10K: Number((chi[at(10)] / calc[at(10)]).toFixed(4)),
   curieWeissData10to30K: { muEffMuBPerDy: Number(cw.effectiveMomentMuB.toFixed(3)), thetaCWK: Number(cw.weissTemperatureK.toFixed(2)), thetaErrorK: Number(cw.uncertainty.weissTemperatureK.toFixed(2)) },
   curieWeissModel10to30K: { muEffMuBPerDy: Number(cwModel.effectiveMomentMuB.toFixed(3)), thetaCWK: Number(cwModel.weissTemperatureK.toFixed(2)) } })`,
    },
    {
      md: `**Reading the comparison.** Data and prediction agree to about a percent over the whole range, with a ratio that
is nearly constant in field and temperature: that is a sample-mass (or calibration) error, which a single-ion model
cannot and should not absorb. In a real spin ice at 2 K the interactions reduce M at low field below the single-ion
curve — look for such a deviation before trusting a single-ion fit there.

**Common pitfalls.** Powder vs single crystal (Ising powder saturates at μ/2); per Dy vs per formula unit; the
demagnetizing field for a strongly magnetic sample (significant below ~1 T here); the diamagnetic core contribution
(~10⁻⁴ emu/mol), which matters only at high T where χ is small; fitting Curie–Weiss over a range where excited CEF
levels are populated (the "θ_CW" then measures the crystal field, not the exchange).`,
    },
  ],
};


const REDUCTION = `[heat-capacity-reduction] cpMag
data: cp
errorColumn: dC
analogue: cpAnalogue
analogueMolarMass: 643.4 g/mol
nuclear:
  - { hyperfine: 0.0098 meV, spin: 2.5, abundance: 0.189 }
  - { hyperfine: 0.0137 meV, spin: 2.5, abundance: 0.249 }
impurityFraction: 0.05
impurityLevels: [0 meV, 0 meV, 0.42 meV, 0.42 meV]`;

const nb4 = {
  file: '04-heat-capacity-entropy.ipynb',
  title: '4 · Heat capacity reduction and the magnetic entropy',
  cells: [
    {
      md: `# 4 · Heat capacity reduction and the magnetic entropy

${INVENTED}

**Why this step.** The entropy is the bookkeeping of the ground state: a Kramers doublet that orders or freezes
releases R ln 2 = 5.76 J/(mol K) per Dy. A spin ice does not: the ice rules (two spins in, two out on every
tetrahedron) leave Pauling's residual entropy (R/2) ln(3/2) = 1.69 J/(mol K), so the entropy released on cooling to the
lowest temperatures is only R[ln 2 − ½ ln(3/2)] = 4.08 J/(mol K). The magnetic entropy is obtained by integrating
C_mag/T — after everything that is not the electronic magnetism of Dy has been removed.`,
    },
    { code: SAMPLE },
    { code: `[data] cp\nfile: data/heat-capacity.csv` },
    { code: `[data] cpAnalogue\nfile: data/heat-capacity-analogue.csv` },
    {
      md: `## What is subtracted

* **Lattice (phonons)** from the nonmagnetic analogue QX-7-Lu, its temperature axis rescaled by the ratio of Debye
  temperatures estimated from the molar masses (θ_D ∝ M^(−1/2)).
* **Nuclear Schottky** of the two odd Dy isotopes: below ~1 K the frozen 4f moment splits the nuclear levels and C rises
  again as T → 0. The hyperfine splittings used here are the values assumed for QX-7 in this teaching example.
* **Secondary phase** (5 % molar, characterised separately as a Schottky anomaly with a 0.42 meV gap between two
  doublets): C_mag = [C − f C_imp]/(1 − f) − C_lattice − n C_nuclear, per formula unit, then per Dy (n = 2).

The entropy is integrated from the lowest measured point (0.35 K) up, without extrapolation: what it measures is the
entropy released *above* 0.35 K.`,
    },
    { id: 'reduction', code: REDUCTION },
    {
      md: `**What to look at.** The left panel shows each contribution; the magnetic part peaks near 1.2 K (the spin-ice
freezing crossover) and the nuclear tail dominates below ~0.5 K. The right panel is S_mag(T): it flattens above ~10 K
at a plateau. The next cell reads the plateau off between 12 and 30 K and compares it with the two reference lines.`,
    },
    {
      id: 'entropy',
      code: `const show = (o) => ({ 'application/json': o, 'text/plain': JSON.stringify(o, null, 1) });
const r = state.results.cpMag;
const idx = r.temperaturesK.map((t, i) => i).filter((i) => r.temperaturesK[i] >= 12 && r.temperaturesK[i] <= 30);
const mean = idx.reduce((s, i) => s + r.entropyJPerMolK[i], 0) / idx.length;
const err = Math.max(...idx.map((i) => r.entropyUncertaintyJPerMolK[i]));
show({ plateauJPerMolK: Number(mean.toFixed(3)), plateauErrorJPerMolK: Number(err.toFixed(3)), plateauTemperatureK: '12–30',
  rLn2: Number(r.rLn2JPerMolK.toFixed(3)), pauling: Number(r.spinIceJPerMolK.toFixed(3)),
  missingFromRln2: Number((r.rLn2JPerMolK - mean).toFixed(3)), paulingResidual: Number(r.paulingJPerMolK.toFixed(3)) })`,
    },
    {
      md: `**Reading the result.** The plateau sits close to R[ln 2 − ½ ln(3/2)], not at R ln 2: about 1.7 J/(mol K) per Dy
is missing, the size of Pauling's residual entropy. That is the thermodynamic signature of spin ice. Whether the
missing entropy is really "residual" or only released below 0.35 K (slow dynamics, or a very-low-temperature
ordering) the data cannot say: only an extrapolation, or measurements at lower temperature with long equilibration,
could.

**Common pitfalls.** (1) A lattice estimate that is off by a few percent at 20–30 K shifts the plateau visibly — check
the analogue's mass scaling, or compare with a Debye fit. (2) Forgetting the nuclear term makes C_mag/T diverge at the
lowest temperatures and adds spurious entropy. (3) Slow equilibration in spin ice below ~0.5 K: relaxation-method
heat capacity can under-read C there. (4) Entropy per formula unit vs per Dy (a factor 2).`,
    },
  ],
};

const nb5 = {
  file: '05-effective-exchange.ipynb',
  title: '5 · Effective exchange and transverse couplings',
  cells: [
    {
      md: `# 5 · Effective exchange and the transverse couplings

${INVENTED}

**Why this step.** Below ~30 K each Dy³⁺ is a two-level system: the ground doublet, described by a pseudospin-1/2.
Interactions between neighbouring ions become couplings between pseudospins, J_zz S^z S^z along the local axes plus
transverse terms J_±, J_±±, J_z± that make quantum fluctuations possible. For a doublet made of |±15/2⟩ the
transverse terms vanish to first order — J± changes m by 1, and |+15/2⟩ and |−15/2⟩ differ by 15 — and appear only
through virtual excitations to the excited CEF doublets, suppressed by the CEF gap. This notebook estimates how small
they are.

**Caution.** These estimates are perturbative (first and second order in the exchange over the CEF gap) and assume a
microscopic coupling form — an isotropic exchange J_ex J_i·J_j between total angular momenta plus the magnetic
dipolar interaction. They show scales and trends, not measured values.`,
    },
    { code: SAMPLE },
    { md: `The crystal field from notebook 2:` },
    { id: 'cef', code: cefCell('cef') },
    {
      md: `## Dipolar coupling alone

The dipolar interaction between two 10 μB moments at the nearest-neighbour distance a√2/4 = 3.61 Å is fixed by the
moment and the lattice: no parameter. Projected on the ground doublets it gives J_zz ≈ +8.7 K in the pseudospin-1/2
convention (H = J_zz S^z_i S^z_j with S^z = ±1/2 along the local axes; positive favours two-in-two-out). That is
4 × D_nn, with D_nn = 5D/3 ≈ 2.2 K the nearest-neighbour dipolar energy scale of the Ising (σ = ±1) language of
notebook 6: mind the factor 4 whenever you compare the two conventions.`,
    },
    { id: 'dipolar', code: `[exchange] exDipolar\ncef: cef\ndipolar: true\norder: 1` },
    {
      md: `## Exchange plus dipolar, and the scan against the CEF gap

For the exchange scale we take J_ex = 4.7 μeV: the size that the nearest-neighbour Ising coupling J1 ≈ 3 K of
notebook 6 corresponds to (J1 ≈ J_ex ⟨J_z⟩² with ⟨J_z⟩ ≈ 7.5). The second-order result includes the virtual
excitations; the exact diagonalisation of the two-ion problem checks the perturbation theory. The scan multiplies the
crystal field by 0.25 … 4, so the gap to the first excited doublet moves from ~7 to ~110 meV: watch the transverse
couplings fall roughly as 1/gap.`,
    },
    {
      id: 'exchange',
      code: `[exchange] ex
cef: cef
isotropic: 4.7 ueV
dipolar: true
order: 2
cefScale: 0.25 .. 4 / 9 log`,
    },
    {
      id: 'couplings',
      code: `const show = (o) => ({ 'application/json': o, 'text/plain': JSON.stringify(o, null, 1) });
const K = physics.units.KELVIN_IN_MEV;
const r = state.results.ex;
const c = r.second;
const scan = r.scanCefScale.map((row) => ({ 'CEF scale': row.value.toFixed(2), 'gap (meV)': row.gapMeV.toFixed(1),
  'J_zz (K)': (row.second.Jzz / K).toFixed(3), 'J_± (mK)': (1000 * row.second.Jpm / K).toFixed(4), '|J_±/J_zz|': Math.abs(row.second.Jpm / row.second.Jzz).toExponential(2) }));
display(scan);
show({ JzzK: Number((c.Jzz / K).toFixed(4)), JpmK: Number((c.Jpm / K).toPrecision(3)), JpmpmK: Number((c.Jpmpm / K).toPrecision(3)), JzpmK: Number((c.Jzpm / K).toPrecision(3)),
  transverseRatio: Number(Math.abs(c.Jpm / c.Jzz).toPrecision(3)), gapMeV: Number(r.gapMeV.toFixed(2)),
  dipolarOnlyJzzK: Number((state.results.exDipolar.first.Jzz / K).toFixed(4)), twoSiteCheckMeV: r.twoSiteCheckMeV })`,
    },
    {
      md: `**Reading the result.** J_zz is a few kelvin; the transverse couplings are smaller by several orders of
magnitude at the real gap (~28 meV) and grow as the gap shrinks. For QX-7 the pseudospins are therefore, to a very
good approximation, classical Ising variables — which is what justifies the classical Monte Carlo of notebook 6. For a
rare earth with a small gap or a mixed ground doublet the same cells would show large J_± and a quantum spin ice.

**Common pitfalls.** Sign conventions differ between papers (local vs global frames, S vs J, factors of 2 and 4 in the
pseudospin mapping): compare ratios and always state the convention. Second-order results are only as good as the
assumed microscopic coupling; the two-site check tests the perturbation theory, not the model.`,
    },
  ],
};

const nb6 = {
  file: '06-monte-carlo-diffuse.ipynb',
  title: '6 · Monte Carlo fit of C(T) and the diffuse scattering',
  cells: [
    {
      md: `# 6 · Monte Carlo of dipolar spin ice: fit of C(T) and the diffuse scattering

${INVENTED}

**Why this step.** With Ising pseudospins (notebook 5) the low-temperature physics is a classical model: Ising moments
μ ≈ 10 μB along the local ⟨111⟩ axes, the long-range dipolar interaction (fixed by μ and a) and short-range exchange
J1 (nearest neighbours; J2, J3 further out). Monte Carlo gives C(T) and the spin correlations of this model; fitting J1
to the magnetic heat capacity and then *predicting* the diffuse neutron scattering is an independent test.

**Budget.** To keep the demo fast the simulation uses a small periodic box, L = 2 cubic cells (128 spins), and
modest run lengths; loop moves and parallel tempering keep it equilibrated down to ~0.4 K. For publication use L ≥ 4
and check the finite-size dependence.`,
    },
    { code: SAMPLE },
    { code: `[data] cp\nfile: data/heat-capacity.csv` },
    { code: `[data] cpAnalogue\nfile: data/heat-capacity-analogue.csv` },
    { code: `[data] diffuse\nfile: data/diffuse-scattering.csv` },
    { md: `The crystal field (for the moment μ = g∥/2 μB) and the magnetic heat capacity, as in notebooks 2 and 4:` },
    { code: cefCell('cef') },
    { code: REDUCTION },
    {
      md: `## Fit of J1 to C_mag(T)

The \`[mc-fit]\` cell fits J1 to the magnetic heat capacity per Dy between 0.5 and 8 K (below 0.5 K the nuclear
term dominates the measured C and real spin ices fall out of equilibrium), with J2 = J3 = 0 (the heat capacity alone
cannot separate the small further-neighbour terms). Each iteration runs one Monte Carlo simulation and
moves J1 by reweighting the recorded histograms (multi-histogram reweighting in T and in the couplings), within a trust
box; four simulations are enough here. The moment is g∥/2 = 9.915 μB from the crystal field of notebook 2, and the
dipolar D = (μ0/4π) μ²/r_nn³ follows from it and a. The reduction result carries no error bars, so the fit uses its
default σ = 3 % of C + 0.01 J/(mol K). **What to look at:** the peak position of C (set by J_eff = J_nn + D_nn, with
J_nn = −J1/3 and D_nn = 5D/3 in the usual nearest-neighbour language) and its height.`,
    },
    {
      id: 'mc-fit-cell',
      code: `[mc-fit] mcFit
data: cpMag
range: [0.5 K, 8 K]
free: [J1]
J1: 3 K
dipolar: true
moment: 9.915
L: 2
sweeps: 1500
simulationTemperatures: 0.3 K .. 10 K / 20 log
maxSimulations: 4
seed: 600`,
    },
    {
      id: 'mc-fit',
      code: `const show = (o) => ({ 'application/json': o, 'text/plain': JSON.stringify(o, null, 1) });
const r = state.results.mcFit;
display(r.history.map((h, i) => ({ simulation: i + 1, 'J1 (K)': h.parametersK.J1.toFixed(3), 'χ²': h.chiSquare.toFixed(1) })));
show({ J1K: Number(r.parametersK.J1.toFixed(3)), J1ErrorK: Number(r.uncertaintiesK.J1.toFixed(3)), chi2ReducedAtMinimum: Number(r.reducedChiSquare.toFixed(2)),
  converged: r.converged, points: r.temperaturesK.length, momentMuB: r.model.momentMuB })`,
    },
    {
      md: `**Reading the fit.** The error bar of J1 is statistical only (data and Monte Carlo noise, with the default 3 %
errors). χ²_red above 1 says the model with J1 alone does not describe every detail: the further-neighbour couplings
set to zero here shift the best J1 by an amount larger than its statistical error. Read J1 as an *effective*
nearest-neighbour coupling of the model J2 = J3 = 0; freeing J2 and J3a with these data moves J1 by ~0.05 K and does
not converge — they need other data (diffuse scattering of single crystals, the ordering at very low temperature).`,
    },
    {
      md: `## Diffuse scattering in absolute units

A \`[spin-ice-mc]\` run from the fitted model (\`from: mcFit\`) keeps spin snapshots at 0.6, 1.2 and 3 K and at 20 K;
the \`[structure-factor]\` cell turns their pair correlations into the powder cross-section (Blech–Averbach average,
barn/sr per Dy) and the difference I(T) − I(20 K), the quantity measured. One overall scale is then fitted to all
three temperatures: since the data are already in absolute units, it should come out near 1; how far it is from 1
measures the absolute calibration of the neutron data. **What to look at:** the difference grows on cooling, with a
broad maximum near Q ≈ 0.6 Å⁻¹ and a minimum near 2 Å⁻¹ — the short-range ice-rule correlations building up. With
L = 2 the correlations are followed only to half the box (~10 Å), so structure below ~0.6 Å⁻¹ is not resolved by
this model.`,
    },
    {
      id: 'mc-run',
      code: `[spin-ice-mc] mc
from: mcFit
temperatures: [0.6 K, 1.2 K, 3 K, 20 K]
sweeps: 1600
snapshots: 80
seed: 77`,
    },
    {
      id: 'structure-factor',
      code: `[structure-factor] sq
run: mc
Q: 0.3 angstrom^-1 .. 3 angstrom^-1 / 55
referenceTemperature: 20 K`,
    },
    {
      id: 'diffuse',
      code: `const show = (o) => ({ 'application/json': o, 'text/plain': JSON.stringify(o, null, 1) });
const col = (d, name) => d.columns.find((c) => c.name === name).values;
const d = state.datasets.diffuse;
const Q = col(d, 'Q');
const sq = state.results.sq;
const temps = [0.6, 1.2, 3.0];
const names = temps.map((t) => String(t).replace('.', 'p') + 'K');
// The model differences in mbarn/sr per Dy, on the data's Q grid (the same 0.3 … 3 Å⁻¹ in steps of 0.05).
const models = temps.map((t) => {
  const k = sq.temperaturesK.findIndex((x) => Math.abs(x - t) < 1e-9);
  return Q.map((q) => 1000 * sq.differenceBarnPerSrPerIon[k][sq.QInvAngstrom.findIndex((x) => Math.abs(x - q) < 1e-9)]);
});
let sxx = 0, sxy = 0;
models.forEach((m, k) => { const y = col(d, 'dI_' + names[k]), e = col(d, 'err_' + names[k]); m.forEach((x, i) => { sxx += x * x / e[i] ** 2; sxy += x * y[i] / e[i] ** 2; }); });
const scale = sxy / sxx, scaleError = 1 / Math.sqrt(sxx);
const chi2Reduced = models.map((m, k) => { const y = col(d, 'dI_' + names[k]), e = col(d, 'err_' + names[k]); return m.reduce((s, x, i) => s + ((y[i] - scale * x) / e[i]) ** 2, 0) / (Q.length - 1); });
const values = temps.flatMap((t, k) => { const y = col(d, 'dI_' + names[k]); return Q.flatMap((q, i) => [{ Q: q, I: y[i], what: 'data', T: t + ' K' }, { Q: q, I: scale * models[k][i], what: 'MC model', T: t + ' K' }]); });
display({ 'application/vnd.vegalite.v5+json': {
  $schema: 'https://vega.github.io/schema/vega-lite/v5.json', width: 460, height: 280, data: { values },
  layer: [
    { transform: [{ filter: "datum.what === 'data'" }], mark: { type: 'point', filled: true, size: 18 },
      encoding: { x: { field: 'Q', type: 'quantitative', title: 'Q (Å⁻¹)' }, y: { field: 'I', type: 'quantitative', title: 'I(T) − I(20 K) (mbarn/sr per Dy)' }, color: { field: 'T', type: 'nominal' } } },
    { transform: [{ filter: "datum.what !== 'data'" }], mark: 'line',
      encoding: { x: { field: 'Q', type: 'quantitative' }, y: { field: 'I', type: 'quantitative' }, color: { field: 'T', type: 'nominal' } } } ] } });
show({ J1K: Number(state.results.mcFit.parametersK.J1.toFixed(3)), temperaturesK: temps, scale: Number(scale.toFixed(3)), scaleError: Number(scaleError.toFixed(3)), chi2Reduced: chi2Reduced.map((x) => Number(x.toFixed(2))) })`,
    },
    {
      md: `**Reading the result.** The model, with J1 from the heat capacity and no further adjustable parameter apart from
one overall scale, reproduces the diffuse scattering at all three temperatures; the scale is close to 1, which says the
absolute normalisation of the diffraction data is good to the stated ~10 %.

**Common pitfalls.** (1) Finite size: L = 2 resolves correlations only up to half the box (~10 Å), which smooths the
low-Q part; a pinch-point analysis needs single crystals and larger boxes. (2) Freezing: below ~0.5 K single-spin
dynamics of real spin ices falls out of equilibrium; the simulation uses loop moves and is always in equilibrium — the
two need not agree there. (3) Fitting J1 with the dipolar term switched off gives an effective nearest-neighbour
coupling, not J1. (4) The heat capacity hardly constrains J2 and J3: they need the diffuse scattering of single
crystals or the low-temperature ordering.`,
    },
  ],
};

export const NOTEBOOKS = [nb1, nb2, nb3, nb4, nb5, nb6];
