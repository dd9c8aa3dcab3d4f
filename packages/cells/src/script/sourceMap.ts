/**
 * Just enough of the Source Map v3 format to map a line of esbuild's output back to the cell's TypeScript line
 * (for runtime error positions in script cells): Base64 VLQ decoding of the `mappings` field.
 */
const BASE64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

function decodeVlq(segment: string): number[] {
  const out: number[] = [];
  let value = 0;
  let shift = 0;
  for (const ch of segment) {
    const digit = BASE64.indexOf(ch);
    if (digit < 0) return out;
    value += (digit & 31) << shift;
    if (digit & 32) shift += 5;
    else {
      out.push(value & 1 ? -(value >>> 1) : value >>> 1);
      value = 0;
      shift = 0;
    }
  }
  return out;
}

/** For each generated line (0-based), the original [line, column] (0-based) of its first mapped segment. */
export function lineMap(mappings: string): ([number, number] | undefined)[] {
  const out: ([number, number] | undefined)[] = [];
  let sourceLine = 0;
  let sourceColumn = 0;
  for (const line of mappings.split(';')) {
    let first: [number, number] | undefined;
    for (const segment of line.split(',')) {
      if (segment === '') continue;
      const fields = decodeVlq(segment);
      if (fields.length >= 4) {
        sourceLine += fields[2]!;
        sourceColumn += fields[3]!;
        first ??= [sourceLine, sourceColumn];
      }
    }
    out.push(first);
  }
  return out;
}
