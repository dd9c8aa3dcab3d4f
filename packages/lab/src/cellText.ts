/**
 * Edits of a typed cell's text (header line `[kind] name`, then a YAML 1.2 body) that keep everything the user
 * wrote around the edited value: indentation, unit, comment.
 */

/** Replace the number of the field at `path` ("B20", "parameters.B20") with `valueText`; null when not found. */
export function setFieldValue(source: string, path: string, valueText: string): string | null {
  const keys = path.split('.').filter((k) => k !== '');
  if (keys.length === 0) return null;
  const lines = source.split('\n');
  // Indentation of the parent keys matched so far; a key matches only below (more indented than) its parent.
  let depth = 0;
  let parentIndent = -1;
  for (let i = 0; i < lines.length; i++) {
    const match = /^(\s*)(-\s+)?([^\s:#][^:#]*?)\s*:(.*)$/.exec(lines[i]);
    if (!match) continue;
    const indent = match[1].length + (match[2]?.length ?? 0);
    if (depth > 0 && indent <= parentIndent) return null;
    if (match[3].replace(/^["']|["']$/g, '') !== keys[depth]) continue;
    if (depth < keys.length - 1) {
      depth += 1;
      parentIndent = indent;
      continue;
    }
    const rest = match[4];
    const number = /^(\s*)([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)/.exec(rest);
    if (!number) return null;
    const edited = rest.slice(0, number[1].length) + valueText + rest.slice(number[0].length);
    lines[i] = lines[i].slice(0, lines[i].length - rest.length) + edited;
    return lines.join('\n');
  }
  return null;
}
