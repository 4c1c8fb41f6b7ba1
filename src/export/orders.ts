/**
 * The order list: every proposed product summed across rooms (and so across
 * units copied from one layout), with spare stock, as CSV and as a PDF page.
 * Products picked from the catalog group by catalog id; custom specs group by
 * name, watts and lumens.
 */
import { checkRange } from '../calc/errors.ts';
import { fixturesAcrossUnits, unitsOf } from '../calc/layout.ts';
import type { ProductForm, Survey } from '../survey/model.ts';
import { pause, progressReporter } from './abort.ts';
import { toCsv, type CsvCell } from './csv.ts';
import { figuresFor, type Figures } from './figures.ts';
import { colours, csvExporterFor, paperFor, pdfExporter, PdfWriter, sizes } from './pdf.ts';
import type { CsvFormat, Exporter, ExportInput, OrderPdfSettings, OrderSettings, ProgressCallback } from './types.ts';
import type { CellInput, UserOptions } from 'jspdf-autotable';

/** Spare stock, percent of the quantity needed, when the settings give none. */
export const defaultSparePercent = 5;

/** One product to order. */
export interface OrderLine {
  /** `catalog:<id>` or `custom:<name>|<watts>|<lumens>`. */
  key: string;
  catalogId: string | null;
  name: string;
  form: ProductForm;
  wattsPerUnit: number;
  lumensPerUnit: number;
  cctKelvin: number;
  /** Units needed: Σ fixtures × units per fixture. */
  needed: number;
  /** ⌈needed × spare % / 100⌉. */
  spare: number;
  /** needed + spare. */
  toOrder: number;
  /** Average unit cost over the units needed (the same for every entry unless a copy was edited). */
  unitCost: number;
  /** True when entries gave different unit costs for the product. */
  unitCostVaries: boolean;
  /** toOrder × unitCost. */
  orderCost: number;
  /** Rooms the product goes in (of the surveyed unit, for a repeated layout). */
  rooms: number;
}

/**
 * Spare units for a quantity: `percent` of it, rounded up to a whole unit.
 * A tiny tolerance keeps 100 × 5 % at 5 rather than 6 from floating-point noise.
 *
 * @example spareUnits(41, 5) //=> 3
 */
export function spareUnits(needed: number, percent: number): number {
  const exact = (needed * percent) / 100;
  return Math.max(0, Math.ceil(exact - 1e-9));
}

/**
 * The sentence that says a document's figures cover every unit of a repeated
 * layout, or null for a survey without one.
 *
 * @example layoutNote({ ...survey, layout: { unitCount: 24, exceptions: [flat3b] } }, fig) //=> 'Figures for all 24 units of this layout (1 differs).'
 */
export function layoutNote(survey: Pick<Survey, 'layout'>, fig: Pick<Figures, 'number'>): string | null {
  if (!survey.layout) return null;
  const units = unitsOf(survey);
  const differing = survey.layout.exceptions.length;
  const differs = differing === 0 ? '' : ` (${fig.number(differing, 0)} ${differing === 1 ? 'differs' : 'differ'})`;
  return `Figures for all ${fig.number(units, 0)} ${units === 1 ? 'unit' : 'units'} of this layout${differs}.`;
}

/**
 * The order lines of a survey, sorted by product name. A survey with a
 * repeated layout orders each entry's fixtures across all its units
 * (`fixturesAcrossUnits`). `fixtureCounts`, when given, replaces each entry's
 * count by entry id (entries it does not list are left out): the phased order
 * list passes the fixtures across a layout's units of the entries done in one
 * year.
 *
 * @example orderLines(demoSurvey(), { sparePercent: 10 })[0].toOrder //=> needed + ⌈needed × 10 %⌉
 */
