/**
 * A full disk, in Chromium. Chromium reports a full disk when a transaction
 * commits: the writes seemed to succeed, then the transaction aborts with a
 * `QuotaExceededError` (common practice, no published source: that is how
 * Chromium's IndexedDB backend fails a commit over quota). A small shim,
 * installed before the app's scripts, does exactly that to every read-write
 * transaction while `window.__lampwalkDiskFull` is true, so the real app, the
 * real store and the real database go through the failure.
 *
 * Checked: the screen says the device is full, that nothing of the change was
 * saved, and what to do (download a backup, free space); what was saved
 * before is still stored and shows after a reload; once space is free again
 * the very next edit saves (the autosave queue is not stuck) and the error
 * goes away; a structural edit (adding a room) fails with the same message,
 * which stays on screen until closed.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { toStoreError } from '../../src/survey/store-error.ts';
import type { OfflineHandle } from '../../src/ui/offline/mount.tsx';
import { messageOf } from '../../src/ui/state/errors.ts';
import { hasChromium, launch } from '../offline/support.ts';
import { buildAndServeProduction, type BuiltApp } from './support/browser.ts';

type WithHandle = Window & { lampwalkOffline: OfflineHandle; __lampwalkDiskFull?: boolean };
const entryHash = '#/s/demo-tallowmere/r/demo-shop/e/demo-shop-troffers';
const entryId = 'demo-shop-troffers';

/** Makes every read-write transaction fail at commit with QuotaExceededError while `window.__lampwalkDiskFull` is set. */
function diskFullShim(): void {
  for (const method of ['put', 'add', 'delete', 'clear'] as const) {
    const original = IDBObjectStore.prototype[method] as (this: IDBObjectStore, ...args: unknown[]) => IDBRequest;
    Object.defineProperty(IDBObjectStore.prototype, method, {
      configurable: true,
      writable: true,
      value: function (this: IDBObjectStore, ...args: unknown[]): IDBRequest {
        const request = original.apply(this, args);
        if ((window as unknown as WithHandle).__lampwalkDiskFull) {
          const tx = this.transaction;
          request.addEventListener('success', () => {
            Object.defineProperty(tx, 'error', { configurable: true, get: () => new DOMException('The quota has been exceeded.', 'QuotaExceededError') });
            try {
              tx.abort();
            } catch {
              // Already aborted by an earlier write of the same transaction.
            }
          });
        }
        return request;
      },
    });
  }
}

async function setDiskFull(page: Page, full: boolean): Promise<void> {
  await page.evaluate((value) => {
    (window as unknown as WithHandle).__lampwalkDiskFull = value;
  }, full);
}

async function saved(page: Page): Promise<void> {
  await page.waitForFunction(() => {
    const status = document.querySelector('[data-testid="save-status"]');
    return status?.getAttribute('data-pending') === '0' && (status.textContent ?? '').includes('Saved on this device');
  });
}

async function storedEntry(page: Page): Promise<{ count: number; notes: string }> {
  return page.evaluate(async (id) => {
    const entry = await (await (window as unknown as WithHandle).lampwalkOffline.store()).getEntry(id);
    return { count: entry.count, notes: entry.notes };
  }, entryId);
}

let app: BuiltApp;

describe('the full-disk message', () => {
  it('says what happened, that nothing was lost, and where the backup button is', () => {
    const quota = messageOf(toStoreError(new DOMException('The quota has been exceeded.', 'QuotaExceededError'), 'save the entry'));
    expect(quota).toMatch(/^Could not save the entry: this device has no storage space left/);
    expect(quota).toContain('everything saved before is unchanged');
    expect(quota).toContain('“Back up everything” is on the surveys list');
    // Only a full disk points at the backup button.
    expect(messageOf(toStoreError(new DOMException('gone', 'InvalidStateError'), 'save the entry'))).not.toContain('Back up everything');
  });
});

