/**
 * Documents for a whole portfolio: the summary a landlord decides on (roll-up
 * totals, the sites side by side, the phased plan year by year with its cash
 * flow and the measures that wait and why, the cautions) and the order list
 * by phase (CSV and PDF: per plan year, the products to order, with each
 * layout's fixtures multiplied across its units).
 */
import { CalcInputError, checkRange } from '../calc/errors.ts';
import { measuresFromSurveys, planPhases, type Measure, type PlanOptions } from '../calc/phasing.ts';
import { calculatePortfolio } from '../calc/portfolio.ts';
import type { PhasePlanSettings, Portfolio, Survey } from '../survey/model.ts';
import { pause, progressReporter } from './abort.ts';
import { niceStep } from './charts.ts';
import { toCsv, type CsvCell } from './csv.ts';
import { figuresFor, type Figures } from './figures.ts';
import {
  defaultSparePercent,
  orderLines,
  orderProductCsvCells,
  orderProductCsvColumns,
  orderQuantities,
  orderTable,
  sortOrderLines,
  type OrderLine,
} from './orders.ts';
import { colours, csvExporterFor, paperFor, pdfExporterFor, PdfWriter, sizes } from './pdf.ts';
import { reportCautions } from './report.ts';
import type {
  CsvFormat,
  OrderSettings,
  PhaseOrderPdfSettings,
  PortfolioExporter,
  PortfolioExportInput,
  PortfolioSummarySettings,
  ProgressCallback,
} from './types.ts';

/** Title of the portfolio summary. */
export const portfolioTitle = 'Portfolio lighting upgrade plan';

/** Headings of the summary's sections, in order (tests look for them). */
export const portfolioSections = {
  totals: 'Portfolio totals',
  sites: 'Sites compared',
  plan: 'Phased plan',
  measures: 'Measures by year',
  deferred: 'Measures that wait, and why',
  cautions: 'Cautions and disclaimer',
} as const;

/**
 * Everything the portfolio documents need, from a portfolio and the surveys
 * (any order; others in the list are ignored): the roll-up, the measures and
 * the plan. `settings` defaults to the portfolio's own plan settings. Throws a
 * `CalcInputError` naming the field for a missing survey, two currencies, or
 * bad plan settings.
 *
 * @example preparePortfolioExport(portfolio, surveys).plan.years.length //=> portfolio.plan.years
 */
export function preparePortfolioExport(
  portfolio: Portfolio,
  surveys: readonly Survey[],
  settings: PhasePlanSettings = portfolio.plan,
  options: PlanOptions = {},
): PortfolioExportInput {
  const result = calculatePortfolio(portfolio, surveys);
  const byId = new Map(surveys.map((s) => [s.id, s] as const));
  const own = portfolio.surveyIds.map((id) => byId.get(id)!);
  let measures: Measure[];
  try {
    measures = measuresFromSurveys(own);
  } catch (err) {
    if (err instanceof CalcInputError) {
      throw new CalcInputError(err.field.replace(/^surveys\[(\d+)\]/, (_, i: string) => `surveyIds[${i}]`), err.problem);
    }
    throw err;
  }
  const first = own[0];
  const plan = planPhases(measures, settings, {
    ...(first ? { locale: first.locale, currency: first.money.currency } : {}),
    ...options,
  });
  return { portfolio, surveys: own, result, measures, plan };
}

function figuresOf(input: PortfolioExportInput): Figures {
  const first = input.surveys[0];
  return figuresFor({ locale: first?.locale ?? 'en-US', units: first?.units ?? 'si', money: { currency: input.result.currency ?? 'USD' } });
}

/** One line of the order list by phase: products for one plan year across every site. */
export interface PhaseOrderLine extends OrderLine {
  /** 1-based plan year. */
  year: number;
  /** Sites the product goes to. */
  sites: number;
}

/**
 * The products to order for each plan year: the order lines of the entries
 * done that year, with each entry's fixtures across its layout's units,
 * merged across sites by product (spares recomputed on the merged quantity).
 * Years with nothing to order are left out.
 *
 * @example phaseOrderLines(input)[0].year //=> 1
 */
