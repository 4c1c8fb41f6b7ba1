/**
 * Shared PDF layout for the report, the quote and the order page: a jsPDF
 * document in points with `compress: true`, a text cursor that breaks pages,
 * headings, wrapped paragraphs, tables (jspdf-autotable), a running header
 * and "page n of m" footers. Every string drawn goes through
 * {@link pdfSafeText}, so the built-in fonts never print a wrong glyph.
 *
 * This is the only place besides the document modules that imports jsPDF;
 * `src/export` is loaded with `import()` by the app.
 */
import { jsPDF } from 'jspdf';
import { autoTable, type CellInput, type RowInput, type UserOptions } from 'jspdf-autotable';
import { CalcInputError } from '../calc/errors.ts';
import { pause, progressReporter } from './abort.ts';
import { utf8WithBom } from './csv.ts';
import type { CompanySettings, ExportedFile, Exporter, ExporterId, ExportInput, ImageInput, PaperSize, ProgressCallback } from './types.ts';
import { pdfSafeText } from './text.ts';

/** An RGB colour, 0–255 each. */
export type Rgb = [number, number, number];

type ColourName = 'ink' | 'muted' | 'rule' | 'accent' | 'accentLight' | 'existing' | 'danger' | 'caution' | 'advice' | 'band';

/** RGB colours of the documents. */
export const colours: Readonly<Record<ColourName, Rgb>> = {
  ink: [33, 37, 41],
  muted: [96, 103, 112],
  rule: [206, 212, 218],
  accent: [0, 98, 110],
  accentLight: [214, 234, 236],
  existing: [160, 166, 173],
  danger: [170, 20, 40],
  caution: [170, 100, 0],
  advice: [45, 85, 135],
  band: [244, 246, 248],
};

/** Locale regions that use US letter paper; everything else gets A4 (from memory: the usual list of letter-paper countries). */
const letterRegions = new Set(['US', 'CA', 'MX', 'PH', 'CL', 'CO', 'VE', 'GT', 'CR', 'PA', 'DO', 'PR', 'SV', 'NI', 'HN']);

/**
 * The paper for a locale: US letter where it is the norm, A4 elsewhere.
 *
 * @example paperFor('en-US') //=> 'letter'
 */
export function paperFor(locale: string): PaperSize {
  try {
    const region = new Intl.Locale(locale).maximize().region;
    return region !== undefined && letterRegions.has(region) ? 'letter' : 'a4';
  } catch {
    return 'a4';
  }
}

/**
 * `PNG` or `JPEG` for an image data URL; throws a `CalcInputError` naming
 * `field` for anything else.
 *
 * @example imageFormat('data:image/png;base64,iVBOR…', 'logo') //=> 'PNG'
 */
export function imageFormat(dataUrl: string, field: string): 'PNG' | 'JPEG' {
  const match = /^data:image\/(png|jpe?g);base64,/i.exec(typeof dataUrl === 'string' ? dataUrl : '');
  if (!match) throw new CalcInputError(field, 'must be a PNG or JPEG image as a base64 data URL');
  return match[1]!.toLowerCase() === 'png' ? 'PNG' : 'JPEG';
}

/**
 * Checks an image's data URL and pixel size and returns its format.
 *
 * @example checkImage({ dataUrl: 'data:image/jpeg;base64,/9j/…', width: 640, height: 480 }, 'photos[0]') //=> 'JPEG'
 */
export function checkImage(image: ImageInput, field: string): 'PNG' | 'JPEG' {
  const format = imageFormat(image.dataUrl, `${field}.dataUrl`);
  for (const side of ['width', 'height'] as const) {
    const value = image[side];
    if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0 || value > 100_000) {
      throw new CalcInputError(`${field}.${side}`, `must be the image's ${side} in pixels, more than 0 (got ${String(value)})`);
    }
  }
  return format;
}

/** Font sizes, points. */
export const sizes = { title: 24, heading: 14, subheading: 11, body: 9.5, small: 8, table: 8 } as const;

interface AutoTableState {
  lastAutoTable?: { finalY?: number };
}

/** A jsPDF document with a text cursor. Units are points; margins in points. */
export class PdfWriter {
  readonly doc: jsPDF;
  readonly pageWidth: number;
  readonly pageHeight: number;
  readonly margin = { left: 48, right: 48, top: 62, bottom: 54 };
  y: number;

