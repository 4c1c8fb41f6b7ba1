/**
 * The build's identity: set by `vite.config.ts` from LAMPWALK_BUILD_ID or the
 * package version. In the offline status line's tooltip, so a user (and the
 * update test) can tell which version runs.
 */
declare const __LAMPWALK_BUILD__: string | undefined;

/** The running build's id; "dev" outside a Vite build. */
export const buildId: string = typeof __LAMPWALK_BUILD__ === 'string' ? __LAMPWALK_BUILD__ : 'dev';
