import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { figuresFor } from '../../src/export/figures.ts';
import { contractorQuotePdf, quoteLines, validUntil } from '../../src/export/quote.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { pdfText, printed, renderPages } from './pdf-helpers.ts';

const signal = () => new AbortController().signal;

describe('contractor quote', () => {
  const survey = demoSurvey();
  const result = calculateSurvey(survey);
  const cost = result.totals.money.cost;

  it('has totals equal to the calculation cost figures, and lines that add up to them', () => {
    for (const markup of ['in-prices', 'separate-line'] as const) {
      const { lines, totals } = quoteLines(survey, result, markup);
      expect(totals.totalBeforeRebates).toBe(cost.gross);
      expect(totals.tax).toBe(cost.tax);
      expect(totals.rebates).toBe(cost.rebates);
      expect(totals.total).toBe(cost.net);
      const sum = lines.reduce((s, l) => s + l.total, 0);
      expect(sum).toBeCloseTo(totals.subtotal, 9);
      // gross = materials + labour + disposal + markup + tax (src/calc/costs.ts projectCost; common practice, no published source)
      expect(totals.subtotal + (totals.markup ?? 0) + totals.tax).toBeCloseTo(cost.gross, 9);
    }
    const { lines } = quoteLines(survey, result);
    // One line per entry being changed: every demo entry has a proposal.
    expect(lines.map((l) => l.number)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    // Bathroom: one fixture with two lamps → quantity 2 units.
    const bath = lines.find((l) => l.roomName === 'Flat 1 — bathroom')!;
    expect(bath.quantity).toBe(2);
    expect(bath.unitPrice).toBeCloseTo(2.4 * (1 + survey.money.markupFraction), 12);
  });

  it('prints the lines, totals, validity date, terms and acceptance block', async () => {
    const date = new Date(2026, 10, 20);
    const bytes = await contractorQuotePdf(signal(), { survey, result }, { companyName: 'Ashgrove Electrical (invented)', date, quoteNumber: 'Q-0042' });
    await renderPages(bytes, 'demo-quote');
    const text = await pdfText(bytes);
    const fig = figuresFor(survey);
    const { lines, totals } = quoteLines(survey, result);
    for (const l of lines) {
      expect(printed(text, fig.money(l.total)), l.product).toBe(true);
      expect(printed(text, fig.money(l.unitPrice)), l.product).toBe(true);
    }
    expect(printed(text, fig.money(totals.subtotal))).toBe(true);
    expect(printed(text, fig.money(cost.tax))).toBe(true);
    expect(printed(text, fig.money(0 - cost.rebates))).toBe(true);
    expect(printed(text, fig.money(cost.gross))).toBe(true);
    expect(printed(text, `Total (USD) ${fig.money(cost.net)}`)).toBe(true);
    // 30 days after 20 November 2026 is 20 December 2026 (calendar arithmetic by hand).
    expect(printed(text, 'Valid until December 20, 2026')).toBe(true);
    expect(printed(text, 'Quotation Q-0042')).toBe(true);
    for (const s of ['Terms', 'Acceptance', 'For the client', 'Signature', 'licensed electrician']) expect(printed(text, s), s).toBe(true);
  });

  it('takes a configurable validity and refuses one out of range', async () => {
    expect(validUntil(new Date(2026, 0, 31), 30)).toEqual(new Date(2026, 2, 2)); // 31 Jan + 30 days = 2 Mar (2026 is not a leap year)
    const bytes = await contractorQuotePdf(signal(), { survey, result }, { companyName: 'A', date: new Date(2026, 10, 20), validDays: 45 });
    expect(printed(await pdfText(bytes), 'January 4, 2027')).toBe(true); // 20 Nov + 45 days = 4 Jan
    const err = await contractorQuotePdf(signal(), { survey, result }, { companyName: 'A', date: new Date(), validDays: 0 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(CalcInputError);
    expect((err as CalcInputError).field).toBe('validDays');
  });
});