  constructor(paper: PaperSize) {
    this.doc = new jsPDF({ unit: 'pt', format: paper, compress: true, putOnlyUsedFonts: true });
    this.pageWidth = this.doc.internal.pageSize.getWidth();
    this.pageHeight = this.doc.internal.pageSize.getHeight();
    this.y = this.margin.top;
    this.doc.setTextColor(...colours.ink);
    this.doc.setLineHeightFactor(1.25);
  }

  /** Usable width between the margins. */
  get width(): number {
    return this.pageWidth - this.margin.left - this.margin.right;
  }

  get bottom(): number {
    return this.pageHeight - this.margin.bottom;
  }

  newPage(): void {
    this.doc.addPage();
    this.y = this.margin.top;
  }

  /** Starts a new page unless `height` points still fit below the cursor. */
  ensureSpace(height: number): void {
    if (this.y + height > this.bottom) this.newPage();
  }

  font(size: number, style: 'normal' | 'bold' | 'italic' = 'normal', colour: Rgb = colours.ink): void {
    this.doc.setFont('helvetica', style);
    this.doc.setFontSize(size);
    this.doc.setTextColor(colour[0], colour[1], colour[2]);
  }

  /** Line height for a font size, points. */
  lineHeight(size: number): number {
    return size * 1.25;
  }

  /** Wraps safe text to a width. */
  wrap(text: string, width: number): string[] {
    return this.doc.splitTextToSize(pdfSafeText(text), width) as string[];
  }

  /** Draws text at a point without moving the cursor (already-safe text is unchanged by pdfSafeText). */
  textAt(text: string, x: number, y: number, options: { align?: 'left' | 'right' | 'center'; maxWidth?: number } = {}): void {
    const safe = pdfSafeText(text);
    const lines = options.maxWidth !== undefined ? (this.doc.splitTextToSize(safe, options.maxWidth) as string[]) : safe;
    this.doc.text(lines, x, y, { align: options.align ?? 'left', baseline: 'alphabetic' });
  }

  /** A section heading with a rule under it; starts a new page when little room is left. */
  heading(text: string, keepWithNext = 80): void {
    this.ensureSpace(keepWithNext);
    if (this.y > this.margin.top) this.y += 10;
    this.font(sizes.heading, 'bold', colours.accent);
    this.y += sizes.heading;
    this.textAt(text, this.margin.left, this.y);
    this.y += 5;
    this.doc.setDrawColor(...colours.accent);
    this.doc.setLineWidth(0.8);
    this.doc.line(this.margin.left, this.y, this.margin.left + this.width, this.y);
    this.y += 12;
    this.font(sizes.body);
  }

  subheading(text: string): void {
    this.ensureSpace(50);
    this.font(sizes.subheading, 'bold');
    this.y += sizes.subheading;
    const lines = this.wrap(text, this.width);
    this.doc.text(lines, this.margin.left, this.y);
    this.y += (lines.length - 1) * this.lineHeight(sizes.subheading) + 6;
    this.font(sizes.body);
  }

  /** A wrapped paragraph at the cursor, breaking pages between lines. */
  paragraph(text: string, options: { size?: number; style?: 'normal' | 'bold' | 'italic'; colour?: Rgb; indent?: number; after?: number } = {}): void {
    const size = options.size ?? sizes.body;
    const indent = options.indent ?? 0;
    this.font(size, options.style ?? 'normal', options.colour ?? colours.ink);
    const lines = this.wrap(text, this.width - indent);
    const step = this.lineHeight(size);
    for (const line of lines) {
      this.ensureSpace(step);
      this.y += size;
      this.doc.text(line, this.margin.left + indent, this.y);
      this.y += step - size;
    }
    this.y += options.after ?? 5;
  }

  /** A bulleted list item. */
  bullet(text: string, size: number = sizes.body): void {
    this.font(size);
    const lines = this.wrap(text, this.width - 14);
    const step = this.lineHeight(size);
    lines.forEach((line, i) => {
      this.ensureSpace(step);
      this.y += size;
      if (i === 0) this.doc.text('\u2022', this.margin.left + 3, this.y);
      this.doc.text(line, this.margin.left + 14, this.y);
      this.y += step - size;
    });
    this.y += 3;
  }

