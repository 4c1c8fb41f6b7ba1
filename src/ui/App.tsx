/**
 * Lampwalk's root: opens the store (seeding the example catalog and the demo
 * survey on first run), keeps the user's preferences and theme, routes by the
 * address hash, and shows what start-up found — another tab in the way, a
 * reload needed, or data the browser deleted (with the offer to restore).
 * First run opens the demo survey. The survey screens and the catalog and
 * settings screens load on first use.
 */
import type { ComponentChildren } from 'preact';
import { useEffect, useMemo, useState } from 'preact/hooks';
import { startLampwalk, type StartState, type SurveyStore } from '../survey/store.ts';
import { Notices } from './components/Notices.tsx';
import { TopBar } from './components/Layout.tsx';
import { lazyScreen } from './lazy.tsx';
import { go, useRoute, type Route } from './router.ts';
import { SurveysScreen } from './screens/SurveysScreen.tsx';
import type { SurveyRoute } from './screens/SurveyArea.tsx';
import type { ToolsRoute } from './screens/ToolsArea.tsx';
import type { PortfolioRoute } from './screens/PortfolioArea.tsx';
import { AppContext, type AppServices, type Notice } from './state/context.ts';
import { messageOf } from './state/errors.ts';
import { loadPreferences, savePreferences, type Preferences } from './state/preferences.ts';

const surveyScreens = lazyScreen<{ route: SurveyRoute }>(() => import('./screens/SurveyArea.tsx').then((module) => module.SurveyArea));
const portfolioScreens = lazyScreen<{ route: PortfolioRoute }>(() => import('./screens/PortfolioArea.tsx').then((module) => module.PortfolioArea));
const toolScreens = lazyScreen<{ route: ToolsRoute }>(() => import('./screens/ToolsArea.tsx').then((module) => module.ToolsArea));

/** Id of the demo survey that first run opens. */
const demoSurveyId = 'demo-tallowmere';

type Boot =
  | { kind: 'opening' }
  | { kind: 'blocked' }
  | { kind: 'reload' }
  | { kind: 'failed'; message: string }
  | { kind: 'ready'; store: SurveyStore; state: StartState; evictedSince: string | null };

function Holding(props: { children: ComponentChildren }) {
  return (
    <>
      <TopBar current="surveys" />
      <main id="main" class="screen">
        {props.children}
      </main>
    </>
  );
}

function Routed(props: { route: Route; evictedSince: string | null | undefined; onRecovered: () => void }) {
  const { route } = props;
  switch (route.name) {
    case 'surveys':
      return <SurveysScreen evictedSince={props.evictedSince} onRecovered={props.onRecovered} />;
    case 'survey':
    case 'room':
    case 'entry':
    case 'suggest':
      return <surveyScreens.View route={route} />;
    case 'portfolios':
    case 'portfolio':
    case 'plan':
      return <portfolioScreens.View route={route} />;
    case 'catalog':
    case 'product':
    case 'settings':
      return <toolScreens.View route={route} />;
    case 'missing':
      return (
        <Holding>
          <h1>Nothing here</h1>
          <p>
            This address does not lead to a Lampwalk screen. <a href="#/">Go to the surveys</a>.
          </p>
        </Holding>
      );
  }
}

/**
 * The whole app: start-up, preferences, routes and the notice area.
 *
 * @example render(<App />, document.getElementById('app')) //=> the first screen (the demo survey on first run)
 */
export function App() {
  const [boot, setBoot] = useState<Boot>({ kind: 'opening' });
  const [preferences, setPreferencesState] = useState<Preferences>(loadPreferences);
  const [notice, setNotice] = useState<Notice | null>(null);
  const route = useRoute();

  useEffect(() => {
    let cancelled = false;
    startLampwalk({
      onBlocked: () => setBoot({ kind: 'blocked' }),
      onClosed: () => setBoot({ kind: 'reload' }),
    })
      .then(({ store, state, previousUse }) => {
        if (cancelled) return;
        if (state === 'first-run' && parseHashIsHome()) go({ name: 'survey', surveyId: demoSurveyId }, true);
        if (state === 'evicted' && !parseHashIsHome()) go({ name: 'surveys' }, true);
        setBoot({ kind: 'ready', store, state, evictedSince: state === 'evicted' ? (previousUse?.firstUsedAt ?? null) : null });
      })
      .catch((error: unknown) => setBoot({ kind: 'failed', message: messageOf(error) }));
    return () => {
      cancelled = true;
    };
  }, []);

  useEffect(() => {
    const root = document.documentElement;
    if (preferences.theme === 'auto') delete root.dataset.theme;
    else root.dataset.theme = preferences.theme;
  }, [preferences.theme]);

  // Fetch the survey screens while the user reads the list, so opening a survey is instant (and works offline).
  useEffect(() => {
    if (boot.kind !== 'ready') return;
    const idle = (window as { requestIdleCallback?: (run: () => void) => number }).requestIdleCallback ?? ((run: () => void) => window.setTimeout(run, 300));
    idle(() => {
      surveyScreens.preload().catch(() => undefined);
    });
  }, [boot.kind]);

  const services = useMemo<AppServices | null>(() => {
    if (boot.kind !== 'ready') return null;
    return {
      store: boot.store,
      preferences,
      setPreferences: (change) => {
        const next = { ...preferences, ...change };
        const refused = savePreferences(next);
        if (refused && refused.startsWith('Not saved')) return refused;
        setPreferencesState(next);
        return refused;
      },
      notify: setNotice,
    };
  }, [boot, preferences]);

  if (boot.kind !== 'ready' || !services) {
    return (
      <Holding>
        {boot.kind === 'opening' && <p role="status">Opening your surveys…</p>}
        {boot.kind === 'blocked' && <p role="alert">Lampwalk is open in another tab with an older version. Close that tab; this one carries on by itself.</p>}
        {boot.kind === 'reload' && (
          <p role="alert">
            Lampwalk was updated in another tab, so this tab has stopped saving. Everything saved so far is kept.{' '}
            <button type="button" class="button" onClick={() => location.reload()}>
              Reload
            </button>
          </p>
        )}
        {boot.kind === 'failed' && <p role="alert">{boot.message}</p>}
      </Holding>
    );
  }

  return (
    <AppContext.Provider value={services}>
      <Routed
        route={route}
        evictedSince={boot.state === 'evicted' ? boot.evictedSince : undefined}
        onRecovered={() => setBoot({ ...boot, state: 'returning', evictedSince: null })}
      />
      <Notices notice={notice} onDismiss={() => setNotice(null)} />
      <footer class="footer">
        <p>Estimates, not guarantees. Wiring work must follow local codes and be done by a licensed electrician.</p>
      </footer>
    </AppContext.Provider>
  );
}

function parseHashIsHome(): boolean {
  return location.hash === '' || location.hash === '#' || location.hash === '#/';
}
