/**
 * The contractor quote: one numbered line per fixture entry being changed
 * (product, quantity, unit price, labour, disposal), then subtotal, tax,
 * rebates and the total, a validity date, terms and a block to sign. The
 * totals are the calculation's cost figures (`result.totals.money.cost`), so
 * the quote and the report always agree.
 */
import { addDays } from 'date-fns';
import { checkInteger } from '../calc/errors.ts';
import type { ProjectCost } from '../calc/costs.ts';
import { calculateLayout } from '../calc/portfolio.ts';
import type { SurveyResult } from '../calc/survey.ts';
import type { Survey } from '../survey/model.ts';
import { pause, progressReporter } from './abort.ts';
import { figuresFor, type Figures } from './figures.ts';
import { layoutNote } from './orders.ts';
import { colours, paperFor, pdfExporter, PdfWriter, sizes } from './pdf.ts';
import type { Exporter, ExportInput, ProgressCallback, QuoteSettings } from './types.ts';

/** Days a quote stays valid when the settings give none. */
export const defaultValidDays = 30;

/** Title of the quote document. */
export const quoteTitle = 'Quotation';

/** One numbered line of the quote. Money already includes the markup when it is shown in the prices. */
export interface QuoteLine {
  number: number;
  roomName: string;
  product: string;
  /** Units of the product supplied: fixtures × units per fixture. */
  quantity: number;
  fixtures: number;
  unitPrice: number;
  materials: number;
  labour: number;
  disposal: number;
  /** materials + labour + disposal */
  total: number;
}

/** The totals block of the quote; each figure is the calculation's. */
export interface QuoteTotals {
  /** Sum of the line totals: materials + labour + disposal (+ markup when folded into prices). */
  subtotal: number;
  /** Markup shown on its own line, or null when it is in the prices. */
  markup: number | null;
  tax: number;
  /** subtotal (+ markup) + tax = the calculation's gross cost. */
  totalBeforeRebates: number;
  rebates: number;
  /** The calculation's net cost. */
  total: number;
}

/**
 * The quote's lines and totals. With the markup in the prices every line is
 * scaled by (1 + markup), so the lines still add up to the calculation's
 * materials + labour + disposal + markup. For a survey with a repeated layout
 * every line and total covers all its units (`calculateLayout`).
 *
 * @example quoteLines(survey, result, 'in-prices').totals.total === result.totals.money.cost.net //=> true
 */
export function quoteLines(survey: Survey, result: SurveyResult, markup: 'in-prices' | 'separate-line' = 'in-prices'): { lines: QuoteLine[]; totals: QuoteTotals } {
  const factor = markup === 'in-prices' ? 1 + survey.money.markupFraction : 1;
  const layout = survey.layout ? calculateLayout(survey, result) : null;
  const lines: QuoteLine[] = [];
  result.rooms.forEach((room, ri) => {
    room.entries.forEach((unitEntry, ei) => {
      const product = survey.rooms[ri]?.entries[ei]?.proposed;
      const e = layout?.entries.get(unitEntry.entryId) ?? unitEntry;
      if (!product || e.count === 0) return;
      const quantity = e.count * product.unitsPerFixture;
      const c = e.money.cost;
      lines.push({
        number: lines.length + 1,
        roomName: room.name,
        product: product.name,
        quantity,
        fixtures: e.count,
        unitPrice: product.unitCost * factor,
        materials: c.materials * factor,
        labour: c.labour * factor,
        disposal: c.disposal * factor,
        total: (c.materials + c.labour + c.disposal) * factor,
      });
    });
  });
  const cost: ProjectCost = (layout?.totals ?? result.totals).money.cost;
  const base = cost.materials + cost.labour + cost.disposal;
  return {
    lines,
    totals: {
      subtotal: markup === 'in-prices' ? base + cost.markup : base,
      markup: markup === 'in-prices' ? null : cost.markup,
      tax: cost.tax,
      totalBeforeRebates: cost.gross,
      rebates: cost.rebates,
      total: cost.net,
    },
  };
}

