/**
 * Browser harness for the screen tests and the UI benchmark: builds the
 * production app with Vite into a temporary folder, serves it on 127.0.0.1
 * (a free port) and drives Debian's Chromium through playwright-core with a
 * fresh profile. Never downloads a browser. Service workers are blocked so
 * every load comes from the build just made.
 *
 * Set LAMPWALK_CHROMIUM to use a Chromium other than /usr/bin/chromium.
 */
import { existsSync } from 'node:fs';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, normalize, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { build } from 'vite';

export const chromiumPath = process.env.LAMPWALK_CHROMIUM ?? '/usr/bin/chromium';
const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** The project folder (two levels above this file's folder). */
export const projectRoot = fileURLToPath(new URL('../../../', import.meta.url));

/** True when the Chromium these tests drive is installed. */
export function hasChromium(): boolean {
  return existsSync(chromiumPath);
}

const contentTypes: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.webmanifest': 'application/manifest+json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.map': 'application/json',
};

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
  const server: Server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://127.0.0.1').pathname);
    const file = normalize(join(outDir, path === '/' ? 'index.html' : path));
    if (!file.startsWith(outDir + sep)) {
      res.writeHead(403).end();
      return;
    }
    readFile(file).then(
      (body) => res.writeHead(200, { 'content-type': contentTypes[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-store' }).end(body),
      () => res.writeHead(404).end(),
    );
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/`,
    outDir,
    close: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
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
