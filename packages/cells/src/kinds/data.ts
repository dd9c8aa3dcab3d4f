/**
 * `[data] name` — a table of measured numbers: a CSV/TSV file (relative to the notebook's directory) or an inline
 * table. The first non-comment line names the columns with their units in parentheses, `T (K), C (J/mol/K)`;
 * every other line is numbers. Units are checked with mathjs; values stay in the units written (consumers
 * convert with `convertValue` from syntax/quantity.ts).
 *
 *   [data] cp
 *   table: |
 *     T (K), C (J/mol/K)
 *     2, 0.51
 *     4, 1.92
 */
import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { createHash } from 'node:crypto';
import { defineKind, type DatasetResult } from './types';
import { CellError, type SourcePosition } from '../errors';
import { isKnownUnit } from '../syntax/quantity';
import { htmlTable, textTable, escapeHtml } from '../render/format';

const DELIMITERS = ['auto', 'comma', 'tab', 'semicolon', 'whitespace'] as const;
type Delimiter = (typeof DELIMITERS)[number];

interface DataInput {
  file?: string;
  table?: string;
  delimiter: Delimiter;
  comment: string;
}

/** Largest file a data cell reads (the notebook is for analysis tables, not raw event files). */
const MAX_BYTES = 20 * 1024 * 1024;

export const dataKind = defineKind<DataInput, DatasetResult>({
  kind: 'data',
  summary: 'a table of numbers with named columns and units, from a CSV/TSV file or written inline',
  fields: {
    file: { type: 'string', doc: 'CSV or TSV file, relative to the notebook directory. Give either file or table.', maxLength: 1000 },
    table: {
      type: 'string',
      multiline: true,
      doc: 'Inline table (YAML block text after "table: |"): a header line "T (K), C (J/mol/K)" then rows of numbers.',
    },
    delimiter: { type: 'choice', values: DELIMITERS, default: 'auto', doc: 'Column separator; auto picks tab, comma, semicolon, then whitespace from the header line.' },
    comment: { type: 'string', default: '#', maxLength: 3, doc: 'Lines starting with this text are skipped.' },
  },
  reads: [],
  writes: 'dataset',
  check(input, ctx) {
    if ((input.file === undefined) === (input.table === undefined)) {
      ctx.fail(input.file === undefined ? '' : 'table', input.file === undefined ? 'neither file nor table' : 'both file and table', 'exactly one of file (a CSV/TSV path) or table (inline text)');
    }
    if (input.comment === '') ctx.fail('comment', '', 'a non-empty comment marker such as "#"');
  },
  run(input, ctx) {
    let text: string;
    let where: Locate;
    if (input.file !== undefined) {
      const path = resolve(ctx.notebookDir, input.file);
      let size: number;
      try {
        size = statSync(path).size;
      } catch {
        return ctx.fail('file', input.file, `a readable file relative to the notebook directory (${ctx.notebookDir})`);
      }
      if (size > MAX_BYTES) ctx.fail('file', input.file, `a file of at most ${MAX_BYTES / 1024 / 1024} MB`);
      text = readFileSync(path, 'utf8');
      where = (line, column) => ({ label: `${input.file} line ${line}, column ${column}: `, position: ctx.positionOf('file') });
    } else {
      text = input.table!;
      // A block scalar's text starts on the line after "table: |", indented by the block's indentation.
      const at = ctx.positionOf('table');
      const indent = blockIndent(ctx.source, at);
      where = (line, column) => ({ label: '', position: at ? { line: at.line + line, column: column + indent } : undefined });
    }
    const parsed = parseTable(text, input.delimiter, input.comment, where);
    return {
      ...parsed,
      source: { file: input.file ?? null, sha256: createHash('sha256').update(text).digest('hex') },
    };
  },
  render(result, info) {
    const columns = result.columns.map((c) => ({ name: c.name, unit: c.unit }));
    const rows = Array.from({ length: result.rows }, (_, i) => result.columns.map((c) => c.values[i]!));
    const from = result.source.file ? ` from ${result.source.file}` : ' (inline)';
    const text = `dataset ${info.name}${from}: ${result.rows} rows × ${result.columns.length} columns\n${textTable(columns, rows, 10)}`;
    const html = `<div class="multiplet-data"><p>dataset <b>${escapeHtml(info.name)}</b>${escapeHtml(from)}: ${result.rows} rows</p>${htmlTable(
      info.name,
      columns,
      rows,
      50,
    )}</div>`;
    if (result.columns.length < 2 || result.rows === 0) return { text, html };
    const x = result.columns[0]!;
    const label = (c: { name: string; unit: string }) => (c.unit ? `${c.name} (${c.unit})` : c.name);
    const values: { x: number; y: number; column: string }[] = [];
    const step = Math.max(1, Math.ceil(result.rows / 2000));
    for (const c of result.columns.slice(1)) {
      for (let i = 0; i < result.rows; i += step) values.push({ x: x.values[i]!, y: c.values[i]!, column: label(c) });
    }
    return {
      text,
      html,
      vegaLite: {
        $schema: 'https://vega.github.io/schema/vega-lite/v5.json',
        description: `dataset ${info.name}`,
        width: 400,
        height: 250,
        data: { values },
        mark: { type: 'point', filled: true, size: 20 },
        encoding: {
          x: { field: 'x', type: 'quantitative', title: label(x) },
          y: { field: 'y', type: 'quantitative', title: result.columns.length === 2 ? label(result.columns[1]!) : 'value' },
          color: { field: 'column', type: 'nominal', title: 'column' },
        },
      },
    };
  },
});

