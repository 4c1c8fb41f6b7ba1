/**
 * A database written by a newer Lampwalk, in Chromium (Debian's, through
 * playwright-core; the production build served on 127.0.0.1). The database
 * "lampwalk" is created at this build's schema version + 1 with records of
 * its own, straight through IndexedDB; then the app is opened, twice. It must
 * show the newer-version message and must neither upgrade, delete, seed nor
 * change anything: the version and every record are the same afterwards, and
 * no usage marker is written (a marker would later make a real first run look
 * like an eviction). The same in fake-indexeddb is in
 * tests/store/migrations.test.ts ("a database written by a newer Lampwalk").
 * Common practice, no published source: an app must never downgrade data it
 * does not understand.
 */
import type { Page } from 'playwright-core';
import { expect, it } from 'vitest';
import { schemaVersion } from '../../src/survey/db.ts';
import { openBrowser } from '../ui/support/browser.ts';
import { browserTests, serveAppForFile } from '../ui/support/suite.ts';

const app = serveAppForFile(240_000);

interface Dump {
  version: number;
  stores: Record<string, unknown[]>;
}

/** Every store and record of database `name`, read in the page (opened without a version, so nothing is upgraded). */
async function dumpInPage(page: Page, name: string): Promise<Dump> {
  return page.evaluate(
    (dbName) =>
      new Promise<Dump>((resolve, reject) => {
        const request = indexedDB.open(dbName);
        request.onerror = () => reject(request.error);
        request.onsuccess = () => {
          const db = request.result;
          const names = [...db.objectStoreNames];
          const tx = db.transaction(names, 'readonly');
          const stores: Record<string, unknown[]> = {};
          for (const storeName of names) {
            const all = tx.objectStore(storeName).getAll();
            all.onsuccess = () => {
              stores[storeName] = all.result;
            };
          }
          tx.oncomplete = () => {
            db.close();
            resolve({ version: db.version, stores });
          };
          tx.onerror = () => reject(tx.error);
        };
      }),
    name,
  );
}

browserTests('a database from a newer Lampwalk, in Chromium', () => {
  it('the app says so, and leaves the database exactly as it was (version and records)', async () => {
    const browser = await openBrowser();
    try {
      const { page } = browser;
      // Any page of the app's origin will do to write the database before the app ever starts.
      await page.goto(`${app.url}manifest.webmanifest`);
      const newerVersion = schemaVersion + 1;
      await page.evaluate(
        ({ version }) =>
          new Promise<void>((resolve, reject) => {
            const request = indexedDB.open('lampwalk', version);
            request.onupgradeneeded = () => {
              const db = request.result;
              db.createObjectStore('surveys', { keyPath: 'id' });
              db.createObjectStore('settings', { keyPath: 'key' });
              db.createObjectStore('sketches', { keyPath: 'id' });
            };
            request.onerror = () => reject(request.error);
            request.onsuccess = () => {
              const db = request.result;
              const tx = db.transaction(['surveys', 'settings', 'sketches'], 'readwrite');
              tx.objectStore('surveys').put({ id: 'future-survey', name: 'Written by a newer build', shape: 'unknown to this build' });
              tx.objectStore('surveys').put({ id: 'future-survey-2', name: 'Another', rooms: 3 });
              tx.objectStore('settings').put({ key: 'app', installId: 'newer-install', firstUsedAt: '2027-01-01T00:00:00Z', somethingNew: true });
              tx.objectStore('sketches').put({ id: 'sketch-1', svg: '<svg/>' });
              tx.oncomplete = () => {
                db.close();
                resolve();
              };
              tx.onerror = () => reject(tx.error);
            };
          }),
        { version: newerVersion },
      );
      const before = await dumpInPage(page, 'lampwalk');
      expect(before.version).toBe(newerVersion);
      const recordsBefore = Object.values(before.stores).reduce((sum, records) => sum + records.length, 0);
      expect(recordsBefore).toBe(4);

      const shown: string[] = [];
      for (let visit = 0; visit < 2; visit++) {
        await page.goto(app.url);
        const alert = page.getByRole('alert').filter({ hasText: 'saved by a newer version of Lampwalk' });
        await alert.waitFor();
        shown.push(await alert.innerText());
      }
      for (const text of shown) {
        expect(text).toMatch(/Nothing was changed/);
        expect(text).toMatch(/Reload the page to get the newer version/);
      }
      // No survey screen, no seeded demo.
      expect(await page.getByRole('heading', { name: /Tallowmere|Surveys/ }).count()).toBe(0);

      const after = await dumpInPage(page, 'lampwalk');
      expect(after).toEqual(before);
      const markers = await page.evaluate(() => ({ local: localStorage.getItem('lampwalk.usage'), cookie: document.cookie.includes('lampwalk_usage') }));
      expect(markers).toEqual({ local: null, cookie: false });
      expect(browser.errors).toEqual([]);
      console.log(
        `versions (Chromium): database at version ${newerVersion} (this build: ${schemaVersion}) refused on ${shown.length} visits with the newer-version message; ` +
          `version and ${recordsBefore} records in ${Object.keys(before.stores).length} stores unchanged, no marker written`,
      );
    } finally {
      await browser.close();
    }
  });
});
