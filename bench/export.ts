/**
 * Export speed for `npm run bench`: the client report of a 1,000-entry
 * survey against a bare jspdf-autotable table of the same fixture rows
 * (same columns, same formatting, same compression), in the same run.
 * Goal: report ≤ 2 × the bare table.
 */
import { performance } from 'node:perf_hooks';
import { jsPDF } from 'jspdf';
import { autoTable } from 'jspdf-autotable';
import { calculateSurvey } from '../src/calc/survey.ts';
import { figuresFor } from '../src/export/figures.ts';
import { clientReportPdf, entryTableColumnStyles, entryTableHead, roomEntryRows } from '../src/export/report.ts';
import { pdfSafeText } from '../src/export/text.ts';
import { syntheticSurvey } from './synthetic.ts';

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

/**
 * Times both and returns the figures for the "export" key of the benchmark JSON.
 *
 * @example await exportBench() //=> { entries: 1000, reportMs: …, bareTableMs: …, ratioToBareTable: 1.6, ratioGoal: 2, … }
 */
export async function exportBench(entryCount = 1000, repeats = 5): Promise<Record<string, number>> {
  const survey = syntheticSurvey(entryCount, 10, 7);
  const result = calculateSurvey(survey);
  const input = { survey, result };
  const settings = { companyName: 'Benchmark Audits', date: new Date(2026, 0, 1) };
  const signal = new AbortController().signal;

  const bare = (): number => {
    const fig = figuresFor(survey);
    const body = survey.rooms.flatMap((_, i) => roomEntryRows(survey, result, i, fig)).map((row) => row.map(pdfSafeText));
    const doc = new jsPDF({ unit: 'pt', format: 'letter', compress: true });
    autoTable(doc, { head: [entryTableHead], body, theme: 'grid', styles: { fontSize: 8 }, columnStyles: entryTableColumnStyles() });
    return doc.output('arraybuffer').byteLength;
  };

  // Warm up both so the JIT has compiled them.
  await clientReportPdf(signal, input, settings);
  bare();

  const reportMs: number[] = [];
  const bareMs: number[] = [];
  let reportBytes = 0;
  let bareBytes = 0;
  for (let i = 0; i < repeats; i++) {
    let t0 = performance.now();
    reportBytes = (await clientReportPdf(signal, input, settings)).length;
    reportMs.push(performance.now() - t0);
    t0 = performance.now();
    bareBytes = bare();
    bareMs.push(performance.now() - t0);
  }
  const round = (n: number) => Math.round(n * 1000) / 1000;
  const report = median(reportMs);
  const table = median(bareMs);
  return {
    entries: entryCount,
    reportMs: round(report),
    bareTableMs: round(table),
    ratioToBareTable: round(report / table),
    ratioGoal: 2,
    reportKb: round(reportBytes / 1024),
    bareTableKb: round(bareBytes / 1024),
    warnings: result.warnings.length,
  };
}