/**
 * The validity date: the quote date plus `validDays` calendar days (date-fns `addDays`).
 *
 * @example validUntil(new Date(2026, 10, 20), 30) //=> 2026-12-20 (local time)
 */
export function validUntil(date: Date, validDays: number): Date {
  return addDays(date, validDays);
}

/**
 * The terms printed when the settings give none.
 *
 * @example defaultTerms(figuresFor(survey), until)[0] //=> 'This quotation is valid until December 20, 2026. …'
 */
export function defaultTerms(fig: Figures, until: Date): string[] {
  return [
    `This quotation is valid until ${fig.date(until)}. Prices include supply and installation of the items listed.`,
    'Work on fixture wiring (ballast removal or bypass, conversion kits, new luminaires, emergency lighting) is carried out by a licensed electrician and follows local electrical and building codes.',
    'Removed lamps and ballasts are disposed of under local hazardous-waste rules (mercury lamps; ballasts that may contain PCBs).',
    'Rebates shown are estimates and depend on the program\u2019s approval; any amount not approved is payable by the client.',
    'Any energy savings stated elsewhere are estimates, not guarantees. Work not listed here is quoted separately.',
  ];
}

function taxLabel(survey: Survey, fig: Figures): string {
  return `Tax (${fig.percent(survey.money.taxFraction)} on ${survey.money.taxBase === 'materials' ? 'materials' : 'the subtotal'})`;
}

/**
 * Makes the contractor quote PDF. Rejects with an `AbortError` when `signal`
 * is aborted and with a `CalcInputError` naming `validDays` when it is not a
 * whole number of days from 1 to 365.
 *
 * @example await contractorQuotePdf(signal, { survey, result }, { companyName: 'Ashgrove Electrical', date: new Date() }) //=> Uint8Array (a PDF)
 */