  /**
   * Draws a table at the cursor with the documents' styles, makes every cell
   * safe text, and moves the cursor below it.
   */
  table(options: UserOptions): void {
    const safeRows = (rows: RowInput[] | undefined): RowInput[] | undefined => rows?.map((row) => safeRow(row));
    const head = safeRows(options.head);
    const body = safeRows(options.body);
    const foot = safeRows(options.foot);
    autoTable(this.doc, {
      theme: 'grid',
      startY: this.y,
      margin: { left: this.margin.left, right: this.margin.right, top: this.margin.top, bottom: this.margin.bottom },
      rowPageBreak: 'avoid',
      ...options,
      ...(head ? { head } : {}),
      ...(body ? { body } : {}),
      ...(foot ? { foot } : {}),
      styles: {
        font: 'helvetica',
        fontSize: sizes.table,
        cellPadding: { top: 3, bottom: 3, left: 4, right: 4 },
        lineColor: colours.rule,
        lineWidth: 0.4,
        textColor: colours.ink,
        overflow: 'linebreak',
        valign: 'top',
        ...options.styles,
      },
      headStyles: {
        fillColor: colours.accent,
        textColor: 255,
        fontStyle: 'bold',
        valign: 'bottom',
        ...options.headStyles,
      },
      footStyles: {
        fillColor: colours.accentLight,
        textColor: colours.ink,
        fontStyle: 'bold',
        ...options.footStyles,
      },
    });
    const finalY = (this.doc as unknown as AutoTableState).lastAutoTable?.finalY;
    this.y = (finalY ?? this.y) + 12;
  }

  /**
   * A company block: logo at the left (scaled to `logoHeight`), then the
   * company name and detail lines. Returns the height used.
   */
  companyBlock(company: CompanySettings, x: number, y: number, logoHeight = 42): number {
    let textX = x;
    let height = 0;
    if (company.logo) {
      const format = checkImage(company.logo, 'logo');
      const h = logoHeight;
      const w = Math.min(160, (company.logo.width / company.logo.height) * h);
      const fittedH = (w / company.logo.width) * company.logo.height;
      this.doc.addImage(company.logo.dataUrl, format, x, y, w, fittedH, undefined, 'FAST');
      textX = x + w + 12;
      height = fittedH;
    }
    this.font(sizes.subheading + 2, 'bold');
    this.textAt(company.companyName, textX, y + 14);
    let lineY = y + 14;
    this.font(sizes.small, 'normal', colours.muted);
    for (const line of company.companyDetails ?? []) {
      lineY += this.lineHeight(sizes.small);
      this.textAt(line, textX, lineY);
    }
    this.font(sizes.body);
    return Math.max(height, lineY - y + 4);
  }

  /**
   * Draws the running header (from page `firstPage` on) and "Page n of m"
   * footers on every page, once all pages exist.
   */
  decorate(header: string, footerLeft: string, firstPage = 2): void {
    const pages = this.doc.getNumberOfPages();
    for (let page = 1; page <= pages; page++) {
      this.doc.setPage(page);
      this.font(sizes.small, 'normal', colours.muted);
      if (page >= firstPage) {
        this.textAt(header, this.margin.left, 34, { maxWidth: this.width - 80 });
        this.doc.setDrawColor(...colours.rule);
        this.doc.setLineWidth(0.5);
        this.doc.line(this.margin.left, 40, this.pageWidth - this.margin.right, 40);
      }
      const footY = this.pageHeight - 28;
      this.textAt(footerLeft, this.margin.left, footY, { maxWidth: this.width - 90 });
      this.textAt(`Page ${page} of ${pages}`, this.pageWidth - this.margin.right, footY, { align: 'right' });
    }
  }

  /** The finished PDF. */
  bytes(): Uint8Array {
    return new Uint8Array(this.doc.output('arraybuffer'));
  }
}

function safeCell(cell: CellInput): CellInput {
  if (typeof cell === 'string') return pdfSafeText(cell);
  if (Array.isArray(cell)) return cell.map((c) => pdfSafeText(c));
  if (cell !== null && typeof cell === 'object' && typeof cell.content === 'string') return { ...cell, content: pdfSafeText(cell.content) };
  return cell;
}

