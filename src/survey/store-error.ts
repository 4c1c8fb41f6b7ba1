/**
 * The one error type the survey store lets out. Screens show `message` as it
 * is (plain words, saying what happened to the user's data and what to do)
 * and branch on `kind`; the browser's own exception, when there was one, is
 * kept in `cause` for the developer console only.
 */
import type { FileProblem } from './validate.ts';

/**
 * What went wrong:
 * - `quota`: the device has no room left; nothing from this save was written.
 * - `not-found`: the survey, room, entry, photo, product or trash item is gone.
 * - `blocked`: an older Lampwalk in another tab keeps the database open.
 * - `closed`: this tab's connection was closed (a newer Lampwalk opened in another tab, or the browser closed it); reload.
 * - `newer-version`: the stored data was written by a newer Lampwalk; nothing was touched.
 * - `invalid-file`: a backup file failed its check; nothing was written (see `problems`).
 * - `invalid`: a value to save, or an argument, is out of range (see `problems`).
 * - `conflict`: ids already in use (an import needs "as a copy" or "replace"), or a restore has nowhere to go.
 * - `unavailable`: this browser offers no database here (e.g. some private windows).
 * - `unknown`: anything else; nothing from the failed save was written.
 */
export type StoreErrorKind =
  | 'quota'
  | 'not-found'
  | 'blocked'
  | 'closed'
  | 'newer-version'
  | 'invalid-file'
  | 'invalid'
  | 'conflict'
  | 'unavailable'
  | 'unknown';

/** A failure of the survey store, with a message fit to show the user. */
export class StoreError extends Error {
  override readonly name = 'StoreError';

  constructor(
    readonly kind: StoreErrorKind,
    message: string,
    /** For `invalid-file` and `invalid`: each problem with the path of the bad value. */
    readonly problems: readonly FileProblem[] = [],
    options?: { cause?: unknown },
  ) {
    super(message, options);
  }
}

/** The `name` of a DOMException or Error, or '' for anything else. */
function errorName(error: unknown): string {
  if (typeof error === 'object' && error !== null && 'name' in error && typeof error.name === 'string') return error.name;
  return '';
}

/**
 * Turns whatever a database call threw into a {@link StoreError}; a
 * StoreError passes through unchanged. `doing` completes "Could not …",
 * e.g. "save the entry".
 *
 * @example
 * toStoreError(new DOMException('full', 'QuotaExceededError'), 'save the entry').kind
 * //=> 'quota'
 */
export function toStoreError(error: unknown, doing: string): StoreError {
  if (error instanceof StoreError) return error;
  const cause = { cause: error };
  const name = errorName(error);
  const lead = `Could not ${doing}`;
  if (name === 'QuotaExceededError' || /quota/i.test(error instanceof Error ? error.message : '')) {
    return new StoreError(
      'quota',
      `${lead}: this device has no storage space left for Lampwalk. Nothing from this change was saved; everything saved before is unchanged. ` +
        'Download a backup, then free some space (for example delete old photos or other apps’ files) and try again.',
      [],
      cause,
    );
  }
  switch (name) {
    case 'VersionError':
      return new StoreError(
        'newer-version',
        'The data on this device was saved by a newer version of Lampwalk, so this version cannot open it. Nothing was changed. ' +
          'Reload the page to get the newer version (or open Lampwalk where you used the newer one).',
        [],
        cause,
      );
    case 'InvalidStateError':
      return new StoreError(
        'closed',
        `${lead}: the connection to the saved data was closed (Lampwalk may have been updated in another tab). Reload the page; nothing saved before is lost.`,
        [],
        cause,
      );
    case 'ConstraintError':
      return new StoreError('conflict', `${lead}: a record with the same id is already saved. Nothing from this change was written.`, [], cause);
    case 'DataCloneError':
      return new StoreError('invalid', `${lead}: the value cannot be stored (it holds something that is not plain data).`, [], cause);
    case 'SecurityError':
    case 'ReferenceError':
      return new StoreError(
        'unavailable',
        'This browser does not let Lampwalk keep data here (a private window, or storage turned off in the settings). Open Lampwalk in a normal window.',
        [],
        cause,
      );
    default:
      return new StoreError(
        'unknown',
        `${lead}: the browser's storage reported an error${name ? ` (${name})` : ''}. Nothing from this change was written; everything saved before is unchanged.`,
        [],
        cause,
      );
  }
}
