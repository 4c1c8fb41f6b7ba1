/**
 * Lampwalk with no signal, in Debian's Chromium: the production build and its
 * Workbox service worker, served from 127.0.0.1. "Offline" means both the
 * browser's offline switch and a server that refuses and records every
 * request, so nothing can quietly come from the network.
 *
 * Two builds are made once (A and B, differing only in LAMPWALK_BUILD_ID) and
 * reused. The tests reach the store and the export code through the small
 * handle `src/ui/offline/mount.tsx` puts on `window.lampwalkOffline`.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { OfflineHandle } from '../../src/ui/offline/mount.tsx';
import { buildApp, deploy, hasChromium, launch, listFiles, precacheFiles, runningBuild, serveFolder, waitForOfflineReady, type StaticServer } from './support.ts';

const slow = 240_000;

let work = '';
let buildA = '';
let buildB = '';

/** The handle, typed, inside `page.evaluate`. */
type WithHandle = Window & { lampwalkOffline: OfflineHandle };

/**
 * What the page asked of the server while it was off, less the browser's own
 * check for a newer `sw.js` (which fails harmlessly with no signal).
 */
function appRequests(refused: readonly string[]): string[] {
  return refused.filter((path) => path !== '/sw.js');
}

async function appRendered(page: Page): Promise<void> {
  await page.waitForFunction(() => (document.getElementById('app')?.childElementCount ?? 0) > 0);
}

