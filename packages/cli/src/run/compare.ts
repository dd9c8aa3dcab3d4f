/**
 * `multiplet run --check`: is a stored output reproduced? Numbers (in JSON values and inside text) must agree to
 * a relative tolerance (default 1e-9, absolute floor 1e-12 for values near zero); all other text must be equal
 * after normalising line endings and trailing spaces. Execution counts and transient display ids are ignored.
 */
import type { NotebookOutput } from './notebook';

export const DEFAULT_RELATIVE_TOLERANCE = 1e-9;
const ABSOLUTE_FLOOR = 1e-12;

const NUMBER = /[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?/g;

function normaliseText(value: unknown): string {
  const text = Array.isArray(value) ? value.join('') : String(value ?? '');
  return text.replace(/\r\n?/g, '\n').split('\n').map((l) => l.replace(/\s+$/, '')).join('\n').replace(/\n+$/, '');
}

function numbersClose(a: number, b: number, tolerance: number): boolean {
  if (a === b) return true;
  return Math.abs(a - b) <= Math.max(ABSOLUTE_FLOOR, tolerance * Math.max(Math.abs(a), Math.abs(b)));
}

/** Compare two texts token by token: numbers within tolerance, everything between them exact. */
export function compareText(stored: string, fresh: string, tolerance: number): string | undefined {
  const a = normaliseText(stored);
  const b = normaliseText(fresh);
  if (a === b) return undefined;
  const skeletonA = a.replace(NUMBER, '#');
  const skeletonB = b.replace(NUMBER, '#');
  if (skeletonA !== skeletonB) {
    let i = 0;
    while (i < a.length && a[i] === b[i]) i++;
    return `text differs at character ${i}: stored ${JSON.stringify(a.slice(i, i + 40))}, now ${JSON.stringify(b.slice(i, i + 40))}`;
  }
  const na = a.match(NUMBER) ?? [];
  const nb = b.match(NUMBER) ?? [];
  for (let i = 0; i < na.length; i++) {
    if (!numbersClose(Number(na[i]), Number(nb[i]), tolerance)) return `number ${i + 1} differs: stored ${na[i]}, now ${nb[i]}`;
  }
  return undefined;
}

export function compareJson(stored: unknown, fresh: unknown, tolerance: number, path = ''): string | undefined {
  if (typeof stored === 'number' && typeof fresh === 'number') {
    return numbersClose(stored, fresh, tolerance) ? undefined : `${path || 'value'}: stored ${stored}, now ${fresh}`;
  }
  if (typeof stored === 'string' && typeof fresh === 'string') {
    const d = compareText(stored, fresh, tolerance);
    return d ? `${path || 'value'}: ${d}` : undefined;
  }
  if (Array.isArray(stored) && Array.isArray(fresh)) {
    if (stored.length !== fresh.length) return `${path || 'value'}: stored ${stored.length} items, now ${fresh.length}`;
    for (let i = 0; i < stored.length; i++) {
      const d = compareJson(stored[i], fresh[i], tolerance, `${path}[${i}]`);
      if (d) return d;
    }
    return undefined;
  }
  if (stored && fresh && typeof stored === 'object' && typeof fresh === 'object' && !Array.isArray(stored) && !Array.isArray(fresh)) {
    const ka = Object.keys(stored).sort();
    const kb = Object.keys(fresh).sort();
    if (ka.join('\u0000') !== kb.join('\u0000')) return `${path || 'value'}: stored keys ${ka.join(', ')}, now ${kb.join(', ')}`;
    for (const k of ka) {
      const d = compareJson((stored as Record<string, unknown>)[k], (fresh as Record<string, unknown>)[k], tolerance, path ? `${path}.${k}` : k);
      if (d) return d;
    }
    return undefined;
  }
  return stored === fresh ? undefined : `${path || 'value'}: stored ${JSON.stringify(stored)?.slice(0, 40)}, now ${JSON.stringify(fresh)?.slice(0, 40)}`;
}

/** nbformat stores text outputs as a string or a list of lines (Jupyter writes lists): compare them joined. */
function joinLines(data: unknown): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [mime, value] of Object.entries((data ?? {}) as Record<string, unknown>)) {
    out[mime] = Array.isArray(value) && value.every((v) => typeof v === 'string') && !mime.includes('json') ? value.join('') : value;
  }
  return out;
}

/** First difference between a cell's stored and recomputed outputs, or undefined when reproduced. */
export function compareOutputs(stored: NotebookOutput[], fresh: NotebookOutput[], tolerance: number): string | undefined {
  if (stored.length !== fresh.length) {
    return `stored ${stored.length} outputs (${stored.map((o) => o.output_type).join(', ') || 'none'}), now ${fresh.length} (${fresh.map((o) => o.output_type).join(', ') || 'none'})`;
  }
  for (let i = 0; i < stored.length; i++) {
    const a = stored[i]!;
    const b = fresh[i]!;
    const where = `output ${i + 1} (${b.output_type})`;
    if (a.output_type !== b.output_type) return `output ${i + 1}: stored ${a.output_type}, now ${b.output_type}`;
    let d: string | undefined;
    switch (a.output_type) {
      case 'stream':
        d = a.name !== b.name ? `stream ${String(a.name)} vs ${String(b.name)}` : compareText(a.text as string, b.text as string, tolerance);
        break;
      case 'error':
        d = a.ename !== b.ename ? `error ${String(a.ename)} vs ${String(b.ename)}` : compareText(a.evalue as string, b.evalue as string, tolerance);
        break;
      default: {
        const da = joinLines(a.data);
        const db = joinLines(b.data);
        d = compareJson(da, db, tolerance, 'data') ?? compareJson(a.metadata ?? {}, b.metadata ?? {}, tolerance, 'metadata');
      }
    }
    if (d) return `${where}: ${d}`;
  }
  return undefined;
}
