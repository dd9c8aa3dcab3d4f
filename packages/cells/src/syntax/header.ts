/**
 * The cell header: the first non-blank line of a typed cell, `[kind] resultName`. A cell whose first non-blank
 * line does not start with `[` followed by a kind-like word is a script cell (TypeScript).
 *
 *   [crystal-field] cefA        kind "crystal-field", result stored as "cefA"
 *   [sample] host
 *
 * Kind names are lower-case words joined by hyphens; result names are identifiers (letters, digits, `_`, not
 * starting with a digit), so a script cell can read them as `state.results.cefA`.
 */
import { CellError } from '../errors';

export interface CellHeader {
  kind: string;
  name: string;
  /** 0-based index of the header line in the cell text. */
  lineIndex: number;
  /** 0-based offset of the header line's first character in the cell text. */
  offset: number;
  /** Offset of the kind word (after `[`) and of the result name, for completion and errors. */
  kindOffset: number;
  nameOffset: number;
}

export type SplitCell =
  | { type: 'typed'; header: CellHeader; body: string }
  | { type: 'script'; code: string };

/** Matches the start of a header: `[` then a kind word then `]`. Anything else is script code. */
const HEADER_START = /^(\s*)\[([A-Za-z][A-Za-z0-9]*(?:-[A-Za-z0-9]+)*)\]/;
export const RESULT_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;
export const KIND_NAME = /^[a-z][a-z0-9]*(?:-[a-z0-9]+)*$/;

/**
 * Split a cell into header and body. The body keeps the same line and column numbering as the cell text (the
 * header line is blanked), so YAML positions are cell positions.
 */
export function splitCell(text: string): SplitCell {
  const lines = text.split('\n');
  let index = 0;
  let offset = 0;
  while (index < lines.length && lines[index]!.trim() === '') {
    offset += lines[index]!.length + 1;
    index++;
  }
  if (index === lines.length) return { type: 'script', code: text };
  const line = lines[index]!.replace(/\r$/, '');
  const start = HEADER_START.exec(line);
  if (!start) return { type: 'script', code: text };
  const indent = start[1]!.length;
  const kindWord = start[2]!;
  const position = { line: index + 1, column: indent + 2 };
  if (!KIND_NAME.test(kindWord)) {
    throw new CellError('CellSyntaxError', `header: got kind "${kindWord}", expected a lower-case kind name such as [crystal-field]`, {
      position,
      field: 'header',
      given: kindWord,
      expected: 'a lower-case kind name',
    });
  }
  const rest = line.slice(start[0].length);
  const nameMatch = /^(\s+)(\S+)\s*$/.exec(rest);
  const nameColumn = start[0].length + (nameMatch ? nameMatch[1]!.length : 0) + 1;
  if (!nameMatch) {
    throw new CellError(
      'CellSyntaxError',
      `header: got "${line.trim()}", expected "[${kindWord}] resultName" (the name the result is stored under)`,
      { position: { line: index + 1, column: start[0].length + 1 }, field: 'header', given: line.trim(), expected: `[${kindWord}] resultName` },
    );
  }
  const name = nameMatch[2]!;
  if (!RESULT_NAME.test(name)) {
    throw new CellError(
      'CellSyntaxError',
      `header: got result name "${name}", expected an identifier (letters, digits and _, not starting with a digit)`,
      { position: { line: index + 1, column: nameColumn }, field: 'header', given: name, expected: 'an identifier' },
    );
  }
  const blanked = lines.slice();
  blanked[index] = ' '.repeat(lines[index]!.length);
  return {
    type: 'typed',
    header: {
      kind: kindWord,
      name,
      lineIndex: index,
      offset,
      kindOffset: offset + indent + 1,
      nameOffset: offset + nameColumn - 1,
    },
    body: blanked.join('\n'),
  };
}
