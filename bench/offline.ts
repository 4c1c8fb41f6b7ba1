/**
 * Offline figures in Debian's Chromium (`npm run bench`, key "offline"):
 *
 * - cold start with no signal, served by the service worker, to first render
 *   (the first child of `#app`, marked with `performance.mark` by a script
 *   injected before the page's own), for the app and for a blank Preact page
 *   built and served the same way (its own Workbox `generateSW` worker), in
 *   the same run, alternating; each start is a fresh browser on a profile that
 *   visited both pages once online;
 * - the precache: what the build's `sw.js` lists, raw (what Workbox reports
 *   and the browser stores) and gzip (what a first visit downloads from a
 *   compressing server);
 * - Lighthouse 12 scores (its default mobile settings) for performance,
 *   accessibility and best practices, on a first online visit.
 *
 * Bounded in time; everything it starts is stopped and its folders removed.
 * `node bin/run-ts.mjs bench/offline.ts` runs only this part.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'vite';
import { generateSW } from 'workbox-build';
import { buildApp, chromiumArgs, chromiumPath, hasChromium, launch, precacheFiles, serveFolder, type StaticServer } from '../tests/offline/support.ts';

/** Cold starts measured per page. */
const coldStarts = 7;
/** Longest the whole offline bench may take. */
const timeLimitMs = 420_000;

export interface ColdStartFigures {
  /** Median time from navigation start to the first child of #app, with no signal. */
  appMedianMs: number;
  blankPreactMedianMs: number;
  ratio: number;
  ratioGoal: number;
  /** Median time until the worker had delivered the HTML (the rest is loading and running the scripts). */
  appHtmlServedMs: number;
  blankHtmlServedMs: number;
  /** Median first contentful paint, for reference. */
  appFirstContentfulPaintMs: number | null;
  blankFirstContentfulPaintMs: number | null;
  samples: number;
}

export interface OfflineFigures {
  coldStart: ColdStartFigures;
  precache: {
    entries: number;
    kib: number;
    gzipKib: number;
    goalKib: number;
    /** The largest precached files, KiB raw. */
    largest: { url: string; kib: number }[];
    blankPreactKib: number;
  };
  lighthouse:
    | {
        version: string;
        formFactor: string;
        performance: number;
        accessibility: number;
        bestPractices: number;
        goals: { performance: number; accessibility: number; bestPractices: number };
        /** The performance metrics behind the score (simulated mobile), ms (CLS unitless). */
        metrics: Record<string, number | null>;
      }
    | { skipped: string };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

const round = (n: number, places = 1) => Math.round(n * 10 ** places) / 10 ** places;

/** Builds a blank Preact page (one paragraph) with its own Workbox service worker into `outDir`. */
async function buildBlankPage(outDir: string): Promise<void> {
  const source = await mkdtemp(join(tmpdir(), 'lampwalk-blank-src-'));
  try {
    await writeFile(
      join(source, 'index.html'),
      '<!doctype html><html lang="en"><head><meta charset="utf-8" /><meta name="viewport" content="width=device-width, initial-scale=1" /><link rel="icon" href="data:," /><title>Blank</title></head><body><div id="app"></div><script type="module" src="./main.js"></script></body></html>\n',
    );
    await writeFile(
      join(source, 'main.js'),
      [
        "import { h, render } from 'preact';",
        "render(h('p', null, 'Blank Preact page'), document.getElementById('app'));",
        "addEventListener('load', () => navigator.serviceWorker.register('sw.js'));",
        '',
      ].join('\n'),
    );
    await build({
      configFile: false,
      root: source,
      logLevel: 'error',
      resolve: { alias: { preact: join(projectRoot(), 'node_modules', 'preact', 'dist', 'preact.mjs') } },
      build: { outDir, emptyOutDir: true, target: 'es2022', sourcemap: false },
    });
    // The same worker settings as the app's (vite.config.ts), less what a blank page lacks.
    await generateSW({
      globDirectory: outDir,
      globPatterns: ['**/*.{js,css,html}'],
      globIgnores: ['sw.js', 'workbox-*.js'],
      swDest: join(outDir, 'sw.js'),
      navigateFallback: 'index.html',
      cleanupOutdatedCaches: true,
      clientsClaim: true,
      mode: 'production',
      sourcemap: false,
    });
  } finally {
    await rm(source, { recursive: true, force: true });
  }
}

function projectRoot(): string {
  return fileURLToPath(new URL('../', import.meta.url));
}

/**
 * Marks the first render: the first element child of #app. Injected as text
 * before the page's own scripts (a function would carry the TypeScript
 * runner's helpers, which the page lacks).
 */
const markFirstRender = `
  new MutationObserver((records, observer) => {
    const app = document.getElementById('app');
    if (!app || app.childElementCount === 0) return;
    performance.mark('lampwalk-first-render');
    observer.disconnect();
  }).observe(document, { childList: true, subtree: true });
`;

interface ColdStart {
  /** When the worker had delivered the page's HTML. */
  htmlServedMs: number;
  firstRenderMs: number;
  firstContentfulPaintMs: number | null;
}

/** Opens `server`'s page in a fresh browser on `profile`, offline, and times the first render. */
async function coldStart(profile: string, server: StaticServer): Promise<ColdStart> {
  const browser = await launch(profile, { offline: true });
  try {
    const { page } = browser;
    await page.addInitScript({ content: markFirstRender });
    await page.goto(server.url);
    const figures = await page.waitForFunction(() => {
      const [mark] = performance.getEntriesByName('lampwalk-first-render');
      if (!mark) return null;
      const paint = performance.getEntriesByName('first-contentful-paint')[0];
      const navigation = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming | undefined;
      return {
        htmlServedMs: navigation?.responseEnd ?? 0,
        firstRenderMs: mark.startTime,
        firstContentfulPaintMs: paint ? paint.startTime : null,
        controlled: navigator.serviceWorker.controller !== null,
      };
    });
    const value = await figures.jsonValue();
    if (!value) throw new Error('no first-render mark');
    if (!value.controlled) throw new Error(`${server.url} was not served by its service worker`);
    return { htmlServedMs: value.htmlServedMs, firstRenderMs: value.firstRenderMs, firstContentfulPaintMs: value.firstContentfulPaintMs };
  } finally {
    await browser.close();
  }
}

/** A free TCP port on 127.0.0.1. */
async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const address = server.address();
  await new Promise<void>((done) => server.close(() => done()));
  if (address === null || typeof address === 'string') throw new Error('no port');
  return address.port;
}

