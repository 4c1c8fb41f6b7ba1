/**
 * The portfolio's documents: the summary PDF (roll-up, sites compared, the
 * phased plan, what waits and why) and the order list by phase (PDF and
 * CSV). The export code loads only when a button is pressed; the documents
 * are made from the plan on screen, so they say what the screen says. The
 * file goes to the share sheet on phones or is downloaded.
 */
import { useId, useState } from 'preact/hooks';
import { calculatePortfolio } from '../../calc/portfolio.ts';
import type { Measure, PhasePlan } from '../../calc/phasing.ts';
import type { ExportedFile } from '../../export/types.ts';
import type { Survey } from '../../survey/model.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import type { PortfolioSession, PortfolioSnapshot } from '../state/portfolioSession.ts';
import { deliver } from '../state/share.ts';
import { surveysInOrder } from '../screens/PortfolioScreen.tsx';
import { Icon } from './Icon.tsx';

const documents = [
  { id: 'portfolio-summary', label: 'Portfolio summary', kind: 'PDF' },
  { id: 'phase-orders-pdf', label: 'Order list by phase', kind: 'PDF' },
  { id: 'phase-orders-csv', label: 'Order list by phase', kind: 'CSV' },
] as const;

type DocumentId = (typeof documents)[number]['id'];

function isAbort(error: unknown): boolean {
  return typeof error === 'object' && error !== null && 'name' in error && (error as { name: unknown }).name === 'AbortError';
}

/**
 * The portfolio document buttons, with progress and Cancel while one is made.
 *
 * @example <PlanExports session={session} snapshot={snapshot} plan={plan} measures={measures} /> //=> three buttons, enabled once the plan is worked out
 */
export function PlanExports(props: { session: PortfolioSession; snapshot: PortfolioSnapshot; plan: PhasePlan | null; measures: readonly Measure[] | null }) {
  const { preferences, notify } = useApp();
  const progressId = useId();
  const [job, setJob] = useState<{ label: string; progress: number; controller: AbortController } | null>(null);
  const ready = props.plan !== null && props.measures !== null;

  const run = async (id: DocumentId, label: string) => {
    if (job || !props.plan || !props.measures) return;
    const controller = new AbortController();
    setJob({ label, progress: 0, controller });
    try {
      await props.session.flush();
      const surveys: Survey[] = surveysInOrder(props.snapshot) ?? [];
      const portfolio = { ...props.snapshot.portfolio, surveyIds: surveys.map((survey) => survey.id) };
      const input = { portfolio, surveys, result: calculatePortfolio(portfolio, surveys), measures: [...props.measures], plan: props.plan };
      const exports = await import('../../export/portfolio.ts');
      const details = preferences.companyDetails
        .split('\n')
        .map((line) => line.trim())
        .filter(Boolean);
      const company = {
        companyName: preferences.companyName || preferences.preparedBy || 'Lampwalk',
        ...(preferences.logo ? { logo: preferences.logo } : {}),
        ...(details.length > 0 ? { companyDetails: details } : {}),
      };
      const date = new Date();
      const onProgress = (progress: number) => setJob((current) => (current && current.controller === controller ? { ...current, progress } : current));
      const csv = preferences.csvDecimal === ',' ? ({ delimiter: ';', decimalSeparator: ',' } as const) : ({ delimiter: ',', decimalSeparator: '.' } as const);
      let file: ExportedFile;
      if (id === 'portfolio-summary') {
        file = await exports.portfolioSummary.run(controller.signal, input, { ...company, date, ...(preferences.preparedBy ? { preparedBy: preferences.preparedBy } : {}) }, onProgress);
      } else if (id === 'phase-orders-pdf') {
        file = await exports.phaseOrdersPdfExporter.run(controller.signal, input, { ...company, date, sparePercent: preferences.sparePercent }, onProgress);
      } else {
        file = await exports.phaseOrdersCsvExporter.run(controller.signal, input, { sparePercent: preferences.sparePercent, ...csv }, onProgress);
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
      {!ready && <p class="quiet">The documents can be made once the plan is worked out.</p>}
      <div class="export-buttons">
        {documents.map((item) => (
          <button key={item.id} type="button" class="button" onClick={() => run(item.id, `${item.label} (${item.kind})`)} disabled={job !== null || !ready} data-testid={`export-${item.id}`}>
            <Icon name="share" />
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
          <button type="button" class="button button--quiet" onClick={() => job.controller.abort()}>
            <Icon name="close" />
            Cancel
          </button>
        </div>
      )}
    </div>
  );
}
