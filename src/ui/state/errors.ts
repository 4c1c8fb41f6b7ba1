/** Turning any failure into words for the screen. */
import { CalcInputError } from '../../calc/errors.ts';
import { StoreError } from '../../survey/store.ts';

/**
 * A message fit to show for a failure: store messages are written for the
 * user already; calculation errors name the field; anything else is wrapped.
 *
 * @example messageOf(new CalcInputError('count', 'must be a whole number')) //=> 'count: must be a whole number'
 */
export function messageOf(error: unknown): string {
  if (error instanceof StoreError) {
    // A full disk: the message says to download a backup; say where the button is.
    if (error.kind === 'quota') return `${error.message} “Back up everything” is on the surveys list (the Lampwalk home screen).`;
    return error.message;
  }
  if (error instanceof CalcInputError) return `${error.field}: ${error.problem}`;
  if (error instanceof Error && error.message) return `Something went wrong: ${error.message}`;
  return 'Something went wrong.';
}
