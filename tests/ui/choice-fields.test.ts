/**
 * The fields automatic product choice reads, set through the screens in a real
 * browser (Debian's Chromium through playwright-core, production build served
 * on 127.0.0.1), on the demo survey:
 * 1. the room form's preferred colour temperature: 4000 K chosen, kept over a
 *    reload, and the suggestions screen turns down the 3500 K troffer kit for
 *    it with the ANSI C78.377 band;
 * 2. a catalog product's rated input voltage: out-of-range and crossed values
 *    get a message beside the field and are not saved; 120–120 V is saved,
 *    shown in the catalog line, and the suggestions screen turns the product
 *    down on a 277 V circuit;
 * 3. emptying either field removes it from the saved records (checked in the
 *    backup the app exports).
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { expect, it } from 'vitest';
import { cctBandKelvin } from '../../src/calc/choice.ts';
import { allSaved, backupEverything, openApp, openBrowser } from './support/browser.ts';
import { browserTests, serveAppForFile } from './support/suite.ts';

const app = serveAppForFile();

const demo = '#/s/demo-tallowmere';
const troffers = 'demo-shop-troffers';

/** The reasons shown for every product under the troffer entry's "Why not the others?". */
async function trofferReasons(page: Page, url: string): Promise<string[]> {
  await page.goto(`${url}${demo}/suggest`);
  const card = page.locator(`[data-testid="suggestion"][data-entry="${troffers}"]`);
  await card.getByTestId('alternatives').locator('summary').click();
  await card.getByTestId('candidate-reason').first().waitFor();
  // "Product name: reason", one line per product.
  return card.getByTestId('candidate').allInnerTexts();
}

browserTests('fields for automatic product choice', () => {
  it('preferred CCT and input voltage are typed, checked, saved, removed, and the suggestions give them as reasons', async () => {
    const browser = await openBrowser();
    const folder = await mkdtemp(join(tmpdir(), 'lampwalk-choice-fields-'));
    try {
      const { page } = browser;
      await openApp(page, app.url);
      await page.getByTestId('demo-banner').waitFor();

      // 1. The shop floor wants 4000 K.
      await page.goto(`${app.url}${demo}/r/demo-shop`);
      const cct = page.getByTestId('room-cct');
      expect(await cct.inputValue()).toBe('');
      await cct.selectOption('4000');
      await allSaved(page);

      // 2. The troffers are on a 277 V circuit.
      await page.goto(`${app.url}${demo}/r/demo-shop/e/${troffers}`);
      await page.getByLabel('Circuit voltage').fill('277');
      await allSaved(page);

      // The Type B tube is rated for 120 V only; what is out of range or crossed is refused beside the field.
      await page.goto(`${app.url}#/catalog/example-t8-typeb`);
      const low = page.getByTestId('product-volts-min');
      const high = page.getByTestId('product-volts-max');
      const messageOf = (field: typeof low) => field.locator('xpath=ancestor::div[contains(@class,"field ")][1]').locator('.field-message').innerText();
      await low.fill('1200');
      expect(await low.getAttribute('aria-invalid')).toBe('true');
      expect(await messageOf(low)).toContain('Must be between 1 and 1,000.');
      await low.fill('120');
      expect(await low.getAttribute('aria-invalid')).toBe('false');
      await high.fill('100');
      expect(await high.getAttribute('aria-invalid')).toBe('true');
      expect(await messageOf(high)).toContain('Must not be below the lowest (120 V).');
      await high.fill('120');
      expect(await high.getAttribute('aria-invalid')).toBe('false');
      await allSaved(page);
      await page.goto(`${app.url}#/catalog`);
      const row = page.locator('[data-testid="product-row"][href$="example-t8-typeb"]');
      expect(await row.innerText()).toContain('CRI 82, 120 V');

      // After a reload (so from what was stored), the suggestions give both reasons.
      await page.goto(`${app.url}${demo}/r/demo-shop`);
      await page.reload();
      expect(await page.getByTestId('room-cct').inputValue()).toBe('4000');
      const reasons = await trofferReasons(page, app.url);
      // ANSI C78.377 nominal 4000 K: 3985 K ± 275 K (from memory, the table in src/calc/choice.ts).
      const band = cctBandKelvin(4000);
      expect([Math.round(band.minKelvin), Math.round(band.maxKelvin)]).toEqual([3710, 4260]);
      expect(reasons.some((line) => line.includes('3500 K is outside the 3710–4260 K band of the 4000 K wanted here'))).toBe(true);
      const tubeLine = (lines: string[]) => lines.find((line) => line.startsWith('4 ft T8 tube 15 W')) ?? '';
      expect(tubeLine(reasons)).toContain('rated 120–120 V; this circuit is 277 V');

      // 3. "No preference" and an emptied voltage remove the fields.
      await page.goto(`${app.url}${demo}/r/demo-shop`);
      await page.getByTestId('room-cct').selectOption('');
      await allSaved(page);
      await page.goto(`${app.url}#/catalog/example-t8-typeb`);
      await page.getByTestId('product-volts-max').fill('');
      expect(await page.getByTestId('product-volts-max').getAttribute('aria-invalid')).toBe('false');
      await allSaved(page);
      const file = await backupEverything(page, app.url, folder);
      const room = file.surveys.find((survey) => survey.id === 'demo-tallowmere')?.rooms.find((item) => item.id === 'demo-shop');
      const tube = file.catalog.find((product) => product.id === 'example-t8-typeb');
      if (!room || !tube) throw new Error('the backup lacks the demo shop floor or the Type B tube');
      expect('preferredCctKelvin' in room).toBe(false);
      expect(tube.inputVoltsMin).toBe(120);
      expect('inputVoltsMax' in tube).toBe(false);
      expect(room.entries.find((entry) => entry.id === troffers)?.conditions.circuitVolts).toBe(277);
      const after = await trofferReasons(page, app.url);
      expect(after.some((line) => line.includes('K band of the'))).toBe(false);
      // Only the lowest end known: 277 V is above it, so nothing rules the tube out on voltage.
      expect(tubeLine(after)).not.toContain('this circuit is 277 V');
      expect(tubeLine(after)).not.toBe('');
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
      await rm(folder, { recursive: true, force: true });
    }
  }, 180_000);
});