async function waitForDevTools(port: number, deadline: number): Promise<void> {
  while (Date.now() < deadline) {
    try {
      const response = await fetch(`http://127.0.0.1:${port}/json/version`);
      if (response.ok) return;
    } catch {
      // Not listening yet.
    }
    await new Promise((done) => setTimeout(done, 200));
  }
  throw new Error('Chromium did not open its DevTools port');
}

/** Lighthouse (default config: mobile) against `url`, in a Chromium started here with a DevTools port. */
async function lighthouseScores(url: string): Promise<OfflineFigures['lighthouse']> {
  let lighthouse: typeof import('lighthouse').default;
  try {
    lighthouse = (await import('lighthouse')).default;
  } catch (error) {
    return { skipped: `lighthouse could not be loaded: ${error instanceof Error ? error.message : String(error)}` };
  }
  const profile = await mkdtemp(join(tmpdir(), 'lampwalk-lighthouse-profile-'));
  let chromium: ChildProcess | undefined;
  try {
    const port = await freePort();
    chromium = spawn(chromiumPath, [...chromiumArgs, `--remote-debugging-port=${port}`, `--user-data-dir=${profile}`, 'about:blank'], { stdio: 'ignore' });
    await waitForDevTools(port, Date.now() + 30_000);
    const result = await lighthouse(url, {
      port,
      logLevel: 'error',
      output: 'json',
      onlyCategories: ['performance', 'accessibility', 'best-practices'],
    });
    if (!result) return { skipped: 'lighthouse returned no result' };
    const { lhr } = result;
    if (lhr.runtimeError) return { skipped: `lighthouse: ${lhr.runtimeError.code} ${lhr.runtimeError.message}` };
    const score = (id: string) => {
      const value = lhr.categories[id]?.score;
      if (value === null || value === undefined) throw new Error(`lighthouse gave no ${id} score`);
      return Math.round(value * 100);
    };
    const metric = (id: string) => {
      const value = lhr.audits[id]?.numericValue;
      return value === undefined ? null : round(value, id === 'cumulative-layout-shift' ? 3 : 0);
    };
    return {
      version: lhr.lighthouseVersion,
      formFactor: lhr.configSettings.formFactor,
      performance: score('performance'),
      accessibility: score('accessibility'),
      bestPractices: score('best-practices'),
      goals: { performance: 95, accessibility: 100, bestPractices: 95 },
      metrics: Object.fromEntries(
        ['first-contentful-paint', 'largest-contentful-paint', 'total-blocking-time', 'cumulative-layout-shift', 'speed-index'].map((id) => [id, metric(id)]),
      ),
    };
  } catch (error) {
    return { skipped: `lighthouse failed here: ${error instanceof Error ? error.message : String(error)}` };
  } finally {
    if (chromium?.pid !== undefined && chromium.exitCode === null) {
      const exited = new Promise((done) => chromium?.once('exit', done));
      chromium.kill('SIGTERM');
      await Promise.race([exited, new Promise((done) => setTimeout(done, 5000))]);
    }
    await rm(profile, { recursive: true, force: true });
  }
}

