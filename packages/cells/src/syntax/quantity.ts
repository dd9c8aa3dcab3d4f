/**
 * Quantities written as "value unit" (`"4.2 K"`, `"0.35 meV"`, `"12 cm^-1"`, `"0.5 T"`, `"10.1 angstrom"`),
 * parsed with mathjs and converted to the unit a field's schema asks for. Scan ranges are written
 * `"2 K .. 300 K / 50"` (50 points, linear) or `"0.1 K .. 300 K / 40 log"` (logarithmic spacing).
 *
 * Energies convert across the spectroscopic equivalences (temperature via k_B, wavenumber via h c, frequency via
 * h) with the constants of `@multiplet/physics/units`; every other conversion is mathjs's own.
 * A private mathjs instance adds the trade's units Oe and G (1 Oe ≙ 1 G ≙ 1e-4 T in vacuum) and emu (1e-3 A m²),
 * common practice.
 */
import { create, all, type Unit } from 'mathjs';
import { KELVIN_IN_MEV, INVERSE_CM_IN_MEV, THZ_IN_MEV, BOHR_MAGNETON_J_PER_T } from '@multiplet/physics/units';

const math = create(all, {});
math.createUnit('Oe', { definition: '1e-4 T' }, { override: false });
math.createUnit('G', { definition: '1e-4 T' }, { override: false });
// Magnetometry's emu (a moment): 1 emu ≙ 1e-3 A m² (common practice). With Oe ≙ 1e-4 T, emu/mol/Oe converts among
// CGS spellings; to SI m³/mol use EMU_PER_MOL_IN_M3_PER_MOL from physics/units (the μ0 factor is not a unit change).
math.createUnit('emu', { definition: '1e-3 A m^2' }, { override: false });
// Data-table units of the trade: moments in Bohr magnetons (muB, A m² = J/T from physics/units), neutron cross-sections
// in barn (1e-28 m², with SI prefixes: mbarn) per steradian (sr = rad², SI).
math.createUnit('muB', { definition: `${BOHR_MAGNETON_J_PER_T} A m^2` }, { override: false });
math.createUnit('barn', { definition: '1e-28 m^2', prefixes: 'short' }, { override: false });
math.createUnit('sr', { definition: '1 rad^2' }, { override: false });

/** Why a quantity string was refused: a phrase that follows "expected ...". */
export class QuantityProblem extends Error {
  constructor(readonly expected: string) {
    super(`expected ${expected}`);
    this.name = 'QuantityProblem';
  }
}

/** Dimension vectors (mathjs order: mass, length, time, current, temperature, luminous, amount, angle, bit). */
const TEMPERATURE = [0, 0, 0, 0, 1, 0, 0, 0, 0];
const INVERSE_LENGTH = [0, -1, 0, 0, 0, 0, 0, 0, 0];
const FREQUENCY = [0, 0, -1, 0, 0, 0, 0, 0, 0];

/** Unit spellings people type that mathjs does not read, rewritten before parsing. */
function normalizeSpelling(text: string): string {
  return text
    .replace(/[μµ]/g, 'u')
    .replace(/Å/g, 'angstrom')
    .replace(/\bcm-1\b/g, 'cm^-1')
    .replace(/⁻¹/g, '^-1')
    .replace(/\bA\^-1\b/g, 'angstrom^-1');
}

/** True if `unitText` (e.g. "J/mol/K") is a unit mathjs understands; "" is the dimensionless unit. */
export function isKnownUnit(unitText: string): boolean {
  if (unitText.trim() === '') return true;
  try {
    const u = math.unit('1 ' + normalizeSpelling(unitText.trim()));
    return u.value !== null && u.units.length > 0;
  } catch {
    return false;
  }
}

function sameDimension(a: Unit, dims: number[]): boolean {
  const d = (a as unknown as { dimensions: number[] }).dimensions;
  return d.length === dims.length && d.every((x, i) => Math.abs(x - dims[i]!) < 1e-12);
}

function isEnergyUnit(unit: string): boolean {
  try {
    return math.unit('1 ' + unit).equalBase(math.unit('1 J'));
  } catch {
    return false;
  }
}

/** Example spelling shown in messages for a target unit. */
export function unitExample(unit: string): string {
  if (unit === '') return '"0.5"';
  if (isEnergyUnit(unit)) return `"0.35 ${unit}" (also K, cm^-1, THz, ueV)`;
  return `"1.5 ${unit}"`;
}

/**
 * Convert the number `value` given in `fromUnit` to `toUnit`. Throws QuantityProblem if the dimensions do not
 * match. Used by kinds that read dataset columns (e.g. a heat-capacity column in mJ/mol/K → J/mol/K).
 */
export function convertValue(value: number, fromUnit: string, toUnit: string): number {
  const from = fromUnit.trim() === '' ? null : normalizeSpelling(fromUnit.trim());
  const to = toUnit.trim() === '' ? null : normalizeSpelling(toUnit.trim());
  if (from === null || to === null) {
    if (from === to) return value;
    throw new QuantityProblem(`a quantity in ${toUnit || 'no unit'} (dimensionless vs ${fromUnit || toUnit})`);
  }
  let u: Unit;
  try {
    u = math.unit(value, from);
  } catch {
    throw new QuantityProblem(`a unit mathjs knows instead of "${fromUnit}"`);
  }
  return convertUnit(u, to, toUnit);
}

