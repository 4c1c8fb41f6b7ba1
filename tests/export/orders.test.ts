import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { figuresFor } from '../../src/export/figures.ts';
import { orderCsvColumns, orderLines, orderListCsv, orderListPdf, spareUnits } from '../../src/export/orders.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { pdfText, printed, renderPages } from './pdf-helpers.ts';

describe('order list', () => {
  const survey = demoSurvey();

  it('rounds spare stock up to whole units', () => {
    // ⌈n × p / 100⌉ by hand (common practice, no published source).
    expect(spareUnits(5, 10)).toBe(1); // 0.5 → 1
    expect(spareUnits(12, 10)).toBe(2); // 1.2 → 2
    expect(spareUnits(100, 5)).toBe(5); // exactly 5
    expect(spareUnits(41, 5)).toBe(3); // 2.05 → 3
    expect(spareUnits(7, 0)).toBe(0);
  });

  it('sums catalog products across rooms and groups custom specs by name, watts and lumens', () => {
    const lines = orderLines(survey, { sparePercent: 10 });
    const a19 = lines.find((l) => l.catalogId === 'example-a19-basic')!;
    // Living room 3 fixtures × 1 + bathroom 1 fixture × 2 = 5 lamps, in 2 rooms.
    expect(a19.needed).toBe(5);
    expect(a19.rooms).toBe(2);
    expect(a19.spare).toBe(1);
    expect(a19.toOrder).toBe(6);
    const customs = lines.filter((l) => l.catalogId === null).map((l) => l.name).sort();
    expect(customs).toEqual(['Bulkhead LED 12 W 1,300 lm 4000 K', 'PAR38 LED 14 W 1,250 lm 3000 K (custom spec)']);
    // Two entries with the same custom spec in different rooms become one line.
    const copy = demoSurvey();
    copy.rooms[3]!.entries[0]!.proposed = { ...copy.rooms[1]!.entries[0]!.proposed! };
    const bulk = orderLines(copy).find((l) => l.name.startsWith('Bulkhead'))!;
    expect(bulk.needed).toBe(6 + 1);
    expect(bulk.rooms).toBe(2);
    const needed = survey.rooms.flatMap((r) => r.entries).reduce((n, e) => n + (e.proposed ? e.count * e.proposed.unitsPerFixture : 0), 0);
    expect(lines.reduce((n, l) => n + l.needed, 0)).toBe(needed);
  });

  it('writes CSV that parses back to the same lines', () => {
    const csv = orderListCsv(survey, { sparePercent: 10 });
    const rows = Papa.parse<Record<string, string>>(csv, { header: true }).data;
    expect(Object.keys(rows[0]!)).toEqual([...orderCsvColumns]);
    const lines = orderLines(survey, { sparePercent: 10 });
    expect(rows.map((r) => Number(r.order_quantity))).toEqual(lines.map((l) => l.toOrder));
    expect(rows.map((r) => r.product_name)).toEqual(lines.map((l) => l.name));
    expect(rows.every((r) => r.currency === 'USD' && r.spare_percent === '10')).toBe(true);
  });

  it('refuses a spare percentage out of range', () => {
    expect(() => orderLines(survey, { sparePercent: 150 })).toThrow(CalcInputError);
  });

  it('prints a PDF page with each product and its quantities', async () => {
    const result = calculateSurvey(survey);
    const bytes = await orderListPdf(new AbortController().signal, { survey, result }, { companyName: 'Ashgrove Electrical (invented)', date: new Date(2026, 10, 20), sparePercent: 10 });
    await renderPages(bytes, 'demo-orders');
    const text = await pdfText(bytes);
    const fig = figuresFor(survey);
    for (const l of orderLines(survey, { sparePercent: 10 })) {
      // Long names wrap inside their cell, and pdftotext reads a wrapped cell's lines apart.
      expect(printed(text, l.name.slice(0, 24)), l.name).toBe(true);
      expect(printed(text, fig.money(l.orderCost)), l.name).toBe(true);
    }
    expect(printed(text, '10 % spare stock')).toBe(true);
  });
});
