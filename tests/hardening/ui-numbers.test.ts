/**
 * Bad numbers typed into every number field of the fixture-entry screen and
 * the room screen (Debian's Chromium through playwright-core, production
 * build on 127.0.0.1): NaN, ±Infinity, 1e308, -1, "1,500", "1.500,5" and
 * text each get a message beside the field (`aria-invalid` and the
 * field's own message), the page never shows NaN or Infinity, and after a
 * reload every field holds what it held before: nothing bad was saved.
 * Emptying a field either asks for a number or, where the field is
 * optional, leaves it unset. The expectations follow the field rules in
 * src/ui/state/fields.ts (common practice, no published source).
 * Also: the fixture-schedule picker refuses a file over its size limit by
 * `File.size`, before reading it.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { expect, it } from 'vitest';
import { allSaved, openAllDetails, openApp, openBrowser } from '../ui/support/browser.ts';
import { browserTests, serveAppForFile } from '../ui/support/suite.ts';

const app = serveAppForFile();

const badTyped = ['NaN', 'Infinity', '-Infinity', '1e308', '-1', '1,500', '1.500,5', 'twelve'];

function numberFields(page: Page): Locator {
  return page.locator('input[inputmode="decimal"]');
}

async function values(page: Page): Promise<string[]> {
  return numberFields(page).evaluateAll((inputs) => inputs.map((input) => (input as HTMLInputElement).value));
}

/** No figure on the page reads NaN, Infinity or undefined (the typed text quoted back in a field message aside). */
async function noNaN(page: Page): Promise<void> {
  const text = (await page.locator('body').innerText()).replace(/“[^”]*”/g, '“…”');
  expect(text).not.toMatch(/NaN|Infinity|undefined/);
}

interface FieldState {
  label: string;
  invalid: string | null;
  message: string;
}

/**
 * Types `text` into every number field at once (as the keyboard would: the
 * value, then an input event) and returns each field's state once every
 * field has reacted.
 */
async function typeEverywhere(page: Page, text: string | readonly string[], expectInvalid: boolean | null): Promise<FieldState[]> {
  await page.evaluate((typed) => {
    const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
    document.querySelectorAll<HTMLInputElement>('input[inputmode="decimal"]').forEach((input, index) => {
      input.focus();
      setter.call(input, typeof typed === 'string' ? typed : (typed[index] ?? ''));
      input.dispatchEvent(new Event('input', { bubbles: true }));
    });
  }, text);
  if (expectInvalid !== null) {
    await page.waitForFunction(
      (want) => [...document.querySelectorAll('input[inputmode="decimal"]')].every((input) => input.getAttribute('aria-invalid') === want),
      expectInvalid ? 'true' : 'false',
    );
  }
  return page.evaluate(() =>
    [...document.querySelectorAll<HTMLInputElement>('input[inputmode="decimal"]')].map((input) => {
      const messageId = (input.getAttribute('aria-describedby') ?? '').split(' ').find((id) => id.endsWith('-msg'));
      const message = messageId ? (document.getElementById(messageId)?.textContent ?? '') : '';
      const label = document.querySelector(`label[for="${input.id}"]`)?.textContent ?? input.id;
      return { label: label.trim(), invalid: input.getAttribute('aria-invalid'), message: message.trim() };
    }),
  );
}

async function openScreen(page: Page, url: string, hash: string): Promise<void> {
  await page.goto(`${url}${hash}`);
  await page.getByTestId('live-panel').or(page.getByTestId('room-ceiling')).first().waitFor();
  await openAllDetails(page);
}

