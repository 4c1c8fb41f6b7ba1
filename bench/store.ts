/**
 * Store speed in a real browser: builds `bench/browser/` with Vite into a
 * temporary folder, serves it on 127.0.0.1, opens it in headless Chromium
 * (Debian's, through playwright-core; never a downloaded browser) with a fresh
 * profile, runs `lampwalkStoreBench()` and returns its figures. Bounded in
 * time; everything it started is stopped and its folders removed.
 *
 * Set LAMPWALK_CHROMIUM to use a Chromium other than /usr/bin/chromium.
 */
import { existsSync } from 'node:fs';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import { build } from 'vite';
import type { StoreFigures } from './browser/page.ts';

const chromiumPath = process.env.LAMPWALK_CHROMIUM ?? '/usr/bin/chromium';
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
/** Longest the whole browser run may take. */
const timeLimitMs = 240_000;

const contentTypes: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.map': 'application/json',
};

/** A static file server for `root` on 127.0.0.1 (a free port). */
async function serve(root: string): Promise<{ server: Server; url: string }> {
  const server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://127.0.0.1').pathname);
    const file = normalize(join(root, path === '/' ? 'index.html' : path));
    if (!file.startsWith(root + sep)) {
      res.writeHead(403).end();
      return;
    }
    readFile(file).then(
      (body) => res.writeHead(200, { 'content-type': contentTypes[extname(file)] ?? 'application/octet-stream' }).end(body),
      () => res.writeHead(404).end(),
    );
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return { server, url: `http://127.0.0.1:${port}/` };
}

/** Runs the store benchmark in Chromium; returns why it was skipped when there is no Chromium. */
export async function storeBench(): Promise<StoreFigures | { skipped: string }> {
  if (!existsSync(chromiumPath)) {
    return { skipped: `no Chromium at ${chromiumPath} (install Debian's chromium package, or set LAMPWALK_CHROMIUM)` };
  }
  const outDir = await mkdtemp(join(tmpdir(), 'lampwalk-store-bench-'));
  const profile = await mkdtemp(join(tmpdir(), 'lampwalk-store-profile-'));
  let server: Server | undefined;
  const browser = { close: async (): Promise<void> => undefined };
  try {
    await build({
      configFile: false,
      root: fileURLToPath(new URL('./browser/', import.meta.url)),
      logLevel: 'error',
      build: { outDir, emptyOutDir: true, target: 'es2022', sourcemap: false },
    });
    const served = await serve(outDir);
    server = served.server;
    const context = await chromium.launchPersistentContext(profile, {
      executablePath: chromiumPath,
      headless: true,
      args: chromiumArgs,
      timeout: 60_000,
    });
    browser.close = () => context.close();
    const page = await context.newPage();
    page.setDefaultTimeout(timeLimitMs);
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));
    await page.goto(served.url);
    await page.waitForFunction(() => 'lampwalkStoreBench' in globalThis);
    const figures = await Promise.race([
      page.evaluate(() => (globalThis as unknown as { lampwalkStoreBench: () => Promise<StoreFigures> }).lampwalkStoreBench()),
      new Promise<never>((_resolve, reject) => setTimeout(() => reject(new Error(`store bench took over ${timeLimitMs / 1000} s`)), timeLimitMs).unref()),
    ]);
    if (errors.length > 0) throw new Error(`store bench page errors: ${errors.join('; ')}`);
    return figures;
  } finally {
    await browser.close().catch(() => undefined);
    await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
    await rm(outDir, { recursive: true, force: true });
    await rm(profile, { recursive: true, force: true });
  }
}

// Run on its own: `node bin/run-ts.mjs bench/store.ts`.
if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  process.stdout.write(`${JSON.stringify({ store: await storeBench() }, null, 2)}\n`);
}
