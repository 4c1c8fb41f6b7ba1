/**
 * The field screens in a real browser (Debian's Chromium through
 * playwright-core, production build served on 127.0.0.1):
 * 1. the walk — a survey, a room, three entries including a non-dimmable
 *    lamp on a dimmed circuit, the warning, a reload, and the totals on
 *    screen equal to `lampwalk calc` on the backup exported from the screen;
 * 2. axe-core finds no WCAG 2.2 A/AA violation on any screen, light or dark
 *    (and in the sunlight theme);
 * 3. invalid numbers show a message beside the field and nothing wrong is saved;
 * 4. taps to repeat a fixture and to add a common one.
 * Expected figures come from the calculation engine itself, through the CLI
 * (common practice, no published source: the screen must agree with the engine).
 */
import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import type { SurveyResult } from '../../src/calc/survey.ts';
import { demoLandlordSurveys } from '../../src/survey/demo.ts';
import { parseSurveyFileText } from '../../src/survey/validate.ts';
import { totalsText } from '../../src/ui/state/totals.ts';
import { uiFigures } from '../../src/ui/state/format.ts';
import { allSaved, axeViolations, openAllDetails, openApp, openBrowser, projectRoot, type AxeViolation } from './support/browser.ts';
import { demoScreens } from './support/demo-screens.ts';
import { browserTests, serveAppForFile } from './support/suite.ts';
import { addCommonFixture, repeatLastFixture } from './support/taps.ts';

const app = serveAppForFile();

async function noNaN(page: Page): Promise<void> {
  expect(await page.locator('body').innerText()).not.toMatch(/NaN|Infinity|undefined/);
}

browserTests('the walk', () => {
  it('creates a survey, a room and three entries; the dimmer warning shows; all survives a reload; totals equal the CLI', async () => {
    const browser = await openBrowser();
    const folder = await mkdtemp(join(tmpdir(), 'lampwalk-walk-'));
    try {
      const { page } = browser;
      // First run opens the demo survey, with one clear action to start a blank one.
      await openApp(page, app.url);
      await page.getByTestId('demo-banner').waitFor();
      await page.getByTestId('demo-new-survey').click();
      await page.locator('h1', { hasText: 'New survey' }).waitFor();

      // An energy price, typed with a decimal comma.
      // A new survey opens its assumptions, since the energy price is not set yet.
      expect(await page.locator('details', { has: page.locator('summary', { hasText: 'Assumptions' }) }).getAttribute('open')).not.toBeNull();
      await page.getByTestId('energy-rate').fill('0,15');
      await expect.poll(() => page.getByTestId('energy-rate').getAttribute('aria-invalid')).toBe('false');

      await page.getByTestId('add-room').click();
      await page.getByTestId('new-room-name').fill('Hall');
      await page.getByTestId('new-room-length').fill('5');
      await page.getByTestId('new-room-width').fill('4');
      await page.getByTestId('new-room-ceiling').fill('2.7');
      await page.getByTestId('new-room-add').click();
      await page.locator('h1', { hasText: 'Hall' }).waitFor();

      // 1: a 60 W lamp on a leading-edge dimmer, swapped to a non-dimmable LED lamp.
      await page.getByTestId('add-fixture').click();
      await page.getByTestId('pick-inc-60').click();
      await page.locator('h1', { hasText: 'Incandescent 60 W' }).waitFor();
      await page.getByTestId('cond-dimmer').selectOption('leading-edge');
      await page.getByRole('button', { name: /Show all \d+ products/ }).click();
      await page.getByTestId('product-pick').filter({ hasText: 'A19 lamp 9 W 800 lm 2700 K (non-dimmable)' }).click();
      await page.locator('[data-testid="entry-warnings"] [data-code="dimmer-non-dimmable"]').waitFor();
      expect(await page.locator('[data-code="dimmer-non-dimmable"]').innerText()).toContain('licensed electrician');
      await page.getByTestId('entry-done').click();

      // 2: two 2-lamp T8 troffers with the first product that fits.
      await page.getByTestId('add-fixture').click();
      await page.getByTestId('pick-f32t8-2-elec').click();
      await page.getByTestId('entry-count-plus').click();
      await page.getByTestId('product-pick').first().click();
      await page.locator('[data-testid="current-proposal"] strong').waitFor();
      await page.getByTestId('entry-done').click();

      // 3: the same again, in one tap.
      await page.getByTestId('repeat-last').click();
      await expect.poll(() => page.getByTestId('entry-row').count()).toBe(3);
      await page.locator('[data-testid="room-warnings"] [data-code="dimmer-non-dimmable"]').waitFor();
      await allSaved(page);

      // Everything is still there after a reload.
      await page.reload();
      await page.locator('h1', { hasText: 'Hall' }).waitFor();
      await expect.poll(() => page.getByTestId('entry-row').count()).toBe(3);
      await page.locator('[data-testid="room-warnings"] [data-code="dimmer-non-dimmable"]').waitFor();
      const rows = await page.getByTestId('entry-row').locator('.row-title').allInnerTexts();
      expect(rows).toEqual(['1 × Incandescent 60 W A-lamp', '2 × 2-lamp F32T8, electronic ballast', '2 × 2-lamp F32T8, electronic ballast']);
      await noNaN(page);

      // The totals on the overview…
      await page.locator('.back-link').click();
      await page.getByTestId('totals').waitFor();
      await noNaN(page);
      const shown: Record<string, string> = {};
      for (const id of ['total-kwh', 'total-kw', 'total-money', 'total-cost', 'total-payback', 'total-npv', 'total-irr', 'total-co2']) {
        shown[id] = await page.getByTestId(id).innerText();
      }

      // …equal `lampwalk calc` on the backup exported from the screen, formatted the same way.
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-backup').click()]);
      const backupPath = join(folder, download.suggestedFilename());
      await download.saveAs(backupPath);
      const parsed = parseSurveyFileText(await readFile(backupPath, 'utf8'));
      if (!parsed.ok) throw new Error(`the exported backup is not a valid survey file: ${JSON.stringify(parsed.problems)}`);
      const survey = parsed.file.surveys[0];
      if (!survey) throw new Error('the backup holds no survey');
      expect(survey.rooms[0]?.entries).toHaveLength(3);
      let out = '';
      const code = await main(['calc', backupPath], {
        stdout: (text) => (out += text),
        stderr: (text) => {
          throw new Error(text);
        },
        readFile: (path) => readFile(path, 'utf8'),
        readStdin: async () => '',
      });
      expect(code).toBe(0);
      const result = (JSON.parse(out) as { surveys: SurveyResult[] }).surveys[0];
      if (!result) throw new Error('lampwalk calc printed no survey');
      const expected = totalsText(survey, result, uiFigures(survey));
      for (const [id, text] of Object.entries(shown)) expect(text, id).toBe(expected[id]);
      expect(result.totals.entries).toBe(3);
      expect(result.totals.savings.kwhPerYear).toBeGreaterThan(0);
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
      await rm(folder, { recursive: true, force: true });
    }
  }, 180_000);
});

