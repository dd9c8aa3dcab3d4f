// Helpers shared by the thermodynamics cell kinds (magnetization, susceptibility, heat-capacity,
// heat-capacity-reduction, curie-weiss-fit): the ion of a crystal-field result, data columns in a given unit, and
// the vega-lite pieces they have in common.
import { getIon } from '@multiplet/physics/ions';
import type { SingleIonInput } from '@multiplet/physics/thermo';
import { convertValue } from '../syntax/quantity';
import type { DatasetResult, RunContext } from './types';

/** J, g_J and the Stevens parameters (meV) of a crystal-field result. */
export function ionOfCef(ctx: RunContext, name: string): { ion: string; single: SingleIonInput } {
  const cef = ctx.result<{ ion: string; parametersMeV: Record<string, number> }>(name);
  const ion = getIon(cef.ion);
  return { ion: ion.name, single: { J: ion.J, gJ: ion.gJ, parametersMeV: cef.parametersMeV } };
}

/**
 * One column of a data result converted to `toUnit`: by name, or the column at `fallback` when no name is given.
 * `convert` replaces the mathjs conversion for units mathjs does not know (emu).
 */
export function dataColumn(
  ctx: RunContext,
  dataName: string,
  columnName: string | undefined,
  fallback: number,
  field: string,
  toUnit: string,
  convert?: (value: number, unit: string) => number | undefined,
): number[] {
  const data = ctx.result<DatasetResult>(dataName);
  const column = columnName === undefined ? data.columns[fallback] : data.columns.find((c) => c.name === columnName);
  if (!column) return ctx.fail(field, columnName ?? `column ${fallback + 1}`, `a column of ${dataName} (${data.columns.map((c) => c.name).join(', ')})`);
  try {
    return column.values.map((v) => {
      const converted = convert ? convert(v, column.unit) : undefined;
      return converted ?? convertValue(v, column.unit, toUnit);
    });
  } catch {
    return ctx.fail(field, column.unit || '(no unit)', `a column whose unit converts to ${toUnit}`);
  }
}

/** emu/mol (CGS molar susceptibility, the same as cm³/mol) or m³/mol → emu/mol; undefined for other units. */
export function susceptibilityToEmuPerMol(value: number, unit: string): number | undefined {
  const u = unit.replace(/\s+/g, '').toLowerCase();
  if (/^emu\/(mol|\(mol\)|mol\/oe|\(mol\*?oe\))$/.test(u) || u === 'cm^3/mol' || u === 'cm3/mol') return value;
  if (u === 'm^3/mol' || u === 'm3/mol') return value / (4 * Math.PI * 1e-6); // 1 emu/mol = 4π·10⁻⁶ m³/mol
  return undefined;
}

export const VEGA_LITE_SCHEMA = 'https://vega.github.io/schema/vega-lite/v5.json';
