/**
 * Vitest set-up shared by the browser test files (kept apart from
 * browser.ts, which the UI benchmark imports outside Vitest): a `describe`
 * that is skipped where Chromium is missing, and one production build served
 * for the whole file.
 */
import { afterAll, beforeAll, describe } from 'vitest';
import { buildAndServe, hasChromium, type ServedApp } from './browser.ts';

/** `describe`, skipped where the Chromium these tests drive is not installed. */
export const browserTests = describe.skipIf(!hasChromium());

/**
 * Builds and serves the app once before the file's tests (where Chromium is
 * installed) and closes it after them. The returned handle reads the served
 * app, so use it inside tests only.
 *
 * @example const app = serveAppForFile(); … await openApp(page, app.url) //=> the build served for this file
 */
export function serveAppForFile(buildTimeoutMs = 180_000): ServedApp {
  let app: ServedApp | undefined;
  beforeAll(async () => {
    if (hasChromium()) app = await buildAndServe();
  }, buildTimeoutMs);
  afterAll(async () => {
    await app?.close();
  });
  const served = (): ServedApp => {
    if (!app) throw new Error('the app was not built (is Chromium installed? did the build fail?)');
    return app;
  };
  return {
    get url() {
      return served().url;
    },
    get outDir() {
      return served().outDir;
    },
    close: () => served().close(),
  };
}
