/**
 * The exporter contract (see `README.md` beside this file). Every exporter in
 * `src/export` is an {@link Exporter}: a label for a button, the file type it
 * makes, and one function that takes an `AbortSignal` and the survey with its
 * results and resolves to the file.
 *
 * Nothing here imports the screens: the app loads this folder with `import()`
 * when the user exports, so jsPDF stays out of the first-load bundle.
 */
import type { Measure, PhasePlan } from '../calc/phasing.ts';
import type { PortfolioResult } from '../calc/portfolio.ts';
import type { SurveyResult } from '../calc/survey.ts';
import type { Portfolio, Survey } from '../survey/model.ts';

/** The exporters this folder provides. */
export type ExporterId = 'client-report' | 'contractor-quote' | 'order-list-csv' | 'order-list-pdf' | 'fixture-schedule-csv';

/** What every exporter works from: the survey as stored and its calculated results. */
export interface ExportInput {
  survey: Survey;
  /** `calculateSurvey(survey)` (or the screen's up-to-date result for the same survey). */
  result: SurveyResult;
}

/** Progress of a long export, 0 (started) to 1 (done); never decreases. */
export type ProgressCallback = (fraction: number) => void;

/** A finished export, ready to save, download or share. */
export interface ExportedFile {
  /** A suggested file name with its extension, e.g. `tallowmere-corner-report.pdf`. */
  fileName: string;
  /** The file type, e.g. `application/pdf`. */
  mimeType: string;
  bytes: Uint8Array;
}

/**
 * One exporter. `run` rejects with a `DOMException` named `AbortError` when
 * `signal` is aborted (test with {@link isAbortError} from `abort.ts`; a
 * cancel is not an error to show the user), and with a `CalcInputError`
 * naming the field when an option is out of range.
 */
export interface Exporter<Options> {
  id: ExporterId;
  /** Short label for a button or menu, e.g. "Client report (PDF)". */
  label: string;
  /** The file type made, e.g. `application/pdf` or `text/csv`. */
  mimeType: string;
  /** File name extension without the dot, e.g. `pdf`. */
  extension: string;
  run(signal: AbortSignal, input: ExportInput, options: Options, onProgress?: ProgressCallback): Promise<ExportedFile>;
}

/** An image given as a data URL with its pixel size (for the aspect ratio). PNG or JPEG. */
export interface ImageInput {
  /** `data:image/png;base64,…` or `data:image/jpeg;base64,…`. */
  dataUrl: string;
  width: number;
  height: number;
}

/** A site photo for the report's thumbnails. */
export interface ReportPhoto extends ImageInput {
  caption: string;
}

/** Paper sizes the PDFs are laid out for. */
export type PaperSize = 'a4' | 'letter';

/** Who issues a document: the auditor's or contractor's company. */
export interface CompanySettings {
  companyName: string;
  logo?: ImageInput;
  /** Optional lines under the company name (address, phone, licence number). */
  companyDetails?: string[];
  /** Default: letter for US/Canada/Mexico/Philippines locales, A4 elsewhere. */
  paper?: PaperSize;
}

/** Settings for the client report. */
export interface ReportSettings extends CompanySettings {
  /** Who prepared the report; defaults to the survey's `preparedBy`. */
  preparedBy?: string;
  /** The report date. */
  date: Date;
  /** Optional site photos shown as thumbnails. */
  photos?: ReportPhoto[];
}

/** Settings for the contractor quote. */
export interface QuoteSettings extends CompanySettings {
  /** The quote date. */
  date: Date;
  /** Days the quote stays valid after its date (default 30). */
  validDays?: number;
  /** Quote reference printed on each page, e.g. "Q-2026-014". */
  quoteNumber?: string;
  /** Who prepared the quote; defaults to the survey's `preparedBy`. */
  preparedBy?: string;
  /** Terms printed above the acceptance block; a default set is used when absent. */
  terms?: string[];
  /**
   * How the survey's markup is shown: folded into each line's prices (the
   * usual way to quote a client) or as its own line before tax.
   * Default `in-prices`. The total is the same either way.
   */
  markup?: 'in-prices' | 'separate-line';
}

/** Settings for the order list. */
export interface OrderSettings {
  /** Extra stock to order, percent of the quantity needed (0–100, default 5); spares round up to whole units. */
  sparePercent?: number;
}

/** Settings for the order list PDF page. */
export interface OrderPdfSettings extends OrderSettings, CompanySettings {
  date: Date;
}

/** Number and column separators for CSV files. */
export interface CsvFormat {
  /** Column separator (default `,`; `;` suits spreadsheets set to a decimal comma). */
  delimiter?: ',' | ';' | '\t';
  /** Decimal separator written in and expected from number cells (default `.`). */
  decimalSeparator?: '.' | ',';
}

/** The exporters of a whole portfolio (`portfolio.ts`). */
export type PortfolioExporterId = 'portfolio-summary' | 'phase-orders-csv' | 'phase-orders-pdf';

/**
 * What the portfolio exporters work from: the portfolio, its surveys, their
 * roll-up, the measures and the phased plan. `preparePortfolioExport` in
 * `portfolio.ts` makes one from a portfolio and its surveys.
 */
export interface PortfolioExportInput {
  portfolio: Portfolio;
  /** The portfolio's surveys, in `portfolio.surveyIds` order. */
  surveys: Survey[];
  /** `calculatePortfolio(portfolio, surveys)`. */
  result: PortfolioResult;
  /** `measuresFromSurveys(surveys)`. */
  measures: Measure[];
  /** `planPhases(measures, settings)`. */
  plan: PhasePlan;
}

/** Like {@link Exporter}, for a whole portfolio. */
export interface PortfolioExporter<Options> {
  id: PortfolioExporterId;
  label: string;
  mimeType: string;
  extension: string;
  run(signal: AbortSignal, input: PortfolioExportInput, options: Options, onProgress?: ProgressCallback): Promise<ExportedFile>;
}

/** Settings for the portfolio summary PDF. */
export interface PortfolioSummarySettings extends CompanySettings {
  date: Date;
  /** Who prepared the summary; printed under the title when given. */
  preparedBy?: string;
}

/** Settings for the order list by phase PDF. */
export interface PhaseOrderPdfSettings extends OrderSettings, CompanySettings {
  date: Date;
}