export function phaseOrderLines(input: PortfolioExportInput, settings: OrderSettings = {}): PhaseOrderLine[] {
  const percent = checkRange('sparePercent', settings.sparePercent ?? defaultSparePercent, 0, 100);
  const byMeasure = new Map(input.measures.map((m) => [m.id, m] as const));
  const out: PhaseOrderLine[] = [];
  const locale = input.surveys[0]?.locale ?? 'en-US';
  for (const year of input.plan.years) {
    const countsBySurvey = new Map<string, Map<string, number>>();
    for (const id of year.measures) {
      const m = byMeasure.get(id);
      if (!m) continue;
      let counts = countsBySurvey.get(m.surveyId);
      if (!counts) countsBySurvey.set(m.surveyId, (counts = new Map()));
      counts.set(m.entryId, m.fixtures);
    }
    const merged = new Map<string, { line: PhaseOrderLine; cost: number; varies: boolean; costs: Set<number> }>();
    for (const survey of input.surveys) {
      const counts = countsBySurvey.get(survey.id);
      if (!counts) continue;
      for (const l of orderLines(survey, { sparePercent: percent }, counts)) {
        const have = merged.get(l.key);
        if (!have) {
          merged.set(l.key, { line: { ...l, year: year.year, sites: 1 }, cost: l.needed * l.unitCost, varies: l.unitCostVaries, costs: new Set([l.unitCost]) });
        } else {
          have.line.needed += l.needed;
          have.line.rooms += l.rooms;
          have.line.sites += 1;
          have.cost += l.needed * l.unitCost;
          have.varies ||= l.unitCostVaries;
          have.costs.add(l.unitCost);
        }
      }
    }
    const lines = [...merged.values()].map(({ line, cost, varies, costs }) => ({
      ...line,
      ...orderQuantities(line.needed, cost, percent),
      unitCostVaries: varies || costs.size > 1,
    }));
    out.push(...sortOrderLines(lines, locale));
  }
  return out;
}

/** Column names of the order list by phase CSV (stable). */
export const phaseOrderCsvColumns = ['phase_year', ...orderProductCsvColumns, 'sites', 'rooms'] as const;

/**
 * The order list by phase as CSV text (header row first, CRLF line ends).
 *
 * @example phaseOrderCsv(input).split('\r\n')[0] //=> 'phase_year,product_key,…'
 */
export function phaseOrderCsv(input: PortfolioExportInput, settings: OrderSettings = {}, format: CsvFormat = {}): string {
  const percent = settings.sparePercent ?? defaultSparePercent;
  const rows: CsvCell[][] = [[...phaseOrderCsvColumns]];
  const currency = input.result.currency ?? '';
  for (const l of phaseOrderLines(input, settings)) rows.push([l.year, ...orderProductCsvCells(l, percent, currency), l.sites, l.rooms]);
  return toCsv(rows, format);
}

function titleBlock(w: PdfWriter, title: string, input: PortfolioExportInput, settings: PortfolioSummarySettings | PhaseOrderPdfSettings, fig: Figures): void {
  const used = w.companyBlock(settings, w.margin.left, 40);
  w.y = Math.max(40 + used, 70) + 16;
  w.font(sizes.title - 4, 'bold', colours.accent);
  w.y += sizes.title - 4;
  w.textAt(title, w.margin.left, w.y);
  w.y += 8;
  const p = input.portfolio;
  const rows: [string, string][] = [
    ['Portfolio', p.name],
    ['Client', [p.client.name, p.client.contact].filter((s) => s.trim() !== '').join(', ')],
    ['Date', fig.date(settings.date)],
  ];
  if ('preparedBy' in settings && settings.preparedBy) rows.push(['Prepared by', settings.preparedBy]);
  w.table({
    theme: 'plain',
    body: rows.filter(([, v]) => v.trim() !== ''),
    styles: { fontSize: sizes.body, cellPadding: { top: 2, bottom: 2, left: 0, right: 6 }, lineWidth: 0 },
    columnStyles: { 0: { fontStyle: 'bold', cellWidth: 80, textColor: colours.muted } },
  });
}

