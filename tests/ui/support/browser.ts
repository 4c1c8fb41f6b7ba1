/**
 * Browser harness for the screen tests and the UI benchmark: builds the
 * production app with Vite into a temporary folder, serves it on 127.0.0.1
 * (a free port) and drives Debian's Chromium through playwright-core with a
 * fresh profile. Never downloads a browser. Service workers are blocked so
 * every load comes from the build just made. Also the page helpers the
 * screen tests share: waiting for saves, the "back up everything" export and
 * the axe-core accessibility check.
 *
 * The Chromium path and flags, the project folder and the static server are
 * those of tests/offline/support.ts.
 *
 * Set LAMPWALK_CHROMIUM to use a Chromium other than /usr/bin/chromium.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { build } from 'vite';
import type { SurveyFile } from '../../../src/survey/format.ts';
import { parseSurveyFileText } from '../../../src/survey/validate.ts';
import { chromiumArgs, chromiumPath, hasChromium, projectRoot, serveFolder } from '../../offline/support.ts';

export { chromiumPath, hasChromium, projectRoot };

/** A production build of the app, served. */
export interface ServedApp {
  url: string;
  outDir: string;
  close(): Promise<void>;
}

/** Builds the app with the project's own Vite config into a temporary folder and serves it. */
export async function buildAndServe(): Promise<ServedApp> {
  const outDir = await mkdtemp(join(tmpdir(), 'lampwalk-ui-build-'));
  await build({
    root: projectRoot,
    configFile: join(projectRoot, 'vite.config.ts'),
    logLevel: 'error',
    build: { outDir, emptyOutDir: true },
  });
  const server = await serveFolder(outDir);
  return {
    url: server.url,
    outDir,
    close: async () => {
      await server.close();
      await rm(outDir, { recursive: true, force: true });
    },
  };
}

/** A Chromium window on a fresh profile. */
export interface OpenBrowser {
  context: BrowserContext;
  page: Page;
  /** Uncaught errors seen on the page. */
  errors: string[];
  close(): Promise<void>;
}

/** Launches Chromium on a fresh profile with one page of the given size. */
export async function openBrowser(viewport = { width: 390, height: 844 }, colorScheme: 'light' | 'dark' = 'light'): Promise<OpenBrowser> {
  const profile = await mkdtemp(join(tmpdir(), 'lampwalk-ui-profile-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: chromiumPath,
    headless: true,
    args: chromiumArgs,
    viewport,
    colorScheme,
    serviceWorkers: 'block',
    acceptDownloads: true,
    timeout: 60_000,
  });
  const page = context.pages()[0] ?? (await context.newPage());
  page.setDefaultTimeout(15_000);
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(error.message));
  return {
    context,
    page,
    errors,
    close: async () => {
      await context.close().catch(() => undefined);
      await rm(profile, { recursive: true, force: true });
    },
  };
}

/** Opens the app and waits for its first screen. */
export async function openApp(page: Page, url: string, hash = ''): Promise<void> {
  await page.goto(`${url}${hash}`);
  await page.locator('h1').first().waitFor();
}

/** Opens every folded section (`<details>`) of the page. */
export async function openAllDetails(page: Page): Promise<void> {
  await page.evaluate(() => document.querySelectorAll('details').forEach((details) => (details.open = true)));
}

/** Waits until every edit on the page has been written. */
export async function allSaved(page: Page): Promise<void> {
  await page.waitForFunction(() => [...document.querySelectorAll('[data-testid="save-status"]')].every((el) => el.getAttribute('data-pending') === '0'));
}

/**
 * Exports "back up everything" from the surveys screen into `folder/name` and parses it.
 *
 * @example const file = await backupEverything(page, app.url, folder) //=> the survey file, every survey and portfolio in it
 */
export async function backupEverything(page: Page, url: string, folder: string, name = 'backup.json'): Promise<SurveyFile> {
  await page.goto(`${url}#/`);
  await page.getByTestId('backup-everything').waitFor();
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('backup-everything').click()]);
  const path = join(folder, name);
  await download.saveAs(path);
  const parsed = parseSurveyFileText(await readFile(path, 'utf8'));
  if (!parsed.ok) throw new Error(`the exported backup is not a valid survey file: ${JSON.stringify(parsed.problems)}`);
  return parsed.file;
}

/** One WCAG rule axe-core found broken, with up to five of the elements that break it. */
export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: unknown[]; failureSummary?: string | undefined }[];
}

let axeSource: Promise<string> | undefined;

/**
 * Runs axe-core on the page as it stands for the WCAG 2.2 A and AA rules
 * (loading axe once per page) and returns what it finds broken.
 *
 * @example await axeViolations(page) //=> [] on a screen with no WCAG 2.2 A/AA violation
 */
export async function axeViolations(page: Page): Promise<AxeViolation[]> {
  axeSource ??= readFile(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
  // Evaluated through the DevTools protocol rather than added as an inline <script>, which the page's Content-Security-Policy refuses.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(await axeSource);
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: object) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const report = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] }, resultTypes: ['violations'] });
    return report.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 5).map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  });
}
