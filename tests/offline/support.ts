/**
 * Browser harness for the offline tests and the offline benchmark: builds the
 * production app (service worker included) with a given build id, serves a
 * folder on 127.0.0.1 from a server that can be switched "off the network"
 * (it then refuses every request and records it), reads the precache list
 * the build wrote, and launches Debian's Chromium through playwright-core on
 * a persistent profile (so a test can close the browser and open it again on
 * the same data). Never downloads a browser.
 *
 * Set LAMPWALK_CHROMIUM to use a Chromium other than /usr/bin/chromium.
 */
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { cp, readdir, readFile, rm } from 'node:fs/promises';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join, normalize, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const chromiumPath = process.env.LAMPWALK_CHROMIUM ?? '/usr/bin/chromium';

/** The launch flags the project uses everywhere (no background traffic, no QUIC). */
export const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** The project folder. */
export const projectRoot = fileURLToPath(new URL('../../', import.meta.url));

/**
 * True when the Chromium these tests drive is installed.
 *
 * @example hasChromium() //=> true where Debian's chromium package is installed
 */
export function hasChromium(): boolean {
  return existsSync(chromiumPath);
}

/**
 * Builds the app with the project's Vite config into `outDir`, in a child
 * process with LAMPWALK_BUILD_ID set (the id the offline status shows).
 *
 * @example await buildApp(join(work, 'build-a'), 'test-a') //=> resolves once build-a holds index.html and sw.js
 */
export async function buildApp(outDir: string, buildId: string): Promise<void> {
  const vite = join(projectRoot, 'node_modules', 'vite', 'bin', 'vite.js');
  await new Promise<void>((resolve, reject) => {
    const child = spawn(process.execPath, [vite, 'build', '--outDir', outDir, '--emptyOutDir', '--logLevel', 'error'], {
      cwd: projectRoot,
      // Vitest sets NODE_ENV=test, which would make a development-flavoured build.
      env: { ...process.env, NODE_ENV: 'production', LAMPWALK_BUILD_ID: buildId },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let errors = '';
    child.stderr.on('data', (chunk: Buffer) => (errors += chunk.toString()));
    child.on('error', reject);
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`vite build (${buildId}) failed with code ${code}: ${errors}`))));
  });
}

/**
 * Replaces everything in `servedDir` with the files of `buildDir` (a deploy).
 *
 * @example await deploy(buildB, served) //=> served now holds build B only
 */
export async function deploy(buildDir: string, servedDir: string): Promise<void> {
  await rm(servedDir, { recursive: true, force: true });
  await cp(buildDir, servedDir, { recursive: true });
}

const contentTypes: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.webmanifest': 'application/manifest+json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.woff2': 'font/woff2',
  '.map': 'application/json',
};

/** A folder served on 127.0.0.1. */
export interface StaticServer {
  url: string;
  origin: string;
  /** Off: every request is refused (503) and recorded in `refused`. */
  setNetwork(on: boolean): void;
  /** Paths requested while the network was off. */
  refused: string[];
  /** Paths served, in order. */
  served: string[];
  close(): Promise<void>;
}

/**
 * Serves `root` (read on every request, so a deploy shows at once) with no HTTP caching.
 *
 * @example (await serveFolder(dir)).url //=> 'http://127.0.0.1:41234/' (a free port)
 */