/** Opens every collapsed part of the screen (and the lists behind a tap) so axe sees all of it. */
async function revealAll(page: Page, screen: string): Promise<void> {
  await openAllDetails(page);
  if (screen === 'room') await page.getByTestId('add-fixture').click();
  if (screen === 'entry') {
    const showAll = page.getByRole('button', { name: /Show all \d+ products/ });
    if (await showAll.count()) await showAll.click();
  }
  if (screen === 'survey') await page.getByTestId('add-room').click();
}

browserTests('accessibility', () => {
  for (const theme of ['light', 'dark', 'sun'] as const) {
    it(`axe-core finds no WCAG 2.2 A/AA violation on any screen (${theme})`, async () => {
      const browser = await openBrowser({ width: 390, height: 844 }, theme === 'dark' ? 'dark' : 'light');
      try {
        const { page } = browser;
        await openApp(page, app.url);
        if (theme === 'sun') {
          await page.evaluate(() => localStorage.setItem('lampwalk.preferences', JSON.stringify({ theme: 'sun' })));
          await page.reload();
          await page.waitForFunction(() => document.documentElement.dataset.theme === 'sun');
        }
        const found: Record<string, AxeViolation[]> = {};
        for (const screen of demoScreens) {
          await page.goto(`${app.url}${screen.hash}`);
          await page.locator('h1').first().waitFor();
          await page.locator('main').first().waitFor();
          await revealAll(page, screen.name);
          const violations = await axeViolations(page);
          if (violations.length > 0) found[screen.name] = violations;
        }
        expect(found).toEqual({});
        expect(browser.errors).toEqual([]);
      } finally {
        await browser.close();
      }
    }, 180_000);
  }
});