export function orderLines(survey: Survey, settings: OrderSettings = {}, fixtureCounts?: ReadonlyMap<string, number>): OrderLine[] {
  const percent = checkRange('sparePercent', settings.sparePercent ?? defaultSparePercent, 0, 100);
  const groups = new Map<string, { line: OrderLine; cost: number; costs: Set<number>; rooms: Set<string> }>();
  const counts = fixtureCounts ?? (survey.layout ? fixturesAcrossUnits(survey) : undefined);
  for (const room of survey.rooms) {
    for (const entry of room.entries) {
      const p = entry.proposed;
      const count = counts ? (counts.get(entry.id) ?? 0) : entry.count;
      if (!p || count === 0) continue;
      const key = p.catalogId !== undefined ? `catalog:${p.catalogId}` : `custom:${p.name.trim()}|${p.wattsPerUnit}|${p.lumensPerUnit}`;
      let group = groups.get(key);
      if (!group) {
        group = {
          line: {
            key,
            catalogId: p.catalogId ?? null,
            name: p.name,
            form: p.form,
            wattsPerUnit: p.wattsPerUnit,
            lumensPerUnit: p.lumensPerUnit,
            cctKelvin: p.cctKelvin,
            needed: 0,
            spare: 0,
            toOrder: 0,
            unitCost: 0,
            unitCostVaries: false,
            orderCost: 0,
            rooms: 0,
          },
          cost: 0,
          costs: new Set(),
          rooms: new Set(),
        };
        groups.set(key, group);
      }
      const units = count * p.unitsPerFixture;
      group.line.needed += units;
      group.cost += units * p.unitCost;
      group.costs.add(p.unitCost);
      group.rooms.add(room.id);
    }
  }
  const lines = [...groups.values()].map(({ line, cost, costs, rooms }) => ({
    ...line,
    ...orderQuantities(line.needed, cost, percent),
    unitCostVaries: costs.size > 1,
    rooms: rooms.size,
  }));
  return sortOrderLines(lines, survey.locale);
}

/**
 * The quantities of an order line from the units needed and their summed
 * cost: spare stock (`spareUnits`), the quantity to order, the average unit
 * cost and the order cost.
 *
 * @example orderQuantities(41, 410, 5) //=> { spare: 3, toOrder: 44, unitCost: 10, orderCost: 440 }
 */
export function orderQuantities(needed: number, cost: number, percent: number): Pick<OrderLine, 'spare' | 'toOrder' | 'unitCost' | 'orderCost'> {
  const spare = spareUnits(needed, percent);
  const unitCost = needed > 0 ? cost / needed : 0;
  const toOrder = needed + spare;
  return { spare, toOrder, unitCost, orderCost: toOrder * unitCost };
}

/**
 * Order lines sorted by product name in the survey's locale (numbers in
 * names compared as numbers), then by key. Sorts in place and returns `lines`.
 *
 * @example sortOrderLines([{ name: 'T8 10' }, { name: 'T8 9' }], 'en-US')[0].name //=> 'T8 9'
 */
export function sortOrderLines<L extends Pick<OrderLine, 'name' | 'key'>>(lines: L[], locale: string): L[] {
  const collator = new Intl.Collator(locale, { numeric: true });
  return lines.sort((a, b) => collator.compare(a.name, b.name) || collator.compare(a.key, b.key));
}

/** Column names for one product in the order list CSVs (stable; other programs may read them). */
export const orderProductCsvColumns = [
  'product_key',
  'catalog_id',
  'product_name',
  'form',
  'watts_per_unit',
  'lumens_per_unit',
  'cct_kelvin',
  'quantity_needed',
  'spare_percent',
  'spare_quantity',
  'order_quantity',
  'unit_cost',
  'order_cost',
  'currency',
] as const;

/** Column names of the order list CSV (stable; other programs may read them). */
export const orderCsvColumns = [...orderProductCsvColumns, 'rooms'] as const;

/**
 * The cells of one order line under `orderProductCsvColumns` (costs rounded to cents).
 *
 * @example orderProductCsvCells(line, 5, 'EUR')[0] //=> line.key
 */
export function orderProductCsvCells(l: OrderLine, sparePercent: number, currency: string): CsvCell[] {
  return [
    l.key,
    l.catalogId,
    l.name,
    l.form,
    l.wattsPerUnit,
    l.lumensPerUnit,
    l.cctKelvin,
    l.needed,
    sparePercent,
    l.spare,
    l.toOrder,
    Math.round(l.unitCost * 100) / 100,
    Math.round(l.orderCost * 100) / 100,
    currency,
  ];
}

/**
 * The order list as CSV text (header row first, CRLF line ends).
 *
 * @example orderListCsv(demoSurvey(), { sparePercent: 5 }).split('\r\n')[0] //=> 'product_key,catalog_id,product_name,…'
 */
export function orderListCsv(survey: Survey, settings: OrderSettings = {}, format: CsvFormat = {}): string {
  const percent = settings.sparePercent ?? defaultSparePercent;
  const rows: CsvCell[][] = [[...orderCsvColumns]];
  for (const l of orderLines(survey, settings)) rows.push([...orderProductCsvCells(l, percent, survey.money.currency), l.rooms]);
  return toCsv(rows, format);
}

/** An extra last column of an order table. */
export interface OrderTableColumn<L> {
  head: string;
  cell(line: L): string;
}