export async function serveFolder(root: string): Promise<StaticServer> {
  let on = true;
  const refused: string[] = [];
  const served: string[] = [];
  const server: Server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://127.0.0.1').pathname);
    if (!on) {
      // Answered at once (a dropped connection makes Chromium retry for seconds).
      refused.push(path);
      res.writeHead(503, { connection: 'close' }).end();
      return;
    }
    served.push(path);
    const file = normalize(join(root, path === '/' ? 'index.html' : path));
    if (!file.startsWith(root + sep)) {
      res.writeHead(403).end();
      return;
    }
    readFile(file).then(
      (body) => res.writeHead(200, { 'content-type': contentTypes[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-cache' }).end(body),
      () => res.writeHead(404).end(),
    );
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const origin = `http://127.0.0.1:${port}`;
  return {
    url: `${origin}/`,
    origin,
    setNetwork(value) {
      on = value;
    },
    refused,
    served,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/** One file of the precache list the build's `sw.js` holds. */
export interface PrecacheFile {
  url: string;
  bytes: number;
  gzipBytes: number;
}

/**
 * The precache list of a build folder (read from the generated `sw.js`), with each file's size.
 *
 * @example (await precacheFiles(buildDir))[0] //=> { url: 'index.html', bytes: 812, gzipBytes: 430 }
 */
export async function precacheFiles(buildDir: string): Promise<PrecacheFile[]> {
  const worker = await readFile(join(buildDir, 'sw.js'), 'utf8');
  const urls = [...worker.matchAll(/\{url:"([^"]+)",revision:(?:"[^"]*"|null)\}/g)].map((match) => match[1]!);
  if (urls.length === 0) throw new Error('sw.js holds no precache list');
  return Promise.all(
    urls.map(async (url) => {
      const body = await readFile(join(buildDir, url));
      return { url, bytes: body.length, gzipBytes: gzipSync(body, { level: 9 }).length };
    }),
  );
}

/**
 * Every file under `dir`, as paths relative to it with forward slashes.
 *
 * @example await listFiles(buildDir) //=> ['assets/index-abc123.js', 'index.html', 'sw.js', …]
 */
export async function listFiles(dir: string): Promise<string[]> {
  const out: string[] = [];
  for (const entry of await readdir(dir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile()) continue;
    out.push(relative(dir, join(entry.parentPath, entry.name)).split(sep).join('/'));
  }
  return out.sort();
}

/** Every request a browser context made, page and service worker alike. */
export interface RequestLog {
  urls: string[];
  /** URLs whose origin is not `origin` (data: URLs are not requests to anyone and are left out). */
  foreign(origin: string): string[];
}

/**
 * Records every request of `context`: its pages' and (in Chromium) its service workers'.
 *
 * @example recordRequests(context).foreign('http://127.0.0.1:41234') //=> [] when nothing left the origin
 */
export function recordRequests(context: BrowserContext): RequestLog {
  const urls: string[] = [];
  const seen = new Set<Page>();
  const watch = (page: Page) => {
    if (seen.has(page)) return;
    seen.add(page);
    page.on('request', (request) => urls.push(request.url()));
  };
  context.pages().forEach(watch);
  context.on('page', watch);
  // Includes requests made by service workers (Chromium).
  context.on('request', (request) => urls.push(request.url()));
  return {
    urls,
    foreign: (origin) => [...new Set(urls)].filter((url) => !url.startsWith('data:') && new URL(url).origin !== origin),
  };
}

/** A Chromium on a persistent profile. */
export interface Browser {
  context: BrowserContext;
  page: Page;
  /** Uncaught page errors. */
  errors: string[];
  requests: RequestLog;
  close(): Promise<void>;
}

/**
 * Launches Chromium on the profile in `profileDir` (created when missing), phone-sized.
 *
 * @example const { page, close } = await launch(profile, { offline: true }) //=> a browser whose network is off
 */
export async function launch(profileDir: string, options: { offline?: boolean } = {}): Promise<Browser> {
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: chromiumPath,
    headless: true,
    args: chromiumArgs,
    viewport: { width: 390, height: 844 },
    offline: options.offline ?? false,
    timeout: 60_000,
  });
  const requests = recordRequests(context);
  const page = context.pages()[0] ?? (await context.newPage());
  page.setDefaultTimeout(30_000);
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(error.message));
  return { context, page, errors, requests, close: () => context.close() };
}

/**
 * Waits until a service worker controls `page`, its precache is complete (an
 * active worker has installed) and the page says "Ready to work offline".
 *
 * @example await waitForOfflineReady(page) //=> resolves on a page that now opens with no signal
 */
export async function waitForOfflineReady(page: Page): Promise<void> {
  await page.waitForFunction(async () => {
    if (!navigator.serviceWorker.controller) return false;
    const registration = await navigator.serviceWorker.getRegistration();
    return registration?.active?.state === 'activated';
  });
  try {
    // Case-sensitive: "Getting ready to work offline…" must not count.
    await page.getByText(/Ready to work offline/).waitFor();
  } catch (error) {
    const shown = await page.locator('#offline-ui').innerText().catch(() => '(no #offline-ui)');
    throw new Error(`the page never said "Ready to work offline"; it shows: ${shown}`, { cause: error });
  }
}

/**
 * The id of the build running in `page` (from the offline status).
 *
 * @example await runningBuild(page) //=> 'test-a'
 */
export async function runningBuild(page: Page): Promise<string | null> {
  return page.locator('[data-build]').getAttribute('data-build');
}
