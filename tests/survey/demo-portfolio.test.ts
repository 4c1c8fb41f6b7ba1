/**
 * The demo landlord scenario: three invented layout surveys and the demo
 * portfolio grouping them with the demo building. Checks that the data is
 * valid survey-file content, that the roll-up and the phased plan run on it
 * with finite figures, that the plan budget is tight enough to defer work,
 * and that the 24-flat layout's two differing units are as described.
 * Counts are of invented demo data (common practice, no published source).
 */
import { describe, expect, it } from 'vitest';
import { fixturesAcrossUnits } from '../../src/calc/layout.ts';
import { measuresFromSurveys, planPhases } from '../../src/calc/phasing.ts';
import { calculatePortfolio } from '../../src/calc/portfolio.ts';
import { demoFlatEntryIds, demoLandlordSurveys, demoPortfolio, demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import { makeSurveyFile } from '../../src/survey/format.ts';
import { parseSurvey, parseSurveyFile, portfolioSchema, problemsAgainst } from '../../src/survey/validate.ts';

const surveys = () => [demoSurvey(), ...demoLandlordSurveys()];

describe('demo landlord data', () => {
  it('every survey and the portfolio pass the file checks, alone and together in one file', () => {
    for (const survey of surveys()) {
      const checked = parseSurvey(survey);
      expect(checked.ok ? [] : checked.problems, survey.id).toEqual([]);
    }
    expect(problemsAgainst(portfolioSchema, demoPortfolio())).toEqual([]);
    const file = JSON.parse(JSON.stringify(makeSurveyFile(surveys(), [...exampleCatalog], new Date('2026-12-01T00:00:00Z'), [], [demoPortfolio()])));
    const whole = parseSurveyFile(file);
    expect(whole.ok ? [] : whole.problems).toEqual([]);
  });

  it('the portfolio groups the demo building and the three layouts, all in one currency', () => {
    const portfolio = demoPortfolio();
    expect(portfolio.surveyIds).toEqual(surveys().map((survey) => survey.id));
    expect(new Set(surveys().map((survey) => survey.money.currency))).toEqual(new Set(['USD']));
    expect(demoLandlordSurveys().map((survey) => survey.layout?.unitCount)).toEqual([24, 2, 8]);
    // Invented names only: each one says so, or is a fictional place in the invented town.
    for (const survey of demoLandlordSurveys()) {
      expect(survey.name).toMatch(/\(demo\)$/);
      expect(survey.site.address).toMatch(/\(invented address\)$/);
      expect(survey.client.name).toMatch(/\(invented\)$/);
    }
  });

  it('the roll-up calculates with finite figures across every unit', () => {
    const result = calculatePortfolio(demoPortfolio(), surveys());
    expect(result.currency).toBe('USD');
    expect(result.sites.map((site) => site.units)).toEqual([1, 24, 2, 8]);
    for (const site of result.sites) {
      for (const value of [site.kwhSavedPerYear, site.firstYearSavings, site.netCost, site.existingKw, site.proposedKw]) {
        expect(Number.isFinite(value), `${site.surveyId}`).toBe(true);
      }
      expect(site.kwhSavedPerYear).toBeGreaterThan(0);
    }
    expect(Number.isFinite(result.economics.netPresentValue)).toBe(true);
    expect(result.economics.netInvestment).toBeGreaterThan(0);
    // 22 regular flats × 8 fixtures + flat 7 (none) + flat 19 (9): the layout's fixtures.
    expect(result.sites[1]?.fixtures).toBe(22 * 8 + 0 + 9);
  });

  it('the plan with the portfolio’s own settings spreads the work and defers some of it', () => {
    const portfolio = demoPortfolio();
    const measures = measuresFromSurveys(surveys());
    const totalCost = measures.reduce((sum, measure) => sum + measure.cost, 0);
    // The budget cannot pay for everything in year 1, nor even in all three years.
    expect(portfolio.plan.budgetPerYear).toBeLessThan(totalCost);
    expect(portfolio.plan.budgetPerYear * portfolio.plan.years).toBeLessThan(totalCost);
    const plan = planPhases(measures, portfolio.plan, { currency: 'USD' });
    expect(plan.years).toHaveLength(3);
    for (const year of plan.years) expect(year.cost).toBeLessThanOrEqual(portfolio.plan.budgetPerYear + 1e-6);
    expect(plan.deferred.length).toBeGreaterThan(0);
    expect(plan.deferred.some((item) => item.year !== null && item.year > 1)).toBe(true);
    expect(plan.deferred.some((item) => item.year === null)).toBe(true);
    expect(Number.isFinite(plan.npv)).toBe(true);
    console.log(
      `demo plan: ${measures.length} measures costing ${totalCost.toFixed(0)} USD, budget ${portfolio.plan.budgetPerYear} × ${portfolio.plan.years} years; ` +
        `${plan.deferred.length} deferred (${plan.deferred.filter((item) => item.year === null).length} not done), NPV ${plan.npv.toFixed(0)} USD, method ${plan.method}`,
    );
  });

  it('the 24-flat layout: flat 7 already converted (every count 0), flat 19 with one more bedroom pendant', () => {
    const flat = demoLandlordSurveys()[0]!;
    const entries = new Map(flat.rooms.flatMap((room) => room.entries).map((entry) => [entry.id, entry]));
    const [converted, extra] = flat.layout?.exceptions ?? [];
    expect(flat.layout?.exceptions).toHaveLength(2);
    expect(converted?.unitLabel).toBe('Flat 7');
    expect(converted?.entryCounts.map((item) => item.entryId).sort()).toEqual([...entries.keys()].sort());
    expect(converted?.entryCounts.every((item) => item.count === 0)).toBe(true);
    expect(extra?.unitLabel).toBe('Flat 19');
    expect(extra?.entryCounts).toEqual([{ entryId: demoFlatEntryIds.bedroom, count: entries.get(demoFlatEntryIds.bedroom)!.count + 1 }]);
    const across = fixturesAcrossUnits(flat);
    // 22 ordinary flats, flat 7 adds nothing, flat 19 adds its own counts.
    expect(across.get(demoFlatEntryIds.bedroom)).toBe(22 * 1 + 0 + 2);
    expect(across.get(demoFlatEntryIds.kitchen)).toBe(22 * 3 + 0 + 3);
    // The rooms the scenario promises: a damp bathroom, a dimmed living room, an emergency stair fixture.
    expect(entries.get(demoFlatEntryIds.bathroom)?.conditions.location).toBe('damp');
    expect(entries.get(demoFlatEntryIds.living)?.conditions.dimmer).not.toBe('none');
    const common = demoLandlordSurveys()[1]!;
    expect(common.rooms.flatMap((room) => room.entries).some((entry) => entry.conditions.emergencyCircuit)).toBe(true);
  });
});
