/**
 * Generator of the demo's "measured" data for the invented compound QX-7 (a Dy pyrochlore oxide Dy2M2O7 with an
 * invented nonmagnetic M⁴⁺ ion; nothing here describes a real material or a real measurement).
 *
 * The hidden true parameters live in `notebooks-demo/truth/hidden-truth.json`, which the notebooks never read. Every
 * dataset is computed with Multiplet's own physics package from those parameters, then made "experimental":
 * Gaussian noise with the stated error bars, an absolute-calibration error, flat backgrounds and an incoherent
 * elastic line in the neutron spectra, a mass-calibration error in magnetometry, a diamagnetic core term in χ, and in
 * the heat capacity a Debye phonon term, a nuclear Schottky term and a 5 % secondary phase.
 *
 * Seeded (physics/random): rerunning writes the same bytes. Run through scripts/demo/generate-data.mjs:
 *   node scripts/demo/generate-data.mjs            (writes notebooks-demo/data/*.csv and truth/hidden-truth.json)
 *   node scripts/demo/generate-data.mjs --check    (regenerates in memory, exit 1 if any committed file differs)
 */
import { mkdirSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { getIon } from '@multiplet/physics/ions';
import { solveCef } from '@multiplet/physics/cef';
import { neutronSpectrum, levelStrengths, thermalTransitions, magneticFormFactor, resolutionFwhmMeV } from '@multiplet/physics/neutron';
import {
  magnetization,
  vanVleckSusceptibility,
  cefHeatCapacity,
  debyeHeatCapacity,
  nuclearSchottkyHeatCapacity,
  schottkyHeatCapacity,
} from '@multiplet/physics/thermo';
import { runSpinIceMonteCarlo } from '@multiplet/physics/montecarlo';
import { createRandom, type Random } from '@multiplet/physics/random';
import { MAGNETIC_PREFACTOR_MB } from '@multiplet/physics/units';
import { pairTable, pairCorrelationShells, powderIntensity } from '@multiplet/physics/scattering';

// ---------------------------------------------------------------------------------------------------------------
// The hidden truth (invented for the demo).
const TRUTH = {
  note: 'Hidden true parameters of the invented compound QX-7, used by scripts/demo/generate-data.ts. The demo notebooks never read this file; only the tests and the demo summary compare against it.',
  compound: {
    label: 'QX-7',
    formula: 'Dy2M2O7 (M: an invented nonmagnetic 4+ ion)',
    ion: 'Dy3+',
    siteSymmetry: 'D3d',
    latticeConstantAngstrom: 10.21,
    molarMassGPerMol: 618.4,
    ionsPerFormulaUnit: 2,
    atomsPerFormulaUnit: 11,
  },
  analogue: { label: 'QX-7-Lu', formula: 'Lu2M2O7', molarMassGPerMol: 643.4 },
  cefMeV: { B20: -0.236, B40: -2.74e-3, B43: 2.41e-2, B60: 1.31e-5, B63: 6.2e-5, B66: 7.9e-5 },
  exchangeK: { J1: 3.05, J2: -0.09, J3a: 0.04, J3b: 0.015 },
  lattice: { debyeTemperatureK: 318 },
  nuclear: [
    { isotope: '161Dy', nuclearSpin: 2.5, abundance: 0.189, hyperfineMeV: 0.0098 },
    { isotope: '163Dy', nuclearSpin: 2.5, abundance: 0.249, hyperfineMeV: 0.0137 },
  ],
  impurity: { molarFraction: 0.05, levelsMeV: [0, 0, 0.42, 0.42], note: 'secondary phase: a doublet–doublet Schottky per mole of phase' },
  magnetometry: { massCalibrationFactor: 1.012, diamagneticEmuPerMolFu: -2.1e-4, chiFieldTesla: 0.1 },
  neutron: {
    calibrationFactor: 0.94,
    runs: [
      { incidentEnergyMeV: 60, qInvAngstrom: 2.6, fwhmPolynomialMeV: [2.45, -0.031, 8.0e-5], grid: [-10, 55, 0.25], backgroundMbSrMeV: 3.0, elasticIncoherentMbSr: 60 },
      { incidentEnergyMeV: 150, qInvAngstrom: 4.1, fwhmPolynomialMeV: [6.1, -0.046, 8.5e-5], grid: [-20, 135, 0.5], backgroundMbSrMeV: 2.2, elasticIncoherentMbSr: 60 },
    ],
    temperaturesK: [5, 120],
  },
  monteCarlo: { L: 2, sweeps: 8000, seed: 20261, note: 'L = 2 (128 spins), Ewald dipolar, loops and parallel tempering' },
  diffuse: { temperaturesK: [0.6, 1.2, 3.0], referenceTemperatureK: 20, qInvAngstrom: [0.3, 3.0, 0.05] },
  seed: 7070,
};

const root = new URL('../../', import.meta.url).pathname;
const dataDir = join(root, 'notebooks-demo/data');
const truthPath = join(root, 'notebooks-demo/truth/hidden-truth.json');
const check = process.argv.includes('--check');

const ion = getIon(TRUTH.compound.ion);
const single = { J: ion.J, gJ: ion.gJ, parametersMeV: TRUTH.cefMeV };
const rng: Random = createRandom(TRUTH.seed);

/** Fixed-precision number text (deterministic, no locale). */
const fmt = (x: number, digits = 6): string => {
  if (x === 0) return '0';
  const s = x.toPrecision(digits);
  return s.includes('e') ? s : String(Number(s));
};
const gridOf = (from: number, to: number, step: number): number[] => {
  const n = Math.round((to - from) / step);
  return Array.from({ length: n + 1 }, (_, k) => Number((from + k * step).toFixed(6)));
};
const logGrid = (from: number, to: number, n: number): number[] =>
  Array.from({ length: n }, (_, k) => Number((from * Math.pow(to / from, k / (n - 1))).toPrecision(4)));

const files = new Map<string, string>();
function csv(name: string, comments: string[], header: string[], rows: number[][], digits = 6): void {
  const lines = [...comments.map((c) => `# ${c}`), header.join(', '), ...rows.map((r) => r.map((v) => fmt(v, digits)).join(', '))];
  files.set(name, lines.join('\n') + '\n');
}
const INVENTED = 'Invented data for the Multiplet demo: compound QX-7 is fictional; generated by scripts/demo/generate-data.ts.';

// ---------------------------------------------------------------------------------------------------------------
// Inelastic neutron scattering: spectra at two incident energies and two temperatures, and a peak list.
const cef = solveCef(ion, TRUTH.cefMeV);
const groundDoublet = cef.groundDoublet;
if (!groundDoublet) throw new RangeError('generate-data: the hidden crystal field must give a ground doublet');
const levels = levelStrengths(ion, TRUTH.cefMeV);
const peakRows: number[][] = [];
for (const run of TRUTH.neutron.runs) {
  const energies = gridOf(run.grid[0], run.grid[1], run.grid[2]);
  for (const temperatureK of TRUTH.neutron.temperaturesK) {
    const spectrum = neutronSpectrum(ion, TRUTH.cefMeV, {
      temperatureK,
      energiesMeV: energies,
      qInvAngstrom: run.qInvAngstrom,
      incidentEnergyMeV: run.incidentEnergyMeV,
      resolution: { fwhmPolynomialMeV: run.fwhmPolynomialMeV },
      intrinsicFwhmMeV: temperatureK > 50 ? 0.6 : 0.2,
      elasticIncoherentMbSr: run.elasticIncoherentMbSr,
    });
    // Counting statistics: about 900 counts at a strong peak; σ from √counts plus a 2 % systematic floor.
    const countsPerUnit = 900 / Math.max(...Array.from(spectrum.intensity).filter((_, k) => energies[k] > 10));
    const rows = energies.map((e, k) => {
      const model = TRUTH.neutron.calibrationFactor * spectrum.intensity[k] + run.backgroundMbSrMeV;
      const sigma = Math.sqrt(Math.max(model, 0) / countsPerUnit + (0.02 * run.backgroundMbSrMeV) ** 2);
      return [e, model + sigma * rng.normal(), sigma];
    });
    csv(
      `ins-Ei${run.incidentEnergyMeV}-${temperatureK}K.csv`,
      [
        INVENTED,
        `Powder INS spectrum, T = ${temperatureK} K, Ei = ${run.incidentEnergyMeV} meV, |Q| = ${run.qInvAngstrom} angstrom^-1 (bank average).`,
        `Absolute units mbarn/sr/meV per Dy; includes a flat background and the incoherent elastic line.`,
        `Resolution FWHM(E) = c0 + c1 E + c2 E^2 with c = [${run.fwhmPolynomialMeV.join(', ')}] meV (see ins-resolution.csv).`,
      ],
      ['E (meV)', 'I (mbarn/sr/meV)', 'dI (mbarn/sr/meV)'],
      rows,
      5,
    );
  }
}
// Peak list: the lines a careful person would extract from these spectra, each transition listed once per temperature,
// from the setting that resolves it best (the smaller resolution FWHM at its energy, within 0.9 Ei), with energy
// transfer above 4 meV. A line is listed when it is significant (above 1 % of the strongest line of its setting and
// 3 times its own error bar); of two lines closer than 0.6 FWHM only the stronger is listed, its intensity error
// widened by the weaker one (an unresolved shoulder).
for (const temperatureK of TRUTH.neutron.temperaturesK) {
  const candidates = thermalTransitions(levels, temperatureK).transitions.filter((t) => t.energyMeV > 4);
  for (const run of TRUTH.neutron.runs) {
    const fwhmAt = (e: number) => resolutionFwhmMeV(run.fwhmPolynomialMeV, e);
    const best = (e: number) =>
      TRUTH.neutron.runs.filter((r) => e < 0.9 * r.incidentEnergyMeV).sort((x, y) => resolutionFwhmMeV(x.fwhmPolynomialMeV, e) - resolutionFwhmMeV(y.fwhmPolynomialMeV, e))[0];
    const transitions = candidates.filter((t) => best(t.energyMeV) === run);
    const f2 = magneticFormFactor(ion.name, run.qInvAngstrom) ** 2;
    const strength = transitions.map(
      (t) => TRUTH.neutron.calibrationFactor * MAGNETIC_PREFACTOR_MB * ion.gJ ** 2 * f2 * t.weight * Math.sqrt(1 - t.energyMeV / run.incidentEnergyMeV),
    );
    const strongest = Math.max(...strength);
    const intensityErrorOf = (k: number) => 0.05 * strength[k] + 0.004 * strongest;
    const listed = transitions
      .map((t, k) => ({ t, k }))
      .filter(({ k }) => strength[k] > Math.max(0.01 * strongest, 3 * intensityErrorOf(k)))
      .sort((x, y) => strength[y.k] - strength[x.k]);
    const kept: { t: (typeof transitions)[number]; k: number; extra: number }[] = [];
    for (const line of listed) {
      const near = kept.find((other) => Math.abs(other.t.energyMeV - line.t.energyMeV) < 0.6 * fwhmAt(line.t.energyMeV));
      if (near) near.extra += strength[line.k];
      else kept.push({ ...line, extra: 0 });
    }
    kept.sort((x, y) => x.t.energyMeV - y.t.energyMeV);
    for (const { t, k, extra } of kept) {
      const errorMeV = Number((0.08 * fwhmAt(t.energyMeV) + 0.1).toFixed(2));
      peakRows.push([
        temperatureK,
        run.incidentEnergyMeV,
        run.qInvAngstrom,
        t.energyMeV + errorMeV * rng.normal(),
        errorMeV,
        strength[k] + intensityErrorOf(k) * rng.normal(),
        Math.hypot(intensityErrorOf(k), extra),
      ]);
    }
  }
}
csv(
  'ins-peaks.csv',
  [
    INVENTED,
    'Crystal-field peaks fitted in the four powder spectra (Gaussian peak fits, resolution-limited widths).',
    'E: energy transfer; I: integrated intensity in absolute units (mbarn/sr per Dy, calibration uncertain by ~10 %).',
  ],
  ['T (K)', 'Ei (meV)', 'Q (angstrom^-1)', 'E (meV)', 'dE (meV)', 'I (mbarn/sr)', 'dI (mbarn/sr)'],
  peakRows,
  5,
);
csv(
  'ins-resolution.csv',
  [INVENTED, 'Instrumental energy resolution (Gaussian FWHM) of the two settings: FWHM(E) = c0 + c1 E + c2 E^2.'],
  ['Ei (meV)', 'c0 (meV)', 'c1', 'c2 (meV^-1)'],
  TRUTH.neutron.runs.map((r) => [r.incidentEnergyMeV, ...r.fwhmPolynomialMeV]),
);

// ---------------------------------------------------------------------------------------------------------------
// Magnetometry: powder M(B) at three temperatures, χ(T) at 0.1 T.
const mTemperatures = [2, 5, 20];
const fields = gridOf(0.25, 7, 0.25);
const m = magnetization(single, { temperaturesK: mTemperatures, fieldsT: fields, direction: 'powder', powder: { degree: 41 } });
const mRows: number[][] = [];
mTemperatures.forEach((t, i) =>
  fields.forEach((b, k) => {
    const value = TRUTH.magnetometry.massCalibrationFactor * m.magnetizationMuB[i][k];
    const sigma = 0.004 * Math.abs(value) + 0.005;
    mRows.push([t, b, value + sigma * rng.normal(), sigma]);
  }),
);
csv(
  'magnetization.csv',
  [INVENTED, 'Powder magnetization, field swept up at fixed temperature. M in Bohr magnetons per Dy ion.'],
  ['T (K)', 'B (T)', 'M (muB)', 'dM (muB)'],
  mRows,
  5,
);

const chiTemperatures = [...gridOf(2, 20, 1), ...gridOf(22, 50, 2), ...gridOf(55, 300, 5)];
const chi = vanVleckSusceptibility(single, { temperaturesK: chiTemperatures, direction: 'powder', ionsPerFormulaUnit: TRUTH.compound.ionsPerFormulaUnit });
csv(
  'susceptibility.csv',
  [INVENTED, `DC susceptibility M/H of the powder in ${TRUTH.magnetometry.chiFieldTesla * 1e4} Oe, per mole of formula units (2 Dy).`],
  ['T (K)', 'chi (emu/mol)', 'dchi (emu/mol)'],
  chiTemperatures.map((t, k) => {
    const value = TRUTH.magnetometry.massCalibrationFactor * chi.chiEmuPerMolFormulaUnit[k] + TRUTH.magnetometry.diamagneticEmuPerMolFu;
    const sigma = 0.003 * Math.abs(value) + 2e-4;
    return [t, value + sigma * rng.normal(), sigma];
  }),
  5,
);

// ---------------------------------------------------------------------------------------------------------------
// Heat capacity: Monte Carlo of dipolar spin ice (magnetic, per Dy) + CEF Schottky + nuclear + Debye lattice,
// then a 5 % secondary phase. C_meas = (1 − f)(C_lattice + n C_mag + n C_nuclear) + f C_impurity.
const cpTemperatures = logGrid(0.35, 30, 40);
const diffuseTemperatures = TRUTH.diffuse.temperaturesK;
const mcTemperatures = [...new Set([...cpTemperatures, ...diffuseTemperatures, TRUTH.diffuse.referenceTemperatureK])].sort((a, b) => a - b);
const momentMuB = groundDoublet.momentParallelMuB;
const mc = runSpinIceMonteCarlo({
  model: { L: TRUTH.monteCarlo.L, latticeConstantAngstrom: TRUTH.compound.latticeConstantAngstrom, momentMuB, exchangeK: TRUTH.exchangeK, dipolar: true },
  temperaturesK: mcTemperatures,
  sweeps: TRUTH.monteCarlo.sweeps,
  seed: TRUTH.monteCarlo.seed,
  snapshotEvery: 40,
});
const mcIndex = (t: number) => mcTemperatures.indexOf(t);
const n = TRUTH.compound.ionsPerFormulaUnit;
const f = TRUTH.impurity.molarFraction;
const cefC = cefHeatCapacity(single, { temperaturesK: cpTemperatures }).heatCapacityJPerMolK;
const debye = debyeHeatCapacity(cpTemperatures, TRUTH.lattice.debyeTemperatureK, TRUTH.compound.atomsPerFormulaUnit);
const nuclear = cpTemperatures.map(() => 0);
for (const isotope of TRUTH.nuclear) {
  const c = nuclearSchottkyHeatCapacity(cpTemperatures, { hyperfineMeV: isotope.hyperfineMeV, nuclearSpin: isotope.nuclearSpin, abundance: isotope.abundance });
  c.heatCapacityJPerMolK.forEach((v, k) => (nuclear[k] += v));
}
const impurity = schottkyHeatCapacity(TRUTH.impurity.levelsMeV, cpTemperatures).heatCapacityJPerMolK;
const magneticPerIon = cpTemperatures.map((t, k) => mc.result.heatCapacityJPerMolK[mcIndex(t)] + cefC[k]);
csv(
  'heat-capacity.csv',
  [INVENTED, 'Specific heat of a pressed QX-7 pellet (relaxation method), zero field, per mole of formula units (2 Dy).'],
  ['T (K)', 'C (J/mol/K)', 'dC (J/mol/K)'],
  cpTemperatures.map((t, k) => {
    const value = (1 - f) * (debye[k] + n * magneticPerIon[k] + n * nuclear[k]) + f * impurity[k];
    const sigma = 0.015 * value + 2e-3;
    return [t, value + sigma * rng.normal(), sigma];
  }),
  5,
);
const analogueRatio = Math.sqrt(TRUTH.compound.molarMassGPerMol / TRUTH.analogue.molarMassGPerMol);
const analogueTemperatures = logGrid(0.3, 40, 36);
const analogueC = debyeHeatCapacity(analogueTemperatures, TRUTH.lattice.debyeTemperatureK * analogueRatio, TRUTH.compound.atomsPerFormulaUnit);
csv(
  'heat-capacity-analogue.csv',
  [INVENTED, `Specific heat of the nonmagnetic analogue ${TRUTH.analogue.label} (${TRUTH.analogue.formula}, ${TRUTH.analogue.molarMassGPerMol} g/mol), per mole of formula units.`],
  ['T (K)', 'C (J/mol/K)', 'dC (J/mol/K)'],
  analogueTemperatures.map((t, k) => {
    const sigma = 0.015 * analogueC[k] + 2e-5;
    return [t, analogueC[k] + sigma * rng.normal(), sigma];
  }),
  5,
);

// ---------------------------------------------------------------------------------------------------------------
// Diffuse magnetic scattering: powder I(Q, T) − I(Q, 20 K) from the same Monte Carlo run's spin snapshots.
const qGrid = gridOf(TRUTH.diffuse.qInvAngstrom[0], TRUTH.diffuse.qInvAngstrom[1], TRUTH.diffuse.qInvAngstrom[2]);
const pairs = pairTable(mc.raw.couplings.cell);
// Blech–Averbach powder average of the snapshots' pair correlations, barn/sr → mbarn/sr per Dy.
const intensityAt = (t: number) =>
  powderIntensity(pairCorrelationShells(pairs, mc.raw.snapshots[mcIndex(t)]), qGrid, momentMuB, (q) => magneticFormFactor(ion.name, q)).map((v) => 1000 * v);
const reference = intensityAt(TRUTH.diffuse.referenceTemperatureK);
const diffuseRows: number[][] = qGrid.map((q) => [q]);
const diffuseHeader = ['Q (angstrom^-1)'];
for (const t of diffuseTemperatures) {
  const at = intensityAt(t);
  diffuseHeader.push(`dI_${String(t).replace('.', 'p')}K (mbarn/sr)`, `err_${String(t).replace('.', 'p')}K (mbarn/sr)`);
  qGrid.forEach((_, k) => {
    const sigma = 40 + 0.03 * Math.abs(at[k]);
    diffuseRows[k].push(TRUTH.neutron.calibrationFactor * (at[k] - reference[k]) + sigma * rng.normal(), sigma);
  });
}
csv(
  'diffuse-scattering.csv',
  [
    INVENTED,
    `Powder diffraction, magnetic diffuse scattering as differences I(Q, T) - I(Q, ${TRUTH.diffuse.referenceTemperatureK} K), mbarn/sr per Dy,`,
    'normalised to the nuclear Bragg peaks (absolute calibration uncertain by ~10 %). Temperatures in the column names.',
  ],
  diffuseHeader,
  diffuseRows,
  5,
);

// ---------------------------------------------------------------------------------------------------------------
const truthOut = {
  ...TRUTH,
  derived: {
    levelsMeV: cef.levels.map((l) => Number(l.energyMeV.toFixed(4))),
    gParallel: Number(groundDoublet.gParallel.toFixed(4)),
    gPerpendicular: Number(groundDoublet.gPerpendicular.toFixed(6)),
    momentParallelMuB: Number(momentMuB.toFixed(4)),
    dipolarDK: Number(mc.raw.couplings.dipolarDK.toFixed(5)),
    monteCarloTemperaturesK: mcTemperatures,
    magneticHeatCapacityJPerMolDyK: mc.result.heatCapacityJPerMolK.map((v) => Number(v.toPrecision(5))),
    magneticEntropyJPerMolDyK: mc.result.entropyJPerMolK.map((v) => Number(v.toPrecision(5))),
  },
};
files.set('../truth/hidden-truth.json', JSON.stringify(truthOut, null, 2) + '\n');

let differences = 0;
for (const [name, text] of files) {
  const path = join(dataDir, name);
  if (check) {
    const same = existsSync(path) && readFileSync(path, 'utf8') === text;
    if (!same) {
      differences++;
      console.error(`differs: ${path}`);
    }
  } else {
    mkdirSync(join(path, '..'), { recursive: true });
    writeFileSync(path, text);
  }
}
if (check) {
  console.log(differences === 0 ? `generate-data --check: all ${files.size} files reproduced byte for byte` : `generate-data --check: ${differences} files differ`);
  process.exit(differences === 0 ? 0 : 1);
}
console.log(`generate-data: wrote ${files.size} files to notebooks-demo/data and notebooks-demo/truth`);