browserTests('reach', () => {
  it('no screen scrolls sideways on a 320 px phone, and every control is at least 44 px or inline text', async () => {
    const browser = await openBrowser({ width: 320, height: 640 });
    try {
      const { page } = browser;
      await openApp(page, app.url);
      const wide: Record<string, number> = {};
      const small: Record<string, string[]> = {};
      for (const screen of demoScreens) {
        await page.goto(`${app.url}${screen.hash}`);
        await page.locator('h1').first().waitFor();
        await revealAll(page, screen.name);
        const width = await page.evaluate(() => document.documentElement.scrollWidth);
        if (width > 320) wide[screen.name] = width;
        const tooSmall = await page.evaluate(() =>
          [...document.querySelectorAll('main button, main select, main input:not([type="file"]):not([type="checkbox"]):not([type="radio"]), main summary, .topbar a')]
            .map((element) => ({ element, box: element.getBoundingClientRect() }))
            .filter(({ box }) => box.width > 0 && (box.height < 44 || box.width < 44))
            .map(({ element }) => (element.textContent ?? element.tagName).trim().slice(0, 40)),
        );
        if (tooSmall.length > 0) small[screen.name] = tooSmall;
      }
      expect(wide).toEqual({});
      expect(small).toEqual({});
    } finally {
      await browser.close();
    }
  }, 120_000);
});

browserTests('bad input', () => {
  it('shows a message beside each bad number, saves nothing wrong, and never shows NaN', async () => {
    const browser = await openBrowser();
    try {
      const { page } = browser;
      const entryHash = '#/s/demo-tallowmere/r/demo-shop/e/demo-shop-troffers';
      await openApp(page, app.url);
      await page.goto(`${app.url}${entryHash}`);
      await page.getByTestId('live-panel').waitFor();
      const count = page.getByTestId('entry-count');
      const lamps = page.getByTestId('existing-lamps');
      const lampWatts = page.getByTestId('existing-lamp-watts');
      /** The message shown beside a field (its `aria-describedby` names it). */
      const messageOf = (field: typeof count) => ({
        innerText: async () => {
          const ids = ((await field.getAttribute('aria-describedby')) ?? '').split(' ').filter((id) => id.endsWith('-msg'));
          return ids.length === 0 ? '' : page.locator(`[id="${ids[0]}"]`).innerText();
        },
      });

      for (const [typed, message] of [
        ['abc', 'is not a number'],
        ['1.5', 'Enter a whole number.'],
        ['-2', 'Must be between 0 and 100,000.'],
        ['1,500', 'for 1500, type it with no separator'],
        ['12 fixtures', 'is not a number'],
        ['', 'Enter a number.'],
      ] as const) {
        await count.fill(typed);
        await expect.poll(() => messageOf(count).innerText()).toContain(message);
        expect(await count.getAttribute('aria-invalid')).toBe('true');
        expect(await page.getByTestId('live-panel').innerText()).toContain('All 12');
        await noNaN(page);
      }
      await lamps.fill('0');
      await expect.poll(() => messageOf(lamps).innerText()).toContain('Must be between 1 and 24.');
      await lampWatts.fill('1,5');
      await expect.poll(() => messageOf(lampWatts).innerText()).toBe('');
      await noNaN(page);

      // The room: a ceiling of 0 and a work plane above the ceiling are refused where typed.
      await page.goto(`${app.url}#/s/demo-tallowmere/r/demo-shop`);
      const ceiling = page.getByTestId('room-ceiling');
      await ceiling.fill('0');
      await expect.poll(() => messageOf(ceiling).innerText()).toContain('more than 0');
      await noNaN(page);
      await allSaved(page);

      // After a reload: the bad values were never saved; the good one ("1,5" = 1.5 W) was.
      await page.goto(`${app.url}${entryHash}`);
      await page.reload();
      await page.getByTestId('live-panel').waitFor();
      expect(await count.inputValue()).toBe('12');
      expect(await lamps.inputValue()).toBe('4');
      expect(await lampWatts.inputValue()).toBe('1.5');
      await page.goto(`${app.url}#/s/demo-tallowmere/r/demo-shop`);
      expect(await page.getByTestId('room-ceiling').inputValue()).toBe('9.84');
      await noNaN(page);
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
    }
  }, 120_000);
});

/** A 1 × 1 PNG, made by hand (the same picture the store tests use). */
const tinyPng = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

