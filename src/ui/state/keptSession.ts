/**
 * The one open session of a kind (a survey's, a portfolio's) that a hook keeps
 * while the user moves between that item's screens: reused when the same item
 * opens again, disposed when another one opens.
 */
import { useEffect, useState } from 'preact/hooks';
import type { SurveyStore } from '../../survey/store.ts';
import { messageOf } from './errors.ts';

/** What the hook needs of a session. */
export interface KeptSession<Snapshot> {
  readonly store: SurveyStore;
  readonly snapshot: Snapshot;
  subscribe(listener: (snapshot: Snapshot) => void): () => void;
  dispose(): void;
}

/** The session (null while it opens or when it failed), its latest snapshot and the failure to show. */
export interface KeptSessionState<Session, Snapshot> {
  session: Session | null;
  snapshot: Snapshot | null;
  error: string | null;
}

/** How to find, open and follow one kind of session. */
export interface KeptSessionKind<Session> {
  /** Holds the session kept for this kind (one per kind, outside any component). */
  kept: { current: Session | null };
  /** The id of the item a session is open on. */
  idOf(session: Session): string;
  open(store: SurveyStore, id: string): Promise<Session>;
  /** Listeners besides the snapshots while the session is followed; returns what stops them. */
  follow?(session: Session): () => void;
  /** Work when the kept session is reused (e.g. reading its items again); a failure is shown as the error. */
  reused?(session: Session): Promise<void>;
}

/**
 * Opens (or reuses) the session of `id` and re-renders on every snapshot.
 *
 * @example useKeptSession(store, 'demo-tallowmere', surveySessions).snapshot //=> null while opening, then the survey's snapshot
 */
export function useKeptSession<Snapshot, Session extends KeptSession<Snapshot>>(
  store: SurveyStore,
  id: string,
  kind: KeptSessionKind<Session>,
): KeptSessionState<Session, Snapshot> {
  const { kept } = kind;
  const [state, setState] = useState<KeptSessionState<Session, Snapshot>>(() =>
    kept.current && kind.idOf(kept.current) === id && kept.current.store === store
      ? { session: kept.current, snapshot: kept.current.snapshot, error: null }
      : { session: null, snapshot: null, error: null },
  );

  useEffect(() => {
    let cancelled = false;
    let unsubscribe = () => {};
    const follow = (session: Session) => {
      if (kept.current && kept.current !== session) kept.current.dispose();
      kept.current = session;
      setState({ session, snapshot: session.snapshot, error: null });
      const stopSnapshots = session.subscribe((snapshot) => setState({ session, snapshot, error: null }));
      const stopOthers = kind.follow?.(session);
      unsubscribe = () => {
        stopSnapshots();
        stopOthers?.();
      };
    };
    const reuse = kept.current && kind.idOf(kept.current) === id && kept.current.store === store ? kept.current : null;
    if (reuse) {
      follow(reuse);
      kind.reused?.(reuse).catch((error: unknown) => {
        if (!cancelled) setState({ session: reuse, snapshot: reuse.snapshot, error: messageOf(error) });
      });
    } else {
      setState({ session: null, snapshot: null, error: null });
      kind.open(store, id).then(
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
    // The kind is fixed per hook; only the store and the id choose the session.
  }, [store, id]);

  return state;
}
