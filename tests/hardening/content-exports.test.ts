/**
 * Hostile text in the exports: every free-text field of a survey holds HTML,
 * script, a `javascript:` URL, template syntax or a spreadsheet formula
 * (tests/hardening/support/payloads.ts). The PDFs (client report, contractor
 * quote, order list) print that text literally, as read back by poppler's
 * pdftotext; the CSVs (fixture schedule, order list) hold it literally too,
 * except that a text cell starting with =, +, - or @ gets one leading
 * apostrophe, so a spreadsheet shows it instead of running it (OWASP "CSV
 * Injection", from memory). Nothing is dropped or escaped as HTML (no
 * `&lt;`): the exports are not web pages.
 */
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { contractorQuotePdf, clientReportPdf, fixtureScheduleCsv, orderListCsv, orderListPdf } from '../../src/export/index.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { problemsAgainst, surveySchema } from '../../src/survey/validate.ts';
import { pdfText, printed } from '../export/pdf-helpers.ts';
import { hostileSurvey, payloads } from './support/payloads.ts';

const survey = hostileSurvey(demoSurvey(), 'hostile');
const result = calculateSurvey(survey);
const signal = () => new AbortController().signal;
const date = new Date(2026, 10, 20);

/** A cell that a spreadsheet would run as a formula: starts with =, +, - or @ (after any tab or CR) and is not a plain number. */
const runnable = (cell: string) => /^[\t\r]*[=+\-@]/.test(cell) && !/^-?\d+([.,]\d+)?$/.test(cell);

function cells(csv: string): string[] {
  const parsed = Papa.parse<string[]>(csv, { skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data.flat();
}

describe('hostile text in the exports', () => {
  it('the hostile survey is a valid survey (the payloads are accepted as ordinary text)', () => {
    expect(problemsAgainst(surveySchema, survey)).toEqual([]);
    expect(result.totals.entries).toBeGreaterThan(0);
  });

  it('PDFs print every payload literally', async () => {
    const report = await pdfText(await clientReportPdf(signal(), { survey, result }, { companyName: `Auditor ${payloads.script}`, preparedBy: payloads.alert, date }));
    const quote = await pdfText(await contractorQuotePdf(signal(), { survey, result }, { companyName: payloads.svg, date, quoteNumber: payloads.formula }));
    const orders = await pdfText(await orderListPdf(signal(), { survey, result }, { companyName: payloads.hyperlink, date, sparePercent: 10 }));
    // Placements printed whole: pdftotext reads a table cell that wraps
    // interleaved with its neighbours, which says nothing about the text.
    const expected: [string, string, string][] = [
      ['report', report, survey.name],
      ['report', report, `Auditor ${payloads.script}`],
      ['report', report, payloads.alert],
      ['report', report, survey.rooms[0]!.name],
      ['report', report, survey.rooms[1]!.name],
      ['report', report, payloads.formula],
      ['quote', quote, payloads.svg],
      ['quote', quote, payloads.formula],
      ['quote', quote, `Client ${payloads.template}, ${payloads.formula}`],
      ['quote', quote, `Site ${payloads.svg}, ${payloads.jsUrl}`],
      ['quote', quote, payloads.alert],
      ['quote', quote, payloads.at],
      ['order list', orders, payloads.hyperlink],
      ['order list', orders, payloads.at],
    ];
    const missing = expected.filter(([, text, payload]) => !printed(text, payload)).map(([doc, , payload]) => `${doc}: ${payload}`);
    expect(missing).toEqual([]);
    // Never HTML-escaped: the PDF is not a web page.
    for (const text of [report, quote, orders]) expect(text).not.toMatch(/&lt;|&gt;|&quot;|&#/);
    console.log(`content in PDFs: ${expected.length} payload placements checked in 3 PDFs, 0 altered`);
  }, 60_000);

  it('CSVs hold every payload literally, formula cells neutralised with one apostrophe', () => {
    const schedule = cells(fixtureScheduleCsv(survey, result));
    const orders = cells(orderListCsv(survey, { sparePercent: 10 }));
    const semicolon = cells(fixtureScheduleCsv(survey, result, { delimiter: ';', decimalSeparator: ',' }));
    for (const list of [schedule, orders, semicolon]) expect(list.filter(runnable)).toEqual([]);

    const expected: [string, string[], string][] = [
      ['schedule', schedule, `'${payloads.hyperlink}`],
      ['schedule', schedule, survey.rooms[1]!.name],
      ['schedule', schedule, `'${payloads.formula}`],
      ['schedule', schedule, `Fixture ${payloads.script}`],
      ['schedule', schedule, `${payloads.template} ${payloads.alert}`],
      ['schedule', schedule, `'${payloads.plus}`],
      ['schedule', schedule, `'${payloads.at}`],
      ['schedule ;', semicolon, `'${payloads.formula}`],
      ['schedule ;', semicolon, survey.rooms[1]!.name],
      ['order list', orders, `'${payloads.at}`],
    ];
    const missing = expected.filter(([, list, cell]) => !list.includes(cell)).map(([doc, , cell]) => `${doc}: ${cell}`);
    expect(missing).toEqual([]);
    console.log(`content in CSVs: ${schedule.length + orders.length + semicolon.length} cells in 3 CSVs, ${expected.length} payload cells checked, 0 runnable`);
  });
});