function warningText(c: { danger: number; caution: number; advice: number }): string {
  return `${c.danger} danger, ${c.caution} caution, ${c.advice} advice`;
}

/**
 * The rows of the portfolio totals table, as printed (label, value).
 *
 * @example portfolioTotalRows(input, fig)[0] //=> ['Sites', '2']
 */
export function portfolioTotalRows(input: PortfolioExportInput, fig: Figures): [string, string][] {
  const r = input.result;
  const t = r.totals;
  const e = r.economics;
  const plan = input.plan;
  return [
    ['Sites', fig.number(r.sites.length, 0)],
    ['Units (repeated layouts counted once per unit)', fig.number(r.units, 0)],
    ['Fixtures', fig.number(t.fixtures, 0)],
    ['Energy saved per year (with HVAC interaction)', fig.kwh(t.savings.kwhPerYear)],
    ['Connected load removed', fig.kw(t.savings.connectedKw)],
    ['Peak demand reduction (coincident)', fig.kw(t.savings.peakKw)],
    ['Money saved in the first year', fig.money(t.money.totalPerYear)],
    ['Project cost net of rebates', fig.money(t.money.cost.net)],
    ['Simple payback (everything at once)', fig.payback(e.simplePaybackYears)],
    ['Net present value (everything at once; each site at its own rate)', fig.money(e.netPresentValue)],
    ['CO2 avoided per year', fig.co2(t.co2KgPerYear)],
    ['Warnings (surveyed units)', warningText(r.warningCounts)],
    ['Budget per year \u00d7 years', `${fig.money(plan.settings.budgetPerYear)} \u00d7 ${fig.number(plan.settings.years, 0)}`],
    ['Net present value of the phased plan', fig.money(plan.npv)],
  ];
}

/** Column headings of the sites table. */
export const siteTableHead = ['Site', 'Units', 'Fixtures', 'kWh/yr saved', 'kW saved', 'Saved/yr', 'Net cost', 'Payback', 'NPV', 'CO2/yr', 'Warnings'];

/**
 * The rows of the sites table, as printed.
 *
 * @example siteRows(input, fig)[0][0] //=> the first site's name
 */
export function siteRows(input: PortfolioExportInput, fig: Figures): string[][] {
  return input.result.sites.map((s) => [
    s.name,
    fig.number(s.units, 0),
    fig.number(s.fixtures, 0),
    fig.number(s.kwhSavedPerYear, 0),
    fig.number(s.kwSaved, 2),
    fig.money(s.firstYearSavings),
    fig.money(s.netCost),
    fig.paybackShort(s.simplePaybackYears),
    fig.money(s.netPresentValue),
    fig.co2(s.co2AvoidedKgPerYear),
    `${s.warningCounts.danger} / ${s.warningCounts.caution} / ${s.warningCounts.advice}`,
  ]);
}

/** Column headings of the plan table. */
export const planTableHead = ['Year', 'Measures', 'Cost', 'Budget left', 'Savings/yr (all done so far)', 'Cash flow', 'Cumulative'];

/**
 * The rows of the year-by-year plan table, as printed.
 *
 * @example planRows(input, fig)[0][0] //=> '1'
 */
export function planRows(input: PortfolioExportInput, fig: Figures): string[][] {
  return input.plan.years.map((y) => [
    String(y.year),
    fig.number(y.measures.length, 0),
    fig.money(y.cost),
    fig.money(y.budgetLeft),
    fig.money(y.savingsPerYear),
    fig.money(y.cashFlow),
    fig.money(y.cumulativeCashFlow),
  ]);
}

function methodSentence(input: PortfolioExportInput, fig: Figures): string {
  const p = input.plan;
  if (p.optimal) {
    return `The plan was found by an exact search (branch and bound): no other choice of years within the budget has a larger net present value.`;
  }
  return (
    `The plan was found by a heuristic (greedy by NPV per unit cost, then local improvement). ` +
    `No plan within the budget can exceed ${fig.money(p.upperBound)} (a relaxation bound), so this plan is within ${fig.percent(p.gapFraction, 2)} of the best possible.`
  );
}

