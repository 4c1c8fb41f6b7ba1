import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { isAbortError } from '../../src/export/abort.ts';
import { figuresFor, lightQualitySentence } from '../../src/export/figures.ts';
import { clientReport, clientReportPdf, reportSections, severityHeadings } from '../../src/export/report.ts';
import type { ReportSettings } from '../../src/export/types.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import type { Survey } from '../../src/survey/model.ts';
import { pageCount, pdfText, pngDataUrl, printed, renderPages } from './pdf-helpers.ts';

const settings: ReportSettings = {
  companyName: 'Brightwell Energy Audits (invented)',
  companyDetails: ['12 Lantern Street, Fernhollow'],
  preparedBy: 'R. Ostrander',
  date: new Date(2026, 10, 20),
  logo: { dataUrl: pngDataUrl(60, 20, [0, 98, 110], [240, 200, 60]), width: 60, height: 20 },
  photos: [
    { caption: 'Shop floor troffers, looking north', dataUrl: pngDataUrl(40, 30, [200, 200, 190], [90, 90, 80]), width: 40, height: 30 },
    { caption: 'Basement strip with 1978 ballast label', dataUrl: pngDataUrl(30, 40, [120, 140, 160], [30, 30, 30]), width: 30, height: 40 },
  ],
};

async function report(survey: Survey, extra: Partial<ReportSettings> = {}) {
  const result = calculateSurvey(survey);
  const bytes = await clientReportPdf(new AbortController().signal, { survey, result }, { ...settings, ...extra });
  return { result, bytes, text: await pdfText(bytes) };
}

describe('client report (demo survey, imperial, USD)', async () => {
  const survey = demoSurvey();
  const { result, bytes, text } = await report(survey);
  const fig = figuresFor(survey);
  await renderPages(bytes, 'demo-report');

  it('is a compressed PDF with a running header and page numbers', () => {
    expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-');
    expect(new TextDecoder('latin1').decode(bytes)).toContain('/FlateDecode');
    const pages = pageCount(text);
    expect(pages).toBeGreaterThanOrEqual(6);
    expect(printed(text, `Page 1 of ${pages}`)).toBe(true);
    expect(printed(text, `Page ${pages} of ${pages}`)).toBe(true);
    expect(printed(text, 'Lighting upgrade assessment — Tallowmere Corner')).toBe(true);
  });

  it('has the cover details', () => {
    for (const s of [settings.companyName, survey.client.name, survey.site.name, survey.site.address, 'R. Ostrander', fig.date(settings.date)]) {
      expect(printed(text, s), s).toBe(true);
    }
    expect(fig.date(settings.date)).toBe('November 20, 2026');
  });

  it('prints the key figures equal to the calculation, formatted as the report formats them', () => {
    const t = result.totals;
    const e = result.economics;
    const figures = [
      fig.kwh(t.savings.kwhPerYear),
      fig.kw(t.savings.peakKw),
      fig.kw(t.savings.connectedKw),
      fig.money(t.money.totalPerYear),
      fig.money(t.money.cost.gross),
      fig.money(t.money.cost.rebates),
      fig.money(t.money.cost.net),
      fig.payback(e.simplePaybackYears),
      fig.money(e.netPresentValue),
      fig.irr(e.internalRateOfReturn),
      fig.co2(t.co2KgPerYear),
    ];
    for (const f of figures) expect(printed(text, f), f).toBe(true);
    // The check can fail: a figure off by a cent-odd amount is not in the text.
    expect(printed(text, fig.money(t.money.cost.net + 1234.57))).toBe(false);
    // The formatter itself is Intl's (ECMA-402 currency formatting in en-US), not a hand-made one.
    const intl = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' });
    expect(fig.money(t.money.cost.net)).toBe(intl.format(t.money.cost.net));
    expect(fig.kwh(t.savings.kwhPerYear)).toBe(`${new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 }).format(t.savings.kwhPerYear)} kWh`);
    expect(e.internalRateOfReturn.kind).toBe('unique');
    expect(printed(text, lightQualitySentence(result))).toBe(true);
  });

  it('prints every warning title present in the survey, under its severity', () => {
    expect(result.warnings.length).toBeGreaterThan(0);
    for (const w of result.warnings) expect(printed(text, w.title), w.title).toBe(true);
    for (const severity of ['danger', 'caution', 'advice'] as const) {
      const n = result.warningCounts[severity];
      if (n > 0) expect(printed(text, `${severityHeadings[severity]} (${n})`), severity).toBe(true);
    }
  });

  it('has every section, every room, and the adequacy figures in imperial units', () => {
    for (const heading of Object.values(reportSections)) expect(printed(text, heading), heading).toBe(true);
    for (const room of result.rooms) {
      expect(printed(text, room.name)).toBe(true);
      expect(printed(text, fig.quantity('illuminance', room.adequacy.targetLux))).toBe(true);
      expect(printed(text, fig.quantity('powerDensity', room.adequacy.allowanceWattsPerSquareMetre))).toBe(true);
    }
    expect(text).toContain(' fc');
    expect(text).toContain('W/ft²');
  });

  it('names the published sources and the cautions', () => {
    for (const source of ['Bonneville Power Administration', 'Uniform Methods Project', '90.1-2019', 'IES', 'eGRID2022', 'NIST Handbook 135']) {
      expect(printed(text, source), source).toBe(true);
    }
    expect(printed(text, result.factors.sources.grid)).toBe(true);
    expect(printed(text, 'These figures are estimates, not guarantees.')).toBe(true);
    expect(printed(text, 'licensed electrician')).toBe(true);
    expect(printed(text, 'Basement strip with 1978 ballast label')).toBe(true);
  });

  it('exposes the contract of an exporter', async () => {
    const file = await clientReport.run(new AbortController().signal, { survey, result }, settings);
    expect(clientReport.mimeType).toBe('application/pdf');
    expect(file.fileName).toBe('tallowmere-corner-shop-and-flats-demo-report.pdf');
    expect(file.bytes.length).toBeGreaterThan(1000);
  });
});

