/**
 * Everything the app and the command line need from `src/export`, in one
 * module to load with `import()` at export time (jsPDF comes with it, so it
 * never enters the first-load bundle). See `README.md` for the contract.
 */
import { contractorQuote } from './quote.ts';
import { clientReport } from './report.ts';
import { orderListCsvExporter, orderListPdfExporter } from './orders.ts';
import { fixtureScheduleExporter } from './schedule.ts';

export { abortError, checkAborted, isAbortError } from './abort.ts';
export { neutraliseCell, restoreCell } from './csv.ts';
export { figuresFor, lightQualitySentence, type Figures } from './figures.ts';
export { defaultSparePercent, orderLines, orderListCsv, orderListPdf, type OrderLine } from './orders.ts';
export { contractorQuotePdf, defaultValidDays, quoteLines, validUntil, type QuoteLine, type QuoteTotals } from './quote.ts';
export { clientReportPdf } from './report.ts';
export {
  autoMapColumns,
  commitRows,
  fixtureScheduleCsv,
  previewSchedule,
  ScheduleImportError,
  type ColumnMapping,
  type PreviewRow,
  type RowProblem,
  type ScheduleColumn,
  type ScheduleImportOptions,
  type SchedulePreview,
} from './schedule.ts';
export { pdfSafeText } from './text.ts';
export type * from './types.ts';
export { clientReport, contractorQuote, fixtureScheduleExporter, orderListCsvExporter, orderListPdfExporter };

export {
  phaseOrderCsv,
  phaseOrderLines,
  phaseOrderPdf,
  phaseOrdersCsvExporter,
  phaseOrdersPdfExporter,
  portfolioSummary,
  portfolioSummaryPdf,
  preparePortfolioExport,
  type PhaseOrderLine,
} from './portfolio.ts';
import { phaseOrdersCsvExporter, phaseOrdersPdfExporter, portfolioSummary } from './portfolio.ts';

/** The exporters of a whole portfolio (input: `PortfolioExportInput`, from `preparePortfolioExport`). */
export const portfolioExporters = [portfolioSummary, phaseOrdersPdfExporter, phaseOrdersCsvExporter] as const;

/** Every exporter, in the order a menu would list them. */
export const exporters = [clientReport, contractorQuote, orderListPdfExporter, orderListCsvExporter, fixtureScheduleExporter] as const;
