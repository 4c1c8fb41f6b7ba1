/**
 * Documents and files from a survey. The export code (and jsPDF with it) is
 * loaded only when a button is pressed; long exports show their progress and
 * can be cancelled; the file then goes to the share sheet on phones or is
 * downloaded.
 */
import type { SurveyResult } from '../../calc/survey.ts';
import type { ExportedFile } from '../../export/types.ts';
import type { Survey } from '../../survey/model.ts';
import { useApp } from '../state/context.ts';
import { companyOf, csvFormatOf, useExportJob } from '../state/exportJob.ts';
import type { Preferences } from '../state/preferences.ts';
import type { SurveySession } from '../state/session.ts';
import { ExportProgress } from './ExportProgress.tsx';
import { Icon } from './Icon.tsx';

/** What the panel offers, in the words of its buttons. */
const documents = [
  { id: 'client-report', label: 'Client report', kind: 'PDF' },
  { id: 'contractor-quote', label: 'Contractor quote', kind: 'PDF' },
  { id: 'order-list-pdf', label: 'Order list', kind: 'PDF' },
  { id: 'order-list-csv', label: 'Order list', kind: 'CSV' },
  { id: 'fixture-schedule-csv', label: 'Fixture schedule', kind: 'CSV' },
  { id: 'backup', label: 'Backup of this survey', kind: 'JSON' },
] as const;

type DocumentId = (typeof documents)[number]['id'];

async function makeFile(
  id: Exclude<DocumentId, 'backup'>,
  signal: AbortSignal,
  input: { survey: Survey; result: SurveyResult },
  preferences: Preferences,
  onProgress: (fraction: number) => void,
): Promise<ExportedFile> {
  const exports = await import('../../export/index.ts');
  const date = new Date();
  const csv = csvFormatOf(preferences);
  const who = companyOf(preferences, input.survey.preparedBy || 'Lampwalk survey');
  switch (id) {
    case 'client-report':
      return exports.clientReport.run(signal, input, { ...who, date }, onProgress);
    case 'contractor-quote':
      return exports.contractorQuote.run(signal, input, { ...who, date, validDays: preferences.quoteValidDays }, onProgress);
    case 'order-list-pdf':
      return exports.orderListPdfExporter.run(signal, input, { ...who, date, sparePercent: preferences.sparePercent }, onProgress);
    case 'order-list-csv':
      return exports.orderListCsvExporter.run(signal, input, { sparePercent: preferences.sparePercent, ...csv }, onProgress);
    case 'fixture-schedule-csv':
      return exports.fixtureScheduleExporter.run(signal, input, csv, onProgress);
  }
}

/**
 * The document and file buttons, with progress and Cancel while one is made.
 *
 * @example <ExportPanel session={session} survey={survey} result={result} /> //=> six buttons; a progress bar during an export
 */
export function ExportPanel(props: { session: SurveySession; survey: Survey; result: SurveyResult | null }) {
  const { store, preferences } = useApp();
  const { job, run: runJob } = useExportJob();

  const run = (id: DocumentId, label: string) =>
    runJob(label, async (signal, onProgress) => {
      if (id === 'backup') {
        await props.session.flush();
        const backup = await store.exportSurvey(props.survey.id);
        return { fileName: backup.fileName, mimeType: 'application/json', bytes: new TextEncoder().encode(backup.text) };
      }
      if (!props.result) throw new Error('the survey cannot be calculated yet; fix the field named above first');
      return makeFile(id, signal, { survey: props.survey, result: props.result }, preferences, onProgress);
    });

  return (
    <div class="exports">
      <div class="export-buttons">
        {documents.map((item) => (
          <button key={item.id} type="button" class="button" onClick={() => run(item.id, `${item.label} (${item.kind})`)} disabled={job !== null} data-testid={`export-${item.id}`}>
            <Icon name={item.kind === 'JSON' ? 'download' : 'share'} />
            <span>
              {item.label} <span class="quiet">{item.kind}</span>
            </span>
          </button>
        ))}
      </div>
      {job && <ExportProgress job={job} cancelTestId="export-cancel" />}
    </div>
  );
}
