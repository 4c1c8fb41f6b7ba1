/**
 * Exports of a survey with a repeated layout: the order list, the quote and
 * the report multiply every fixture by the units of the layout (less the
 * differing units), and say so in one line. The explicit-copies survey is the
 * reference: the same units entered room by room. Invented demo data (common
 * practice, no published source).
 */
import { describe, expect, it } from 'vitest';
import { calculateLayout } from '../../src/calc/portfolio.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { figuresFor } from '../../src/export/figures.ts';
import { layoutNote, orderLines, orderListCsv, orderListPdf } from '../../src/export/orders.ts';
import { contractorQuotePdf, quoteLines } from '../../src/export/quote.ts';
import { clientReportPdf, summaryRows } from '../../src/export/report.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import type { Survey } from '../../src/survey/model.ts';
import { pdfText, printed } from './pdf-helpers.ts';

const signal = () => new AbortController().signal;
const settings = { companyName: 'Ashgrove Electrical (invented)', date: new Date(2026, 10, 20) };

/** The demo as one of 24 flats; Flat 3B has no troffers left to change, Flat 7A three bulkheads. */
function layoutSurvey(): Survey {
  return {
    ...demoSurvey(),
    layout: {
      unitCount: 24,
      exceptions: [
        { id: 'f3b', unitLabel: 'Flat 3B', entryCounts: [{ entryId: 'demo-shop-troffers', count: 0 }], notes: 'Converted' },
        { id: 'f7a', unitLabel: 'Flat 7A', entryCounts: [{ entryId: 'demo-stair-bulkheads', count: 3 }], notes: '' },
      ],
    },
  };
}

/** The same 24 units entered room by room (fresh ids), for reference. */
function copies(survey: Survey): Survey {
  const layout = survey.layout!;
  const rooms = Array.from({ length: layout.unitCount }, (_, u) => {
    const unit = layout.exceptions[u];
    return survey.rooms.map((room) => ({
      ...room,
      id: `${room.id}~${u}`,
      entries: room.entries.map((entry) => ({
        ...entry,
        id: `${entry.id}~${u}`,
        count: unit?.entryCounts.find((c) => c.entryId === entry.id)?.count ?? entry.count,
      })),
    }));
  }).flat();
  const { layout: _layout, ...rest } = survey;
  return { ...rest, rooms };
}

describe('exports of a repeated layout', () => {
  const survey = layoutSurvey();
  const result = calculateSurvey(survey);
  const reference = copies(survey);
  const referenceResult = calculateSurvey(reference);

  it('the order list orders fixtures × units, equal to the explicitly copied units', () => {
    const lines = orderLines(survey, { sparePercent: 5 });
    const expected = orderLines(reference, { sparePercent: 5 });
    expect(lines.map((l) => [l.key, l.needed, l.spare, l.toOrder])).toEqual(expected.map((l) => [l.key, l.needed, l.spare, l.toOrder]));
    // Troffer kit: 12 per unit, 23 units (Flat 3B has none) → 276 fixtures.
    const troffer = survey.rooms[0]!.entries[0]!.proposed!;
    const trofferLine = lines.find((l) => l.catalogId === troffer.catalogId)!;
    expect(trofferLine.needed).toBe(23 * 12 * troffer.unitsPerFixture);
    // The phased list's explicit counts still win.
    const one = orderLines(survey, { sparePercent: 0 }, new Map([['demo-shop-troffers', 2]]));
    expect(one).toHaveLength(1);
    expect(one[0]!.needed).toBe(2 * troffer.unitsPerFixture);
    expect(orderListCsv(survey).split('\r\n').length).toBe(orderListCsv(reference).split('\r\n').length);
  });

  it('the quote covers every unit: lines and totals equal the copies’, and say so', async () => {
    const { lines, totals } = quoteLines(survey, result);
    const expected = quoteLines(reference, referenceResult);
    expect(totals.total).toBeCloseTo(expected.totals.total, 6);
    expect(totals.tax).toBeCloseTo(expected.totals.tax, 6);
    const sum = (list: typeof lines, f: (l: (typeof lines)[number]) => number) => list.reduce((s, l) => s + f(l), 0);
    expect(sum(lines, (l) => l.quantity)).toBe(sum(expected.lines, (l) => l.quantity));
    expect(sum(lines, (l) => l.total)).toBeCloseTo(sum(expected.lines, (l) => l.total), 6);
    expect(lines).toHaveLength(7);
    expect(lines[0]!.fixtures).toBe(23 * 12);

    const text = await pdfText(await contractorQuotePdf(signal(), { survey, result }, settings));
    const fig = figuresFor(survey);
    expect(printed(text, 'Figures for all 24 units of this layout (2 differ).')).toBe(true);
    expect(printed(text, fig.money(totals.total))).toBe(true);
    expect(printed(text, `the surveyed unit alone comes to ${fig.money(result.totals.money.cost.net)}`)).toBe(true);
  });

  it('the report shows all-units and per-unit figures, with the layout line', async () => {
    const fig = figuresFor(survey);
    const layout = calculateLayout(survey, result);
    const rows = new Map(summaryRows(survey, result, fig));
    expect(rows.get('Units of this layout')).toBe('24, of which 2 differ from the surveyed unit');
    expect(rows.get('Energy saved per year (with HVAC interaction)')).toBe(
      `${fig.kwh(layout.totals.savings.kwhPerYear)} (per unit: ${fig.kwh(result.totals.savings.kwhPerYear)})`,
    );
    expect(rows.get('Project cost net of rebates')).toBe(`${fig.money(layout.totals.money.cost.net)} (per unit: ${fig.money(result.totals.money.cost.net)})`);
    // The all-units figure is the copies' figure.
    expect(fig.money(layout.totals.money.cost.net)).toBe(fig.money(referenceResult.totals.money.cost.net));
    expect(rows.get(`Net present value (${survey.money.analysisYears} years at ${fig.percent(survey.money.discountRatePerYear)} real)`)).toBe(
      fig.money(referenceResult.economics.netPresentValue),
    );

    const text = await pdfText(await clientReportPdf(signal(), { survey, result }, settings));
    expect(printed(text, 'Figures for all 24 units of this layout (2 differ).')).toBe(true);
    expect(printed(text, fig.kwh(layout.totals.savings.kwhPerYear))).toBe(true);
    expect(printed(text, 'the room tables and charts describe the surveyed unit')).toBe(true);
  });

  it('the order list PDF says it covers the layout', async () => {
    const text = await pdfText(await orderListPdf(signal(), { survey, result }, { ...settings, sparePercent: 5 }));
    expect(printed(text, 'Figures for all 24 units of this layout (2 differ).')).toBe(true);
    const total = orderLines(survey, { sparePercent: 5 }).reduce((n, l) => n + l.toOrder, 0);
    expect(printed(text, figuresFor(survey).number(total, 0))).toBe(true);
  });

  it('a survey without a layout prints no layout line', async () => {
    const plain = demoSurvey();
    expect(layoutNote(plain, figuresFor(plain))).toBeNull();
    expect(layoutNote({ layout: { unitCount: 6, exceptions: [] } }, figuresFor(plain))).toBe('Figures for all 6 units of this layout.');
    const text = await pdfText(await contractorQuotePdf(signal(), { survey: plain, result: calculateSurvey(plain) }, settings));
    expect(text).not.toMatch(/of this layout/);
  });
});
