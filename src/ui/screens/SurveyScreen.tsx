/**
 * A survey at a glance: what the whole swap saves and costs, a chart, the
 * rooms with their savings and warnings, the hazards to deal with, and the
 * details, assumptions and exports.
 */
import { useMemo, useState } from 'preact/hooks';
import { calculateLayout, type LayoutResult } from '../../calc/portfolio.ts';
import type { Severity } from '../../calc/warnings.ts';
import { AddRoom } from '../components/AddRoom.tsx';
import { Assumptions } from '../components/Assumptions.tsx';
import { CashFlowChart, RoomEnergyChart } from '../components/charts.tsx';
import { ExportPanel } from '../components/ExportPanel.tsx';
import { Section } from '../components/Section.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { RoomList } from '../components/RoomList.tsx';
import { SaveStatus } from '../components/SaveStatus.tsx';
import { LayoutEditor } from '../components/LayoutEditor.tsx';
import { allUnitsResult, Totals, UnitTotals } from '../components/Totals.tsx';
import { WarningBadges, WarningGroups } from '../components/Warnings.tsx';
import { SurveyDetails } from '../components/SurveyDetails.tsx';
import { go, href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { uiFigures } from '../state/format.ts';
import type { SessionSnapshot, SurveySession } from '../state/session.ts';
import { useNewSurvey } from './SurveysScreen.tsx';

/** Id of the demo survey seeded on first run. */
const demoId = 'demo-tallowmere';

function DemoBanner() {
  const { start, busy } = useNewSurvey();
  return (
    <div class="banner" data-testid="demo-banner">
      <p>
        <strong>This is a made-up demo building</strong> with real calculations: a shop, two flats, a stair and a basement, with the problems a walk
        usually finds. Look around, change anything, then start your own.
      </p>
      <button type="button" class="button button--primary" onClick={start} disabled={busy} data-testid="demo-new-survey">
        <Icon name="plus" />
        Start a blank survey
      </button>
    </div>
  );
}

function DeleteSurvey(props: { session: SurveySession; name: string }) {
  const { store, notify } = useApp();
  const remove = async () => {
    try {
      await props.session.flush();
      const trashId = await store.deleteSurvey(props.session.surveyId);
      go({ name: 'surveys' });
      notify({
        tone: 'info',
        text: `“${props.name}” moved to Recently deleted.`,
        action: {
          label: 'Undo',
          run: async () => {
            const { surveyId } = await store.restoreFromTrash(trashId);
            go({ name: 'survey', surveyId });
          },
        },
      });
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    }
  };
  return (
    <button type="button" class="button button--danger" onClick={remove}>
      <Icon name="trash" />
      Delete this survey
    </button>
  );
}

/**
 * The survey overview.
 *
 * @example <SurveyScreen session={session} snapshot={snapshot} /> //=> totals, chart, rooms, hazards, exports
 */
export function SurveyScreen(props: { session: SurveySession; snapshot: SessionSnapshot }) {
  const { session, snapshot } = props;
  const { survey, result, calcError } = snapshot;
  const fig = uiFigures(survey);
  const [showAll, setShowAll] = useState(false);
  const warnings = result?.warnings ?? [];
  const safety = warnings.filter((warning) => warning.safety || warning.severity === 'danger');
  const subtitle = [survey.site.name || survey.site.address, survey.client.name && `for ${survey.client.name}`].filter(Boolean).join(' · ');
  const priceMissing = survey.money.energyRatePerKwh === 0;
  const counts: Record<Severity, number> = result?.warningCounts ?? { danger: 0, caution: 0, advice: 0 };
  const roomNames = new Map(survey.rooms.map((room) => [room.id, room.name]));
  const units = useMemo((): { layout: LayoutResult | null; error: string | null } => {
    if (!result || !survey.layout) return { layout: null, error: null };
    try {
      return { layout: calculateLayout(survey, result), error: null };
    } catch (error) {
      return { layout: null, error: messageOf(error) };
    }
  }, [survey, result]);
  // With a layout, the headline figures and the cash flow are those of every unit.
  const shown = result && units.layout ? allUnitsResult(result, units.layout) : result;

  return (
    <Screen
      title={survey.name || 'Untitled survey'}
      section="surveys"
      back={{ route: { name: 'surveys' }, label: 'Surveys' }}
      subtitle={subtitle || undefined}
      aside={<SaveStatus status={snapshot.status} />}
    >
      {survey.id === demoId && <DemoBanner />}
      {calcError && (
        <p class="panel panel--alert" role="alert">
          The figures cannot be worked out: {calcError}
        </p>
      )}
      {units.error && (
        <p class="panel panel--alert" role="alert" data-testid="layout-error">
          The figures for all units cannot be worked out: {units.error}
        </p>
      )}
      <div class="overview">
        <div class="overview-main">
          {result && shown && (
            <Section title={units.layout ? `What the swap does in all ${fig.number(units.layout.units)} units` : 'What the swap does'}>
              {priceMissing && (
                <p class="nudge">
                  <Icon name="rethink" size={20} />
                  <span>No energy price yet, so money figures are zero. Enter it under Assumptions.</span>
                </p>
              )}
              <Totals survey={survey} result={shown} fig={fig} />
              {units.layout && <UnitTotals survey={survey} layout={units.layout} fig={fig} />}
              <div class="charts">
                <RoomEnergyChart rooms={result.rooms} fig={fig} />
                <CashFlowChart years={shown.economics.cashFlows} paybackYears={shown.economics.simplePaybackYears} fig={fig} />
              </div>
              {units.layout && <p class="quiet">Room figures and the chart of rooms are for the surveyed unit.</p>}
            </Section>
          )}
          <Section title={`Rooms (${survey.rooms.length})`}>
            <RoomList survey={survey} results={result?.rooms ?? null} fig={fig} />
            <AddRoom session={session} survey={survey} />
          </Section>
        </div>
        <div class="overview-side">
          <Section title="Deal with before ordering">
            <p>
              <WarningBadges counts={counts} /> {warnings.length === 0 ? 'Nothing found so far.' : `${warnings.length} in all.`}
            </p>
            <WarningGroups warnings={showAll ? warnings : safety} roomNames={roomNames} empty={showAll ? undefined : 'No safety hazards found so far.'} testId="survey-warnings" />
            {warnings.length > safety.length && (
              <button type="button" class="button button--quiet" onClick={() => setShowAll(!showAll)} aria-expanded={showAll}>
                {showAll ? 'Show safety items only' : `Show all ${warnings.length}`}
              </button>
            )}
          </Section>
          <Section title="Choose products">
            <p class="quiet">Lampwalk can propose, for each fixture, the catalog product with the lowest life-cycle cost that meets every check. Nothing changes until you accept.</p>
            <a class="button" href={href({ name: 'suggest', surveyId: survey.id })} data-testid="open-suggestions">
              <Icon name="box" />
              Suggest products
            </a>
          </Section>
          <Section title="Documents and files">
            <ExportPanel session={session} survey={survey} result={result} />
          </Section>
        </div>
      </div>
      <details class="panel" open={survey.layout !== undefined} data-testid="layout-panel">
        <summary>
          <h2>{survey.layout ? `Units with this layout (${fig.number(survey.layout.unitCount)})` : 'One typical unit of many?'}</h2>
        </summary>
        <LayoutEditor session={session} survey={survey} />
      </details>
      <details class="panel" open={survey.site.name === '' && survey.rooms.length === 0}>
        <summary>
          <h2>Site and client</h2>
        </summary>
        <SurveyDetails session={session} survey={survey} />
      </details>
      <details class="panel" open={priceMissing && survey.id !== demoId}>
        <summary>
          <h2>Assumptions</h2>
        </summary>
        <Assumptions session={session} survey={survey} result={result} fig={fig} />
      </details>
      <div class="danger-zone">
        <DeleteSurvey session={session} name={survey.name} />
      </div>
    </Screen>
  );
}
