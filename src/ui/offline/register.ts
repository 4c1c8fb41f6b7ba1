/**
 * Registers the service worker the build generates (`sw.js`, Workbox) and
 * reports the two moments the user needs to know about: every file is
 * precached (the app now opens with no signal), and a new version is
 * installed and waiting. A waiting version is activated only through
 * {@link PendingUpdate.apply}, which saves pending edits first; nothing here
 * ever reloads the page on its own.
 */
import { Workbox } from 'workbox-window';
import { inDevelopmentServer, offlineUnavailableReason } from './availability.ts';

/** A new version, installed and waiting for the user's go-ahead. */
export interface PendingUpdate {
  /**
   * Awaits `flushPendingEdits` (every edit typed so far is written), then
   * activates the new version and reloads the page once it controls it. When
   * flushing rejects, nothing is activated and the rejection is passed on:
   * the update waits and the edit is not lost.
   */
  apply(flushPendingEdits: () => Promise<void>): Promise<void>;
}

/** What {@link registerOffline} tells its caller. */
export interface OfflineCallbacks {
  /** Every file the app needs is precached: from now on it opens with no signal. */
  onReady?: () => void;
  /** A new version is waiting (announced once per version). */
  onUpdateWaiting?: (update: PendingUpdate) => void;
}

/** A running registration. */
export interface OfflineRegistration {
  /** Asks the server for a newer version now (does nothing useful offline). */
  checkForUpdate(): Promise<void>;
  /** Stops the callbacks and the periodic checks (the worker stays registered). */
  stop(): void;
}

/** Options of {@link registerOffline}; the defaults suit the app. */
export interface RegisterOptions {
  /** The worker script, relative to the page; default `sw.js` (what the build writes). */
  scriptUrl?: string;
  /** How often to look for a new version while the app stays open; default one hour. */
  updateCheckMs?: number;
}

const oneHourMs = 60 * 60 * 1000;

/**
 * Registers `sw.js` with workbox-window. Returns null when the browser has no
 * service workers (see {@link offlineUnavailableReason}) and in the
 * development server, which builds no worker.
 *
 * @example
 * registerOffline({ onReady: () => show('Ready to work offline'), onUpdateWaiting: (update) => offerUpdate(update) })
 * //=> an OfflineRegistration (null where service workers are unavailable)
 */
export function registerOffline(callbacks: OfflineCallbacks, options: RegisterOptions = {}): OfflineRegistration | null {
  if (inDevelopmentServer || offlineUnavailableReason() !== null) return null;
  const container = navigator.serviceWorker;
  const wb = new Workbox(options.scriptUrl ?? 'sw.js');
  let stopped = false;
  let accepted = false;
  let registration: ServiceWorkerRegistration | undefined;
  const announced = new WeakSet<ServiceWorker>();
  /** Whether a worker controlled the page when it loaded (so a change of controller is an update, not the first install). */
  const controlledAtLoad = container.controller !== null;

  const reload = () => {
    if (!stopped) window.location.reload();
  };

  const announce = (worker: ServiceWorker | null) => {
    if (stopped || accepted || !worker || announced.has(worker)) return;
    announced.add(worker);
    callbacks.onUpdateWaiting?.({
      async apply(flushPendingEdits) {
        await flushPendingEdits();
        accepted = true;
        const waiting = registration?.waiting ?? null;
        if (waiting === null) {
          // Already activated (accepted in another tab): this page runs the old
          // version under the new worker, so it only needs the reload.
          reload();
          return;
        }
        wb.addEventListener('controlling', reload);
        wb.messageSkipWaiting();
      },
    });
  };

  /** Follows a worker that is still installing when the page registers (missed by workbox-window's own events). */
  const follow = (worker: ServiceWorker | null) => {
    if (!worker) return;
    worker.addEventListener('statechange', () => {
      if (worker.state === 'installed' && registration?.waiting === worker && container.controller !== null) announce(worker);
    });
  };

  wb.addEventListener('waiting', (event) => announce(event.sw ?? registration?.waiting ?? null));
  wb.addEventListener('controlling', (event) => {
    // The first install taking the page (clientsClaim) is not an update.
    if (accepted || !controlledAtLoad || event.isUpdate !== true) return;
    // Another tab accepted an update: the old version keeps running here
    // until the user reloads; offer the reload rather than doing it.
    if (event.sw) announce(event.sw);
  });

  const checkForUpdate = async () => {
    if (stopped || !registration || !navigator.onLine) return;
    try {
      await registration.update();
    } catch {
      // No signal or the server is down: the next check tries again.
    }
  };
  const onOnline = () => void checkForUpdate();
  const timer = window.setInterval(onOnline, options.updateCheckMs ?? oneHourMs);
  window.addEventListener('online', onOnline);

  // An active worker has finished installing, so its precache is complete.
  // (Not chained to register(), which may wait for an update check first.)
  void container.ready.then(() => {
    if (!stopped) callbacks.onReady?.();
  });

  wb.register()
    .then(async (found) => {
      if (!found || stopped) return;
      registration = found;
      follow(found.installing);
      if (found.waiting && container.controller !== null) announce(found.waiting);
      await checkForUpdate();
    })
    .catch(() => {
      // Registration failed (e.g. the page was opened from a server without
      // sw.js): the app still works online; the status simply never says ready.
    });

  return {
    checkForUpdate,
    stop() {
      stopped = true;
      window.clearInterval(timer);
      window.removeEventListener('online', onOnline);
    },
  };
}
