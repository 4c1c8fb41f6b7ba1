/**
 * The portfolio's documents: the summary PDF (roll-up, sites compared, the
 * phased plan, what waits and why) and the order list by phase (PDF and
 * CSV). The export code loads only when a button is pressed; the documents
 * are made from the plan on screen, so they say what the screen says. The
 * file goes to the share sheet on phones or is downloaded.
 */
import { calculatePortfolio } from '../../calc/portfolio.ts';
import type { Measure, PhasePlan } from '../../calc/phasing.ts';
import type { Survey } from '../../survey/model.ts';
import { useApp } from '../state/context.ts';
import { companyOf, csvFormatOf, useExportJob } from '../state/exportJob.ts';
import type { PortfolioSession, PortfolioSnapshot } from '../state/portfolioSession.ts';
import { surveysInOrder } from '../screens/PortfolioScreen.tsx';
import { ExportProgress } from './ExportProgress.tsx';
import { Icon } from './Icon.tsx';

const documents = [
  { id: 'portfolio-summary', label: 'Portfolio summary', kind: 'PDF' },
  { id: 'phase-orders-pdf', label: 'Order list by phase', kind: 'PDF' },
  { id: 'phase-orders-csv', label: 'Order list by phase', kind: 'CSV' },
] as const;

type DocumentId = (typeof documents)[number]['id'];

/**
 * The portfolio document buttons, with progress and Cancel while one is made.
 *
 * @example <PlanExports session={session} snapshot={snapshot} plan={plan} measures={measures} /> //=> three buttons, enabled once the plan is worked out
 */
export function PlanExports(props: { session: PortfolioSession; snapshot: PortfolioSnapshot; plan: PhasePlan | null; measures: readonly Measure[] | null }) {
  const { preferences } = useApp();
  const { job, run: runJob } = useExportJob();
  const ready = props.plan !== null && props.measures !== null;

  const run = (id: DocumentId, label: string) => {
    const { plan, measures } = props;
    if (job || !plan || !measures) return;
    return runJob(label, async (signal, onProgress) => {
      await props.session.flush();
      const surveys: Survey[] = surveysInOrder(props.snapshot) ?? [];
      const portfolio = { ...props.snapshot.portfolio, surveyIds: surveys.map((survey) => survey.id) };
      const input = { portfolio, surveys, result: calculatePortfolio(portfolio, surveys), measures: [...measures], plan };
      const exports = await import('../../export/portfolio.ts');
      const company = companyOf(preferences, preferences.preparedBy || 'Lampwalk');
      const date = new Date();
      if (id === 'portfolio-summary') {
        return exports.portfolioSummary.run(signal, input, { ...company, date, ...(preferences.preparedBy ? { preparedBy: preferences.preparedBy } : {}) }, onProgress);
      } else if (id === 'phase-orders-pdf') {
        return exports.phaseOrdersPdfExporter.run(signal, input, { ...company, date, sparePercent: preferences.sparePercent }, onProgress);
      }
      return exports.phaseOrdersCsvExporter.run(signal, input, { sparePercent: preferences.sparePercent, ...csvFormatOf(preferences) }, onProgress);
    });
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
      {job && <ExportProgress job={job} />}
    </div>
  );
}