function drawHorizonChart(w: PdfWriter, input: PortfolioExportInput, fig: Figures): void {
  const rows = input.plan.horizon;
  const points = [{ year: 0, value: 0 }, ...rows.map((r) => ({ year: r.year, value: r.cumulativeCashFlow }))];
  const plotHeight = 150;
  w.ensureSpace(plotHeight + 70);
  w.subheading('Cumulative cash flow of the plan (undiscounted)');
  const top = w.y + 4;
  const x0 = w.margin.left + 62;
  const x1 = w.margin.left + w.width - 10;
  const yBottom = top + plotHeight;
  const values = points.map((p) => p.value);
  const low = Math.min(0, ...values);
  const high = Math.max(0, ...values);
  const step = niceStep(high - low || 1, 5);
  const axisLow = Math.floor(low / step) * step;
  const axisHigh = Math.ceil(high / step) * step || step;
  const years = Math.max(1, points.length - 1);
  const xOf = (year: number) => x0 + (year / years) * (x1 - x0);
  const yOf = (value: number) => yBottom - ((value - axisLow) / (axisHigh - axisLow)) * (yBottom - top);
  w.doc.setLineWidth(0.4);
  w.font(sizes.small - 1, 'normal', colours.muted);
  for (let v = axisLow; v <= axisHigh + step / 2; v += step) {
    w.doc.setDrawColor(...colours.rule);
    w.doc.line(x0, yOf(v), x1, yOf(v));
    w.textAt(fig.moneyWhole(v), x0 - 4, yOf(v) + 2.5, { align: 'right' });
  }
  const yearStep = years > 20 ? 5 : years > 10 ? 2 : 1;
  for (let year = 0; year <= years; year += yearStep) w.textAt(String(year), xOf(year), yBottom + 10, { align: 'center' });
  w.textAt('plan year', x1, yBottom + 20, { align: 'right' });
  // The phase years shaded.
  w.doc.setFillColor(...colours.band);
  w.doc.rect(x0, top, xOf(input.plan.settings.years) - x0, plotHeight, 'F');
  w.doc.setDrawColor(...colours.ink);
  w.doc.setLineWidth(0.8);
  w.doc.line(x0, yOf(0), x1, yOf(0));
  w.doc.setDrawColor(...colours.accent);
  w.doc.setLineWidth(1.6);
  for (let i = 1; i < points.length; i++) {
    w.doc.line(xOf(points[i - 1]!.year), yOf(points[i - 1]!.value), xOf(points[i]!.year), yOf(points[i]!.value));
  }
  w.font(sizes.small, 'normal', colours.muted);
  w.textAt(`Shaded: the ${fig.number(input.plan.settings.years, 0)} plan years.`, x0 + 6, top + 10);
  w.y = yBottom + 28;
  w.font(sizes.body);
}

/**
 * Makes the portfolio summary PDF. Rejects with an `AbortError` when
 * `signal` is aborted and a `CalcInputError` for a bad logo.
 *
 * @example await portfolioSummaryPdf(signal, preparePortfolioExport(portfolio, surveys), { companyName: 'Brightwell Audits', date: new Date() }) //=> Uint8Array (a PDF)
 */
