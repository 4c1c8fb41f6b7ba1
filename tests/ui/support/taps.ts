/**
 * The two speed-of-entry walks, counting every tap (click) they make, for
 * the browser test (which checks the limits) and for `npm run bench` (which
 * reports the counts). Each starts on a room screen.
 */
import type { Locator, Page } from 'playwright-core';

/** A page wrapper that counts the taps made through it. */
export class TapCounter {
  taps = 0;
  constructor(readonly page: Page) {}

  async tap(target: Locator): Promise<void> {
    this.taps++;
    await target.click();
  }
}

/** Number of fixture entries listed on the room screen. */
export async function entryRows(page: Page): Promise<number> {
  return page.locator('[data-testid="entry-row"]').count();
}

/**
 * Logs the last fixture again from the room screen. Resolves to the taps it
 * took, after checking that one more entry is listed.
 */
export async function repeatLastFixture(page: Page): Promise<number> {
  const counter = new TapCounter(page);
  const before = await entryRows(page);
  await counter.tap(page.getByTestId('repeat-last'));
  await page.locator('[data-testid="entry-row"]').nth(before).waitFor();
  return counter.taps;
}

/**
 * Adds a common fixture from the room screen: a 2-lamp F32T8 troffer, three
 * of them, swapped to the first catalog product that fits, back on the room
 * screen. Resolves to the taps it took, after checking the new entry is
 * listed with its count and a proposal.
 */
export async function addCommonFixture(page: Page): Promise<number> {
  const counter = new TapCounter(page);
  const before = await entryRows(page);
  await counter.tap(page.getByTestId('add-fixture'));
  await counter.tap(page.getByTestId('pick-f32t8-2-elec'));
  await page.getByTestId('entry-count-plus').waitFor();
  await counter.tap(page.getByTestId('entry-count-plus'));
  await counter.tap(page.getByTestId('entry-count-plus'));
  await page.getByTestId('entry-count').and(page.locator('input')).first().waitFor();
  await counter.tap(page.getByTestId('product-pick').first());
  await page.locator('[data-testid="current-proposal"] strong').waitFor();
  await counter.tap(page.getByTestId('entry-done'));
  const row = page.locator('[data-testid="entry-row"]').nth(before);
  await row.waitFor();
  const title = await row.locator('.row-title').innerText();
  const line = await row.locator('.row-line').innerText();
  if (!title.startsWith('3 ×')) throw new Error(`the new entry should count 3 fixtures, the room lists "${title}"`);
  if (!line.startsWith('→')) throw new Error(`the new entry should have a proposal, the room lists "${line}"`);
  return counter.taps;
}