browserTests('photos, documents and spreadsheets', () => {
  it('keeps a room photo, makes the client report, and brings a fixture schedule back into a room in one step', async () => {
    const browser = await openBrowser();
    const folder = await mkdtemp(join(tmpdir(), 'lampwalk-files-'));
    try {
      const { page } = browser;
      await openApp(page, app.url);
      await page.goto(`${app.url}#/s/demo-tallowmere/r/demo-stair`);
      await page.getByTestId('entry-row').first().waitFor();

      // A photo, downscaled to JPEG in the page and stored with its thumbnail.
      await page.getByTestId('photo-input-room').setInputFiles({ name: 'stair.png', mimeType: 'image/png', buffer: tinyPng });
      await page.locator('.photo-list img').first().waitFor();
      await page.reload();
      await page.locator('.photo-list img').first().waitFor();
      expect(await page.locator('.photo-list img').count()).toBe(1);

      // An export can be cancelled: no file, and a cancel is not reported as a failure.
      await page.goto(`${app.url}#/s/demo-tallowmere`);
      let downloads = 0;
      page.on('download', () => downloads++);
      // Tap Cancel as soon as it shows, inside the page, so a small survey's report cannot finish first.
      await page.getByTestId('export-client-report').waitFor();
      const cancelled = await page.evaluate(async () => {
        document.querySelector<HTMLButtonElement>('[data-testid="export-client-report"]')!.click();
        for (let i = 0; i < 100 && !document.querySelector('[data-testid="export-cancel"]'); i++) {
          await new Promise((resolve) => setTimeout(resolve, 0));
        }
        const cancel = document.querySelector<HTMLButtonElement>('[data-testid="export-cancel"]');
        cancel?.click();
        return cancel !== null;
      });
      expect(cancelled).toBe(true);
      await expect.poll(() => page.getByTestId('notice').innerText()).toContain('cancelled');
      expect(downloads).toBe(0);

      // The client report, made by the export code loaded on the click.
      const [report] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-client-report').click()]);
      expect(report.suggestedFilename()).toMatch(/\.pdf$/);
      const reportPath = join(folder, report.suggestedFilename());
      await report.saveAs(reportPath);
      expect((await readFile(reportPath)).subarray(0, 5).toString()).toBe('%PDF-');

      // The fixture schedule out as CSV and back into the stair: every row previewed, then added at once.
      const [csv] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-fixture-schedule-csv').click()]);
      const csvPath = join(folder, csv.suggestedFilename());
      await csv.saveAs(csvPath);
      const rowsInFile = (await readFile(csvPath, 'utf8')).trim().split('\n').length - 1;
      await page.goto(`${app.url}#/s/demo-tallowmere/r/demo-stair`);
      await page.getByTestId('entry-row').first().waitFor();
      const before = await page.getByTestId('entry-row').count();
      await page.getByTestId('schedule-file').setInputFiles(csvPath);
      await page.getByTestId('schedule-preview').waitFor();
      expect(await page.locator('[data-testid="schedule-preview"] tbody tr').count()).toBe(rowsInFile);
      await page.getByTestId('schedule-commit').click();
      await expect.poll(() => page.getByTestId('entry-row').count()).toBe(before + rowsInFile);

      // A file with a bad row adds nothing until the bad row is left out on purpose.
      const badPath = join(folder, 'bad.csv');
      await writeFile(badPath, 'count,existing_technology,rated_watts_per_lamp,circuit_volts\n4,halogen,50,120\nfour,halogen,50,120\n');
      await page.getByTestId('schedule-file').setInputFiles(badPath);
      await page.getByTestId('schedule-preview').waitFor();
      expect(await page.locator('[data-testid="schedule-preview"] .row-bad').innerText()).toContain('3');
      expect(await page.getByTestId('schedule-commit').isDisabled()).toBe(true);
      expect(await page.getByTestId('entry-row').count()).toBe(before + rowsInFile);
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
      await rm(folder, { recursive: true, force: true });
    }
  }, 180_000);
});

