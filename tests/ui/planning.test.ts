/**
 * Bulk-swap planning in a real browser (Debian's Chromium through
 * playwright-core, production build served on 127.0.0.1):
 * 1. a new survey marked as one typical unit of 12, one of them already
 *    converted: the overview shows the fixtures per unit and for all units;
 * 2. a portfolio of that survey and the demo survey built through the
 *    screens: its roll-up figures equal `calculatePortfolio` run in Node on
 *    the backup exported from the app, formatted the same way (common
 *    practice, no published source: the screen must agree with the engine);
 * 3. a yearly budget too small for everything: the plan shows the years, the
 *    method and gap line, and deferred measures with their one-line reasons;
 * 4. product suggestions on the demo survey: nothing changes before the user
 *    accepts; after "Use all suggestions" every changed entry carries the
 *    product `chooseProducts` picks in Node from the same backup;
 * 5. axe-core finds no WCAG 2.2 A/AA violation on the new screens in the
 *    light, dark and sunlight themes, and none scrolls sideways at 320 px.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, it } from 'vitest';
import { chooseProducts } from '../../src/calc/choice.ts';
import { calculatePortfolio } from '../../src/calc/portfolio.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { defaultPreferences } from '../../src/ui/state/preferences.ts';
import { portfolioFigures, portfolioTotalsText } from '../../src/ui/state/portfolioText.ts';
import { allSaved, axeViolations, backupEverything, openAllDetails, openApp, openBrowser, type AxeViolation } from './support/browser.ts';
import { browserTests, serveAppForFile } from './support/suite.ts';

const app = serveAppForFile();

const demoId = 'demo-tallowmere';

browserTests('bulk-swap planning', () => {
  it('layout, portfolio roll-up equal to the engine, a phased plan with reasons, suggestions accepted only on request', async () => {
    const browser = await openBrowser();
    const folder = await mkdtemp(join(tmpdir(), 'lampwalk-planning-'));
    const violations: Record<string, AxeViolation[]> = {};
    const checkAxe = async (name: string) => {
      await openAllDetails(browser.page);
      const found = await axeViolations(browser.page);
      if (found.length > 0) violations[name] = found;
    };
    try {
      const { page } = browser;
      await openApp(page, app.url);
      await page.getByTestId('demo-banner').waitFor();

      // 1. A survey of one typical flat: a hall with two 2-lamp T8 troffers.
      await page.getByTestId('demo-new-survey').click();
      await page.locator('h1', { hasText: 'New survey' }).waitFor();
      await page.getByTestId('energy-rate').fill('0.15');
      await page.getByTestId('survey-name').fill('Typical flat (test)');
      await page.getByTestId('add-room').click();
      await page.getByTestId('new-room-name').fill('Hall');
      await page.getByTestId('new-room-length').fill('5');
      await page.getByTestId('new-room-width').fill('4');
      await page.getByTestId('new-room-ceiling').fill('2.7');
      await page.getByTestId('new-room-add').click();
      await page.locator('h1', { hasText: 'Hall' }).waitFor();
      await page.getByTestId('add-fixture').click();
      await page.getByTestId('pick-f32t8-2-elec').click();
      await page.getByTestId('entry-count-plus').click();
      await page.getByTestId('product-pick').first().click();
      await page.locator('[data-testid="current-proposal"] strong').waitFor();
      await page.getByTestId('entry-done').click();
      await page.locator('.back-link').click();
      await page.getByTestId('totals').waitFor();
      const flatUrl = page.url();

      // Twelve flats share the layout; one is already converted.
      await page.getByTestId('layout-panel').locator('summary').click();
      await page.getByTestId('layout-toggle').check({ force: true });
      await page.getByTestId('layout-units').fill('0');
      await expect.poll(() => page.getByTestId('layout-units').getAttribute('aria-invalid')).toBe('true');
      await page.getByTestId('layout-units').fill('12');
      await expect.poll(() => page.getByTestId('layout-units').getAttribute('aria-invalid')).toBe('false');
      await page.getByTestId('layout-add-unit').click();
      await page.getByTestId('layout-unit-label').fill('Flat 4');
      await page.getByTestId('layout-unit-converted').click();
      await page.getByTestId('unit-totals').waitFor();
      // (12 − 1) flats × 2 fixtures + 0 in the converted flat (fixturesAcrossUnits' rule, worked by hand).
      await expect.poll(() => page.getByTestId('all-fixtures').innerText()).toBe('22');
      expect(await page.getByTestId('unit-fixtures').innerText()).toBe('2');
      await allSaved(page);
      await checkAxe('survey with layout');
      const flatId = decodeURIComponent(new URL(flatUrl).hash.replace('#/s/', ''));

      // 2. A portfolio of the two surveys, built from the surveys screen.
      await page.goto(`${app.url}#/`);
      await page.getByTestId('open-portfolios').click();
      await page.locator('h1', { hasText: 'Portfolios' }).waitFor();
      await checkAxe('portfolios');
      await page.getByTestId('new-portfolio-name').fill('North estate (test)');
      await page.getByTestId('new-portfolio').click();
      await page.locator('h1', { hasText: 'North estate (test)' }).waitFor();
      await page.locator(`[data-testid="choose-survey"][data-survey="${flatId}"]`).check();
      await page.locator(`[data-testid="choose-survey"][data-survey="${demoId}"]`).check();
      await expect.poll(() => page.getByTestId('site-row').count()).toBe(2);
      await page.getByTestId('portfolio-totals').waitFor();
      await allSaved(page);
      const portfolioUrl = page.url();
      const shown: Record<string, string> = {};
      for (const id of ['pf-units', 'pf-fixtures', 'pf-kwh', 'pf-kw', 'pf-money', 'pf-cost', 'pf-payback', 'pf-npv', 'pf-co2', 'pf-warnings']) {
        shown[id] = await page.getByTestId(id).innerText();
      }
      expect(await page.locator(`[data-testid="site-row"][data-survey="${flatId}"] [data-testid="site-units"]`).innerText()).toBe('12 (1 differs)');
      await checkAxe('portfolio');

      // 4a. Suggestions on the demo survey, looked at but not accepted.
      await page.goto(`${app.url}#/s/${demoId}/suggest`);
      await page.getByTestId('suggest-summary').waitFor();
      const changedRows = page.locator('[data-testid="suggestion"][data-changed="true"]');
      const changedCount = await changedRows.count();
      expect(changedCount).toBeGreaterThan(0);
      await page.getByTestId('alternatives').first().locator('summary').click();
      // The list renders after the toggle event: wait for it before reading it.
      await page.getByTestId('alternatives').first().getByTestId('candidate-reason').first().waitFor();
      const firstReasons = await page.getByTestId('alternatives').first().getByTestId('candidate-reason').allInnerTexts();
      expect(firstReasons.length).toBeGreaterThan(1);
      expect(firstReasons.every((line) => line.trim().length > 0)).toBe(true);
      await checkAxe('suggestions');

      // The roll-up on screen equals calculatePortfolio on the exported backup; nothing was changed by looking.
      const before = await backupEverything(page, app.url, folder, 'before.json');
      // Found by name: the demo data may hold portfolios of its own.
      const portfolio = before.portfolios.find((item) => item.name === 'North estate (test)');
      if (!portfolio) throw new Error('the backup holds no portfolio');
      expect(portfolio.surveyIds).toEqual([flatId, demoId]);
      const result = calculatePortfolio(portfolio, before.surveys);
      const language = await page.evaluate(() => navigator.language);
      const preferences = defaultPreferences(language);
      const expected = portfolioTotalsText(result, portfolioFigures(preferences.locale, preferences.units, result.currency ?? preferences.currency));
      for (const [id, text] of Object.entries(shown)) expect(text, id).toBe(expected[id]);
      expect(result.sites[0]?.fixtures).toBe(22);
      expect(result.units).toBe(13);
      const demoBefore = before.surveys.find((survey) => survey.id === demoId);
      if (!demoBefore) throw new Error('the backup holds no demo survey');
      const proposals = (survey: typeof demoBefore) => survey.rooms.flatMap((room) => room.entries.map((entry) => [entry.id, entry.proposed?.name ?? null] as const));
      expect(proposals(demoBefore)).toEqual(proposals(demoSurvey()));

      // 3. A budget of a third of the net cost a year for two years: some measures must wait.
      await page.goto(portfolioUrl);
      await page.getByTestId('open-plan').click();
      await page.locator('h1', { hasText: 'Phased plan' }).waitFor();
      const budget = Math.max(1, Math.round(result.economics.netInvestment / 3));
      await page.getByTestId('plan-budget').fill(String(budget));
      await page.getByTestId('plan-years-count').fill('2');
      await expect.poll(() => page.getByTestId('plan-year').count()).toBe(2);
      await page.getByTestId('plan-deferred').waitFor();
      const reasons = await page.getByTestId('deferred').allInnerTexts();
      expect(reasons.length).toBeGreaterThan(0);
      for (const line of reasons) expect(line).toMatch(/: \S/);
      expect(await page.getByTestId('plan-method').innerText()).toMatch(/^(Optimal|Within \d)/);
      await page.getByTestId('plan-chart').waitFor();
      await allSaved(page);
      await checkAxe('plan');

      // 4b. Accept every suggestion, after the confirmation that says how many entries change.
      await page.goto(`${app.url}#/s/${demoId}/suggest`);
      await page.getByTestId('use-all').click();
      expect(await page.getByTestId('confirm-all').innerText()).toContain(`${changedCount} fixture`);
      await page.getByTestId('confirm-use-all').click();
      await expect.poll(() => page.locator('[data-testid="suggestion"][data-changed="true"]').count()).toBe(0);
      await allSaved(page);

      const after = await backupEverything(page, app.url, folder, 'after.json');
      expect(after.portfolios.find((item) => item.name === 'North estate (test)')?.plan).toEqual({ budgetPerYear: budget, years: 2 });
      const demoAfter = after.surveys.find((survey) => survey.id === demoId);
      if (!demoAfter) throw new Error('the second backup holds no demo survey');
      const choice = chooseProducts(demoBefore, before.catalog);
      const afterById = new Map(demoAfter.rooms.flatMap((room) => room.entries.map((entry) => [entry.id, entry] as const)));
      const beforeById = new Map(demoBefore.rooms.flatMap((room) => room.entries.map((entry) => [entry.id, entry] as const)));
      expect(choice.counts.changed).toBe(changedCount);
      for (const entry of choice.entries) {
        const now = afterById.get(entry.entryId);
        if (entry.changed && entry.best) expect(now?.proposed?.catalogId, entry.entryId).toBe(entry.best.productId);
        else expect(now?.proposed ?? null, entry.entryId).toEqual(beforeById.get(entry.entryId)?.proposed ?? null);
      }

      // 5a. The same axe check on the new screens in the dark and sunlight themes.
      const newScreens = { 'survey with layout': new URL(flatUrl).hash, portfolios: '#/p', portfolio: new URL(portfolioUrl).hash, plan: `${new URL(portfolioUrl).hash}/plan`, suggestions: `#/s/${demoId}/suggest` };
      for (const theme of ['dark', 'sun'] as const) {
        await page.evaluate((chosen) => {
          const saved = JSON.parse(localStorage.getItem('lampwalk.preferences') ?? '{}') as Record<string, unknown>;
          localStorage.setItem('lampwalk.preferences', JSON.stringify({ ...saved, theme: chosen }));
        }, theme);
        for (const [name, hash] of Object.entries(newScreens)) {
          await page.goto(`${app.url}${hash}`);
          await page.reload();
          await page.waitForFunction((chosen) => document.documentElement.dataset.theme === chosen, theme);
          await page.locator('h1').first().waitFor();
          await page.locator('main .panel').first().waitFor();
          if (name === 'suggestions') {
            await page.getByTestId('alternatives').first().locator('summary').click();
            await page.getByTestId('candidate-reason').first().waitFor();
          }
          if (name === 'plan') await page.getByTestId('plan-chart').waitFor();
          await checkAxe(`${name} (${theme})`);
        }
      }

      // 5. No sideways scrolling at 320 px on the new screens.
      await page.setViewportSize({ width: 320, height: 640 });
      const wide: Record<string, number> = {};
      for (const hash of [new URL(portfolioUrl).hash, `${new URL(portfolioUrl).hash}/plan`, `#/s/${demoId}/suggest`, '#/p', new URL(flatUrl).hash]) {
        await page.goto(`${app.url}${hash}`);
        await page.locator('h1').first().waitFor();
        await page.locator('main .panel').first().waitFor();
        const width = await page.evaluate(() => document.documentElement.scrollWidth);
        if (width > 320) wide[hash] = width;
      }
      expect(wide).toEqual({});
      expect(violations).toEqual({});
      expect(browser.errors).toEqual([]);
    } finally {
      await browser.close();
      await rm(folder, { recursive: true, force: true });
    }
  }, 300_000);
});
