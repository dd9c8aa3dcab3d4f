/**
 * `[exchange] name` — effective pseudospin-1/2 exchange of the nearest-neighbour pyrochlore bond from a
 * crystal-field result and microscopic couplings (isotropic J_ex J_i·J_j, a 3×3 matrix, magnetic dipolar), to
 * first and second order, with the exact two-site check, optional scans against the CEF scale (gap) and the
 * exchange scale, and an optional J_ex from a Curie–Weiss temperature (@multiplet/physics/exchange).
 *
 *   [exchange] exA
 *   cef: cefA
 *   isotropic: 0.005 meV
 *   dipolar: true
 *   cefScale: 0.25 .. 4 / 9 log
 *
 * Conventions (pseudospin basis, bond phases, the coupling form): packages/physics/src/exchange/*.ts and the
 * README's exchange section.
 */
import { getIon } from '@multiplet/physics/ions';
import { InputError } from '@multiplet/physics/errors';
import { CEF_PARAMETER_KEYS, parseParameterKey, parameterKey } from '@multiplet/physics/cef';
import { KELVIN_IN_MEV } from '@multiplet/physics/units';
import {
  pseudospinSiteFromParameters,
  pyrochloreBond,
  microscopicCouplingMatrix,
  effectiveExchange,
  exchangeScan,
  scaledCefSite,
  scaledCoupling,
  curieWeissThetaK,
  exchangeScaleFromCurieWeiss,
  isotropicExchangeFromIsingJ1,
  furtherNeighbourExchange,
  type MediatedCoupling,
  type ExchangeScanRow,
  type PseudospinCouplings,
} from '@multiplet/physics/exchange';
import { defineKind } from './types';
import type { CrystalFieldResult } from './crystalField';
import { escapeHtml, formatNumber, htmlKeyValue, htmlTable, textTable } from '../render/format';

interface ExchangeInput {
  cef: string;
  latticeConstant?: number;
  bond: number[];
  unit: string;
  isotropic?: number;
  matrix?: number[][];
  dipolar: boolean;
  thetaCW?: number;
  fromMonteCarlo?: string;
  order: number;
  twoSiteCheck: boolean;
  cefScale?: number[];
  exchangeScale?: number[];
  furtherNeighbours: boolean;
  scanParameter?: string;
  scanValues?: number[];
}

type Couplings = { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number; residualMeV: number; matrixLocalMeV: number[][] };

export interface ExchangeResult {
  ion: string;
  cef: string;
  latticeConstantAngstrom: number;
  bond: string;
  gapMeV: number | null;
  kramers: boolean;
  doubletKind: string;
  gLocal: number[][];
  /** J_ex used, meV (from the cell or from thetaCW); null when none. */
  isotropicMeV: number | null;
  isotropicFromThetaCW: { thetaCWK: number; thetaFixedK: number; thetaPerMeVK: number } | null;
  /** J_ex taken from the J1 of a Monte Carlo model (mc-fit or spin-ice-mc result), or null. */
  isotropicFromMonteCarlo: { result: string; J1K: number } | null;
  dipolar: boolean;
  order: number;
  first: Couplings;
  second: Couplings | null;
  ratios: { JpmOverJzz: number | null; JpmpmOverJzz: number | null; JzpmOverJzz: number | null };
  interpretation: string;
  /** Mean-field θ_CW (K) of the nearest-neighbour pseudospin model at the highest order computed. */
  thetaCWModelK: number;
  twoSiteCheckMeV: number | null;
  twoSiteLevelsMeV: { exact: number[]; effective: number[] } | null;
  scanCefScale: ExchangeScanRow[] | null;
  scanExchangeScale: ExchangeScanRow[] | null;
  /** Couplings mediated by a virtually excited common neighbour (J1 correction, J2, J3a, J3b), or null. */
  furtherNeighbours: MediatedCoupling[] | null;
  /** Scan of one Stevens parameter (values in meV; the others as in the crystal-field result). */
  scanParameter: { key: string; rows: ExchangeScanRow[] } | null;
}

