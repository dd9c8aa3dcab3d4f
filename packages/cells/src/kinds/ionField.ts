// The `ion` field of the kinds that take one (sample, crystal-field, point-charge): its check at the field's line
// and the fallback to the sample's ion, written once.
import { getIon, type Ion } from '@multiplet/physics/ions';
import { InputError } from '@multiplet/physics/errors';
import type { RunContext } from './types';

/** check(): an ion name the ion table does not know fails at the `ion` line with the table's message. */
export function checkIonName(ion: string | undefined, ctx: Pick<RunContext, 'fail'>): void {
  if (ion === undefined) return;
  try {
    getIon(ion);
  } catch (error) {
    if (error instanceof InputError) ctx.fail('ion', ion, error.expected);
    throw error;
  }
}

/** run(): the ion given (or taken from the sample or a base result); none at all is an error at `ion`. */
export function requireIon(ionName: string | undefined, ctx: Pick<RunContext, 'fail'>): Ion {
  if (ionName === undefined) ctx.fail('ion', undefined, 'an ion (no [sample] cell ran yet to take it from)');
  return getIon(ionName!);
}