export async function portfolioSummaryPdf(
  signal: AbortSignal,
  input: PortfolioExportInput,
  settings: PortfolioSummarySettings,
  onProgress?: ProgressCallback,
): Promise<Uint8Array> {
  const progress = progressReporter(onProgress);
  progress(0);
  await pause(signal);
  const fig = figuresOf(input);
  const w = new PdfWriter(settings.paper ?? paperFor(fig.locale));
  titleBlock(w, portfolioTitle, input, settings, fig);

  w.heading(portfolioSections.totals);
  w.table({
    body: portfolioTotalRows(input, fig),
    theme: 'striped',
    styles: { fontSize: sizes.body },
    alternateRowStyles: { fillColor: colours.band },
    bodyStyles: { fillColor: [255, 255, 255] },
    columnStyles: { 0: { cellWidth: w.width * 0.55 }, 1: { fontStyle: 'bold' } },
  });
  progress(0.2);
  await pause(signal);

  w.heading(portfolioSections.sites);
  const t = input.result.totals;
  const right = { halign: 'right' as const };
  w.table({
    head: [siteTableHead],
    body: siteRows(input, fig),
    foot: [
      [
        'Total',
        fig.number(input.result.units, 0),
        fig.number(t.fixtures, 0),
        fig.number(t.savings.kwhPerYear, 0),
        fig.number(t.savings.connectedKw, 2),
        fig.money(t.money.totalPerYear),
        fig.money(t.money.cost.net),
        fig.paybackShort(input.result.economics.simplePaybackYears),
        fig.money(input.result.economics.netPresentValue),
        fig.co2(t.co2KgPerYear),
        `${input.result.warningCounts.danger} / ${input.result.warningCounts.caution} / ${input.result.warningCounts.advice}`,
      ].map((content, i) => ({ content, styles: i > 0 ? right : {} })),
    ],
    styles: { fontSize: sizes.table - 0.5 },
    columnStyles: { 1: right, 2: right, 3: right, 4: right, 5: right, 6: right, 7: right, 8: right, 9: right, 10: right },
  });
  w.paragraph(
    'Units, fixtures, energy and money are across every unit of a repeated layout. kW saved is the connected load removed. Warnings (danger / caution / advice) are those of the surveyed unit; each site\u2019s client report lists them.',
    { size: sizes.small, colour: colours.muted },
  );
  progress(0.4);
  await pause(signal);

  w.heading(portfolioSections.plan);
  w.paragraph(
    `Budget ${fig.money(input.plan.settings.budgetPerYear)} a year for ${fig.number(input.plan.settings.years, 0)} ${input.plan.settings.years === 1 ? 'year' : 'years'}. ` +
      `Net present value of the plan: ${fig.money(input.plan.npv)}. ${methodSentence(input, fig)}`,
  );
  w.table({
    head: [planTableHead],
    body: planRows(input, fig),
    columnStyles: { 0: right, 1: right, 2: right, 3: right, 4: right, 5: right, 6: right },
  });
  drawHorizonChart(w, input, fig);
  const last = input.plan.horizon[input.plan.horizon.length - 1];
  if (last) {
    w.paragraph(
      `Over ${fig.number(last.year, 0)} years the plan\u2019s cumulative cash flow reaches ${fig.money(last.cumulativeCashFlow)}; discounted, ${fig.money(last.cumulativeDiscountedCashFlow)} (its net present value).`,
      { size: sizes.small },
    );
  }
  w.paragraph('How the plan counts:', { size: sizes.small, style: 'bold', after: 2 });
  for (const c of input.plan.conventions) w.bullet(c, sizes.small);
  progress(0.6);
  await pause(signal);

  w.heading(portfolioSections.measures);
  const byId = new Map(input.plan.measures.map((m) => [m.measureId, m] as const));
  const measureRows: string[][] = [];
  for (const y of input.plan.years) {
    for (const id of y.measures) {
      const m = byId.get(id)!;
      measureRows.push([String(y.year), m.label, fig.money(m.cost), fig.money(m.npv)]);
    }
  }
  if (measureRows.length === 0) w.paragraph('No measure fits the budget with a positive net present value.');
  else {
    w.table({
      head: [['Year', 'Measure (site \u00b7 room \u00b7 fixture)', 'Cost', 'NPV']],
      body: measureRows,
      columnStyles: { 0: { ...right, cellWidth: 30 }, 2: { ...right, cellWidth: 70 }, 3: { ...right, cellWidth: 70 } },
    });
  }
  progress(0.75);
  await pause(signal);

  w.heading(portfolioSections.deferred);
  if (input.plan.deferred.length === 0) w.paragraph('Every measure is done in year 1.');
  else {
    w.table({
      head: [['Measure', 'Year', 'Why']],
      body: input.plan.deferred.map((d) => [d.label, d.year === null ? 'not done' : String(d.year), d.reason]),
      columnStyles: { 0: { cellWidth: 170 }, 1: { cellWidth: 44 } },
    });
  }
  progress(0.85);
  await pause(signal);

  w.heading(portfolioSections.cautions);
  for (const caution of reportCautions) w.bullet(caution);
  w.paragraph(
    'This plan supports a decision; it is not a design, a specification or a promise of results. The people who install the work are responsible for doing it safely and to code.',
    { size: sizes.small, style: 'italic', colour: colours.muted },
  );
  w.decorate(`${portfolioTitle} \u2014 ${input.portfolio.name}`, `${settings.companyName} \u00b7 ${fig.date(settings.date)}`);
  progress(0.95);
  await pause(signal);
  const bytes = w.bytes();
  progress(1);
  return bytes;
}

