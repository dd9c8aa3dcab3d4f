/**
 * `multiplet compute KIND FILE.json|-`: read one JSON object, run the named computation, print one JSON object.
 * Bad input prints one line to stderr and exits 2.
 */
import { readFileSync } from 'node:fs';
import { InputError } from '@multiplet/physics/errors';
import { COMPUTE_KINDS } from './index';

export async function computeCommand(args: string[]): Promise<number> {
  const [kind, file] = args;
  const kinds = Object.keys(COMPUTE_KINDS).sort();
  if (!kind || !(kind in COMPUTE_KINDS)) {
    process.stderr.write(`multiplet compute: unknown kind ${kind ? JSON.stringify(kind) : '(none)'}, expected one of: ${kinds.join(', ')}\n`);
    return 2;
  }
  if (!file) {
    process.stderr.write('multiplet compute: missing input file (a path, or - for standard input)\n');
    return 2;
  }
  let text: string;
  try {
    text = file === '-' ? readFileSync(0, 'utf8') : readFileSync(file, 'utf8');
  } catch (err) {
    process.stderr.write(`multiplet compute: cannot read ${file}: ${(err as Error).message}\n`);
    return 2;
  }
  let input: unknown;
  try {
    input = JSON.parse(text);
  } catch (err) {
    process.stderr.write(`multiplet compute: malformed JSON in ${file === '-' ? 'standard input' : file}: ${(err as Error).message}\n`);
    return 2;
  }
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    process.stderr.write(`multiplet compute: input must be a JSON object, got ${Array.isArray(input) ? 'an array' : typeof input}\n`);
    return 2;
  }
  try {
    const output = await COMPUTE_KINDS[kind].run(input as Record<string, unknown>);
    process.stdout.write(JSON.stringify(output) + '\n');
    return 0;
  } catch (err) {
    if (err instanceof InputError) {
      process.stderr.write(`multiplet compute ${kind}: ${err.message}\n`);
      return 2;
    }
    throw err;
  }
}
