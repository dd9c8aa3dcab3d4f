/**
 * `[neutron-spectrum] name` — the CEF inelastic neutron spectrum of a crystal-field result in absolute units
 * (mb sr⁻¹ meV⁻¹ per ion), with the instrumental resolution as a FWHM polynomial, from
 * @multiplet/physics/neutron (neutronSpectrum).
 *
 *   [neutron-spectrum] insA
 *   cef: cefA
 *   temperature: 5 K
 *   energies: -5 meV .. 60 meV / 261
 *   Q: 2 angstrom^-1
 *   incidentEnergy: 80 meV
 *   resolution: [1.2, -0.01]
 */
import { neutronSpectrum, LINE_SHAPES } from '@multiplet/physics/neutron';
import { getIon } from '@multiplet/physics/ions';
import { defineKind } from './types';
import { escapeHtml, formatNumber, htmlTable, textTable } from '../render/format';

interface NeutronSpectrumInput {
  cef: string;
  temperature: number;
  energies: number[];
  Q?: number;
  incidentEnergy?: number;
  resolution: number[];
  lineShape: 'gaussian' | 'lorentzian' | 'pseudo-voigt';
  intrinsicWidth: number;
  qDirection?: number[];
}

export interface NeutronSpectrumCellResult {
  ion: string;
  temperatureK: number;
  energiesMeV: number[];
  /** mb sr⁻¹ meV⁻¹ per ion. */
  intensity: number[];
  formFactor: number;
  levelsMeV: number[];
  transitions: { fromMeV: number; toMeV: number; energyMeV: number; strength: number; integratedIntensityMbSr: number }[];
}

export const neutronSpectrumKind = defineKind<NeutronSpectrumInput, NeutronSpectrumCellResult>({
  kind: 'neutron-spectrum',
  summary: 'CEF neutron spectrum S(E) in mb/sr/meV per ion (powder or single crystal) with resolution, and the transitions',
  fields: {
    cef: { type: 'reference', kinds: ['crystal-field'], required: true, doc: 'The crystal-field result whose ion and parameters make the spectrum.' },
    temperature: { type: 'quantity', unit: 'K', min: 0, required: true, doc: 'Sample temperature (Boltzmann populations, detailed balance).', control: { min: 0, max: 300, step: 0.5 } },
    energies: { type: 'range', unit: 'meV', required: true, doc: 'Energy-transfer grid, e.g. "-5 meV .. 60 meV / 261" (negative: neutron energy gain).' },
    Q: { type: 'quantity', unit: 'angstrom^-1', min: 0, doc: '|Q| for the magnetic form factor (default: f = 1).' },
    incidentEnergy: { type: 'quantity', unit: 'meV', min: 0, doc: 'Incident energy for the k_f/k_i factor (default: no factor).' },
    resolution: {
      type: 'list',
      of: { type: 'number', doc: 'Coefficient c_k of E^k (meV^(1−k)).' },
      minItems: 1,
      default: [0.1],
      doc: 'Instrumental resolution FWHM(E) = c0 + c1 E + c2 E² + … in meV, e.g. [1.2, -0.01].',
    },
    lineShape: { type: 'choice', values: LINE_SHAPES, default: 'pseudo-voigt', doc: 'Line shape: Gaussian resolution ⊗ Lorentzian intrinsic width (pseudo-Voigt), or either alone.' },
    intrinsicWidth: { type: 'quantity', unit: 'meV', min: 0, default: '0 meV', doc: 'Intrinsic (Lorentzian) FWHM of the inelastic lines.', control: { min: 0, max: 5, step: 0.01 } },
    qDirection: { type: 'list', of: { type: 'number', doc: 'Component in the CEF frame.' }, minItems: 3, maxItems: 3, doc: 'Q direction [x, y, z] in the CEF frame for a single crystal (default: powder average).' },
  },
  reads: ['references'],
  writes: 'result',
  run(input, ctx) {
    const cef = ctx.result<{ ion: string; parametersMeV: Record<string, number> }>(input.cef);
    ctx.task.checkpoint();
    const result = neutronSpectrum(getIon(cef.ion), cef.parametersMeV, {
      temperatureK: input.temperature,
      energiesMeV: input.energies,
      qInvAngstrom: input.Q,
      incidentEnergyMeV: input.incidentEnergy,
      resolution: { fwhmPolynomialMeV: input.resolution },
      lineShape: input.lineShape,
      intrinsicFwhmMeV: input.intrinsicWidth,
      qDirection: input.qDirection as [number, number, number] | undefined,
    });
    return {
      ion: cef.ion,
      temperatureK: input.temperature,
      energiesMeV: [...input.energies],
      intensity: Array.from(result.intensity),
      formFactor: result.formFactor,
      levelsMeV: result.cef.levels.map((l) => (Math.abs(l.energyMeV) < 1e-9 ? 0 : l.energyMeV)),
      transitions: result.cef.transitions.map((t, k) => ({
        fromMeV: Math.abs(t.fromMeV) < 1e-9 ? 0 : t.fromMeV,
        toMeV: t.toMeV,
        energyMeV: t.energyMeV,
        strength: t.strength,
        integratedIntensityMbSr: result.transitionIntensitiesMbSr[k]!,
      })),
    };
  },
  render(r, info) {
    const columns = [{ name: 'from', unit: 'meV' }, { name: 'to', unit: 'meV' }, { name: 'E', unit: 'meV' }, { name: '|⟨j|J⊥|i⟩|²' }, { name: 'I', unit: 'mb/sr' }];
    const shown = r.transitions.filter((t) => t.energyMeV > 0 && t.integratedIntensityMbSr > 1e-6 * Math.max(...r.transitions.map((x) => x.integratedIntensityMbSr)));
    const rows = shown.map((t) => [t.fromMeV, t.toMeV, t.energyMeV, t.strength, t.integratedIntensityMbSr]);
    const text = [`neutron spectrum ${info.name}: ${r.ion} at ${formatNumber(r.temperatureK)} K, f(Q) = ${formatNumber(r.formFactor)}; energy-loss transitions:`, textTable(columns, rows, 20)].join('\n');
    const html = `<div class="multiplet-neutron-spectrum"><p><b>${escapeHtml(info.name)}</b>: ${escapeHtml(r.ion)} at ${formatNumber(r.temperatureK)} K, f(Q) = ${formatNumber(r.formFactor)}</p>${htmlTable('energy-loss transitions', columns, rows)}</div>`;
    const vegaLite = {
      $schema: 'https://vega.github.io/schema/vega-lite/v5.json',
      description: `CEF neutron spectrum ${info.name}`,
      width: 420,
      height: 240,
      data: { values: r.energiesMeV.map((e, i) => ({ energyMeV: e, intensity: r.intensity[i] })) },
      mark: 'line',
      encoding: {
        x: { field: 'energyMeV', type: 'quantitative', title: 'E (meV)' },
        y: { field: 'intensity', type: 'quantitative', title: 'd²σ/dΩdE (mb sr⁻¹ meV⁻¹ per ion)' },
      },
    };
    return { text, html, vegaLite };
  },
});
