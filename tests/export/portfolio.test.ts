import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { calculateLayout } from '../../src/calc/portfolio.ts';
import { CalcInputError } from '../../src/calc/errors.ts';
import { figuresFor } from '../../src/export/figures.ts';
import { orderLines } from '../../src/export/orders.ts';
import {
  phaseOrderCsv,
  phaseOrderLines,
  phaseOrderPdf,
  phaseOrdersCsvExporter,
  portfolioSections,
  portfolioSummary,
  portfolioSummaryPdf,
  preparePortfolioExport,
} from '../../src/export/portfolio.ts';
import { reportCautions } from '../../src/export/report.ts';
import { portfolioExporters } from '../../src/export/index.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import type { Portfolio, Survey } from '../../src/survey/model.ts';
import { pdfText, printed, squash } from './pdf-helpers.ts';

/** Two invented sites: the demo building as 8 flats of one layout (one flat already converted in the first room), and a one-off copy. */
function sites(): { portfolio: Portfolio; surveys: Survey[] } {
  const flats = demoSurvey();
  flats.id = 'flats';
  flats.name = 'Larchfield Row flats (demo)';
  flats.site = { name: 'Larchfield Row', address: '1 Example Lane' };
  const e0 = flats.rooms[0]!.entries[0]!;
  flats.layout = { unitCount: 8, exceptions: [{ id: 'x', unitLabel: 'Flat 2', entryCounts: [{ entryId: e0.id, count: 0 }], notes: '' }] };
  const hall = demoSurvey();
  hall.id = 'hall';
  hall.name = 'Quillby Hall (demo)';
  hall.site = { name: 'Quillby Hall', address: '2 Example Lane' };
  const stamp = '2026-11-20T09:00:00.000Z';
  return {
    surveys: [flats, hall],
    portfolio: {
      id: 'p1',
      name: 'Example estate (demo)',
      client: { name: 'Invented Housing Co-op', contact: 'A. Tester' },
      surveyIds: ['flats', 'hall'],
      plan: { budgetPerYear: 0, years: 3 },
      notes: '',
      createdAt: stamp,
      updatedAt: stamp,
    },
  };
}

function budgetFor(input: { measures: { cost: number }[] }): number {
  // A third of the total: the plan must spread the work.
  return Math.round(input.measures.reduce((s, m) => s + Math.max(0, m.cost), 0) / 3);
}

describe('portfolio summary PDF', async () => {
  const { portfolio, surveys } = sites();
  const probe = preparePortfolioExport(portfolio, surveys, { budgetPerYear: 1e6, years: 1 });
  const budget = budgetFor(probe);
  const input = preparePortfolioExport(portfolio, surveys, { budgetPerYear: budget, years: 3 });
  const fig = figuresFor(surveys[0]!);
  const bytes = await portfolioSummaryPdf(new AbortController().signal, input, { companyName: 'Brightwell Audits (invented)', date: new Date(2026, 10, 20) });
  const text = await pdfText(bytes);

  it('has every section and the cautions of the client report', () => {
    for (const heading of Object.values(portfolioSections)) expect(printed(text, heading)).toBe(true);
    for (const caution of reportCautions) expect(printed(text, caution)).toBe(true);
  });

  it('prints the roll-up totals equal to the calculation, layouts multiplied', () => {
    const flats = calculateLayout(surveys[0]!);
    const hall = calculateLayout(surveys[1]!);
    // Hand check of the roll-up: 7 regular flats × entry 0 + 8 flats × the rest, plus the hall.
    expect(input.result.totals.fixtures).toBe(flats.totals.fixtures + hall.totals.fixtures);
    expect(input.result.units).toBe(9);
    expect(printed(text, fig.number(input.result.totals.fixtures, 0))).toBe(true);
    expect(printed(text, fig.kwh(input.result.totals.savings.kwhPerYear))).toBe(true);
    expect(printed(text, fig.money(input.result.totals.money.cost.net))).toBe(true);
    expect(printed(text, fig.money(input.result.economics.netPresentValue))).toBe(true);
  });

  it('compares the sites side by side with their own figures', () => {
    for (const site of input.result.sites) {
      expect(printed(text, site.name)).toBe(true);
      expect(printed(text, fig.number(site.kwhSavedPerYear, 0))).toBe(true);
      expect(printed(text, fig.money(site.netCost))).toBe(true);
      expect(printed(text, fig.money(site.netPresentValue))).toBe(true);
      expect(printed(text, fig.number(site.kwSaved, 2))).toBe(true);
    }
  });

  it('prints the plan year by year, its NPV, and every deferred measure with its reason', () => {
    expect(input.plan.deferred.length).toBeGreaterThan(0);
    expect(printed(text, fig.money(input.plan.npv))).toBe(true);
    for (const y of input.plan.years) {
      expect(printed(text, fig.money(y.cost))).toBe(true);
      expect(printed(text, fig.money(y.cumulativeCashFlow))).toBe(true);
    }
    const flat = squash(text);
    for (const d of input.plan.deferred) expect(printed(flat, d.reason)).toBe(true);
  });

  it('the exporter names the file after the portfolio; portfolioExporters lists it', async () => {
    const file = await portfolioSummary.run(new AbortController().signal, input, { companyName: 'X', date: new Date(2026, 10, 20) });
    expect(file.fileName).toBe('example-estate-demo-portfolio.pdf');
    expect(new TextDecoder().decode(file.bytes.slice(0, 5))).toBe('%PDF-');
    expect(portfolioExporters.map((e) => e.id)).toEqual(['portfolio-summary', 'phase-orders-pdf', 'phase-orders-csv']);
  });

  it('stops when aborted', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(portfolioSummaryPdf(controller.signal, input, { companyName: 'X', date: new Date() })).rejects.toMatchObject({ name: 'AbortError' });
  });
});