describe('client report in SI units and euros', () => {
  it('prints lx, m², W/m² and money formatted for de-DE', async () => {
    const survey = { ...demoSurvey(), units: 'si' as const, locale: 'de-DE', money: { ...demoSurvey().money, currency: 'EUR' } };
    const { result, text } = await report(survey, { photos: [] });
    const fig = figuresFor(survey);
    expect(fig.money(result.totals.money.cost.net)).toMatch(/^\d{1,3}(\.\d{3})*,\d{2}\u00a0€$/);
    expect(printed(text, fig.money(result.totals.money.cost.net))).toBe(true);
    expect(printed(text, fig.kwh(result.totals.savings.kwhPerYear))).toBe(true);
    expect(printed(text, fig.quantity('illuminance', result.rooms[0]!.adequacy.targetLux))).toBe(true);
    expect(fig.quantity('illuminance', result.rooms[0]!.adequacy.targetLux)).toMatch(/ lx$/);
    expect(text).toContain('W/m²');
    expect(text).toContain('m²');
    expect(text).not.toContain('W/ft²');
  });
});

describe('client report: honest IRR, cancel, progress and bad settings', () => {
  it('says there is no IRR when nothing is invested', async () => {
    const survey = demoSurvey();
    for (const room of survey.rooms) for (const entry of room.entries) entry.proposed = null;
    const { result, text } = await report(survey, { photos: [] });
    expect(result.economics.internalRateOfReturn.kind).toBe('none');
    expect(printed(text, figuresFor(survey).irr(result.economics.internalRateOfReturn))).toBe(true);
  });

  it('reports progress from 0 to 1 without going back', async () => {
    const survey = demoSurvey();
    const seen: number[] = [];
    await clientReportPdf(new AbortController().signal, { survey, result: calculateSurvey(survey) }, settings, (f) => seen.push(f));
    expect(seen[0]).toBe(0);
    expect(seen[seen.length - 1]).toBe(1);
    for (let i = 1; i < seen.length; i++) expect(seen[i]!).toBeGreaterThan(seen[i - 1]!);
  });

  it('rejects with an AbortError when cancelled, before or during the export', async () => {
    const survey = demoSurvey();
    const input = { survey, result: calculateSurvey(survey) };
    const before = await clientReportPdf(AbortSignal.abort(), input, settings).catch((e: unknown) => e);
    expect(isAbortError(before)).toBe(true);
    const controller = new AbortController();
    const during = await clientReportPdf(controller.signal, input, settings, (f) => {
      if (f >= 0.1) controller.abort();
    }).catch((e: unknown) => e);
    expect(isAbortError(during)).toBe(true);
    expect(during).toBeInstanceOf(DOMException);
  });

  it('names the field of a logo or photo that is not a PNG or JPEG data URL', async () => {
    const survey = demoSurvey();
    const input = { survey, result: calculateSurvey(survey) };
    const badLogo = await clientReportPdf(new AbortController().signal, input, {
      ...settings,
      logo: { dataUrl: 'data:image/gif;base64,R0lGOD', width: 10, height: 10 },
    }).catch((e: unknown) => e);
    expect(badLogo).toBeInstanceOf(CalcInputError);
    expect((badLogo as CalcInputError).field).toBe('logo.dataUrl');
    const badPhoto = await clientReportPdf(new AbortController().signal, input, {
      ...settings,
      photos: [{ caption: 'x', dataUrl: pngDataUrl(2, 2, [0, 0, 0], [9, 9, 9]), width: 0, height: 2 }],
    }).catch((e: unknown) => e);
    expect((badPhoto as CalcInputError).field).toBe('photos[0].width');
  });
});
