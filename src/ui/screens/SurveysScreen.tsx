/**
 * The first screen: the surveys on this device, a clear way to start a new
 * one, backup and restore, and how safe the data is. After the browser has
 * deleted the data it says so and offers to restore a backup.
 */
import { useEffect, useState } from 'preact/hooks';
import type { SurveyHeader } from '../../survey/model.ts';
import { BackupImport } from '../components/BackupImport.tsx';
import { Section } from '../components/Section.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { StoragePanel } from '../components/StoragePanel.tsx';
import { go, href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';

function relativeTime(iso: string, locale: string): string {
  const seconds = (Date.parse(iso) - Date.now()) / 1000;
  if (!Number.isFinite(seconds)) return '';
  const format = new Intl.RelativeTimeFormat(locale, { numeric: 'auto' });
  const steps: [Intl.RelativeTimeFormatUnit, number][] = [
    ['year', 31_536_000],
    ['month', 2_592_000],
    ['day', 86_400],
    ['hour', 3600],
    ['minute', 60],
  ];
  for (const [unit, size] of steps) if (Math.abs(seconds) >= size) return format.format(Math.round(seconds / size), unit);
  return format.format(0, 'minute');
}

/**
 * Starts a blank survey from the user's defaults and opens it.
 *
 * @example const { start } = useNewSurvey(); await start() //=> a blank survey is saved and opened
 */
export function useNewSurvey(): { start: () => Promise<void>; busy: boolean } {
  const { store, preferences, notify } = useApp();
  const [busy, setBusy] = useState(false);
  const start = async () => {
    setBusy(true);
    try {
      const { newSurveyFields } = await import('../state/defaults.ts');
      const name = `New survey ${new Intl.DateTimeFormat(preferences.locale, { dateStyle: 'medium' }).format(new Date())}`;
      const survey = await store.createSurvey(newSurveyFields(preferences, name));
      go({ name: 'survey', surveyId: survey.id });
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    } finally {
      setBusy(false);
    }
  };
  return { start, busy };
}

function SurveyCard(props: { survey: SurveyHeader; locale: string }) {
  const { survey } = props;
  const place = [survey.site.name, survey.site.address].filter(Boolean).join(', ');
  return (
    <li>
      <a class="card card--link" href={href({ name: 'survey', surveyId: survey.id })} data-testid="survey-card">
        <span class="card-title">{survey.name || 'Untitled survey'}</span>
        {place && <span class="card-line">{place}</span>}
        {survey.client.name && <span class="card-line">For {survey.client.name}</span>}
        <span class="card-line quiet">Changed {relativeTime(survey.updatedAt, props.locale)}</span>
        <Icon name="next" />
      </a>
    </li>
  );
}

function EvictionNotice(props: { since: string | null; onStartAgain: () => Promise<void>; onRestored: () => Promise<void> }) {
  const { preferences } = useApp();
  const since = props.since ? new Intl.DateTimeFormat(preferences.locale, { dateStyle: 'long' }).format(new Date(props.since)) : null;
  return (
    <section class="panel panel--alert" aria-labelledby="evicted-heading" data-testid="eviction-notice">
      <h2 id="evicted-heading">
        <Icon name="hazard" /> Your saved surveys are gone from this browser
      </h2>
      <p>
        Lampwalk was used here{since ? ` since ${since}` : ''}, but the browser has deleted its saved data (browsers do this when space runs low, or
        after weeks unused). Open your latest backup file to bring everything back.
      </p>
      <BackupImport label="Restore from a backup file" onImported={props.onRestored} />
      <p>
        <button type="button" class="button button--quiet" onClick={props.onStartAgain}>
          Start again with the demo survey
        </button>
      </p>
    </section>
  );
}

/**
 * The surveys list.
 *
 * @example <SurveysScreen evictedSince={undefined} onRecovered={refresh} /> //=> the list, a new-survey button, backup and storage
 */
export function SurveysScreen(props: { evictedSince: string | null | undefined; onRecovered: () => void }) {
  const { store, preferences, notify } = useApp();
  const [surveys, setSurveys] = useState<SurveyHeader[] | null>(null);
  const [refreshKey, setRefreshKey] = useState(0);
  const { start, busy } = useNewSurvey();
  const evicted = props.evictedSince !== undefined;

  useEffect(() => {
    if (evicted) return;
    store
      .listSurveys()
      .then(setSurveys)
      .catch((error: unknown) => notify({ tone: 'error', text: messageOf(error) }));
  }, [refreshKey, evicted]);

  const refresh = () => setRefreshKey((key) => key + 1);

  const recover = async (seedDemo: boolean) => {
    try {
      await store.initialise({ exampleCatalog: seedDemo, demoSurvey: seedDemo });
      props.onRecovered();
      refresh();
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    }
  };

  return (
    <Screen title="Surveys" section="surveys">
      {evicted && <EvictionNotice since={props.evictedSince ?? null} onStartAgain={() => recover(true)} onRestored={() => recover(false)} />}
      {!evicted && (
        <>
          <div class="hero-actions">
            <button type="button" class="button button--primary button--big" onClick={start} disabled={busy} data-testid="new-survey">
              <Icon name="plus" />
              Start a blank survey
            </button>
            <a class="button" href={href({ name: 'portfolios' })} data-testid="open-portfolios">
              <Icon name="copy" />
              Portfolios: several buildings, one plan
            </a>
          </div>
          <section class="panel" aria-labelledby="list-heading">
            <h2 id="list-heading">On this device</h2>
            {surveys === null && <p class="quiet">Opening…</p>}
            {surveys?.length === 0 && <p>No surveys yet. Start one above, or open a backup file below.</p>}
            {surveys && surveys.length > 0 && (
              <ul class="cards">
                {surveys.map((survey) => (
                  <SurveyCard key={survey.id} survey={survey} locale={preferences.locale} />
                ))}
              </ul>
            )}
          </section>
          <div class="columns">
            <Section title="Keep it safe">
              <StoragePanel refreshKey={refreshKey} />
            </Section>
            <Section title="Bring in a backup">
              <p class="quiet">Adds the surveys, catalog and photos of a Lampwalk backup file. You see what it holds before anything changes.</p>
              <BackupImport onImported={refresh} />
            </Section>
          </div>
        </>
      )}
    </Screen>
  );
}
