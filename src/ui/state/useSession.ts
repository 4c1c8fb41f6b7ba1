/** Hooks that open a survey session and follow its changes. */
import { useContext, useEffect, useRef, useState } from 'preact/hooks';
import type { CatalogProduct } from '../../survey/model.ts';
import type { SurveyStore } from '../../survey/store.ts';
import { AppContext } from './context.ts';
import { messageOf } from './errors.ts';
import { useKeptSession, type KeptSessionKind, type KeptSessionState } from './keptSession.ts';
import { SurveySession, type SessionSnapshot } from './session.ts';

/** Survey sessions for `useKeptSession`: the one kept while the user moves between a survey's screens. */
const surveySessions: KeptSessionKind<SurveySession> = {
  kept: { current: null },
  idOf: (session) => session.surveyId,
  open: (store, id) => SurveySession.open(store, id),
};

export type SessionState = KeptSessionState<SurveySession, SessionSnapshot>;

/**
 * Opens (or reuses) the session of `surveyId` and re-renders on every change.
 * When another window replaces a value edited here, the notice area says so.
 *
 * @example useSurveySession(store, 'demo-tallowmere').snapshot?.survey.name //=> 'Tallowmere Corner — shop and flats (demo)'
 */
export function useSurveySession(store: SurveyStore, surveyId: string): SessionState {
  const services = useContext(AppContext);
  const notify = useRef(services?.notify);
  notify.current = services?.notify;

  const state = useKeptSession<SessionSnapshot, SurveySession>(store, surveyId, {
    ...surveySessions,
    follow: (session) => session.onOtherWindow((text) => notify.current?.({ tone: 'info', text })),
  });

  // A tab the browser froze in the background may have missed other windows' messages:
  // read the survey again whenever the page is shown, so a value replaced meanwhile is shown and announced.
  useEffect(() => {
    const session = state.session;
    if (!session) return;
    const shown = () => {
      if (document.visibilityState === 'visible') session.applyChange({ surveyId: session.surveyId, kind: 'layout', ids: [] }).catch(() => undefined);
    };
    document.addEventListener('visibilitychange', shown);
    window.addEventListener('pageshow', shown);
    return () => {
      document.removeEventListener('visibilitychange', shown);
      window.removeEventListener('pageshow', shown);
    };
  }, [state.session]);

  // Warn before closing the page while edits are still being written.
  useEffect(() => {
    const session = state.session;
    if (!session) return;
    const guard = (event: BeforeUnloadEvent) => {
      if (session.queue.status.pending > 0) event.preventDefault();
    };
    window.addEventListener('beforeunload', guard);
    return () => window.removeEventListener('beforeunload', guard);
  }, [state.session]);

  return state;
}

/**
 * The catalog, read once per screen; `reload` after a change.
 *
 * @example useCatalog(store).catalog?.length //=> 8 with the example catalog
 */
export function useCatalog(store: SurveyStore): { catalog: CatalogProduct[] | null; reload: () => void; error: string | null } {
  const [catalog, setCatalog] = useState<CatalogProduct[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [version, setVersion] = useState(0);
  useEffect(() => {
    store.listCatalog().then(
      (list) => {
        setCatalog(list);
        setError(null);
      },
      (failure: unknown) => setError(messageOf(failure)),
    );
  }, [store, version]);
  return { catalog, reload: () => setVersion((v) => v + 1), error };
}
