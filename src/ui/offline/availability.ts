/**
 * Whether this browser can keep Lampwalk for use with no signal. Kept apart
 * from `register.ts` so the first screen can say so without loading
 * workbox-window.
 */

/**
 * Why offline use is unavailable here, or null when it is available.
 *
 * @example offlineUnavailableReason() //=> null in Chromium over https or on localhost
 */
export function offlineUnavailableReason(): string | null {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) {
    return 'This browser cannot keep Lampwalk for use with no signal (a private window, or service workers turned off).';
  }
  if (!window.isSecureContext) return 'Lampwalk can keep itself for use with no signal only when opened over HTTPS.';
  return null;
}


/** True in Vite's development server, which builds no worker (every build, whatever its mode, has one). */
export const inDevelopmentServer: boolean = import.meta.hot !== undefined;
