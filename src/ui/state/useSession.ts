/** Hooks that open a survey session and follow its changes. */
import { useContext, useEffect, useRef, useState } from 'preact/hooks';
import type { CatalogProduct } from '../../survey/model.ts';
import type { SurveyStore } from '../../survey/store.ts';
import { AppContext } from './context.ts';
import { messageOf } from './errors.ts';
import { SurveySession, type SessionSnapshot } from './session.ts';

/** The session kept while the user moves between a survey's screens. */
let current: SurveySession | null = null;

export interface SessionState {
  session: SurveySession | null;
  snapshot: SessionSnapshot | null;
  error: string | null;
}

/**
 * Opens (or reuses) the session of `surveyId` and re-renders on every change.
 * When another window replaces a value edited here, the notice area says so.
 *
 * @example useSurveySession(store, 'demo-tallowmere').snapshot?.survey.name //=> 'Tallowmere Corner — shop and flats (demo)'
 */
export function useSurveySession(store: SurveyStore, surveyId: string): SessionState {
  const [state, setState] = useState<SessionState>(() =>
    current && current.surveyId === surveyId && current.store === store
      ? { session: current, snapshot: current.snapshot, error: null }
      : { session: null, snapshot: null, error: null },
  );

  const services = useContext(AppContext);
  const notify = useRef(services?.notify);
  notify.current = services?.notify;

  useEffect(() => {
    let cancelled = false;
    let unsubscribe = () => {};
    const follow = (session: SurveySession) => {
      if (current && current !== session) current.dispose();
      current = session;
      setState({ session, snapshot: session.snapshot, error: null });
      const stopSnapshots = session.subscribe((snapshot) => setState({ session, snapshot, error: null }));
      const stopNotices = session.onOtherWindow((text) => notify.current?.({ tone: 'info', text }));
      unsubscribe = () => {
        stopSnapshots();
        stopNotices();
      };
    };
    if (current && current.surveyId === surveyId && current.store === store) follow(current);
    else {
      setState({ session: null, snapshot: null, error: null });
      SurveySession.open(store, surveyId).then(
        (session) => {
          if (!cancelled) follow(session);
        },
        (error: unknown) => {
          if (!cancelled) setState({ session: null, snapshot: null, error: messageOf(error) });
        },
      );
    }
    return () => {
      cancelled = true;
      unsubscribe();
    };
  }, [store, surveyId]);

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
