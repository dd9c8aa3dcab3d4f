/**
 * Minimal execution history for history_request: what this process executed with store_history, numbered by
 * execution count. There is one history session per process (number 1); nothing is written to disk.
 */

export interface HistoryEntry {
  line: number;
  input: string;
  /** text/plain of the execute_result, or null when the cell produced no value. */
  output: string | null;
}

/** One row of history_reply: [session, line, input] or [session, line, [input, output]]. */
export type HistoryRow = [number, number, string | [string, string | null]];

export interface HistoryQuery {
  accessType: 'tail' | 'range' | 'search';
  output: boolean;
  n?: number;
  session?: number;
  start?: number;
  stop?: number;
  pattern?: string;
  unique?: boolean;
}

export const HISTORY_SESSION = 1;

/** Glob as used by history search ("*" any run, "?" one character, "[...]" a class); anchored at both ends. */
export function globToRegExp(pattern: string): RegExp {
  let source = '';
  for (let i = 0; i < pattern.length; i++) {
    const c = pattern[i]!;
    if (c === '*') source += '[\\s\\S]*';
    else if (c === '?') source += '[\\s\\S]';
    else if (c === '[') {
      const close = pattern.indexOf(']', i + 2);
      if (close < 0) source += '\\[';
      else {
        let body = pattern.slice(i + 1, close);
        const negate = body.startsWith('!') || body.startsWith('^');
        if (negate) body = body.slice(1);
        source += `[${negate ? '^' : ''}${body.replace(/[\\\]]/g, (m) => '\\' + m)}]`;
        i = close;
      }
    } else source += c.replace(/[.+^${}()|\\\]]/g, (m) => '\\' + m);
  }
  try {
    return new RegExp(`^${source}$`);
  } catch {
    // A class body that is not a valid character class: match the pattern literally instead.
    return new RegExp(`^${pattern.replace(/[.*+?^${}()|[\]\\]/g, (m) => '\\' + m)}$`);
  }
}

export class HistoryStore {
  private entries: HistoryEntry[] = [];

  record(entry: HistoryEntry): void {
    this.entries.push(entry);
  }

  get size(): number {
    return this.entries.length;
  }

  query(q: HistoryQuery): HistoryRow[] {
    const row = (e: HistoryEntry): HistoryRow => [HISTORY_SESSION, e.line, q.output ? [e.input, e.output] : e.input];
    const lastN = (list: HistoryEntry[]) => (q.n !== undefined && q.n >= 0 ? list.slice(Math.max(0, list.length - q.n)) : list);
    if (q.accessType === 'tail') return lastN(this.entries).map(row);
    if (q.accessType === 'range') {
      // Session 0 (or absent) means the current one; negative numbers count back to earlier sessions, which this
      // process does not have.
      const session = q.session ?? 0;
      if (session !== 0 && session !== HISTORY_SESSION) return [];
      const start = q.start ?? 1;
      const stop = q.stop ?? Number.POSITIVE_INFINITY;
      return this.entries.filter((e) => e.line >= start && e.line < stop).map(row);
    }
    const re = globToRegExp(q.pattern ?? '*');
    let found = this.entries.filter((e) => re.test(e.input));
    if (q.unique) {
      const lastIndex = new Map<string, number>();
      found.forEach((e, i) => lastIndex.set(e.input, i));
      found = found.filter((e, i) => lastIndex.get(e.input) === i);
    }
    return lastN(found).map(row);
  }

  clear(): void {
    this.entries = [];
  }
}
