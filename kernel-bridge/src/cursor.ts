/**
 * Cursor positions. Since protocol 5.2 `cursor_pos`, `cursor_start` and `cursor_end` count Unicode code points;
 * the cells session works on JavaScript string indices (UTF-16 code units). These convert at the boundary.
 */

/** Code-point offset → UTF-16 index in `text` (clamped to the text). */
export function codePointsToIndex(text: string, codePoints: number): number {
  let index = 0;
  let seen = 0;
  while (index < text.length && seen < codePoints) {
    const c = text.codePointAt(index)!;
    index += c > 0xffff ? 2 : 1;
    seen++;
  }
  return index;
}

/** UTF-16 index → code-point offset in `text` (clamped to the text). */
export function indexToCodePoints(text: string, index: number): number {
  let i = 0;
  let seen = 0;
  const end = Math.max(0, Math.min(index, text.length));
  while (i < end) {
    const c = text.codePointAt(i)!;
    i += c > 0xffff ? 2 : 1;
    seen++;
  }
  return seen;
}

/** Number of code points in `text`. */
export function codePointLength(text: string): number {
  return indexToCodePoints(text, text.length);
}