describe('order list by phase', async () => {
  const { portfolio, surveys } = sites();
  const probe = preparePortfolioExport(portfolio, surveys, { budgetPerYear: 1e6, years: 1 });
  const input = preparePortfolioExport(portfolio, surveys, { budgetPerYear: budgetFor(probe), years: 3 });

  it('over all years, orders what the surveys need across every unit (spares aside)', () => {
    // Everything done in one year with a budget for all: the needed quantities
    // equal each survey's own order list with counts × units (7 flats for entry 0, 8 for the rest), summed by product.
    const all = phaseOrderLines(probe, { sparePercent: 0 });
    expect(all.every((l) => l.year === 1)).toBe(true);
    const expected = new Map<string, number>();
    for (const s of surveys) {
      const layout = calculateLayout(s);
      const counts = new Map([...layout.fixturesByEntry].filter(([id]) => probe.plan.assignments[`${s.id}/${id}`] === 1));
      for (const l of orderLines(s, { sparePercent: 0 }, counts)) expected.set(l.key, (expected.get(l.key) ?? 0) + l.needed);
    }
    expect(new Map(all.map((l) => [l.key, l.needed]))).toEqual(expected);
    // Hand check for one product: the flats' first entry, 7 flats × count × units per fixture.
    const e0 = surveys[0]!.rooms[0]!.entries[0]!;
    const m0 = probe.measures.find((m) => m.id === `flats/${e0.id}`)!;
    expect(m0.fixtures).toBe(7 * e0.count);
  });

  it('each year orders the products of that year\u2019s measures only', () => {
    const lines = phaseOrderLines(input, { sparePercent: 10 });
    for (const y of input.plan.years) {
      const units = input.measures.filter((m) => input.plan.assignments[m.id] === y.year).reduce((s, m) => s + m.productUnits, 0);
      const own = lines.filter((l) => l.year === y.year);
      expect(own.reduce((s, l) => s + l.needed, 0)).toBe(units);
      // 10 % spare, rounded up per line.
      for (const l of own) expect(l.spare).toBe(Math.ceil((l.needed * 10) / 100 - 1e-9));
    }
  });

  it('writes CSV that reads back to the same lines', async () => {
    const csv = phaseOrderCsv(input, { sparePercent: 5 });
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    const lines = phaseOrderLines(input, { sparePercent: 5 });
    expect(parsed.data.length).toBe(lines.length);
    parsed.data.forEach((row, i) => {
      expect(Number(row.phase_year)).toBe(lines[i]!.year);
      expect(Number(row.order_quantity)).toBe(lines[i]!.toOrder);
      expect(row.currency).toBe('USD');
    });
    const file = await phaseOrdersCsvExporter.run(new AbortController().signal, input, {});
    expect(file.fileName).toBe('example-estate-demo-orders-by-phase.csv');
  });

  it('prints each year\u2019s quantities in the PDF', async () => {
    const fig = figuresFor(surveys[0]!);
    const text = await pdfText(await phaseOrderPdf(new AbortController().signal, input, { companyName: 'Ashgrove (invented)', date: new Date(2026, 10, 20) }));
    const lines = phaseOrderLines(input);
    for (const y of input.plan.years) expect(printed(text, `Year ${y.year}`)).toBe(true);
    for (const l of lines) expect(printed(text, fig.number(l.toOrder, 0))).toBe(true);
  });

  it('names a missing survey by its place in the portfolio', () => {
    const { portfolio: p, surveys: s } = sites();
    expect(() => preparePortfolioExport(p, [s[0]!])).toThrow(CalcInputError);
    expect(() => preparePortfolioExport(p, [s[0]!])).toThrow(/surveyIds\[1\]/);
  });
});
