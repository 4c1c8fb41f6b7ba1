/**
 * Documents and files from a survey. The export code (and jsPDF with it) is
 * loaded only when a button is pressed; long exports show their progress and
 * can be cancelled; the file then goes to the share sheet on phones or is
 * downloaded.
 */
import { useId, useState } from 'preact/hooks';
import type { SurveyResult } from '../../calc/survey.ts';
import type { ExportedFile } from '../../export/types.ts';
import type { Survey } from '../../survey/model.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import type { Preferences } from '../state/preferences.ts';
import type { SurveySession } from '../state/session.ts';
import { deliver } from '../state/share.ts';
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

interface Job {
  id: DocumentId;
  label: string;
  progress: number;
  controller: AbortController;
}

function company(preferences: Preferences, survey: Survey) {
  const details = preferences.companyDetails
    .split('\n')
    .map((line) => line.trim())
    .filter(Boolean);
  return {
    companyName: preferences.companyName || survey.preparedBy || 'Lampwalk survey',
    ...(preferences.logo ? { logo: preferences.logo } : {}),
    ...(details.length > 0 ? { companyDetails: details } : {}),
  };
}

async function makeFile(
  id: Exclude<DocumentId, 'backup'>,
  signal: AbortSignal,
  input: { survey: Survey; result: SurveyResult },
  preferences: Preferences,
  onProgress: (fraction: number) => void,
): Promise<ExportedFile> {
  const exports = await import('../../export/index.ts');
  const date = new Date();
  const csv = preferences.csvDecimal === ',' ? ({ delimiter: ';', decimalSeparator: ',' } as const) : ({ delimiter: ',', decimalSeparator: '.' } as const);
  const who = company(preferences, input.survey);
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

function isAbort(error: unknown): boolean {
  return typeof error === 'object' && error !== null && 'name' in error && (error as { name: unknown }).name === 'AbortError';
}

/**
 * The document and file buttons, with progress and Cancel while one is made.
 *
 * @example <ExportPanel session={session} survey={survey} result={result} /> //=> six buttons; a progress bar during an export
 */
export function ExportPanel(props: { session: SurveySession; survey: Survey; result: SurveyResult | null }) {
  const { store, preferences, notify } = useApp();
  const progressId = useId();
  const [job, setJob] = useState<Job | null>(null);

  const run = async (id: DocumentId, label: string) => {
    if (job) return;
    const controller = new AbortController();
    const started: Job = { id, label, progress: 0, controller };
    setJob(started);
    try {
      let file: ExportedFile;
      if (id === 'backup') {
        await props.session.flush();
        const backup = await store.exportSurvey(props.survey.id);
        file = { fileName: backup.fileName, mimeType: 'application/json', bytes: new TextEncoder().encode(backup.text) };
      } else {
        if (!props.result) throw new Error('the survey cannot be calculated yet; fix the field named above first');
        file = await makeFile(id, controller.signal, { survey: props.survey, result: props.result }, preferences, (progress) =>
          setJob((current) => (current && current.controller === controller ? { ...current, progress } : current)),
        );
      }
      if (controller.signal.aborted) throw new DOMException('cancelled', 'AbortError');
      const how = await deliver(file);
      if (how !== 'cancelled') notify({ tone: 'info', text: `${label} ready: ${file.fileName}.` });
    } catch (error) {
      if (isAbort(error)) notify({ tone: 'info', text: `${label}: cancelled.` });
      else notify({ tone: 'error', text: `${label} could not be made. ${messageOf(error)}` });
    } finally {
      setJob(null);
    }
  };

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
      {job && (
        <div class="export-progress" role="status">
          <label for={progressId}>Making the {job.label}…</label>
          <progress id={progressId} max={1} value={job.progress} />
          <button type="button" class="button button--quiet" onClick={() => job.controller.abort()} data-testid="export-cancel">
            <Icon name="close" />
            Cancel
          </button>
        </div>
      )}
    </div>
  );
}
