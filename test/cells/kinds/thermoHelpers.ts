// Shared by the thermodynamics cell-kind tests: the result payload of a cell and a data table as cell text.
export const MULTIPLET_MIME = 'application/vnd.multiplet.result+json';

export function resultOf<T>(data: Record<string, unknown>): T {
  return (data[MULTIPLET_MIME] as { result: T }).result;
}

/** `[data] name` with an inline table: header (columns with units) and rows. */
export function dataCell(name: string, header: string, rows: number[][]): string {
  return `[data] ${name}\ntable: |\n  ${header}\n${rows.map((r) => '  ' + r.map((x) => x.toPrecision(12)).join(', ')).join('\n')}\n`;
}
