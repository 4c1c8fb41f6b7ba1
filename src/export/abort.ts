/**
 * Cancelling and progress for long exports. A cancel rejects with a
 * `DOMException` named `AbortError`, which callers filter out with
 * {@link isAbortError} instead of showing it as a failure.
 */
import type { ProgressCallback } from './types.ts';

/**
 * The error a cancelled export rejects with: the signal's own reason when it
 * is already an `AbortError`, otherwise a new one carrying the reason as its
 * cause.
 *
 * @example abortError(AbortSignal.abort()).name //=> 'AbortError'
 */
export function abortError(signal: AbortSignal): DOMException {
  const reason: unknown = signal.reason;
  if (reason instanceof DOMException && reason.name === 'AbortError') return reason;
  const error = new DOMException('The export was cancelled.', 'AbortError');
  if (reason !== undefined) Object.defineProperty(error, 'cause', { value: reason });
  return error;
}

/**
 * Throws an `AbortError` when `signal` has been aborted.
 *
 * @example checkAborted(new AbortController().signal) //=> undefined (no throw)
 */
export function checkAborted(signal: AbortSignal): void {
  if (signal.aborted) throw abortError(signal);
}

/**
 * True for the error a cancelled export rejects with (not a failure to report).
 *
 * @example isAbortError(new DOMException('x', 'AbortError')) //=> true
 */
export function isAbortError(error: unknown): boolean {
  return typeof error === 'object' && error !== null && 'name' in error && (error as { name: unknown }).name === 'AbortError';
}

const immediate = (globalThis as { setImmediate?: (run: () => void) => unknown }).setImmediate;

/**
 * Lets the event loop run (so a Cancel tap is seen and progress is painted),
 * then throws an `AbortError` if the export was cancelled meanwhile.
 *
 * @example await pause(signal) //=> undefined, or rejects with an AbortError
 */
export async function pause(signal: AbortSignal): Promise<void> {
  checkAborted(signal);
  await new Promise<void>((resolve) => {
    if (immediate) immediate(resolve);
    else if (typeof MessageChannel !== 'undefined') {
      const channel = new MessageChannel();
      channel.port1.onmessage = () => {
        channel.port1.close();
        resolve();
      };
      channel.port2.postMessage(null);
    } else setTimeout(resolve, 0);
  });
  checkAborted(signal);
}

/**
 * Wraps an optional progress callback so it only ever sees fractions in
 * [0, 1] that never go backwards, and is told 1 exactly once at the end.
 *
 * @example const p = progressReporter((f) => seen.push(f)); p(0.5); p(0.4); p(2) // seen: [0.5, 1]
 */
export function progressReporter(callback: ProgressCallback | undefined): (fraction: number) => void {
  let last = -1;
  return (fraction: number) => {
    if (!callback) return;
    const clamped = Math.min(1, Math.max(0, Number.isFinite(fraction) ? fraction : 0));
    if (clamped <= last) return;
    last = clamped;
    callback(clamped);
  };
}
