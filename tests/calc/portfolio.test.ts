import fc from 'fast-check';
import { irr as libIrr, npv as libNpv } from 'financial';
import { describe, expect, it } from 'vitest';
import { syntheticSurvey } from '../../bench/synthetic.ts';
import { CalcInputError } from '../../src/calc/errors.ts';
import { netPresentValue } from '../../src/calc/economics.ts';
import { calculateLayout, calculatePortfolio, type LayoutResult } from '../../src/calc/portfolio.ts';
import { calculateSurvey, type SurveyTotals } from '../../src/calc/survey.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import type { LayoutException, Portfolio, Survey } from '../../src/survey/model.ts';

/**
 * The same project surveyed the long way: every unit's rooms copied by hand
 * with fresh ids, each differing unit with its own counts. This is what a
 * repeated layout stands for, so its totals must match.
 */
function explicitCopies(survey: Survey): Survey {
  const layout = survey.layout;
  if (!layout) return survey;
  const units: (LayoutException | null)[] = [...layout.exceptions];
  while (units.length < layout.unitCount) units.push(null);
  const rooms = units.flatMap((unit, u) =>
    survey.rooms.map((room) => ({
      ...room,
      id: `${room.id}~unit${u}`,
      entries: room.entries.map((entry) => ({
        ...entry,
        id: `${entry.id}~unit${u}`,
        count: unit?.entryCounts.find((c) => c.entryId === entry.id)?.count ?? entry.count,
      })),
    })),
  );
  const { layout: _dropped, ...rest } = survey;
  return { ...rest, rooms };
}

function relClose(actual: number, expected: number, path: string): void {
  const scale = Math.max(1, Math.abs(expected));
  if (Math.abs(actual - expected) > 1e-9 * scale) {
    throw new Error(`${path}: ${actual} differs from ${expected} by more than 1e-9 relative`);
  }
}

/** Every total the issue names: kWh, kW, kVA, cost parts, savings, CO2, counts. */
function compareTotals(a: SurveyTotals, b: SurveyTotals): void {
  for (const side of ['existing', 'proposed'] as const) {
    relClose(a[side].watts, b[side].watts, `${side}.watts`);
    relClose(a[side].kwhPerYear, b[side].kwhPerYear, `${side}.kwhPerYear`);
    relClose(a[side].voltAmperes, b[side].voltAmperes, `${side}.voltAmperes`);
    relClose(a[side].kva, b[side].kva, `${side}.kva`);
  }
  for (const k of ['lightingKwhPerYear', 'kwhPerYear', 'connectedKw', 'peakKw', 'gasThermsPerYear'] as const) {
    relClose(a.savings[k], b.savings[k], `savings.${k}`);
  }
  for (const k of ['energyPerYear', 'demandPerYear', 'maintenancePerYear', 'totalPerYear'] as const) {
    relClose(a.money[k], b.money[k], `money.${k}`);
  }
  for (const k of ['materials', 'labour', 'disposal', 'markup', 'tax', 'gross', 'rebates', 'net'] as const) {
    relClose(a.money.cost[k], b.money.cost[k], `money.cost.${k}`);
  }
  expect(a.money.simplePaybackYears === null).toBe(b.money.simplePaybackYears === null);
  if (a.money.simplePaybackYears !== null && b.money.simplePaybackYears !== null) {
    relClose(a.money.simplePaybackYears, b.money.simplePaybackYears, 'money.simplePaybackYears');
  }
  relClose(a.co2KgPerYear, b.co2KgPerYear, 'co2KgPerYear');
  expect(a.fixtures).toBe(b.fixtures);
  expect(a.entries).toBe(b.entries);
  expect(a.rooms).toBe(b.rooms);
}

function compareWithCopies(survey: Survey): LayoutResult {
  const layout = calculateLayout(survey);
  const copied = calculateSurvey(explicitCopies(survey));
  compareTotals(layout.totals, copied.totals);
  relClose(layout.economics.netPresentValue, copied.economics.netPresentValue, 'economics.netPresentValue');
  relClose(layout.economics.presentValueOfSavings, copied.economics.presentValueOfSavings, 'economics.presentValueOfSavings');
  relClose(layout.economics.lifetimeSavings, copied.economics.lifetimeSavings, 'economics.lifetimeSavings');
  // Each entry across units equals the sum of its copies.
  for (const [entryId, entry] of layout.entries) {
    const copies = copied.rooms.flatMap((r) => r.entries).filter((e) => e.entryId.startsWith(`${entryId}~unit`));
    expect(entry.count).toBe(copies.reduce((s, e) => s + e.count, 0));
    relClose(entry.money.cost.net, copies.reduce((s, e) => s + e.money.cost.net, 0), `entries[${entryId}].money.cost.net`);
    relClose(entry.savings.kwhPerYear, copies.reduce((s, e) => s + e.savings.kwhPerYear, 0), `entries[${entryId}].savings.kwhPerYear`);
    relClose(entry.co2KgPerYear, copies.reduce((s, e) => s + e.co2KgPerYear, 0), `entries[${entryId}].co2KgPerYear`);
  }
  return layout;
}