describe.skipIf(!hasChromium())('a full disk, in Chromium', () => {
  beforeAll(async () => {
    app = await buildAndServeProduction('quota');
  }, 180_000);
  afterAll(async () => app?.close());

  it('says so clearly, keeps what was saved, and saves again once there is room', async () => {
    const browser = await launch(`${app.work}/profile`);
    const { page, context } = browser;
    try {
      await context.addInitScript(diskFullShim);
      await page.goto(`${app.server.url}${entryHash}`);
      await page.getByTestId('live-panel').waitFor();
      const count = page.getByTestId('entry-count');
      const notes = page.getByLabel('Notes', { exact: true });

      // Saved before the disk fills.
      await count.fill('5');
      await notes.fill('checked before the disk filled');
      await saved(page);
      expect(await storedEntry(page)).toEqual({ count: 5, notes: 'checked before the disk filled' });

      // The disk is full: the edit fails, and the screen says why and what to do.
      await setDiskFull(page, true);
      await count.fill('9');
      const alert = page.locator('[data-testid="save-status"][role="alert"]');
      await alert.waitFor();
      const message = await alert.innerText();
      expect(message).toMatch(/^Not saved:/);
      expect(message).toContain('no storage space left');
      expect(message).toContain('Nothing from this change was saved');
      expect(message).toMatch(/Download a backup/);
      expect(message).toMatch(/free some space/);
      expect(message).toContain('“Back up everything” is on the surveys list');
      expect(message).not.toMatch(/QuotaExceededError|DOMException|undefined/);
      // Nothing of it was written; what was saved before is intact.
      expect(await storedEntry(page)).toEqual({ count: 5, notes: 'checked before the disk filled' });
      // Leaving the field, the screen shows what is stored again.
      await count.blur();
      await expect.poll(() => count.inputValue()).toBe('5');
      expect(await page.getByTestId('entry-count').getAttribute('aria-invalid')).toBe('false');
      // Likewise a text field: its refused text does not stay on screen as if saved.
      await notes.fill('typed while the disk was full');
      await expect.poll(() => storedEntry(page)).toEqual({ count: 5, notes: 'checked before the disk filled' });
      await notes.blur();
      await expect.poll(() => notes.inputValue()).toBe('checked before the disk filled');

      // A structural edit fails the same way, with the message in the notice area.
      await page.goto(`${app.server.url}#/s/demo-tallowmere`);
      await page.getByTestId('add-room').click();
      await page.getByTestId('new-room-name').fill('Store room');
      await page.getByTestId('new-room-length').fill('3');
      await page.getByTestId('new-room-width').fill('2');
      await page.getByTestId('new-room-ceiling').fill('2.5');
      const roomsBefore = await page.evaluate(async () => (await (await (window as unknown as WithHandle).lampwalkOffline.store()).listRooms('demo-tallowmere')).length);
      await page.getByTestId('new-room-add').click();
      const notice = page.getByTestId('notice');
      await notice.waitFor();
      expect(await notice.innerText()).toContain('no storage space left');
      // An error notice stays until closed (an information notice goes after 12 s).
      await page.waitForTimeout(12_500);
      expect(await notice.innerText()).toContain('no storage space left');
      expect(await page.evaluate(async () => (await (await (window as unknown as WithHandle).lampwalkOffline.store()).listRooms('demo-tallowmere')).length)).toBe(roomsBefore);

      // Space is free again: the very next edit saves, with no reload.
      await page.goto(`${app.server.url}${entryHash}`);
      await page.getByTestId('live-panel').waitFor();
      await setDiskFull(page, false);
      await count.fill('12');
      await saved(page);
      expect(await page.locator('[data-testid="save-status"][role="alert"]').count()).toBe(0);
      expect(await storedEntry(page)).toEqual({ count: 12, notes: 'checked before the disk filled' });

      // And after a reload the screen shows the saved values.
      await page.reload();
      await page.getByTestId('live-panel').waitFor();
      expect(await count.inputValue()).toBe('12');
      expect(await notes.inputValue()).toBe('checked before the disk filled');
      expect(browser.errors).toEqual([]);
      console.log('full disk: 2 field edits and 1 new room refused with the message; earlier values intact; the next edit saved');
    } finally {
      await browser.close();
    }
  }, 120_000);
});