function safeRow(row: RowInput): RowInput {
  if (Array.isArray(row)) return row.map((cell: CellInput) => safeCell(cell));
  const out: { [key: string]: CellInput } = {};
  for (const [key, cell] of Object.entries(row)) out[key] = safeCell(cell);
  return out;
}

/**
 * A file-name-friendly slug of a survey name, e.g. "Tallowmere Corner — shop" → "tallowmere-corner-shop".
 *
 * @example fileSlug('Tallowmere Corner — shop and flats (demo)') //=> 'tallowmere-corner-shop-and-flats-demo'
 */
export function fileSlug(name: string): string {
  const slug = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/g, '');
  return slug === '' ? 'survey' : slug;
}

/** An exporter of one kind of input (a survey, a portfolio) to one file. */
export interface FileExporter<Input, Id extends string, Options> {
  id: Id;
  label: string;
  mimeType: string;
  extension: string;
  run(signal: AbortSignal, input: Input, options: Options, onProgress?: ProgressCallback): Promise<ExportedFile>;
}

/** The file types the exporters write: extension, the exporter's type and the file's. */
const fileKinds = {
  pdf: { extension: 'pdf', mimeType: 'application/pdf', fileMimeType: 'application/pdf' },
  csv: { extension: 'csv', mimeType: 'text/csv', fileMimeType: 'text/csv;charset=utf-8' },
} as const;

function fileExporter<Input, Id extends string, Options>(
  kind: keyof typeof fileKinds,
  nameOf: (input: Input) => string,
  id: Id,
  label: string,
  suffix: string,
  make: (signal: AbortSignal, input: Input, options: Options, onProgress?: ProgressCallback) => Promise<Uint8Array>,
): FileExporter<Input, Id, Options> {
  const { extension, mimeType, fileMimeType } = fileKinds[kind];
  return {
    id,
    label,
    mimeType,
    extension,
    async run(signal, input, options, onProgress) {
      const bytes = await make(signal, input, options, onProgress);
      return { fileName: `${fileSlug(nameOf(input))}-${suffix}.${extension}`, mimeType: fileMimeType, bytes };
    },
  };
}

/**
 * An exporter for a PDF document made by `make`, named `<slug of nameOf(input)>-<suffix>.pdf`.
 *
 * @example pdfExporterFor((input: PortfolioExportInput) => input.portfolio.name, 'portfolio-summary', 'Portfolio summary (PDF)', 'portfolio', portfolioSummaryPdf).extension //=> 'pdf'
 */
export function pdfExporterFor<Input, Id extends string, Options>(
  nameOf: (input: Input) => string,
  id: Id,
  label: string,
  suffix: string,
  make: (signal: AbortSignal, input: Input, options: Options, onProgress?: ProgressCallback) => Promise<Uint8Array>,
): FileExporter<Input, Id, Options> {
  return fileExporter('pdf', nameOf, id, label, suffix, make);
}

/**
 * An exporter for a PDF document made by `make`, named `<survey>-<suffix>.pdf`.
 *
 * @example pdfExporter('client-report', 'Client report (PDF)', 'report', clientReportPdf).extension //=> 'pdf'
 */
export function pdfExporter<Options>(
  id: ExporterId,
  label: string,
  suffix: string,
  make: (signal: AbortSignal, input: ExportInput, options: Options, onProgress?: ProgressCallback) => Promise<Uint8Array>,
): Exporter<Options> {
  return pdfExporterFor((input: ExportInput) => input.survey.name, id, label, suffix, make);
}

/**
 * An exporter for CSV text made by `make` (UTF-8 with a byte-order mark for
 * spreadsheets), named `<slug of nameOf(input)>-<suffix>.csv`.
 *
 * @example csvExporterFor((input: ExportInput) => input.survey.name, 'order-list-csv', 'Order list (CSV)', 'orders', (input, o) => orderListCsv(input.survey, o, o)).extension //=> 'csv'
 */
export function csvExporterFor<Input, Id extends string, Options>(
  nameOf: (input: Input) => string,
  id: Id,
  label: string,
  suffix: string,
  make: (input: Input, options: Options) => string,
): FileExporter<Input, Id, Options> {
  return fileExporter('csv', nameOf, id, label, suffix, async (signal, input: Input, options: Options, onProgress) => {
    const progress = progressReporter(onProgress);
    await pause(signal);
    const bytes = utf8WithBom(make(input, options));
    progress(1);
    return bytes;
  });
}
