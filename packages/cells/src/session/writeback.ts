/**
 * Write-back: change one field of a typed cell's text without touching anything else (comments, order, spacing),
 * by replacing the source range of that field's YAML node. The notebook stays the record of what was computed.
 */
import { CellError } from '../errors';
import { splitCell } from '../syntax/header';
import { parseBody } from '../syntax/body';
import { formatNumber } from '../render/format';

/** The text written for a control value: full precision when needed, with the unit. */
export function valueText(value: number, unit: string): string {
  const short = formatNumber(value, 12);
  const text = Number(short) === value ? short : String(value);
  return unit ? `${text} ${unit}` : text;
}

function pathOf(field: string): string[] {
  return field.split('.').filter((p) => p !== '');
}

/** Replace (or add) `field` in the cell text with `text` (a YAML plain scalar such as "0.41 meV"). */
export function setFieldInSource(source: string, field: string, text: string): string {
  const split = splitCell(source);
  if (split.type !== 'typed') throw new CellError('CellInputError', 'write-back: not a typed cell', { field, expected: 'a [kind] name cell' });
  const header = split.header;
  const body = parseBody(split.body, { line: header.lineIndex + 1, column: 1 });
  const path = pathOf(field);
  if (path.length === 0) throw new CellError('CellInputError', `write-back: got field "${field}", expected a field path such as B.B20`, { field });
  const range = body.rangeOf(path);
  if (range) return source.slice(0, range[0]) + text + source.slice(range[1]);
  // Absent field: add it at the end of its parent block (top level, or a block mapping that exists).
  if (path.length === 1) {
    const trimmed = source.replace(/\s+$/, '');
    return `${trimmed}\n${path[0]}: ${text}\n`;
  }
  const parentRange = body.rangeOf(path.slice(0, -1));
  if (parentRange) {
    const before = source.slice(0, parentRange[0]);
    const parentText = source.slice(parentRange[0], parentRange[1]);
    if (parentText.trimStart().startsWith('{')) {
      const close = parentText.lastIndexOf('}');
      const inner = parentText.slice(0, close).replace(/\s+$/, '');
      const separator = inner.trim() === '{' ? ' ' : ', ';
      return before + inner + `${separator}${path[path.length - 1]}: ${text}` + parentText.slice(close) + source.slice(parentRange[1]);
    }
    const column = body.positionOf(path.slice(0, -1))!.column;
    const indent = ' '.repeat(Math.max(0, column - 1));
    const end = parentText.replace(/\s+$/, '');
    return before + end + `\n${indent}${path[path.length - 1]}: ${text}` + source.slice(parentRange[0] + end.length);
  }
  throw new CellError('CellInputError', `write-back: field "${field}" is not in the cell and its parent "${path.slice(0, -1).join('.')}" is not either`, { field });
}
