/**
 * Number and table formatting shared by every kind's `render`: deterministic (no locale), HTML-escaped, units in
 * column headers.
 */

/** Six significant digits, trailing zeros trimmed; integers as integers. Same text in every host and locale. */
export function formatNumber(x: number, digits = 6): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  if (Number.isInteger(x) && Math.abs(x) < 1e15) return String(x);
  const abs = Math.abs(x);
  if (abs >= 1e-4 && abs < 1e7) {
    const s = x.toPrecision(digits);
    return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
  }
  return x.toExponential(digits - 1).replace(/\.?0+e/, 'e');
}

/** A quantity for text output: "4.2 K". */
export function formatQuantity(x: number, unit: string): string {
  return unit ? `${formatNumber(x)} ${unit}` : formatNumber(x);
}

export function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

export interface Column {
  /** Header text, e.g. "E". */
  name: string;
  /** Unit shown in the header as "E (meV)"; "" for none. */
  unit?: string;
}

/** An HTML table with a caption; cells are strings (already formatted) or numbers (formatted here). */
export function htmlTable(caption: string, columns: Column[], rows: (string | number)[][], maxRows = 200): string {
  const head = columns.map((c) => `<th>${escapeHtml(c.name)}${c.unit ? ` (${escapeHtml(c.unit)})` : ''}</th>`).join('');
  const shown = rows.slice(0, maxRows);
  const body = shown
    .map((row) => `<tr>${row.map((cell) => `<td>${escapeHtml(typeof cell === 'number' ? formatNumber(cell) : cell)}</td>`).join('')}</tr>`)
    .join('');
  const more = rows.length > maxRows ? `<tr><td colspan="${columns.length}">… ${rows.length - maxRows} more rows</td></tr>` : '';
  return `<table class="multiplet-table"><caption>${escapeHtml(caption)}</caption><thead><tr>${head}</tr></thead><tbody>${body}${more}</tbody></table>`;
}

/** A two-column field/value table. */
export function htmlKeyValue(caption: string, entries: [string, string][]): string {
  return htmlTable(caption, [{ name: 'field' }, { name: 'value' }], entries);
}

/** Plain-text table with aligned columns (for text/plain). */
export function textTable(columns: Column[], rows: (string | number)[][], maxRows = 30): string {
  const header = columns.map((c) => (c.unit ? `${c.name} (${c.unit})` : c.name));
  const cells = rows.slice(0, maxRows).map((row) => row.map((cell) => (typeof cell === 'number' ? formatNumber(cell) : cell)));
  const widths = header.map((h, i) => Math.max(h.length, ...cells.map((row) => (row[i] ?? '').length)));
  const line = (row: string[]) => row.map((cell, i) => cell.padStart(widths[i]!)).join('  ').trimEnd();
  const out = [line(header), ...cells.map(line)];
  if (rows.length > maxRows) out.push(`… ${rows.length - maxRows} more rows`);
  return out.join('\n');
}
