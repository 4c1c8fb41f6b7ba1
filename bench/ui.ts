/**
 * Field-screen figures for `npm run bench`, measured on the production build
 * in headless Chromium (Debian's, through playwright-core; never a downloaded
 * browser):
 * - first-load JS: every script the page needs before its first screen
 *   (index.html's module scripts and preloads and the chunks they import
 *   statically), gzip level 9, in kB of 1,000 bytes (goal 40); and every
 *   chunk loaded later (the survey screens, catalog and settings, exports);
 * - taps to repeat a fixture and to add a common fixture (the same walks the
 *   browser test checks, `tests/ui/support/taps.ts`);
 * - time from opening a 1,000-entry survey to its room list on screen
 *   (the survey is brought in through the app's own backup import).
 *
 * `node bin/run-ts.mjs bench/ui.ts` runs only this part.
 */
import { readFile, readdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { makeSurveyFile } from '../src/survey/format.ts';
import { buildAndServe, chromiumPath, hasChromium, openApp, openBrowser } from '../tests/ui/support/browser.ts';
import { addCommonFixture, repeatLastFixture } from '../tests/ui/support/taps.ts';
import { syntheticSurvey } from './synthetic.ts';

export interface UiBenchFigures {
  firstLoadJsGzipKb: number;
  firstLoadGoalKb: number;
  firstLoadFiles: { file: string; gzipKb: number }[];
  /** Every other script chunk, loaded on demand (survey screens, catalog and settings, export code…). */
  lazyChunksGzipKb: Record<string, number>;
  repeatLastFixtureTaps: number;
  repeatGoalTaps: number;
  addCommonFixtureTaps: number;
  addCommonGoalTaps: number;
  openSurvey1000: {
    entries: number;
    rooms: number;
    /** The first open of this survey in the page (the survey screens' code is already fetched: the app loads it while idle). */
    firstOpenMs: number;
    /** Median of later opens, each after another survey was open: read from the store, checked, calculated and rendered every time. */
    medianMs: number;
    runs: number;
  };
}

/** kB of 1,000 bytes, as Vite prints chunk sizes. */
const kb = (bytes: number) => Math.round((bytes / 1000) * 100) / 100;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** Chunks a chunk imports statically (minified `import{…}from"./x.js"` or `import"./x.js"`), not `import()`. */
function staticImports(code: string): string[] {
  return [...code.matchAll(/\bimport\s*(?:[\w$*{}\s,]+?\s*from\s*)?["']\.\/([^"']+\.js)["']/g)].map((match) => match[1]!);
}

/**
 * The scripts the page needs before its first screen (index.html's module
 * scripts and preloads, and every chunk they import statically), and every
 * other chunk, with gzip sizes.
 */
async function bundleSizes(outDir: string): Promise<Pick<UiBenchFigures, 'firstLoadJsGzipKb' | 'firstLoadFiles' | 'lazyChunksGzipKb'>> {
  const html = await readFile(join(outDir, 'index.html'), 'utf8');
  const queue: string[] = [];
  for (const match of html.matchAll(/<script[^>]*type="module"[^>]*src="([^"]+)"/g)) queue.push(match[1]!.replace(/^\//, ''));
  for (const match of html.matchAll(/<link[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g)) queue.push(match[1]!.replace(/^\//, ''));
  const upFront = new Set<string>();
  const firstLoadFiles: { file: string; gzipKb: number }[] = [];
  while (queue.length > 0) {
    const file = queue.shift()!;
    if (upFront.has(file)) continue;
    upFront.add(file);
    const code = await readFile(join(outDir, file));
    firstLoadFiles.push({ file, gzipKb: kb(gzipSync(code, { level: 9 }).length) });
    for (const imported of staticImports(code.toString('utf8'))) queue.push(join(file, '..', imported));
  }
  const lazyChunksGzipKb: Record<string, number> = {};
  for (const name of await readdir(join(outDir, 'assets'))) {
    if (!name.endsWith('.js') || upFront.has(`assets/${name}`)) continue;
    lazyChunksGzipKb[name.replace(/-[\w-]{8}\.js$/, '')] = kb(gzipSync(await readFile(join(outDir, 'assets', name)), { level: 9 }).length);
  }
  const total = firstLoadFiles.reduce((sum, file) => sum + file.gzipKb, 0);
  return { firstLoadJsGzipKb: Math.round(total * 100) / 100, firstLoadFiles, lazyChunksGzipKb };
}

/** Runs the UI benchmark; says why it was skipped when there is no Chromium. */
export async function uiBench(): Promise<UiBenchFigures | { skipped: string }> {
  if (!hasChromium()) return { skipped: `no Chromium at ${chromiumPath} (install Debian's chromium package, or set LAMPWALK_CHROMIUM)` };
  const app = await buildAndServe();
  const browser = await openBrowser({ width: 390, height: 844 });
  try {
    const sizes = await bundleSizes(app.outDir);
    const { page } = browser;
    page.setDefaultTimeout(60_000);
    await openApp(page, app.url);

    await page.goto(`${app.url}#/s/demo-tallowmere/r/demo-shop`);
    await page.getByTestId('entry-row').first().waitFor();
    const repeatLastFixtureTaps = await repeatLastFixture(page);
    const addCommonFixtureTaps = await addCommonFixture(page);

    // A 1,000-entry survey (100 rooms), brought in through the app's backup import.
    const big = syntheticSurvey(1000, 10, 42);
    const text = JSON.stringify(makeSurveyFile([big], [], new Date()));
    await page.goto(`${app.url}#/`);
    await page.getByTestId('backup-file').setInputFiles({ name: 'big.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    await page.getByTestId('backup-import-commit').click();
    await page.locator('[data-testid="survey-card"]', { hasText: big.name }).waitFor();

    // Written as text: the TypeScript runner would wrap a named function with a helper the page does not have.
    const open = (surveyId: string, rooms: number) =>
      page.evaluate<number>(`new Promise((done) => {
        const start = performance.now();
        location.hash = ${JSON.stringify(`#/s/${encodeURIComponent(surveyId)}`)};
        (function check() {
          if (document.querySelectorAll('[data-testid="room-row"]').length === ${rooms}) requestAnimationFrame(() => done(performance.now() - start));
          else requestAnimationFrame(check);
        })();
      })`);
    const leave = async () => {
      // Open another survey, so the next open reads the big one from the store again.
      await page.evaluate(() => (location.hash = '#/s/demo-tallowmere'));
      await page.locator('h1', { hasText: 'Tallowmere' }).waitFor();
    };
    await page.goto(`${app.url}#/`);
    await page.locator('h1', { hasText: 'Surveys' }).waitFor();
    const firstOpenMs = await open(big.id, big.rooms.length);
    const times: number[] = [];
    for (let run = 0; run < 7; run++) {
      await leave();
      times.push(await open(big.id, big.rooms.length));
    }
    if (browser.errors.length > 0) throw new Error(`page errors: ${browser.errors.join('; ')}`);
    return {
      ...sizes,
      firstLoadGoalKb: 40,
      repeatLastFixtureTaps,
      repeatGoalTaps: 2,
      addCommonFixtureTaps,
      addCommonGoalTaps: 8,
      openSurvey1000: {
        entries: 1000,
        rooms: big.rooms.length,
        firstOpenMs: Math.round(firstOpenMs * 10) / 10,
        medianMs: Math.round(median(times) * 10) / 10,
        runs: times.length,
      },
    };
  } finally {
    await browser.close();
    await app.close();
  }
}

// Run on its own: `node bin/run-ts.mjs bench/ui.ts`.
if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  process.stdout.write(`${JSON.stringify({ ui: await uiBench() }, null, 2)}\n`);
}