function entryIds(survey: Survey): string[] {
  return survey.rooms.flatMap((r) => r.entries.map((e) => e.id));
}

function portfolioOf(surveyIds: string[]): Portfolio {
  return {
    id: 'pf-1',
    name: 'Riverside estate (invented)',
    client: { name: 'Example Homes Ltd (invented)', contact: '' },
    surveyIds,
    plan: { budgetPerYear: 20_000, years: 3 },
    notes: '',
    createdAt: '2024-05-01T09:00:00.000Z',
    updatedAt: '2024-05-01T09:00:00.000Z',
  };
}

describe('calculateLayout', () => {
  it('without a layout gives the survey’s own totals and economics', () => {
    const survey = demoSurvey();
    const own = calculateSurvey(survey);
    const layout = calculateLayout(survey, own);
    expect(layout.units).toBe(1);
    expect(layout.differingUnits).toBe(0);
    expect(layout.totals).toBe(own.totals);
    expect(layout.economics).toBe(own.economics);
    expect(layout.perUnit).toBe(own.totals);
  });

  it('works a small hand example: 10 flats, one already converted', () => {
    // Hand calculation (common practice, no published source): 10 flats × 4 fixtures,
    // one flat has 0 left to change → 9 × 4 = 36 fixtures; every money figure is 9× the surveyed flat's.
    const base = demoSurvey();
    const first = base.rooms[0]!.entries[0]!;
    const survey: Survey = {
      ...base,
      rooms: [{ ...base.rooms[0]!, entries: [{ ...first, count: 4 }] }],
      layout: { unitCount: 10, exceptions: [{ id: 'x1', unitLabel: 'Flat 3B', entryCounts: [{ entryId: first.id, count: 0 }], notes: '' }] },
    };
    const layout = calculateLayout(survey);
    expect(layout.totals.fixtures).toBe(36);
    expect(layout.fixturesByEntry.get(first.id)).toBe(36);
    relClose(layout.totals.money.cost.net, 9 * layout.perUnit.money.cost.net, 'net cost');
    relClose(layout.totals.savings.kwhPerYear, 9 * layout.perUnit.savings.kwhPerYear, 'kWh saved');
    // The troffers are metered at 118 W (demo data): 36 × 118 W existing.
    relClose(layout.totals.existing.watts, 36 * 118, 'existing watts');
    // Payback is a ratio: the same for 9 flats as for one.
    relClose(layout.totals.money.simplePaybackYears!, layout.perUnit.money.simplePaybackYears!, 'payback');
    expect(layout.totals.rooms).toBe(10);
    expect(layout.totals.entries).toBe(10);
  });

  it('layout totals equal the sum of explicitly copied units (demo survey, 24 flats, 3 differ)', () => {
    const survey = demoSurvey();
    const ids = entryIds(survey);
    survey.layout = {
      unitCount: 24,
      exceptions: [
        { id: 'a', unitLabel: 'Flat 1A', entryCounts: ids.map((entryId) => ({ entryId, count: 0 })), notes: 'Converted last year' },
        { id: 'b', unitLabel: 'Flat 2C', entryCounts: [{ entryId: ids[0]!, count: 3 }, { entryId: ids[2]!, count: 11 }], notes: '' },
        { id: 'c', unitLabel: 'Flat 4D', entryCounts: [], notes: 'Listed, no change' },
      ],
    };
    const layout = compareWithCopies(survey);
    expect(layout.units).toBe(24);
    expect(layout.differingUnits).toBe(3);
    const per = calculateSurvey(survey).totals.fixtures;
    // 21 regular units + an empty one + one with two entries changed + one like the rest.
    const first = survey.rooms.flatMap((r) => r.entries);
    const expected = 22 * per + (per - first[0]!.count + 3 - first[2]!.count + 11);
    expect(layout.totals.fixtures).toBe(expected);
  });

  it('an entry counted 0 in the surveyed unit but fitted in a differing unit is recalculated, not lost', () => {
    const survey = demoSurvey();
    const entry = survey.rooms[1]!.entries[0]!;
    entry.count = 0;
    survey.layout = { unitCount: 5, exceptions: [{ id: 'x', unitLabel: 'Flat 5', entryCounts: [{ entryId: entry.id, count: 3 }], notes: '' }] };
    const layout = compareWithCopies(survey);
    expect(layout.fixturesByEntry.get(entry.id)).toBe(3);
    expect(layout.entries.get(entry.id)!.money.cost.net).toBeGreaterThan(0);
  });

  it('keeps room-level figures per unit', () => {
    const survey = { ...demoSurvey(), layout: { unitCount: 50, exceptions: [] } };
    const layout = calculateLayout(survey);
    const own = calculateSurvey(survey);
    expect(layout.unitResult.rooms[0]!.adequacy.proposedLux).toBe(own.rooms[0]!.adequacy.proposedLux);
    expect(layout.unitResult.circuits).toEqual(own.circuits);
    expect(layout.entries.get(survey.rooms[0]!.entries[0]!.id)!.proposed.wattsPerFixture).toBe(own.rooms[0]!.entries[0]!.proposed.wattsPerFixture);
  });

  it('property: equals explicit copies for random unit counts and differing units', () => {
    const bases = [demoSurvey(), syntheticSurvey(12, 4, 7)];
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: bases.length - 1 }),
        fc.integer({ min: 1, max: 12 }),
        fc.array(fc.array(fc.tuple(fc.nat(40), fc.integer({ min: 0, max: 25 })), { maxLength: 4 }), { maxLength: 5 }),
        fc.nat(40),
        (which, unitCount, rawExceptions, zeroed) => {
          const survey = structuredClone(bases[which]!);
          const ids = entryIds(survey);
          // Sometimes the surveyed unit lacks a fixture another unit has.
          survey.rooms.flatMap((r) => r.entries)[zeroed % ids.length]!.count = 0;
          const exceptions: LayoutException[] = rawExceptions.slice(0, unitCount).map((list, i) => {
            const byEntry = new Map<string, number>();
            for (const [pick, count] of list) byEntry.set(ids[pick % ids.length]!, count);
            return { id: `x${i}`, unitLabel: `Unit ${i}`, entryCounts: [...byEntry].map(([entryId, count]) => ({ entryId, count })), notes: '' };
          });
          survey.layout = { unitCount, exceptions };
          compareWithCopies(survey);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('refuses more differing units than units, naming the field', () => {
    const survey = { ...demoSurvey(), layout: { unitCount: 1, exceptions: [
      { id: 'a', unitLabel: 'A', entryCounts: [], notes: '' },
      { id: 'b', unitLabel: 'B', entryCounts: [], notes: '' },
    ] } };
    expect(() => calculateLayout(survey)).toThrow(CalcInputError);
    expect(() => calculateLayout(survey)).toThrow(/layout\.exceptions: lists 2 differing units but the layout has only 1/);
  });

  it('refuses a unit count out of range and an exception naming no entry', () => {
    expect(() => calculateLayout({ ...demoSurvey(), layout: { unitCount: 10_001, exceptions: [] } })).toThrow(/layout\.unitCount/);
    expect(() => calculateLayout({ ...demoSurvey(), layout: { unitCount: 0, exceptions: [] } })).toThrow(/layout\.unitCount/);
    const bad = { ...demoSurvey(), layout: { unitCount: 3, exceptions: [{ id: 'a', unitLabel: 'A', entryCounts: [{ entryId: 'nope', count: 1 }], notes: '' }] } };
    expect(() => calculateLayout(bad)).toThrow(/layout\.exceptions\[0\]\.entryCounts\[0\]\.entryId/);
  });

  it('refuses a result that belongs to another survey', () => {
    const other = calculateSurvey({ ...demoSurvey(), id: 'other' });
    expect(() => calculateLayout(demoSurvey(), other)).toThrow(/not/);
  });
});

describe('calculatePortfolio', () => {
  const siteA: Survey = { ...demoSurvey(), id: 'site-a', name: 'Block A', layout: { unitCount: 24, exceptions: [] } };
  const siteB: Survey = { ...syntheticSurvey(20, 5, 3), id: 'site-b', name: 'Block B' };
  const siteC: Survey = {
    ...demoSurvey(),
    id: 'site-c',
    name: 'Block C',
    money: { ...demoSurvey().money, discountRatePerYear: 0.06, analysisYears: 25 },
    layout: { unitCount: 6, exceptions: [{ id: 'x', unitLabel: 'Flat 6', entryCounts: [], notes: '' }] },
  };

  it('rolls up to the sum of its sites, in portfolio order', () => {
    const result = calculatePortfolio(portfolioOf(['site-b', 'site-a', 'site-c']), [siteA, siteB, siteC]);
    expect(result.sites.map((s) => s.surveyId)).toEqual(['site-b', 'site-a', 'site-c']);
    expect(result.currency).toBe(siteA.money.currency);
    const layouts = [siteB, siteA, siteC].map((s) => calculateLayout(s));
    const sum = (f: (l: LayoutResult) => number) => layouts.reduce((acc, l) => acc + f(l), 0);
    relClose(result.totals.savings.kwhPerYear, sum((l) => l.totals.savings.kwhPerYear), 'kWh saved');
    relClose(result.totals.existing.watts, sum((l) => l.totals.existing.watts), 'existing watts');
    relClose(result.totals.money.cost.net, sum((l) => l.totals.money.cost.net), 'net cost');
    relClose(result.totals.money.totalPerYear, sum((l) => l.totals.money.totalPerYear), 'first-year savings');
    relClose(result.totals.co2KgPerYear, sum((l) => l.totals.co2KgPerYear), 'CO2');
    expect(result.totals.fixtures).toBe(sum((l) => l.totals.fixtures));
    expect(result.units).toBe(24 + 1 + 6);
    // NIST Handbook 135: present values of independent projects add, each at its own rate.
    relClose(result.economics.netPresentValue, sum((l) => l.economics.netPresentValue), 'NPV');
    relClose(result.economics.simplePaybackYears!, result.totals.money.cost.net / result.totals.money.totalPerYear, 'payback');
    // The summed cash flows run over the longest period (25 years), year 0 being −Σ net cost.
    expect(result.economics.analysisYears).toBe(25);
    expect(result.economics.cashFlows).toHaveLength(26);
    relClose(result.economics.cashFlows[0]!, -result.totals.money.cost.net, 'year 0');
    // Years 16–25 hold only site C (the others stop at 15 years).
    relClose(result.economics.cashFlows[20]!, layouts[2]!.economics.cashFlows[20]!.netCashFlow, 'year 20');
    expect(result.economics.discountRatesPerYear).toEqual([0.03, 0.06]);
    const site = result.sites[1]!;
    relClose(site.kwhSavedPerYear, layouts[1]!.totals.savings.kwhPerYear, 'site kWh');
    relClose(site.existingKw, layouts[1]!.totals.existing.watts / 1000, 'site kW');
    expect(site.units).toBe(24);
    expect(site.warningCounts).toEqual(calculateSurvey(siteA).warningCounts);
  });

  it('at one discount rate, Σ site NPVs equals the NPV of the summed cash flows; IRR matches numpy-financial', () => {
    const result = calculatePortfolio(portfolioOf(['site-a', 'site-b']), [siteA, siteB]);
    const flows = result.economics.cashFlows;
    // NIST Handbook 135: NPV is additive over cash flows at one discount rate.
    relClose(netPresentValue(0.03, flows), result.economics.netPresentValue, 'NPV of summed flows');
    // numpy-financial convention, via the `financial` reference library.
    relClose(libNpv(0.03, flows), result.economics.netPresentValue, 'financial.npv');
    const irr = result.economics.internalRateOfReturn;
    expect(irr.kind).toBe('unique');
    if (irr.kind === 'unique') expect(irr.ratePerYear).toBeCloseTo(libIrr(flows), 6);
  });

  it('names a missing survey, a duplicate and a second currency with both codes', () => {
    expect(() => calculatePortfolio(portfolioOf(['site-a', 'gone']), [siteA])).toThrow(/surveyIds\[1\]: .*"gone"/);
    expect(() => calculatePortfolio(portfolioOf(['site-a', 'site-a']), [siteA])).toThrow(/surveyIds\[1\]/);
    const euro: Survey = { ...siteB, money: { ...siteB.money, currency: 'EUR' } };
    const currency = siteA.money.currency;
    let error: unknown;
    try {
      calculatePortfolio(portfolioOf(['site-a', 'site-b']), [siteA, euro]);
    } catch (err) {
      error = err;
    }
    expect(error).toBeInstanceOf(CalcInputError);
    const e = error as CalcInputError;
    expect(e.field).toBe('surveyIds[1]');
    expect(e.problem).toContain('EUR');
    expect(e.problem).toContain(currency);
  });

  it('prefixes an error inside a site with its place in the portfolio', () => {
    const bad: Survey = { ...siteC, layout: { unitCount: 0, exceptions: [] } };
    expect(() => calculatePortfolio(portfolioOf(['site-a', 'site-c']), [siteA, bad])).toThrow(/surveyIds\[1\]\.layout\.unitCount/);
  });

  it('gives zero totals, no currency and a null payback for an empty portfolio, with no NaN', () => {
    const result = calculatePortfolio(portfolioOf([]), [siteA]);
    expect(result.currency).toBeNull();
    expect(result.sites).toEqual([]);
    expect(result.totals.money.cost.net).toBe(0);
    expect(result.totals.savings.kwhPerYear).toBe(0);
    expect(result.totals.money.simplePaybackYears).toBeNull();
    expect(result.economics.simplePaybackYears).toBeNull();
    expect(result.economics.netPresentValue).toBe(0);
    expect(result.economics.savingsToInvestmentRatio).toBeNull();
    const text = JSON.stringify(result, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? 'NOT FINITE' : v));
    expect(text).not.toContain('NOT FINITE');
  });
});