describe.skipIf(!hasChromium())('offline, in Chromium', () => {
  beforeAll(async () => {
    work = await mkdtemp(join(tmpdir(), 'lampwalk-offline-test-'));
    buildA = join(work, 'build-a');
    buildB = join(work, 'build-b');
    // One build at a time: two at once only slow each other on two cores.
    await buildApp(buildA, 'test-a');
    await buildApp(buildB, 'test-b');
  }, slow);

  afterAll(async () => {
    if (work) await rm(work, { recursive: true, force: true });
  });

  describe('one profile: online once, then offline', () => {
    let server: StaticServer;
    const profile = () => join(work, 'profile-field');
    let surveyId = '';

    beforeAll(async () => {
      await deploy(buildA, join(work, 'served-field'));
      server = await serveFolder(join(work, 'served-field'));
    });
    afterAll(async () => server?.close());

    test(
      'after one online visit the app opens offline, saves a survey with a room and an entry, and exports a PDF',
      async () => {
        const browser = await launch(profile());
        try {
          const { page, context } = browser;
          await page.goto(server.url);
          await appRendered(page);
          await waitForOfflineReady(page);

          await context.setOffline(true);
          server.setNetwork(false);
          await page.reload();
          await appRendered(page);
          await page.getByText(/No signal:/).waitFor();

          const saved = await page.evaluate(async () => {
            const lw = (window as unknown as WithHandle).lampwalkOffline;
            const store = await lw.store();
            const [template] = await store.listSurveys();
            if (!template) throw new Error('no survey to copy settings from');
            const demo = await store.loadSurvey(template.id);
            const { id: _id, rooms, createdAt: _c, updatedAt: _u, ...fields } = demo;
            const room = rooms.find((r) => r.entries.length > 0);
            if (!room) throw new Error('the demo has no room with entries');
            const { id: _roomId, entries, ...roomFields } = room;
            const { id: _entryId, ...entryFields } = entries[0]!;
            const survey = await lw.edit((s) => s.createSurvey({ ...fields, name: 'Basement plant room (offline)' }));
            const newRoom = await lw.edit((s) => s.addRoom(survey.id, { ...roomFields, name: 'Plant room B2' }));
            await lw.edit((s) => s.addEntry(newRoom.id, { ...entryFields, count: 7, notes: 'logged with no signal' }));
            const back = await store.loadSurvey(survey.id);
            const result = await lw.calculate(back);
            const code = await lw.exportCode();
            const file = await code.clientReport.run(new AbortController().signal, { survey: back, result }, { companyName: 'Offline Test Audits', date: new Date(2026, 0, 15) });
            return {
              surveyId: survey.id,
              rooms: back.rooms.map((r) => ({ name: r.name, counts: r.entries.map((e) => e.count), notes: r.entries.map((e) => e.notes) })),
              pdfHead: new TextDecoder().decode(file.bytes.slice(0, 5)),
              pdfBytes: file.bytes.length,
              mimeType: file.mimeType,
            };
          });
          surveyId = saved.surveyId;
          expect(saved.rooms).toEqual([{ name: 'Plant room B2', counts: [7], notes: ['logged with no signal'] }]);
          expect(saved.pdfHead).toBe('%PDF-');
          expect(saved.pdfBytes).toBeGreaterThan(1000);
          expect(saved.mimeType).toBe('application/pdf');

          // Nothing reached the server while offline, and everything asked for stayed on the app's origin.
          expect(appRequests(server.refused)).toEqual([]);
          expect(browser.requests.foreign(server.origin)).toEqual([]);
          expect(browser.errors).toEqual([]);
        } finally {
          await browser.close();
        }
      },
      slow,
    );

    test(
      'closing the browser and opening it again offline on the same profile brings back the app and the data',
      async () => {
        expect(surveyId, 'the previous test created the survey').not.toBe('');
        server.setNetwork(false);
        const browser = await launch(profile(), { offline: true });
        try {
          const { page } = browser;
          await page.goto(server.url);
          await appRendered(page);
          await page.getByText(/No signal:/).waitFor();
          const found = await page.evaluate(async (id) => {
            const lw = (window as unknown as WithHandle).lampwalkOffline;
            const survey = await (await lw.store()).loadSurvey(id);
            return { name: survey.name, rooms: survey.rooms.map((r) => [r.name, r.entries.map((e) => e.notes)]) };
          }, surveyId);
          expect(found).toEqual({ name: 'Basement plant room (offline)', rooms: [['Plant room B2', ['logged with no signal']]] });
          expect(appRequests(server.refused)).toEqual([]);
          expect(browser.requests.foreign(server.origin)).toEqual([]);
          expect(browser.errors).toEqual([]);
        } finally {
          await browser.close();
          server.setNetwork(true);
        }
      },
      slow,
    );
  });

  test('the precache holds every script, style and page of the build, the export code included, and no sourcemap', async () => {
    const files = await listFiles(buildA);
    const precached = (await precacheFiles(buildA)).map((f) => f.url);
    const needed = files.filter((f) => /\.(js|css|html|woff2)$/.test(f) && f !== 'sw.js' && !/^workbox-[\w-]+\.js$/.test(f));
    expect(needed.length).toBeGreaterThan(3);
    for (const file of needed) expect(precached, file).toContain(file);
    expect(precached.filter((url) => url.endsWith('.map'))).toEqual([]);
    expect(precached).toContain('index.html');
    // Listed once: the manifest plugin adds it, the glob patterns leave it out.
    expect(precached.filter((url) => url === 'manifest.webmanifest')).toHaveLength(1);
    // The export code (jsPDF with it) is a chunk of its own, precached.
    const exportChunks: string[] = [];
    for (const url of precached.filter((u) => u.endsWith('.js'))) {
      if ((await readFile(join(buildA, url), 'utf8')).includes('Lighting upgrade assessment')) exportChunks.push(url);
    }
    expect(exportChunks).toHaveLength(1);
    // jsPDF's optional HTML/SVG helpers are left out: none of their code is in any script
    // (each string below is in its library and not in jsPDF itself).
    const bundled = (await Promise.all(precached.filter((u) => u.endsWith('.js')).map((u) => readFile(join(buildA, u), 'utf8')))).join('\n');
    expect(bundled).toContain('Lampwalk does not bundle this optional jsPDF helper');
    expect(bundled).not.toContain('html2canvas.hertzen.com'); // html2canvas
    expect(bundled).not.toContain('ALLOWED_TAGS'); // dompurify
    expect(bundled).not.toContain('forkString'); // canvg
  });

  test(
    'Chromium finds the app installable and its manifest free of errors; the install hint reacts to the install prompt',
    async () => {
      await deploy(buildA, join(work, 'served-install'));
      const server = await serveFolder(join(work, 'served-install'));
      const browser = await launch(join(work, 'profile-install'));
      try {
        const { page, context } = browser;
        await page.goto(server.url);
        await appRendered(page);
        await waitForOfflineReady(page);
        const cdp = await context.newCDPSession(page);
        const manifest = (await cdp.send('Page.getAppManifest')) as { url: string; errors: { message: string }[]; data?: string };
        expect(manifest.errors).toEqual([]);
        expect(manifest.url).toBe(`${server.origin}/manifest.webmanifest`);
        const data = JSON.parse(manifest.data ?? '{}') as Record<string, unknown>;
        expect(data).toMatchObject({ name: 'Lampwalk', display: 'standalone', start_url: '.', scope: '.', theme_color: '#1d3b34', background_color: '#f7f5ef' });
        const { installabilityErrors } = (await cdp.send('Page.getInstallabilityErrors')) as { installabilityErrors: { errorId: string }[] };
        expect(installabilityErrors).toEqual([]);
        // Icons named by the manifest and the page load from the server.
        for (const path of ['/icons/icon-192.png', '/icons/icon-512.png', '/icons/maskable-192.png', '/icons/maskable-512.png', '/icons/apple-touch-icon.png', '/icons/icon.svg']) {
          const response = await page.request.get(`${server.origin}${path}`);
          expect(response.status(), path).toBe(200);
        }

        // Where the browser offers installation, the hint shows an Install button that opens the browser's dialog.
        await page.evaluate(() => {
          const event = Object.assign(new Event('beforeinstallprompt', { cancelable: true }), {
            prompt: async () => {
              document.body.dataset.installPrompted = 'yes';
            },
            userChoice: Promise.resolve({ outcome: 'dismissed' as const, platform: 'web' }),
          });
          window.dispatchEvent(event);
          document.body.dataset.installPromptPrevented = String(event.defaultPrevented);
        });
        await page.getByRole('button', { name: 'Install Lampwalk' }).click();
        const prompted = await page.evaluate(() => ({ asked: document.body.dataset.installPrompted === 'yes', prevented: document.body.dataset.installPromptPrevented === 'true' }));
        expect(prompted).toEqual({ asked: true, prevented: true });

        // Where it does not (Safari on iPhone), one sentence says why and how.
        const iphone = await context.newPage();
        const iphoneCdp = await context.newCDPSession(iphone);
        await iphoneCdp.send('Emulation.setUserAgentOverride', {
          userAgent: 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Mobile/15E148 Safari/604.1',
        });
        await iphone.addInitScript(() => {
          Reflect.deleteProperty(window, 'onbeforeinstallprompt');
        });
        await iphone.goto(server.url);
        await appRendered(iphone);
        const hint = iphone.getByRole('complementary', { name: 'Install Lampwalk' });
        await hint.waitFor();
        await expect(hint.textContent()).resolves.toContain('tap Share, then Add to Home Screen');
        await expect(hint.textContent()).resolves.toContain('automatic clean-up');
        await iphone.close();

        expect(browser.requests.foreign(server.origin)).toEqual([]);
        expect(browser.errors).toEqual([]);
      } finally {
        await browser.close();
        await server.close();
      }
    },
    slow,
  );

  test(
    'an update waits for the user, saves the edit still in progress, then runs the new version',
    async () => {
      const served = join(work, 'served-update');
      await deploy(buildA, served);
      const server = await serveFolder(served);
      const browser = await launch(join(work, 'profile-update'));
      try {
        const { page } = browser;
        await page.goto(server.url);
        await appRendered(page);
        await waitForOfflineReady(page);
        expect(await runningBuild(page)).toBe('test-a');

        // Build B goes live; the next visit finds it.
        await deploy(buildB, served);
        await page.reload();
        await appRendered(page);
        await page.getByText('Update available').waitFor();
        const update = page.getByRole('button', { name: 'Update now' });

        // Nothing reloads by itself: still build A a while later.
        await page.waitForTimeout(1500);
        expect(await runningBuild(page)).toBe('test-a');

        // "Later" folds the notice into the status line, which brings it back.
        await page.getByRole('button', { name: 'Later' }).click();
        expect(await update.count()).toBe(0);
        await page.getByRole('button', { name: 'Update available' }).click();
        await update.waitFor();

        // An edit whose save is still running when the user accepts the update.
        const surveyId = await page.evaluate(async () => {
          const lw = (window as unknown as WithHandle).lampwalkOffline;
          const [first] = await (await lw.store()).listSurveys();
          if (!first) throw new Error('no survey');
          void lw.edit(async (store) => {
            await new Promise((resolve) => setTimeout(resolve, 1500));
            return store.updateSurvey(first.id, { name: 'Renamed just before the update' });
          });
          return first.id;
        });
        const reloaded = page.waitForEvent('framenavigated', { timeout: 30_000 });
        await update.click();
        await page.getByText('Saving edits and updating').waitFor();
        await reloaded;
        await appRendered(page);
        await page.waitForFunction(() => document.querySelector('[data-build]')?.getAttribute('data-build') === 'test-b');

        const after = await page.evaluate(async (id) => {
          const lw = (window as unknown as WithHandle).lampwalkOffline;
          return { build: lw.buildId, name: (await (await lw.store()).loadSurvey(id)).name };
        }, surveyId);
        expect(after).toEqual({ build: 'test-b', name: 'Renamed just before the update' });
        await page.getByText(/Ready to work offline/).waitFor();
        expect(await page.getByText('Update available').count()).toBe(0);
        expect(browser.requests.foreign(server.origin)).toEqual([]);
        expect(browser.errors).toEqual([]);
      } finally {
        await browser.close();
        await server.close();
      }
    },
    slow,
  );

  test(
    'a first visit, the survey screens and an online export ask nothing of any other origin',
    async () => {
      await deploy(buildA, join(work, 'served-origin'));
      const server = await serveFolder(join(work, 'served-origin'));
      const browser = await launch(join(work, 'profile-origin'));
      try {
        const { page } = browser;
        await page.goto(server.url);
        await appRendered(page);
        await waitForOfflineReady(page);
        // Open whatever links the first screen offers (the survey screens load their own chunks).
        const links = await page.locator('#app a[href^="#"]').evaluateAll((as) => as.map((a) => a.getAttribute('href') ?? '').slice(0, 6));
        for (const href of links) {
          await page.goto(new URL(href, server.url).href);
          await appRendered(page);
          await page.waitForLoadState('networkidle');
        }
        const pdfHead = await page.evaluate(async () => {
          const lw = (window as unknown as WithHandle).lampwalkOffline;
          const store = await lw.store();
          const [first] = await store.listSurveys();
          if (!first) throw new Error('no survey');
          const survey = await store.loadSurvey(first.id);
          const code = await lw.exportCode();
          const file = await code.contractorQuote.run(new AbortController().signal, { survey, result: await lw.calculate(survey) }, { companyName: 'Origin Check', date: new Date(2026, 0, 15) });
          return new TextDecoder().decode(file.bytes.slice(0, 5));
        });
        expect(pdfHead).toBe('%PDF-');
        expect(browser.requests.urls.length).toBeGreaterThan(5);
        expect(browser.requests.foreign(server.origin)).toEqual([]);
        expect(browser.errors).toEqual([]);
      } finally {
        await browser.close();
        await server.close();
      }
    },
    slow,
  );
});
