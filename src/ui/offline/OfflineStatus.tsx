/**
 * Says whether Lampwalk is ready to open with no signal, and offers a waiting
 * update. Accepting the update first awaits `flushPendingEdits` (the screens'
 * autosave queue), then activates the new version, which reloads the page;
 * the page never reloads by itself.
 */
import { useEffect, useState } from 'preact/hooks';
import { buildId } from './build.ts';
import { inDevelopmentServer, offlineUnavailableReason } from './availability.ts';
import type { OfflineCallbacks, OfflineRegistration, PendingUpdate } from './register.ts';
import './offline.css';

export interface OfflineStatusProps {
  /** Resolves once every edit made so far is saved; rejects when one could not be. */
  flushPendingEdits: () => Promise<void>;
}

type Readiness = 'preparing' | 'ready' | 'unavailable' | 'development';

interface SharedRegistration {
  registration: OfflineRegistration | null;
  listeners: Set<OfflineCallbacks>;
  ready: boolean;
  update: PendingUpdate | null;
}

/** One registration per page, however often the component mounts. */
let shared: SharedRegistration | null = null;

function subscribe(listener: OfflineCallbacks): () => void {
  if (!shared) {
    const state: SharedRegistration = { registration: null, listeners: new Set(), ready: false, update: null };
    shared = state;
    // workbox-window loads after the first screen, not with it.
    import('./register.ts')
      .then(({ registerOffline }) => {
        state.registration = registerOffline({
          onReady: () => {
            state.ready = true;
            for (const each of state.listeners) each.onReady?.();
          },
          onUpdateWaiting: (update) => {
            state.update = update;
            for (const each of state.listeners) each.onUpdateWaiting?.(update);
          },
        });
      })
      .catch(() => {
        // The chunk could not load (an old page after an update elsewhere): the app works; the status stays "getting ready".
      });
  }
  const state = shared;
  state.listeners.add(listener);
  if (state.ready) listener.onReady?.();
  if (state.update) listener.onUpdateWaiting?.(state.update);
  return () => state.listeners.delete(listener);
}

function messageOf(error: unknown): string {
  return error instanceof Error && error.message ? error.message : 'An edit could not be saved.';
}

function useOnline(): boolean {
  const [online, setOnline] = useState(() => navigator.onLine);
  useEffect(() => {
    const update = () => setOnline(navigator.onLine);
    window.addEventListener('online', update);
    window.addEventListener('offline', update);
    return () => {
      window.removeEventListener('online', update);
      window.removeEventListener('offline', update);
    };
  }, []);
  return online;
}

/**
 * The offline line and the update notice. Mount once, near the top or bottom
 * of the app.
 *
 * @example
 * <OfflineStatus flushPendingEdits={() => session.flush()} />
 * //=> "Ready to work offline." once precached; "Update available" with an Update button when a new version waits
 */
export function OfflineStatus(props: OfflineStatusProps) {
  const { flushPendingEdits } = props;
  const [readiness, setReadiness] = useState<Readiness>(() => (inDevelopmentServer ? 'development' : offlineUnavailableReason() !== null ? 'unavailable' : 'preparing'));
  const [update, setUpdate] = useState<PendingUpdate | null>(null);
  const [applying, setApplying] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  /** The user chose "Later": the notice folds into the status line until asked for again. */
  const [later, setLater] = useState(false);
  const online = useOnline();

  useEffect(() => {
    if (readiness === 'unavailable' || readiness === 'development') return undefined;
    return subscribe({ onReady: () => setReadiness('ready'), onUpdateWaiting: setUpdate });
  }, []);

  const accept = async () => {
    if (!update || applying) return;
    setApplying(true);
    setFailure(null);
    try {
      await update.apply(flushPendingEdits);
      // The page reloads when the new version takes control.
    } catch (error) {
      setApplying(false);
      setFailure(`The update waits: ${messageOf(error)}`);
    }
  };

  if (readiness === 'development') return null;
  const line =
    readiness === 'unavailable'
      ? offlineUnavailableReason()
      : readiness === 'preparing'
        ? 'Getting ready to work offline…'
        : online
          ? 'Ready to work offline.'
          : 'No signal: Lampwalk keeps working and saving on this device.';
  return (
    <section class="offline-status" aria-label="Offline use and updates" data-build={buildId} data-readiness={readiness}>
      <div class="offline-status__notices" aria-live="polite">
        {update && !later && (
          <div class="offline-status__update">
            <p>
              <strong>Update available.</strong> Your edits are saved first, then Lampwalk restarts on the new version.
            </p>
            <p class="offline-status__actions">
              <button type="button" class="offline-status__button" onClick={accept} disabled={applying}>
                {applying ? 'Saving edits and updating…' : 'Update now'}
              </button>
              {!applying && (
                <button type="button" class="offline-status__secondary" onClick={() => setLater(true)}>
                  Later
                </button>
              )}
            </p>
            {failure && <p class="offline-status__failure">{failure}</p>}
          </div>
        )}
      </div>
      <p class="offline-status__line" role="status" title={`Lampwalk version ${buildId}`}>
        <span class={`offline-status__dot offline-status__dot--${readiness}`} aria-hidden="true" />
        {line}
        {update && later && (
          <button type="button" class="offline-status__link" onClick={() => setLater(false)}>
            Update available
          </button>
        )}
      </p>
    </section>
  );
}
