/**
 * Scans of the effective couplings against the CEF gap (the whole CEF scaled, H_CEF → s·H_CEF, which scales all
 * level energies and keeps the eigenstates, or any sequence of prepared sites, e.g. one parameter moved) and
 * against the exchange scale (K → λK). First-order couplings scale as λ and do not depend on s; second-order
 * corrections scale as λ²/s (the perturbative energy denominators are CEF energies).
 */
import { InputError } from '../errors';
import { NO_TASK, type LongTask } from '../progress';
import type { BondGeometry } from './bondGeometry';
import { effectiveExchange } from './effectiveExchange';
import type { Matrix3 } from './matrix3';
import type { PseudospinSite } from './pseudospinSite';
import { couplingRatios, type CouplingRatios } from './pseudospinCouplings';

/** One row of a scan table (couplings in meV). */
export interface ExchangeScanRow {
  /** Scan variable value (CEF scale s, exchange scale λ, or the moved parameter's value). */
  value: number;
  gapMeV: number;
  first: { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number };
  second: { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number };
  ratiosSecond: CouplingRatios;
  /** Largest |exact − effective| of the four lowest two-site levels, meV (null when not computed). */
  twoSiteCheckMeV: number | null;
}

/** One scan point: the site(s) and the coupling to use. */
export interface ExchangeScanPoint {
  value: number;
  siteI: PseudospinSite;
  siteJ: PseudospinSite;
  couplingGlobalMeV: Matrix3;
}

/**
 * The site with its CEF scaled by s > 0 (energies × s, eigenstates unchanged: exact for H_CEF → s·H_CEF).
 * @example scaledCefSite(site, 0.5).gapMeV === site.gapMeV / 2
 * See also: exchangeScan
 */
export function scaledCefSite(site: PseudospinSite, scale: number): PseudospinSite {
  if (!(scale > 0) || !Number.isFinite(scale)) throw new InputError('cefScale', scale, 'a positive finite factor');
  return { ...site, energiesMeV: site.energiesMeV.map((e) => e * scale), gapMeV: site.gapMeV * scale };
}

/** K scaled by λ (new matrix). */
export function scaledCoupling(k: Matrix3, scale: number): Matrix3 {
  if (!Number.isFinite(scale)) throw new InputError('exchangeScale', scale, 'a finite factor');
  return k.map((row) => row.map((x) => x * scale));
}

/**
 * Effective couplings (first and second order) at every scan point, in order; optional exact two-site check.
 * Points whose coupling is too strong for second-order perturbation theory raise InputError naming the value.
 * @example exchangeScan([0.5, 1, 2].map((s) => ({ value: s, siteI: scaledCefSite(site, s), siteJ: scaledCefSite(site, s), couplingGlobalMeV: k })), bond)
 * See also: scaledCefSite, effectiveExchange
 */
export function exchangeScan(
  points: readonly ExchangeScanPoint[],
  geometry: BondGeometry,
  options: { twoSiteCheck?: boolean; task?: LongTask } = {},
): ExchangeScanRow[] {
  const task = options.task ?? NO_TASK;
  const rows: ExchangeScanRow[] = [];
  points.forEach((p, index) => {
    task.checkpoint();
    let r;
    try {
      r = effectiveExchange(p.siteI, p.siteJ, geometry, p.couplingGlobalMeV, { order: 2, twoSiteCheck: options.twoSiteCheck ?? false });
    } catch (error) {
      if (error instanceof InputError) throw new InputError(`scan[${index}]`, p.value, `a scan value where ${error.expected}`);
      throw error;
    }
    const pick = (c: { Jzz: number; Jpm: number; Jpmpm: number; Jzpm: number }) => ({ Jzz: c.Jzz, Jpm: c.Jpm, Jpmpm: c.Jpmpm, Jzpm: c.Jzpm });
    rows.push({
      value: p.value,
      gapMeV: Math.min(p.siteI.gapMeV, p.siteJ.gapMeV),
      first: pick(r.first),
      second: pick(r.second!),
      ratiosSecond: couplingRatios(r.second!),
      twoSiteCheckMeV: r.twoSiteCheck ? r.twoSiteCheck.maxDifferenceMeV : null,
    });
    task.report(index + 1, points.length, 'exchange scan');
  });
  return rows;
}
