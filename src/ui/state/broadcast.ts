/**
 * Telling other windows (tabs, the installed app) what was saved here.
 *
 * After each committed edit the store reports which survey and records it
 * changed (`SurveyStore.onChange`); this module posts that on the
 * BroadcastChannel {@link changesChannelName}, and open survey sessions in
 * other windows read the changed records again (`SurveySession`). Portfolio
 * edits (`SurveyStore.onPortfolioChange`) go on the same channel as
 * {@link PortfolioChangeMessage}, a shape survey listeners (of this build or
 * an older one) do not accept, and an open portfolio screen in another
 * window reads its portfolio again (`PortfolioSession`). Messages
 * carry ids only, never survey data, and stay inside this browser profile.
 * Where BroadcastChannel is missing nothing is posted: each window then
 * still saves per field (the later write wins) but learns of the other's
 * changes only when the survey is opened again.
 */
import type { PortfolioChange, StoreChange, SurveyStore } from '../../survey/store.ts';

/** Name of the channel every Lampwalk window of this origin shares. */
export const changesChannelName = 'lampwalk-changes';

/** What is posted after each committed edit. */
export interface ChangeMessage extends StoreChange {
  /** The database written (tests use their own). */
  database: string;
  /** The store (one per window) that wrote it: a window ignores its own messages. */
  from: string;
}

/** What is posted after each committed portfolio edit. */
export interface PortfolioChangeMessage extends PortfolioChange {
  database: string;
  from: string;
}

const senders = new WeakMap<SurveyStore, { id: string; stop: () => void }>();

function openChannel(): BroadcastChannel | null {
  if (typeof BroadcastChannel === 'undefined') return null;
  const channel = new BroadcastChannel(changesChannelName);
  // In Node (tests) an open channel would keep the process alive.
  (channel as { unref?: () => void }).unref?.();
  return channel;
}

function isChangeMessage(data: unknown): data is ChangeMessage {
  if (typeof data !== 'object' || data === null) return false;
  const message = data as Partial<ChangeMessage>;
  return (
    typeof message.database === 'string' &&
    typeof message.from === 'string' &&
    typeof message.surveyId === 'string' &&
    (message.kind === 'entry' || message.kind === 'room' || message.kind === 'survey' || message.kind === 'layout') &&
    Array.isArray(message.ids) &&
    message.ids.every((id) => typeof id === 'string')
  );
}

function isPortfolioChangeMessage(data: unknown): data is PortfolioChangeMessage {
  if (typeof data !== 'object' || data === null) return false;
  const message = data as Partial<PortfolioChangeMessage>;
  return typeof message.database === 'string' && typeof message.from === 'string' && message.kind === 'portfolio' && typeof message.portfolioId === 'string';
}

/**
 * Starts posting every edit `store` commits to the other windows (once per
 * store; later calls do nothing). Returns the id its messages carry.
 *
 * @example announceChanges(store) //=> 'c0ffee…' (a random id); other windows now hear of each save
 */
export function announceChanges(store: SurveyStore): string {
  const known = senders.get(store);
  if (known) return known.id;
  const id = crypto.randomUUID();
  const channel = openChannel();
  const post = (message: ChangeMessage | PortfolioChangeMessage) => {
    try {
      channel?.postMessage(message);
    } catch {
      // A closed channel: the other windows learn of it when they next open the survey or portfolio.
    }
  };
  const stop = store.onChange((change) => post({ ...change, ids: [...change.ids], database: store.databaseName, from: id }));
  const stopPortfolios = store.onPortfolioChange((change) => post({ ...change, database: store.databaseName, from: id }));
  senders.set(store, {
    id,
    stop: () => {
      stop();
      stopPortfolios();
      channel?.close();
    },
  });
  return id;
}

/**
 * Calls `listener` for each change another window saved to `store`'s
 * database; returns the function that stops listening.
 *
 * @example const stop = listenForChanges(store, (change) => session.applyChange(change))
 */
export function listenForChanges(store: SurveyStore, listener: (change: StoreChange) => void): () => void {
  const own = announceChanges(store);
  const channel = openChannel();
  if (!channel) return () => undefined;
  channel.onmessage = (event: MessageEvent) => {
    const data: unknown = event.data;
    if (!isChangeMessage(data) || data.from === own || data.database !== store.databaseName) return;
    listener({ surveyId: data.surveyId, kind: data.kind, ids: data.ids });
  };
  return () => channel.close();
}

/**
 * Calls `listener` for each portfolio change another window saved to
 * `store`'s database; returns the function that stops listening.
 *
 * @example const stop = listenForPortfolioChanges(store, (change) => session.applyChange(change))
 */
export function listenForPortfolioChanges(store: SurveyStore, listener: (change: PortfolioChange) => void): () => void {
  const own = announceChanges(store);
  const channel = openChannel();
  if (!channel) return () => undefined;
  channel.onmessage = (event: MessageEvent) => {
    const data: unknown = event.data;
    if (!isPortfolioChangeMessage(data) || data.from === own || data.database !== store.databaseName) return;
    listener({ kind: 'portfolio', portfolioId: data.portfolioId });
  };
  return () => channel.close();
}
