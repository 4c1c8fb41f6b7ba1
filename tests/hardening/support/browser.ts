/**
 * Shared pieces of the hardening browser tests: one production build (service
 * worker included, built as `npm run build` does) served on 127.0.0.1, a
 * hard kill of a Chromium launched on a given profile, and the in-page
 * recorders for Content-Security-Policy violations and dialogs.
 *
 * The build, the server and the persistent-profile launch are those of
 * tests/offline/support.ts; nothing here downloads a browser.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { cp, mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { buildApp, serveFolder, type StaticServer } from '../../offline/support.ts';

/** A production build served from 127.0.0.1. */
export interface BuiltApp {
  server: StaticServer;
  /** The build folder. */
  dir: string;
  /** A scratch folder for profiles and downloads, removed by `close`. */
  work: string;
  close(): Promise<void>;
}

/**
 * Builds the app once (production mode, in a child process) and serves it.
 * LAMPWALK_HARDENING_BUILD names a build folder made beforehand to serve
 * instead (it is copied, never changed).
 *
 * @example const app = await buildAndServeProduction('crash') //=> app.server.url is 'http://127.0.0.1:<port>/'
 */
export async function buildAndServeProduction(label: string): Promise<BuiltApp> {
  const work = await mkdtemp(join(tmpdir(), `lampwalk-hardening-${label}-`));
  const dir = join(work, 'build');
  const prebuilt = process.env.LAMPWALK_HARDENING_BUILD;
  if (prebuilt) await cp(prebuilt, dir, { recursive: true });
  else await buildApp(dir, `hardening-${label}`);
  const server = await serveFolder(dir);
  return {
    server,
    dir,
    work,
    close: async () => {
      await server.close();
      await rm(work, { recursive: true, force: true });
    },
  };
}

/** The process ids of Linux, with each one's parent and command line. */
function processTable(): { pid: number; ppid: number; cmdline: string }[] {
  const table: { pid: number; ppid: number; cmdline: string }[] = [];
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    try {
      const stat = readFileSync(`/proc/${name}/stat`, 'utf8');
      // The command name (field 2) may hold spaces and parentheses: the parent id follows the last ')'.
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      const cmdline = readFileSync(`/proc/${name}/cmdline`, 'utf8').split('\0').join(' ');
      table.push({ pid: Number(name), ppid, cmdline });
    } catch {
      // The process ended while being read.
    }
  }
  return table;
}

/**
 * The Chromium browser process started on `profileDir` (the one whose command
 * line names that profile and that is no renderer, GPU or utility child), and
 * every process below it.
 *
 * @example browserProcesses(profile) //=> { main: 41234, all: [41234, 41240, 41262, …] }
 */
export function browserProcesses(profileDir: string): { main: number; all: number[] } {
  const table = processTable();
  const mains = table.filter((row) => row.cmdline.includes(`--user-data-dir=${profileDir}`) && !row.cmdline.includes('--type='));
  if (mains.length !== 1) throw new Error(`expected one Chromium browser process on ${profileDir}, found ${mains.length}`);
  const main = mains[0]!.pid;
  const all = [main];
  for (let i = 0; i < all.length; i++) for (const row of table) if (row.ppid === all[i] && !all.includes(row.pid)) all.push(row.pid);
  return { main, all };
}

/**
 * Kills the Chromium running on `profileDir` with SIGKILL, the browser
 * process first and then every child (renderers, the storage and network
 * services), with no chance to flush or close anything. Resolves once they
 * are gone.
 *
 * @example await killBrowser(profile) //=> 6 (processes killed)
 */
export async function killBrowser(profileDir: string): Promise<number> {
  const { all } = browserProcesses(profileDir);
  for (const pid of all) {
    try {
      process.kill(pid, 'SIGKILL');
    } catch {
      // Already gone (a child that exited with its parent).
    }
  }
  const alive = (pid: number) => {
    try {
      process.kill(pid, 0);
      // A killed child stays a zombie until its parent reaps it: dead all the same.
      const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
      return !stat.slice(stat.lastIndexOf(')') + 2).startsWith('Z');
    } catch {
      return false;
    }
  };
  const deadline = Date.now() + 10_000;
  while (all.some(alive)) {
    if (Date.now() > deadline) throw new Error(`Chromium processes still alive 10 s after SIGKILL: ${all.filter(alive).join(', ')}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  return all.length;
}

/** What the page recorder saw (see {@link recordPolicyViolations}). */
export interface PageRecord {
  violations: string[];
  dialogs: string[];
}

/**
 * Records, in every page of `context` from its first script on, each
 * Content-Security-Policy violation (`securitypolicyviolation` events) and
 * each dialog (alert, confirm, prompt), which an injected payload would open.
 * Call before opening any page.
 *
 * @example const record = await recordPolicyViolations(context) //=> record.violations stays [] on a clean walk
 */
export async function recordPolicyViolations(context: BrowserContext): Promise<PageRecord> {
  const record: PageRecord = { violations: [], dialogs: [] };
  await context.exposeBinding('__lampwalkViolation', (_source, text: string) => {
    record.violations.push(text);
  });
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      const report = (window as unknown as { __lampwalkViolation: (text: string) => void }).__lampwalkViolation;
      report(`${event.effectiveDirective} blocked ${event.blockedURI || '(inline)'} at ${event.sourceFile}:${event.lineNumber}`);
    });
  });
  const watch = (page: Page) =>
    page.on('dialog', (dialog) => {
      record.dialogs.push(`${dialog.type()}: ${dialog.message()}`);
      dialog.dismiss().catch(() => undefined);
    });
  context.pages().forEach(watch);
  context.on('page', watch);
  return record;
}