async function run(work: string): Promise<OfflineFigures> {
  const appDir = join(work, 'app');
  const blankDir = join(work, 'blank');
  await buildApp(appDir, 'bench');
  await mkdir(blankDir, { recursive: true });
  await buildBlankPage(blankDir);

  const appFiles = await precacheFiles(appDir);
  const blankFiles = await precacheFiles(blankDir);
  const kib = (bytes: number) => round(bytes / 1024);

  const app = await serveFolder(appDir);
  const blank = await serveFolder(blankDir);
  try {
    // One online visit each, until the worker controls the page with its precache complete.
    const profile = join(work, 'profile');
    const first = await launch(profile);
    try {
      for (const [name, server] of [['app', app], ['blank page', blank]] as const) {
        try {
          await first.page.goto(server.url);
          await first.page.waitForFunction(async () => {
            const registration = await navigator.serviceWorker.getRegistration();
            return navigator.serviceWorker.controller !== null && registration?.active?.state === 'activated';
          });
          // A second visit, served by the worker, before the browser closes (it stores the registration meanwhile).
          await first.page.reload();
          await first.page.waitForFunction(() => navigator.serviceWorker.controller !== null);
          await first.page.waitForTimeout(1000);
        } catch (error) {
          throw new Error(`the ${name} never came under its service worker online`, { cause: error });
        }
      }
    } finally {
      await first.close();
    }

    app.setNetwork(false);
    blank.setNetwork(false);
    const appStarts: ColdStart[] = [];
    const blankStarts: ColdStart[] = [];
    for (let i = 0; i < coldStarts; i++) {
      appStarts.push(await coldStart(profile, app));
      blankStarts.push(await coldStart(profile, blank));
    }
    app.setNetwork(true);

    const fcp = (starts: ColdStart[]) => {
      const values = starts.flatMap((s) => (s.firstContentfulPaintMs === null ? [] : [s.firstContentfulPaintMs]));
      return values.length > 0 ? round(median(values)) : null;
    };
    const appMs = median(appStarts.map((s) => s.firstRenderMs));
    const blankMs = median(blankStarts.map((s) => s.firstRenderMs));
    return {
      coldStart: {
        appMedianMs: round(appMs),
        blankPreactMedianMs: round(blankMs),
        ratio: round(appMs / blankMs, 2),
        ratioGoal: 1.5,
        appHtmlServedMs: round(median(appStarts.map((s) => s.htmlServedMs))),
        blankHtmlServedMs: round(median(blankStarts.map((s) => s.htmlServedMs))),
        appFirstContentfulPaintMs: fcp(appStarts),
        blankFirstContentfulPaintMs: fcp(blankStarts),
        samples: coldStarts,
      },
      precache: {
        entries: appFiles.length,
        kib: kib(appFiles.reduce((sum, f) => sum + f.bytes, 0)),
        gzipKib: kib(appFiles.reduce((sum, f) => sum + f.gzipBytes, 0)),
        goalKib: 500,
        largest: [...appFiles]
          .sort((a, b) => b.bytes - a.bytes)
          .slice(0, 4)
          .map((f) => ({ url: f.url, kib: kib(f.bytes) })),
        blankPreactKib: kib(blankFiles.reduce((sum, f) => sum + f.bytes, 0)),
      },
      lighthouse: await lighthouseScores(app.url),
    };
  } finally {
    await app.close();
    await blank.close();
  }
}

/**
 * Runs the offline benchmark; returns why it was skipped when there is no Chromium.
 *
 * @example (await offlineBench()).coldStart.ratio //=> about 1.5 (app vs blank Preact page, same run)
 */
export async function offlineBench(): Promise<OfflineFigures | { skipped: string }> {
  if (!hasChromium()) return { skipped: `no Chromium at ${chromiumPath} (install Debian's chromium package, or set LAMPWALK_CHROMIUM)` };
  const work = await mkdtemp(join(tmpdir(), 'lampwalk-offline-bench-'));
  let timer: NodeJS.Timeout | undefined;
  try {
    return await Promise.race([
      run(work),
      new Promise<never>((_done, reject) => {
        timer = setTimeout(() => reject(new Error(`offline bench took over ${timeLimitMs / 1000} s`)), timeLimitMs);
        timer.unref();
      }),
    ]);
  } finally {
    clearTimeout(timer);
    await rm(work, { recursive: true, force: true });
  }
}

// Run on its own: `node bin/run-ts.mjs bench/offline.ts`.
if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  process.stdout.write(`${JSON.stringify({ offline: await offlineBench() }, null, 2)}\n`);
}