/**
 * Writes an order table: one row per line, and a foot row labelled
 * `totalLabel` with the summed quantities and cost. `extra` adds a column at
 * the end (right-aligned, empty in the foot).
 *
 * @example orderTable(w, fig, orderLines(survey), 'Total') // writes the order list table
 */
export function orderTable<L extends OrderLine>(w: PdfWriter, fig: Figures, lines: readonly L[], totalLabel: string, extra?: OrderTableColumn<L>): void {
  const right = { halign: 'right' as const };
  const head = ['Product', 'Catalog id', 'W', 'lm', 'Needed', 'Spare', 'To order', 'Unit cost', 'Cost'];
  const foot: CellInput[] = [
    totalLabel,
    '',
    '',
    '',
    { content: fig.number(lines.reduce((n, l) => n + l.needed, 0), 0), styles: right },
    { content: fig.number(lines.reduce((n, l) => n + l.spare, 0), 0), styles: right },
    { content: fig.number(lines.reduce((n, l) => n + l.toOrder, 0), 0), styles: right },
    '',
    { content: fig.money(lines.reduce((n, l) => n + l.orderCost, 0)), styles: right },
  ];
  const columnStyles: NonNullable<UserOptions['columnStyles']> = { 2: right, 3: right, 4: right, 5: right, 6: { ...right, fontStyle: 'bold' }, 7: right, 8: right };
  if (extra) {
    head.push(extra.head);
    foot.push('');
    columnStyles[head.length - 1] = right;
  }
  w.table({
    head: [head],
    body: lines.map((l) => {
      const row = [
        l.name,
        l.catalogId ?? 'custom',
        fig.number(l.wattsPerUnit, 1),
        fig.number(l.lumensPerUnit, 0),
        fig.number(l.needed, 0),
        fig.number(l.spare, 0),
        fig.number(l.toOrder, 0),
        l.unitCostVaries ? `${fig.money(l.unitCost)} avg.` : fig.money(l.unitCost),
        fig.money(l.orderCost),
      ];
      if (extra) row.push(extra.cell(l));
      return row;
    }),
    foot: [foot],
    columnStyles,
  });
}

/**
 * The order list as a one-section PDF (more pages only for long lists).
 *
 * @example await orderListPdf(signal, { survey, result }, { companyName: 'Ashgrove Electrical', date: new Date() }) //=> Uint8Array (a PDF)
 */
export async function orderListPdf(signal: AbortSignal, input: ExportInput, settings: OrderPdfSettings, onProgress?: ProgressCallback): Promise<Uint8Array> {
  const { survey } = input;
  const progress = progressReporter(onProgress);
  progress(0);
  await pause(signal);
  const percent = checkRange('sparePercent', settings.sparePercent ?? defaultSparePercent, 0, 100);
  const lines = orderLines(survey, settings);
  const fig = figuresFor(survey);
  const w = new PdfWriter(settings.paper ?? paperFor(survey.locale));
  const used = w.companyBlock(settings, w.margin.left, 40);
  w.y = Math.max(40 + used, 70) + 16;
  w.heading('Order list');
  const perLayout = layoutNote(survey, fig);
  w.paragraph(
    `${survey.name}. Proposed products summed over ${fig.number(survey.rooms.length, 0)} rooms${perLayout ? ' of the surveyed unit and multiplied across the layout' : ''}, with ${fig.number(percent, 0)} % spare stock (rounded up to whole units). Prepared ${fig.date(settings.date)}.`,
    { size: sizes.small },
  );
  if (perLayout) w.paragraph(perLayout, { size: sizes.small });
  orderTable(w, fig, lines, 'Total');
  w.paragraph('Costs are the survey\u2019s unit costs before markup and tax; check prices and stock with the supplier.', {
    size: sizes.small,
    colour: colours.muted,
  });
  w.decorate(`Order list \u2014 ${survey.site.name || survey.name}`, `${settings.companyName} \u00b7 ${fig.date(settings.date)}`, 1);
  progress(0.9);
  await pause(signal);
  const bytes = w.bytes();
  progress(1);
  return bytes;
}

/** The order list exporter, CSV. */
export const orderListCsvExporter: Exporter<OrderSettings & CsvFormat> = csvExporterFor(
  (input: ExportInput) => input.survey.name,
  'order-list-csv',
  'Order list (CSV)',
  'orders',
  (input, settings) => orderListCsv(input.survey, settings, settings),
);

/** The order list exporter, PDF page. */
export const orderListPdfExporter: Exporter<OrderPdfSettings> = pdfExporter('order-list-pdf', 'Order list (PDF)', 'orders', orderListPdf);