const ENERGY_UNITS = ['meV', 'K', 'cm-1', 'THz', 'ueV'] as const;

function pick(c: PseudospinCouplings): Couplings {
  return { Jzz: c.Jzz, Jpm: c.Jpm, Jpmpm: c.Jpmpm, Jzpm: c.Jzpm, residualMeV: c.residualMeV, matrixLocalMeV: c.matrixLocalMeV };
}

const COUPLING_NAMES = [
  ['Jzz', 'J_zz'],
  ['Jpm', 'J_±'],
  ['Jpmpm', 'J_±±'],
  ['Jzpm', 'J_z±'],
] as const;

export const exchangeKind = defineKind<ExchangeInput, ExchangeResult>({
  kind: 'exchange',
  summary: 'effective pseudospin-1/2 exchange J_zz, J_±, J_±±, J_z± of a pyrochlore bond from a crystal-field result, to first and second order',
  fields: {
    cef: {
      type: 'reference',
      kinds: ['crystal-field'],
      required: true,
      doc: 'The crystal-field result whose ground doublet is the pseudospin (parameters in the local frame, z ∥ local ⟨111⟩).',
    },
    latticeConstant: {
      type: 'quantity',
      unit: 'angstrom',
      min: 1e-3,
      doc: "Cubic lattice constant a (nearest-neighbour distance a√2/4); default: the sample's.",
    },
    bond: {
      type: 'list',
      of: { type: 'integer', min: 0, max: 3, doc: 'A pyrochlore sublattice 0..3.' },
      minItems: 2,
      maxItems: 2,
      default: [0, 1],
      doc: 'The bond [from, to] between pyrochlore sublattices (all are equivalent for a D3d crystal field).',
    },
    unit: {
      type: 'choice',
      values: ENERGY_UNITS,
      default: 'meV',
      doc: 'Unit of bare numbers in isotropic and matrix.',
    },
    isotropic: {
      type: 'quantity',
      unit: 'meV',
      bareUnitField: 'unit',
      control: { relativeSpan: 2, zeroSpan: 0.01 },
      doc: 'Isotropic exchange J_ex of J_ex J_i·J_j between total angular momenta (positive: antiferromagnetic).',
    },
    matrix: {
      type: 'list',
      minItems: 3,
      maxItems: 3,
      of: {
        type: 'list',
        minItems: 3,
        maxItems: 3,
        of: { type: 'quantity', unit: 'meV', bareUnitField: 'unit', doc: 'A matrix element.' },
        doc: 'A row of the matrix.',
      },
      doc: 'A general 3×3 exchange matrix K (global cubic frame, bond [from, to]): H = J_iᵀ K J_j.',
    },
    dipolar: { type: 'boolean', default: true, doc: 'Include the magnetic dipolar coupling μ0(g_J μB)²(J_i·J_j − 3(J_i·r̂)(J_j·r̂))/(4πr³).' },
    thetaCW: {
      type: 'quantity',
      unit: 'K',
      doc: 'A measured Curie–Weiss temperature of the ground doublets: J_ex is chosen so that the mean-field θ of the first-order model equals it (instead of giving isotropic).',
    },
    fromMonteCarlo: {
      type: 'reference',
      kinds: ['mc-fit', 'spin-ice-mc'],
      doc: 'Take J_ex from the nearest-neighbour J1 of a Monte Carlo model (H = Σ J1 S_i·S_j with unit Ising vectors, dipolar separate): J_ex is chosen so that the first-order J_zz/4 equals J_nn = −J1/3 (instead of giving isotropic).',
    },
    order: { type: 'integer', min: 1, max: 2, default: 2, doc: 'Perturbation order: 1 (projection) or 2 (with virtual CEF excitations).' },
    twoSiteCheck: { type: 'boolean', default: true, doc: 'Compare with the exact diagonalisation of the two-ion Hamiltonian.' },
    cefScale: {
      type: 'range',
      unit: '',
      min: 1e-6,
      doc: 'Scan: the crystal field scaled by these factors (the gap scales with it), e.g. "0.25 .. 4 / 9 log".',
    },
    exchangeScale: {
      type: 'range',
      unit: '',
      doc: 'Scan: all microscopic couplings scaled by these factors, e.g. "0.5 .. 2 / 5".',
    },
    scanParameter: {
      type: 'string',
      maxLength: 6,
      suggestions: CEF_PARAMETER_KEYS,
      patternText: 'a Stevens parameter name such as B20 or B43',
      doc: 'Scan: move this Stevens parameter of the crystal-field result through scanValues (the gap moves with it).',
    },
    scanValues: {
      type: 'range',
      unit: 'meV',
      doc: 'Values of scanParameter, e.g. "-0.5 meV .. -0.1 meV / 9".',
    },
    furtherNeighbours: {
      type: 'boolean',
      default: false,
      doc: 'Also compute the second-order couplings between further neighbours (J2, J3b, and a correction to J1) mediated by a virtually excited common nearest neighbour (isotropic and dipolar couplings only).',
    },
  },
  reads: ['sample', 'references'],
  writes: 'result',
  check(input, ctx) {
    if (input.furtherNeighbours && input.matrix !== undefined)
      ctx.fail('furtherNeighbours', true, 'isotropic and/or dipolar couplings only (a bond matrix is not mapped to the other bonds)');
    if (input.thetaCW !== undefined && input.isotropic !== undefined)
      ctx.fail('thetaCW', input.thetaCW, 'either thetaCW or isotropic, not both (thetaCW determines the isotropic exchange)');
    if (input.fromMonteCarlo !== undefined && (input.isotropic !== undefined || input.thetaCW !== undefined))
      ctx.fail('fromMonteCarlo', input.fromMonteCarlo, 'only one source of the isotropic exchange: isotropic, thetaCW or fromMonteCarlo');
    if (input.isotropic === undefined && input.matrix === undefined && !input.dipolar && input.thetaCW === undefined && input.fromMonteCarlo === undefined)
      ctx.fail('isotropic', undefined, 'a coupling: isotropic, matrix, dipolar: true or thetaCW');
    if (input.bond[0] === input.bond[1]) ctx.fail('bond', input.bond, 'two different sublattices');
    if (input.scanParameter !== undefined) {
      const index = parseParameterKey(input.scanParameter);
      if (!index) ctx.fail('scanParameter', input.scanParameter, 'a Stevens parameter name such as B20, B43 or B4-3');
      if (input.scanValues === undefined) ctx.fail('scanParameter', input.scanParameter, 'scanValues beside it, e.g. "scanValues: -0.5 meV .. -0.1 meV / 9"');
    } else if (input.scanValues !== undefined) ctx.fail('scanValues', input.scanValues, 'a scanParameter naming the Stevens parameter to move');
  },
  run(input, ctx) {
    const cef = ctx.result<CrystalFieldResult>(input.cef);
    const sample = ctx.sampleIfDefined();
    const a = input.latticeConstant ?? sample?.latticeConstantAngstrom ?? undefined;
    if (a === undefined || a === null) ctx.fail('latticeConstant', undefined, 'a lattice constant (none given and the sample has none)');
    if (cef.groundDoublet === null)
      ctx.fail('cef', input.cef, `a crystal-field result with a doublet ground state (${input.cef} has ${cef.levels[0]?.degeneracy ?? 0}-fold ground level)`);
    const ion = getIon(cef.ion);
    const site = pseudospinSiteFromParameters(ion, cef.parametersMeV, { field: 'cef' });
    const bond = pyrochloreBond(a!, input.bond[0], input.bond[1], 'latticeConstant');
    let isotropic = input.isotropic;
    let fromTheta: ExchangeResult['isotropicFromThetaCW'] = null;
    if (input.thetaCW !== undefined) {
      const est = exchangeScaleFromCurieWeiss(input.thetaCW, site, a!, { matrixMeV: input.matrix, dipolar: input.dipolar });
      isotropic = est.isotropicMeV;
      fromTheta = { thetaCWK: input.thetaCW, thetaFixedK: est.thetaFixedK, thetaPerMeVK: est.thetaPerMeVK };
    }
    let fromMc: ExchangeResult['isotropicFromMonteCarlo'] = null;
    if (input.fromMonteCarlo !== undefined) {
      const mc = ctx.result<{ model?: { exchangeK?: Record<string, number> } }>(input.fromMonteCarlo);
      const j1 = mc.model?.exchangeK?.J1;
      if (typeof j1 !== 'number') ctx.fail('fromMonteCarlo', input.fromMonteCarlo, 'a Monte Carlo result with a model J1');
      isotropic = isotropicExchangeFromIsingJ1(j1!, site, a!).isotropicMeV;
      fromMc = { result: input.fromMonteCarlo, J1K: j1! };
    }
    const spec = { isotropicMeV: isotropic, matrixMeV: input.matrix, dipolar: input.dipolar };
    const k = microscopicCouplingMatrix(spec, bond, ion.gJ, ion.gJ, 'coupling');
    ctx.task.checkpoint();
    const order = input.order === 1 ? 1 : 2;
    const r = effectiveExchange(site, site, bond, k, { order, twoSiteCheck: input.twoSiteCheck });
    const top = r.second ?? r.first;
    const scanCefScale = input.cefScale
      ? exchangeScan(
          input.cefScale.map((s) => {
            const scaled = scaledCefSite(site, s);
            return { value: s, siteI: scaled, siteJ: scaled, couplingGlobalMeV: k };
          }),
          bond,
          { task: ctx.task },
        )
      : null;
    const scanExchangeScale = input.exchangeScale
      ? exchangeScan(input.exchangeScale.map((l) => ({ value: l, siteI: site, siteJ: site, couplingGlobalMeV: scaledCoupling(k, l) })), bond, { task: ctx.task })
      : null;
    let scanParameter: ExchangeResult['scanParameter'] = null;
    if (input.scanParameter !== undefined && input.scanValues !== undefined) {
      const index = parseParameterKey(input.scanParameter)!;
      const key = parameterKey(index.n, index.m);
      const points = input.scanValues.map((value) => {
        let moved;
        try {
          moved = pseudospinSiteFromParameters(ion, { ...cef.parametersMeV, [key]: value }, { field: 'cef' });
        } catch (error) {
          if (error instanceof InputError)
            ctx.fail('scanValues', value, `values of ${key} for which the ground level stays an isolated doublet (${key} = ${value} meV: ${error.message})`);
          throw error;
        }
        return { value, siteI: moved, siteJ: moved, couplingGlobalMeV: k };
      });
      scanParameter = { key, rows: exchangeScan(points, bond, { task: ctx.task }) };
    }
    return {
      ion: ion.name,
      cef: input.cef,
      latticeConstantAngstrom: a!,
      bond: bond.label,
      gapMeV: Number.isFinite(site.gapMeV) ? site.gapMeV : null,
      kramers: ion.kramers,
      doubletKind: site.doubletKind,
      gLocal: site.gLocal,
      isotropicMeV: isotropic ?? null,
      isotropicFromThetaCW: fromTheta,
      isotropicFromMonteCarlo: fromMc,
      dipolar: input.dipolar,
      order,
      first: pick(r.first),
      second: r.second ? pick(r.second) : null,
      ratios: r.ratios.second ?? r.ratios.first,
      interpretation: r.interpretation,
      thetaCWModelK: curieWeissThetaK(top, site.gLocal),
      twoSiteCheckMeV: r.twoSiteCheck ? r.twoSiteCheck.maxDifferenceMeV : null,
      twoSiteLevelsMeV: r.twoSiteCheck ? { exact: r.twoSiteCheck.exactLevelsMeV, effective: r.twoSiteCheck.effectiveLevelsMeV } : null,
      scanCefScale,
      scanExchangeScale,
      furtherNeighbours: input.furtherNeighbours ? furtherNeighbourExchange(site, a!, spec) : null,
      scanParameter,
    };
  },
  render(r, info) {
    const columns = [{ name: 'coupling' }, { name: '1st order', unit: 'meV' }, { name: '2nd order', unit: 'meV' }, { name: '2nd order', unit: 'K' }];
    const rows = COUPLING_NAMES.map(([key, label]) => [
      label,
      r.first[key],
      r.second ? r.second[key] : '—',
      r.second ? r.second[key] / KELVIN_IN_MEV : '—',
    ]);
    const ratio = (x: number | null) => (x === null ? '—' : formatNumber(x, 3));
    const facts: [string, string][] = [
      ['ion, doublet', `${r.ion} (${r.kramers ? 'Kramers' : 'non-Kramers'}, ${r.doubletKind} transverse components)`],
      ['bond', r.bond],
      ['CEF gap', r.gapMeV === null ? '—' : `${formatNumber(r.gapMeV)} meV`],
      ['J_ex', r.isotropicMeV === null ? '—' : `${formatNumber(r.isotropicMeV)} meV${r.isotropicFromThetaCW ? ` (from θ_CW = ${formatNumber(r.isotropicFromThetaCW.thetaCWK)} K, mean field)` : ''}${r.isotropicFromMonteCarlo ? ` (from J1 = ${formatNumber(r.isotropicFromMonteCarlo.J1K)} K of ${r.isotropicFromMonteCarlo.result})` : ''}`],
      ['dipolar', r.dipolar ? 'yes (this bond only)' : 'no'],
      ['J_±/J_zz, J_±±/J_zz, J_z±/J_zz', `${ratio(r.ratios.JpmOverJzz)}, ${ratio(r.ratios.JpmpmOverJzz)}, ${ratio(r.ratios.JzpmOverJzz)}`],
      ['two-site check', r.twoSiteCheckMeV === null ? 'not run' : `max |exact − effective| = ${formatNumber(r.twoSiteCheckMeV, 3)} meV`],
      ['θ_CW of the model (mean field)', `${formatNumber(r.thetaCWModelK, 4)} K`],
    ];
    const scanColumns = [{ name: 'scan value' }, { name: 'gap', unit: 'meV' }, ...COUPLING_NAMES.map(([, label]) => ({ name: `${label} (2nd)`, unit: 'meV' }))];
    const scans: Array<[string, ExchangeScanRow[]]> = [];
    if (r.scanCefScale) scans.push(['CEF scale', r.scanCefScale]);
    if (r.scanParameter) scans.push([`${r.scanParameter.key} (meV)`, r.scanParameter.rows]);
    if (r.scanExchangeScale) scans.push(['exchange scale', r.scanExchangeScale]);
    const scanRows = (rowsOf: ExchangeScanRow[]) => rowsOf.map((row) => [row.value, row.gapMeV, ...COUPLING_NAMES.map(([key]) => row.second[key])]);
    const text = [
      `exchange ${info.name}: ${r.ion}, ${r.bond}, from ${r.cef}`,
      textTable(columns, rows),
      `ratios to J_zz: J_± ${ratio(r.ratios.JpmOverJzz)}, J_±± ${ratio(r.ratios.JpmpmOverJzz)}, J_z± ${ratio(r.ratios.JzpmOverJzz)}`,
      r.interpretation,
      r.twoSiteCheckMeV === null ? '' : `two-site check: max |exact − effective| = ${formatNumber(r.twoSiteCheckMeV, 3)} meV`,
      ...scans.map(([label, rowsOf]) => `scan of ${label}:\n${textTable(scanColumns, scanRows(rowsOf), 12)}`),
    ]
      .filter((line) => line !== '')
      .join('\n');
    const furtherColumns = [{ name: 'shell' }, { name: 'r', unit: 'Å' }, { name: 'middle ions' }, { name: 'mediated J_zz', unit: 'meV' }, { name: 'direct dipolar zz', unit: 'meV' }];
    const furtherRows = (r.furtherNeighbours ?? []).map((c) => [
      c.shell,
      c.distanceAngstrom,
      String(c.middleIons),
      c.JzzMeV,
      c.directDipolarLocalMeV ? c.directDipolarLocalMeV[2]![2]! : '—',
    ]);
    const html = [
      `<div class="multiplet-exchange"><p><b>${escapeHtml(info.name)}</b>: ${escapeHtml(r.interpretation)}</p>`,
      htmlTable('pseudospin couplings (convention: README, exchange)', columns, rows),
      htmlKeyValue('bond and checks', facts),
      r.furtherNeighbours ? htmlTable('further neighbours via a virtually excited middle ion (second order)', furtherColumns, furtherRows) : '',
      ...scans.map(([label, rowsOf]) => htmlTable(`scan of ${label}`, scanColumns, scanRows(rowsOf))),
      '</div>',
    ].join('');
    const scanValues = (rowsOf: ExchangeScanRow[], x: (row: ExchangeScanRow) => number) =>
      rowsOf.flatMap((row) => COUPLING_NAMES.map(([key, label]) => ({ x: x(row), coupling: label, valueMeV: row.second[key], firstOrderMeV: row.first[key] })));
    const plot = (values: Record<string, unknown>[], title: string, xTitle: string, logX: boolean) => ({
      width: 360,
      height: 220,
      title,
      data: { values },
      mark: { type: 'line', point: true },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: xTitle, scale: logX ? { type: 'log' } : {} },
        y: { field: 'valueMeV', type: 'quantitative', title: 'coupling, 2nd order (meV)' },
        color: { field: 'coupling', type: 'nominal' },
        tooltip: [
          { field: 'coupling', type: 'nominal' },
          { field: 'x', type: 'quantitative' },
          { field: 'valueMeV', type: 'quantitative', title: '2nd order (meV)' },
          { field: 'firstOrderMeV', type: 'quantitative', title: '1st order (meV)' },
        ],
      },
    });
    const panels: Record<string, unknown>[] = [];
    const gapTitle = 'gap to first excited CEF level (meV)';
    if (r.scanCefScale) panels.push(plot(scanValues(r.scanCefScale, (row) => row.gapMeV), 'vs gap (CEF scaled)', gapTitle, true));
    if (r.scanParameter) panels.push(plot(scanValues(r.scanParameter.rows, (row) => row.gapMeV), `vs gap (${r.scanParameter.key} moved)`, gapTitle, false));
    if (r.scanExchangeScale) panels.push(plot(scanValues(r.scanExchangeScale, (row) => row.value), 'vs exchange scale', 'exchange scale factor', false));
    const schema = 'https://vega.github.io/schema/vega-lite/v5.json';
    const vegaLite =
      panels.length === 0
        ? {
            $schema: schema,
            description: `effective couplings of ${info.name}`,
            data: {
              values: COUPLING_NAMES.flatMap(([key, label]) => [
                { coupling: label, order: '1st', valueMeV: r.first[key] },
                ...(r.second ? [{ coupling: label, order: '2nd', valueMeV: r.second[key] }] : []),
              ]),
            },
            mark: 'bar',
            encoding: {
              x: { field: 'coupling', type: 'nominal', sort: COUPLING_NAMES.map(([, l]) => l) },
              xOffset: { field: 'order', type: 'nominal' },
              y: { field: 'valueMeV', type: 'quantitative', title: 'coupling (meV)' },
              color: { field: 'order', type: 'nominal' },
            },
          }
        : panels.length === 1
          ? { $schema: schema, description: `effective couplings of ${info.name}`, ...panels[0] }
          : { $schema: schema, description: `effective couplings of ${info.name}`, vconcat: panels };
    return { text, html, vegaLite };
  },
});