function convertUnit(u: Unit, to: string, shownTarget: string): number {
  let target: Unit;
  try {
    target = math.unit('1 ' + to);
  } catch {
    throw new QuantityProblem(`a known target unit (schema unit "${shownTarget}" is not one)`);
  }
  if (u.equalBase(target)) return u.toNumber(to);
  if (isEnergyUnit(to)) {
    // Spectroscopic equivalences: E = k_B T, E = h c / λ (wavenumber), E = h ν. Constants from physics/units.
    if (sameDimension(u, TEMPERATURE)) return (u.toNumber('K') * KELVIN_IN_MEV) / math.unit('1 meV').toNumber(to) ;
    if (sameDimension(u, INVERSE_LENGTH)) return (u.toNumber('cm^-1') * INVERSE_CM_IN_MEV) / math.unit('1 meV').toNumber(to);
    if (sameDimension(u, FREQUENCY)) return (u.toNumber('THz') * THZ_IN_MEV) / math.unit('1 meV').toNumber(to);
  }
  throw new QuantityProblem(`a quantity convertible to ${shownTarget}, such as ${unitExample(shownTarget)}; "${u.formatUnits()}" is not`);
}

/**
 * Parse "value unit" and return the value in `toUnit`. A bare number (or numeric string) is accepted only when
 * `bareUnit` says which unit it is in (or the target is dimensionless).
 */
export function parseQuantity(given: unknown, toUnit: string, bareUnit?: string): number {
  const expected = `a quantity "value unit" such as ${unitExample(toUnit)}`;
  if (typeof given === 'number') {
    if (!Number.isFinite(given)) throw new QuantityProblem(`a finite number (${expected})`);
    if (toUnit === '') return given;
    if (bareUnit !== undefined) return bareUnit === toUnit ? given : convertValue(given, bareUnit, toUnit);
    throw new QuantityProblem(`${expected}: the unit is required`);
  }
  if (typeof given !== 'string') throw new QuantityProblem(expected);
  const text = given.trim();
  if (text === '' || text.length > 200) throw new QuantityProblem(expected);
  if (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(text)) return parseQuantity(Number(text), toUnit, bareUnit);
  const match = /^([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.+)$/.exec(text);
  if (!match) throw new QuantityProblem(expected);
  const number = Number(match[1]);
  if (!Number.isFinite(number)) throw new QuantityProblem(`a finite number (${expected})`);
  const unitText = normalizeSpelling(match[2]!.trim());
  if (toUnit === '') throw new QuantityProblem('a plain number (this field has no unit)');
  let u: Unit;
  try {
    u = math.unit(number, unitText);
  } catch {
    throw new QuantityProblem(`${expected}; "${match[2]!.trim()}" is not a unit mathjs knows`);
  }
  const value = convertUnit(u, normalizeSpelling(toUnit), toUnit);
  if (!Number.isFinite(value)) throw new QuantityProblem(`a finite ${expected}`);
  return value;
}

export interface ParsedRange {
  values: number[];
  from: number;
  to: number;
  points: number;
  spacing: 'linear' | 'log';
}

/** The largest scan a cell may ask for in one range. */
export const MAX_RANGE_POINTS = 100_000;

/**
 * Parse a scan "from .. to / n [log]" into `n` values in `toUnit`. Both ends carry units.
 * @example parseRange("2 K .. 300 K / 3", "K").values // [2, 151, 300]
 */
export function parseRange(given: unknown, toUnit: string): ParsedRange {
  const expected = `a scan "from .. to / points" such as "2 ${toUnit} .. 300 ${toUnit} / 50" (append "log" for logarithmic spacing)`;
  if (typeof given !== 'string' || given.length > 300) throw new QuantityProblem(expected);
  const match = /^\s*(.+?)\s*\.\.\s*(.+?)\s*\/\s*(\d+)\s*(log|linear)?\s*$/.exec(given);
  if (!match) throw new QuantityProblem(expected);
  let from: number, to: number;
  try {
    from = parseQuantity(match[1], toUnit);
    to = parseQuantity(match[2], toUnit);
  } catch (problem) {
    if (problem instanceof QuantityProblem) throw new QuantityProblem(`${expected}; the ends: ${problem.expected}`);
    throw problem;
  }
  const points = Number(match[3]);
  if (!Number.isInteger(points) || points < 1 || points > MAX_RANGE_POINTS) {
    throw new QuantityProblem(`${expected}, with 1 to ${MAX_RANGE_POINTS} points`);
  }
  const spacing = match[4] === 'log' ? 'log' : 'linear';
  if (spacing === 'log' && (from <= 0 || to <= 0)) throw new QuantityProblem(`positive ends for a log scan (${expected})`);
  const values: number[] = [];
  for (let i = 0; i < points; i++) {
    const t = points === 1 ? 0 : i / (points - 1);
    values.push(spacing === 'log' ? Math.exp(Math.log(from) + t * (Math.log(to) - Math.log(from))) : from + t * (to - from));
  }
  // Pin the ends exactly (log/exp round trips are not exact).
  values[0] = from;
  if (points > 1) values[points - 1] = to;
  return { values, from, to, points, spacing };
}

/** Units offered by completion for a target unit, most common first. */
export function unitSuggestions(toUnit: string): string[] {
  if (toUnit === '') return [];
  if (isEnergyUnit(toUnit)) return ['meV', 'K', 'cm^-1', 'THz', 'ueV', 'eV', 'J'];
  const table: Record<string, string[]> = {
    K: ['K', 'mK', 'degC'],
    T: ['T', 'mT', 'Oe', 'G'],
    angstrom: ['angstrom', 'nm', 'pm'],
    'g/mol': ['g/mol', 'kg/mol'],
    'angstrom^-1': ['angstrom^-1', 'nm^-1'],
  };
  return table[toUnit] ?? [toUnit];
}
