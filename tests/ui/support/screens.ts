/**
 * Screenshots of every screen, phone and desktop sizes, light and dark (and
 * sunlight), written to test-artifacts/ui/ for a human to look at. Not a
 * test: `node bin/run-ts.mjs tests/ui/support/screens.ts [screen…]`; with
 * SLICES=1 each page is also written in parts two screens tall.
 */
import { mkdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildAndServe, openApp, openBrowser, projectRoot } from './browser.ts';
import { demoScreens } from './demo-screens.ts';

async function main(): Promise<void> {
  const only = process.argv.slice(2);
  const outDir = join(projectRoot, 'test-artifacts', 'ui');
  await mkdir(outDir, { recursive: true });
  const app = await buildAndServe();
  try {
    for (const size of [
      { label: 'phone', width: 360, height: 740 },
      { label: 'desktop', width: 1280, height: 800 },
    ]) {
      for (const theme of ['light', 'dark', 'sun'] as const) {
        const browser = await openBrowser({ width: size.width, height: size.height }, theme === 'dark' ? 'dark' : 'light');
        try {
          const { page } = browser;
          await openApp(page, app.url);
          if (theme === 'sun') {
          await page.evaluate(() => localStorage.setItem('lampwalk.preferences', JSON.stringify({ theme: 'sun' })));
          await page.reload();
          await page.waitForFunction(() => document.documentElement.dataset.theme === 'sun');
        }
          for (const screen of demoScreens) {
            if (only.length > 0 && !only.includes(screen.name)) continue;
            await page.goto(`${app.url}${screen.hash}`);
            await page.locator('h1').first().waitFor();
            await page.waitForTimeout(400);
            await page.screenshot({ path: join(outDir, `${screen.name}-${size.label}-${theme}.png`), fullPage: true });
            if (process.env.SLICES) {
              const height = await page.evaluate(() => document.documentElement.scrollHeight);
              const sliceHeight = size.height * 2;
              for (let y = 0, part = 1; y < height && part <= 8; y += sliceHeight, part++) {
                await page.screenshot({
                  path: join(outDir, `${screen.name}-${size.label}-${theme}-part${part}.png`),
                  fullPage: true,
                  clip: { x: 0, y, width: size.width, height: Math.min(sliceHeight, height - y) },
                });
              }
            }
          }
          if (browser.errors.length > 0) process.stderr.write(`page errors: ${browser.errors.join('; ')}\n`);
        } finally {
          await browser.close();
        }
      }
    }
  } finally {
    await app.close();
  }
  process.stdout.write(`screenshots in ${outDir}\n`);
}

// Only when run as a script, never when imported.
if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) await main();