/** Where a table position is, as a message prefix (files) and/or a cell position (inline tables). */
type Locate = (line: number, column: number) => { label: string; position: SourcePosition | undefined };

/** Indentation (in columns) of the block scalar that starts after the `table:` key at `at`. */
function blockIndent(source: string, at: SourcePosition | undefined): number {
  if (!at) return 0;
  const next = source.split('\n')[at.line];
  return next === undefined ? 0 : next.length - next.trimStart().length;
}

function splitLine(line: string, delimiter: Exclude<Delimiter, 'auto'>): string[] {
  switch (delimiter) {
    case 'comma':
      return line.split(',');
    case 'tab':
      return line.split('\t');
    case 'semicolon':
      return line.split(';');
    case 'whitespace':
      return line.trim().split(/\s+/);
  }
}

/** Parse header and numbers; errors name the line and column inside the table or file. */
export function parseTable(
  text: string,
  delimiterChoice: Delimiter,
  comment: string,
  where: Locate,
): { columns: { name: string; unit: string; values: number[] }[]; rows: number } {
  const lines = text.split(/\r?\n/);
  const headerIndex = lines.findIndex((l) => l.trim() !== '' && !l.trimStart().startsWith(comment));
  if (headerIndex < 0) {
    throw new CellError('CellInputError', `${where(1, 1).label}got no header line, expected a header naming the columns such as "T (K), C (J/mol/K)"`, {
      position: where(1, 1).position,
      field: 'table',
      expected: 'a header line',
    });
  }
  const headerLine = lines[headerIndex]!;
  const delimiter: Exclude<Delimiter, 'auto'> =
    delimiterChoice !== 'auto'
      ? delimiterChoice
      : headerLine.includes('\t')
        ? 'tab'
        : headerLine.includes(',')
          ? 'comma'
          : headerLine.includes(';')
            ? 'semicolon'
            : 'whitespace';
  const headerCells =
    delimiter === 'whitespace' ? (headerLine.match(/[^\s(]+(?:\s*\([^)]*\))?/g) ?? []) : splitLine(headerLine, delimiter);
  const columns = headerCells.map((cell, i) => {
    const raw = cell.trim().replace(/^"(.*)"$/, '$1');
    const m = /^(.*?)\s*(?:\(([^()]*)\))?$/.exec(raw)!;
    const name = m[1]!.trim();
    const unit = (m[2] ?? '').trim();
    const column = headerLine.indexOf(cell.trim()) + 1;
    if (name === '') {
      throw new CellError('CellInputError', `${where(headerIndex + 1, column).label}column ${i + 1} has no name, expected "name (unit)" such as "T (K)"`, {
      position: where(headerIndex + 1, column).position,
        field: `columns[${i}]`,
        given: raw,
        expected: 'name (unit)',
      });
    }
    if (!isKnownUnit(unit)) {
      throw new CellError('CellInputError', `${where(headerIndex + 1, column).label}column "${name}" unit: got "${unit}", expected a unit mathjs knows such as K, J/mol/K, meV, T`, {
      position: where(headerIndex + 1, column).position,
        field: `columns[${i}].unit`,
        given: unit,
        expected: 'a unit mathjs knows',
      });
    }
    return { name, unit, values: [] as number[] };
  });
  const seen = new Set<string>();
  for (const c of columns) {
    if (seen.has(c.name)) {
      throw new CellError('CellInputError', `${where(headerIndex + 1, 1).label}column name "${c.name}" appears twice, expected distinct names`, {
      position: where(headerIndex + 1, 1).position,
        field: 'columns',
        given: c.name,
        expected: 'distinct column names',
      });
    }
    seen.add(c.name);
  }
  let rows = 0;
  for (let index = headerIndex + 1; index < lines.length; index++) {
    const line = lines[index]!;
    if (line.trim() === '' || line.trimStart().startsWith(comment)) continue;
    const cells = splitLine(line, delimiter);
    if (cells.length !== columns.length) {
      throw new CellError(
        'CellInputError',
        `${where(index + 1, 1).label}got ${cells.length} values, expected ${columns.length} (${columns.map((c) => c.name).join(', ')})`,
        { position: where(index + 1, 1).position, field: `rows[${rows}]`, given: line.trim(), expected: `${columns.length} values` },
      );
    }
    let offset = 0;
    cells.forEach((cell, i) => {
      const trimmed = cell.trim();
      const value = trimmed === '' ? NaN : Number(trimmed);
      if (!Number.isFinite(value)) {
        const column = line.indexOf(cell, offset) + 1 + (cell.length - cell.trimStart().length);
        throw new CellError(
          'CellInputError',
          `${where(index + 1, column).label}column "${columns[i]!.name}": got ${JSON.stringify(trimmed.slice(0, 40))}, expected a finite number`,
          { position: where(index + 1, column).position, field: `columns[${i}]`, given: trimmed, expected: 'a finite number' },
        );
      }
      offset = line.indexOf(cell, offset) + cell.length;
      columns[i]!.values.push(value);
    });
    rows++;
  }
  if (rows === 0) {
    throw new CellError('CellInputError', `${where(headerIndex + 2, 1).label}got no rows, expected at least one row of numbers under the header`, {
      position: where(headerIndex + 2, 1).position,
      field: 'rows',
      expected: 'at least one row',
    });
  }
  return { columns, rows };
}