/** Types every bad value into every number field of the screen at `hash`; returns what happened. */
async function typeBadNumbers(page: Page, url: string, hash: string, screen: string): Promise<{ fields: number; refused: number; changed: number; emptyRefused: number; emptyOptional: number }> {
  await openScreen(page, url, hash);
  const count = await numberFields(page).count();
  expect(count, `${screen}: number fields`).toBeGreaterThan(5);
  const before = await values(page);
  let refused = 0;
  for (const typed of badTyped) {
    const states = await typeEverywhere(page, typed, true);
    for (const state of states) {
      expect(state.message, `${screen} / ${state.label} / ${typed}`).toMatch(/not a number|Must be|whole number|could be|without separators/);
      refused++;
    }
    await noNaN(page);
  }
  // Leave the fields, let anything pending settle, and reload: every field holds what it held before.
  await page.locator('h1').first().click();
  await allSaved(page);
  await page.reload();
  await page.getByTestId('live-panel').or(page.getByTestId('room-ceiling')).first().waitFor();
  await openAllDetails(page);
  const after = await values(page);
  const changed = after.filter((value, index) => value !== before[index]).length;
  expect(after, `${screen}: values after a reload`).toEqual(before);
  await noNaN(page);

  // Empty: a required field asks for a number; an optional one is left unset. Then the values are typed back.
  const emptied = await typeEverywhere(page, '', null);
  await page.waitForTimeout(200);
  const settled = await typeEverywhere(page, '', null);
  let emptyRefused = 0;
  let emptyOptional = 0;
  for (const [index, state] of settled.entries()) {
    expect(state.invalid, `${screen} / ${state.label} emptied`).toBe(emptied[index]!.invalid);
    if (state.invalid === 'true') {
      expect(state.message, `${screen} / ${state.label} emptied`).toBe('Enter a number.');
      emptyRefused++;
    } else {
      expect(state.message, `${screen} / ${state.label} emptied`).toBe('');
      emptyOptional++;
    }
  }
  await typeEverywhere(page, before, false);
  await page.locator('h1').first().click();
  await allSaved(page);
  await noNaN(page);
  return { fields: count, refused, changed, emptyRefused, emptyOptional };
}

browserTests('bad numbers in every number field', () => {
  it('refuses each bad value beside its field on the entry and room screens, and saves none of them', async () => {
    const browser = await openBrowser();
    try {
      const { page } = browser;
      await openApp(page, app.url);
      const entry = await typeBadNumbers(page, app.url, '#/s/demo-tallowmere/r/demo-shop/e/demo-shop-display', 'entry screen');
      const room = await typeBadNumbers(page, app.url, '#/s/demo-tallowmere/r/demo-shop', 'room screen');
      console.log(
        `ui bad numbers: entry screen ${entry.fields} number fields, room screen ${room.fields}; ` +
          `${entry.refused + room.refused} bad values typed (${badTyped.length} per field), ${entry.refused + room.refused} refused beside the field, ${entry.changed + room.changed} fields changed after a reload; ` +
          `emptied: ${entry.emptyRefused + room.emptyRefused} asked for a number, ${entry.emptyOptional + room.emptyOptional} optional left unset`,
      );
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
    }
  }, 300_000);
});

browserTests('an oversized fixture schedule in the file picker', () => {
  it('is refused by its size, before it is read, with the limit in MB', async () => {
    const browser = await openBrowser();
    const folder = await mkdtemp(join(tmpdir(), 'lampwalk-big-schedule-'));
    try {
      const { page } = browser;
      await openApp(page, app.url, '#/s/demo-tallowmere/r/demo-shop');
      await page.getByTestId('room-ceiling').waitFor();
      // 21 MB of schedule rows: over the 20 MB limit (scheduleMaxFileBytes).
      const row = Buffer.from('4,halogen,50,230\r\n');
      const big = Buffer.concat([Buffer.from('count,existing_technology,rated_watts_per_lamp,circuit_volts\r\n'), Buffer.alloc(21_000_000 - 64, row)]);
      // Handed over by path (a local browser reads it from disk), as a phone's file picker would.
      const file = join(folder, 'huge-schedule.csv');
      await writeFile(file, big);
      await page.getByTestId('schedule-file').setInputFiles(file);
      const alert = page.locator('.schedule-import [role="alert"]');
      await alert.waitFor();
      // The picker's own message (file name first), not a preview of a parsed file.
      expect(await alert.innerText()).toMatch(/^huge-schedule\.csv: the file is too large: a fixture schedule can be at most 20 MB/);
      expect(await page.getByTestId('schedule-preview').count()).toBe(0);
      console.log(`ui oversized schedule: a ${(big.length / 1e6).toFixed(1)} MB file refused by the picker before reading (limit 20 MB)`);
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
      await rm(folder, { recursive: true, force: true });
    }
  }, 120_000);
});