/**
 * The order list by phase as a PDF: one table per plan year.
 *
 * @example await phaseOrderPdf(signal, input, { companyName: 'Ashgrove Electrical', date: new Date() }) //=> Uint8Array (a PDF)
 */
export async function phaseOrderPdf(signal: AbortSignal, input: PortfolioExportInput, settings: PhaseOrderPdfSettings, onProgress?: ProgressCallback): Promise<Uint8Array> {
  const progress = progressReporter(onProgress);
  progress(0);
  await pause(signal);
  const percent = checkRange('sparePercent', settings.sparePercent ?? defaultSparePercent, 0, 100);
  const lines = phaseOrderLines(input, settings);
  const fig = figuresOf(input);
  const w = new PdfWriter(settings.paper ?? paperFor(fig.locale));
  titleBlock(w, 'Order list by phase', input, settings, fig);
  w.paragraph(
    `Proposed products for each year of the phased plan (budget ${fig.money(input.plan.settings.budgetPerYear)} a year), summed over the sites and over every unit of a repeated layout, with ${fig.number(percent, 0)} % spare stock rounded up to whole units.`,
    { size: sizes.small },
  );
  for (const year of input.plan.years) {
    const own = lines.filter((l) => l.year === year.year);
    w.subheading(`Year ${year.year}`);
    if (own.length === 0) {
      w.paragraph('Nothing to order this year.', { size: sizes.small });
      continue;
    }
    orderTable(w, fig, own, `Year ${year.year} total`, { head: 'Sites', cell: (l) => fig.number(l.sites, 0) });
    await pause(signal);
  }
  w.paragraph('Costs are the surveys\u2019 unit costs before markup and tax; check prices and stock with the supplier.', {
    size: sizes.small,
    colour: colours.muted,
  });
  w.decorate(`Order list by phase \u2014 ${input.portfolio.name}`, `${settings.companyName} \u00b7 ${fig.date(settings.date)}`);
  progress(0.9);
  await pause(signal);
  const bytes = w.bytes();
  progress(1);
  return bytes;
}

const portfolioName = (input: PortfolioExportInput): string => input.portfolio.name;

/** The portfolio summary exporter (PDF). */
export const portfolioSummary: PortfolioExporter<PortfolioSummarySettings> = pdfExporterFor(
  portfolioName,
  'portfolio-summary',
  'Portfolio summary (PDF)',
  'portfolio',
  portfolioSummaryPdf,
);

/** The order list by phase exporter, PDF. */
export const phaseOrdersPdfExporter: PortfolioExporter<PhaseOrderPdfSettings> = pdfExporterFor(
  portfolioName,
  'phase-orders-pdf',
  'Order list by phase (PDF)',
  'orders-by-phase',
  phaseOrderPdf,
);

/** The order list by phase exporter, CSV. */
export const phaseOrdersCsvExporter: PortfolioExporter<OrderSettings & CsvFormat> = csvExporterFor(
  portfolioName,
  'phase-orders-csv',
  'Order list by phase (CSV)',
  'orders-by-phase',
  (input, settings) => phaseOrderCsv(input, settings, settings),
);