browserTests('catalog and settings', () => {
  it('adds a product, edits it in place, retires it; settings are kept and the theme applies', async () => {
    const browser = await openBrowser();
    try {
      const { page } = browser;
      await openApp(page, app.url);
      await page.goto(`${app.url}#/catalog`);
      await page.getByTestId('product-row').first().waitFor();
      const offered = await page.getByTestId('product-row').count();
      await page.getByTestId('new-product').click();
      const form = page.locator('form[aria-label="New product"]');
      for (const [label, value] of [
        ['Product name', 'Test lamp 7 W'],
        ['Watts', '7'],
        ['Lumens', '600'],
        ['CCT', '3000'],
        ['CRI', '90'],
        ['Power factor', '0,9'],
        ['Rated life', '25000'],
        ['Price each', '3.5'],
      ] as const) {
        await form.getByLabel(label, { exact: true }).fill(value);
      }
      await form.getByRole('button', { name: 'Add to the catalog' }).click();
      await page.locator('h1', { hasText: 'Test lamp 7 W' }).waitFor();
      await page.getByTestId('product-watts').fill('6.5');
      await page.locator('label', { hasText: 'Retired: no longer offered' }).click();
      await expect.poll(() => page.getByTestId('product-retired').isChecked()).toBe(true);
      await allSaved(page);
      await page.reload();
      await page.locator('h1', { hasText: 'Test lamp 7 W' }).waitFor();
      expect(await page.getByTestId('product-watts').inputValue()).toBe('6.5');
      expect(await page.getByTestId('product-retired').isChecked()).toBe(true);
      await page.locator('.back-link').click();
      await page.locator('section', { hasText: 'Retired (1)' }).waitFor();
      expect(await page.getByTestId('product-row').count()).toBe(offered + 1);

      await page.goto(`${app.url}#/settings`);
      await page.getByLabel('Company name').fill('Brightwell Surveys');
      await page.locator('[data-testid="theme-choice"] label', { hasText: 'Dark' }).click();
      await page.waitForFunction(() => document.documentElement.dataset.theme === 'dark');
      await page.reload();
      await page.getByLabel('Company name').waitFor();
      expect(await page.getByLabel('Company name').inputValue()).toBe('Brightwell Surveys');
      expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
    }
  }, 120_000);
});

browserTests('backups', () => {
  it('a backup brought back in asks copy or replace; after the browser deletes the data, the app says so and restores it', async () => {
    const browser = await openBrowser();
    const folder = await mkdtemp(join(tmpdir(), 'lampwalk-backup-'));
    try {
      const { page } = browser;
      await openApp(page, app.url);
      await page.goto(`${app.url}#/`);
      await page.getByTestId('storage-panel').waitFor();
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('backup-everything').click()]);
      const backupPath = join(folder, download.suggestedFilename());
      await download.saveAs(backupPath);

      // The same file again: the preview says it is already here; "keep both" adds a copy.
      await page.getByTestId('backup-file').setInputFiles(backupPath);
      await page.locator('.preview-card', { hasText: 'already here' }).waitFor();
      await page.getByTestId('backup-import-commit').click();
      // Every seeded survey (the demo building and the landlord layouts) twice.
      const seededSurveys = 1 + demoLandlordSurveys().length;
      await expect.poll(() => page.getByTestId('survey-card').count()).toBe(2 * seededSurveys);

      // The browser clears the database (as it may under storage pressure): the app notices and restores.
      // A blank page of the same origin (the app must not hold the database open while it is deleted).
      await page.route('**/blank-page', (route) => route.fulfill({ contentType: 'text/html', body: '<!doctype html><title>blank</title>' }));
      await page.goto(`${app.url}blank-page`);
      await page.evaluate(
        () =>
          new Promise<void>((resolve, reject) => {
            const request = indexedDB.deleteDatabase('lampwalk');
            request.onsuccess = () => resolve();
            request.onerror = () => reject(request.error);
          }),
      );
      await page.goto(`${app.url}#/s/demo-tallowmere`);
      await page.getByTestId('eviction-notice').waitFor();
      await page.getByTestId('backup-file').setInputFiles(backupPath);
      await page.getByTestId('backup-import-commit').click();
      await expect.poll(() => page.getByTestId('survey-card').count()).toBe(seededSurveys);
      // Newest first: the demo building (walked after the layouts) heads the list.
      expect(await page.getByTestId('survey-card').first().innerText()).toContain('Tallowmere');
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
      await rm(folder, { recursive: true, force: true });
    }
  }, 120_000);
});

browserTests('speed of entry', () => {
  it('repeats the last fixture in at most 2 taps and adds a common fixture in at most 8', async () => {
    const browser = await openBrowser();
    try {
      const { page } = browser;
      await openApp(page, app.url);
      await page.goto(`${app.url}#/s/demo-tallowmere/r/demo-shop`);
      await page.getByTestId('entry-row').first().waitFor();
      const repeatTaps = await repeatLastFixture(page);
      const addTaps = await addCommonFixture(page);
      expect(repeatTaps).toBeLessThanOrEqual(2);
      expect(addTaps).toBeLessThanOrEqual(8);
      await mkdir(join(projectRoot, 'test-artifacts'), { recursive: true });
      await writeFile(join(projectRoot, 'test-artifacts', 'ui-taps.json'), `${JSON.stringify({ repeatLastFixtureTaps: repeatTaps, addCommonFixtureTaps: addTaps }, null, 2)}\n`);
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
    }
  }, 120_000);
});