export async function contractorQuotePdf(
  signal: AbortSignal,
  input: ExportInput,
  settings: QuoteSettings,
  onProgress?: ProgressCallback,
): Promise<Uint8Array> {
  const { survey, result } = input;
  const progress = progressReporter(onProgress);
  progress(0);
  await pause(signal);
  const validDays = checkInteger('validDays', settings.validDays ?? defaultValidDays, 1, 365);
  const fig = figuresFor(survey);
  const until = validUntil(settings.date, validDays);
  const { lines, totals } = quoteLines(survey, result, settings.markup ?? 'in-prices');
  const perLayout = layoutNote(survey, fig);
  const w = new PdfWriter(settings.paper ?? paperFor(survey.locale));

  // Letterhead and quote details.
  const used = w.companyBlock(settings, w.margin.left, 40);
  w.font(sizes.title, 'bold', colours.accent);
  w.textAt(quoteTitle, w.pageWidth - w.margin.right, 60, { align: 'right' });
  w.y = Math.max(40 + used, 80) + 20;
  const detailRows: [string, string][] = [
    ['Quote', settings.quoteNumber ?? ''],
    ['Date', fig.date(settings.date)],
    ['Valid until', fig.date(until)],
    ['Client', [survey.client.name, survey.client.contact].filter((s) => s.trim() !== '').join(', ')],
    ['Site', [survey.site.name, survey.site.address].filter((s) => s.trim() !== '').join(', ')],
    ['Prepared by', settings.preparedBy ?? survey.preparedBy],
  ];
  w.table({
    theme: 'plain',
    body: detailRows.filter(([, v]) => v.trim() !== ''),
    styles: { fontSize: sizes.body, cellPadding: { top: 2, bottom: 2, left: 0, right: 6 }, lineWidth: 0 },
    columnStyles: { 0: { fontStyle: 'bold', cellWidth: 80, textColor: colours.muted } },
  });
  if (perLayout) {
    w.paragraph(
      `${perLayout} Quantities and prices below cover every unit; the surveyed unit alone comes to ${fig.money(result.totals.money.cost.net)} after estimated rebates.`,
      { size: sizes.small },
    );
  }
  progress(0.1);
  await pause(signal);

  const right = { halign: 'right' as const };
  w.table({
    head: [['No.', 'Location', 'Product', 'Qty', 'Unit price', 'Materials', 'Labour', 'Disposal', 'Line total']],
    body: lines.map((l) => [
      String(l.number),
      l.roomName,
      l.fixtures === l.quantity ? l.product : `${l.product} (${fig.number(l.fixtures, 0)} ${l.fixtures === 1 ? 'fixture' : 'fixtures'})`,
      fig.number(l.quantity, 0),
      fig.money(l.unitPrice),
      fig.money(l.materials),
      fig.money(l.labour),
      fig.money(l.disposal),
      fig.money(l.total),
    ]),
    columnStyles: {
      0: { ...right, cellWidth: 24 },
      1: { cellWidth: 80 },
      3: { ...right, cellWidth: 30 },
      4: { ...right, cellWidth: 50 },
      5: { ...right, cellWidth: 56 },
      6: { ...right, cellWidth: 52 },
      7: { ...right, cellWidth: 48 },
      8: { ...right, cellWidth: 58 },
    },
  });
  progress(0.6);
  await pause(signal);

  const totalRows: [string, string][] = [['Subtotal', fig.money(totals.subtotal)]];
  if (totals.markup !== null) totalRows.push([`Markup (${fig.percent(survey.money.markupFraction)})`, fig.money(totals.markup)]);
  totalRows.push([taxLabel(survey, fig), fig.money(totals.tax)]);
  totalRows.push(['Total before rebates', fig.money(totals.totalBeforeRebates)]);
  totalRows.push(['Rebates (estimated)', fig.money(totals.rebates === 0 ? 0 : 0 - totals.rebates)]);
  const tableWidth = 250;
  w.ensureSpace(24 * (totalRows.length + 1));
  w.table({
    theme: 'plain',
    body: totalRows,
    foot: [[`Total (${survey.money.currency})`, fig.money(totals.total)]],
    tableWidth,
    margin: { left: w.margin.left + w.width - tableWidth, right: w.margin.right, top: w.margin.top, bottom: w.margin.bottom },
    styles: { fontSize: sizes.body, lineWidth: 0 },
    columnStyles: { 1: right },
    footStyles: { fontSize: sizes.subheading, halign: 'right' },
  });

  w.subheading('Terms');
  for (const term of settings.terms ?? defaultTerms(fig, until)) w.bullet(term, sizes.small);
  progress(0.8);
  await pause(signal);

  // Acceptance block.
  w.ensureSpace(170);
  w.y += 8;
  w.subheading('Acceptance');
  w.paragraph(
    `I accept this quotation of ${fig.money(totals.total)} (after estimated rebates of ${fig.money(totals.rebates)}) and the terms above.`,
    { size: sizes.small },
  );
  const colW = (w.width - 30) / 2;
  const top = w.y + 10;
  const blocks: [string, number][] = [
    ['For the client', w.margin.left],
    [`For ${settings.companyName}`, w.margin.left + colW + 30],
  ];
  for (const [title, x] of blocks) {
    w.font(sizes.body, 'bold');
    w.textAt(title, x, top, { maxWidth: colW });
    w.font(sizes.small, 'normal', colours.muted);
    let y = top + 34;
    for (const label of ['Name', 'Signature', 'Date']) {
      w.doc.setDrawColor(...colours.ink);
      w.doc.setLineWidth(0.6);
      w.doc.line(x + 52, y, x + colW, y);
      w.textAt(label, x, y - 2);
      y += 30;
    }
  }
  w.y = top + 34 + 3 * 30;
  const reference = settings.quoteNumber ? `${quoteTitle} ${settings.quoteNumber}` : quoteTitle;
  w.decorate(`${reference} \u2014 ${survey.site.name || survey.name}`, `${settings.companyName} \u00b7 valid until ${fig.date(until)}`);
  progress(0.95);
  await pause(signal);
  const bytes = w.bytes();
  progress(1);
  return bytes;
}

/** The contractor quote exporter. */
export const contractorQuote: Exporter<QuoteSettings> = pdfExporter('contractor-quote', 'Contractor quote (PDF)', 'quote', contractorQuotePdf);
