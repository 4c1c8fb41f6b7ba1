/**
 * One open portfolio: the portfolio record, the surveys it groups (read in
 * full, for the roll-up and the plan), the headers of every survey on the
 * device (to choose from) and the edits the screens make.
 *
 * An edit is checked against the survey file's portfolio schema first; a
 * refused value comes back as a message for the field and nothing is saved.
 * An accepted edit shows at once and is saved through its own autosave queue
 * (one store call per edit, merged while waiting, counted by
 * `flushPendingEdits`). When a save fails the portfolio is read back from
 * the store so the screen shows what is really saved.
 *
 * Another window's saves arrive over the BroadcastChannel (`broadcast.ts`):
 * a change to this portfolio reads it again, and a change to one of its
 * surveys reads that survey again, each once this window's own edits are
 * saved (so what is shown is what is stored, own edits included).
 */
import type { Portfolio, Survey, SurveyHeader } from '../../survey/model.ts';
import type { Patch, PortfolioChange, StoreChange, SurveyStore } from '../../survey/store.ts';
import { portfolioSchema, problemsAgainst } from '../../survey/validate.ts';
import { listenForChanges, listenForPortfolioChanges } from './broadcast.ts';
import { messageOf } from './errors.ts';
import { registerQueue } from './flush.ts';
import { SaveQueue, type QueueStatus } from './queue.ts';
import { useKeptSession, type KeptSessionKind, type KeptSessionState } from './keptSession.ts';
import { applyPatch } from './session.ts';

/** The fields of a portfolio the screens change. */
export type PortfolioPatch = Patch<Omit<Portfolio, 'id' | 'createdAt' | 'updatedAt'>>;

/** What the portfolio screens render from. A new object after every change. */
export interface PortfolioSnapshot {
  portfolio: Portfolio;
  /** Every survey on the device, newest first (as the store lists them). */
  headers: SurveyHeader[];
  /** The portfolio's surveys, read in full, by id (surveys still loading are absent). */
  surveys: ReadonlyMap<string, Survey>;
  /** Ids the portfolio names that are not on this device (deleted, or not restored). */
  missing: string[];
  status: QueueStatus;
}

/**
 * One open portfolio and its edits (see the file comment).
 *
 * @example (await PortfolioSession.open(store, id)).snapshot.portfolio.name //=> 'North estate'
 */
export class PortfolioSession {
  readonly queue = new SaveQueue(messageOf);
  #snapshot: PortfolioSnapshot;
  #listeners = new Set<(snapshot: PortfolioSnapshot) => void>();
  #unregister: () => void;
  #stopListening: () => void = () => undefined;
  /** What other windows changed that is still to be read: the whole portfolio, or some of its surveys. */
  #stale = { portfolio: false, surveyIds: new Set<string>() };
  #catchingUp: Promise<void> | null = null;

  private constructor(
    readonly store: SurveyStore,
    portfolio: Portfolio,
    headers: SurveyHeader[],
    surveys: Map<string, Survey>,
    missing: string[],
  ) {
    this.#unregister = registerQueue(this.queue);
    this.#snapshot = { portfolio, headers, surveys, missing, status: this.queue.status };
    this.queue.subscribe((status) => this.#set({ status }));
  }

  /** Reads the portfolio, the survey list and the portfolio's surveys. */
  static async open(store: SurveyStore, portfolioId: string): Promise<PortfolioSession> {
    const [portfolio, headers] = await Promise.all([store.getPortfolio(portfolioId), store.listSurveys()]);
    const { surveys, missing } = await readSurveys(store, portfolio.surveyIds, headers, new Map());
    const session = new PortfolioSession(store, portfolio, headers, surveys, missing);
    const stopPortfolios = listenForPortfolioChanges(store, (change) => void session.applyChange(change));
    const stopSurveys = listenForChanges(store, (change) => void session.applyChange(change));
    session.#stopListening = () => {
      stopPortfolios();
      stopSurveys();
    };
    return session;
  }

  /**
   * Takes in a change another window saved: this portfolio's (read it all
   * again) or one of its surveys' (read that survey again); others are
   * ignored. Resolves once the snapshot shows it. A portfolio deleted
   * elsewhere leaves the snapshot as it was, with a message in `status.error`.
   */
  async applyChange(change: PortfolioChange | StoreChange): Promise<void> {
    if (change.kind === 'portfolio') {
      if (change.portfolioId !== this.portfolioId) return;
      this.#stale.portfolio = true;
    } else {
      // Surveys outside the portfolio matter only for the chooser, which lists every survey's header.
      const inPortfolio = this.#snapshot.portfolio.surveyIds.includes(change.surveyId);
      if (!inPortfolio && change.kind !== 'survey' && change.kind !== 'layout') return;
      this.#stale.surveyIds.add(change.surveyId);
    }
    await this.#catchUp();
  }

  /** Reads what other windows changed, after this window's own edits are saved; one reading at a time. */
  #catchUp(): Promise<void> {
    this.#catchingUp ??= this.#readStale().finally(() => {
      this.#catchingUp = null;
      // A change that arrived as the reading ended.
      if (this.#stale.portfolio || this.#stale.surveyIds.size > 0) void this.#catchUp();
    });
    return this.#catchingUp;
  }

  async #readStale(): Promise<void> {
    try {
      while (this.#stale.portfolio || this.#stale.surveyIds.size > 0) {
        await this.queue.idle();
        const whole = this.#stale.portfolio;
        const surveyIds = [...this.#stale.surveyIds];
        this.#stale = { portfolio: false, surveyIds: new Set() };
        const [portfolio, headers] = await Promise.all([whole ? this.store.getPortfolio(this.portfolioId) : this.#snapshot.portfolio, this.store.listSurveys()]);
        const known = new Map(this.#snapshot.surveys);
        for (const id of surveyIds) known.delete(id);
        const { surveys, missing } = await readSurveys(this.store, portfolio.surveyIds, headers, whole ? new Map() : known);
        // An edit made here while reading: read again once it is saved, so it is not shown undone.
        if (this.queue.status.pending > 0) {
          this.#stale.portfolio ||= whole;
          for (const id of surveyIds) this.#stale.surveyIds.add(id);
          continue;
        }
        this.#set(whole ? { portfolio, headers, surveys, missing } : { headers, surveys, missing });
      }
    } catch (error) {
      this.#set({ status: { ...this.#snapshot.status, error: messageOf(error) } });
    }
  }

  get snapshot(): PortfolioSnapshot {
    return this.#snapshot;
  }

  get portfolioId(): string {
    return this.#snapshot.portfolio.id;
  }

  subscribe(listener: (snapshot: PortfolioSnapshot) => void): () => void {
    this.#listeners.add(listener);
    return () => this.#listeners.delete(listener);
  }

  #set(change: Partial<PortfolioSnapshot>): void {
    this.#snapshot = { ...this.#snapshot, ...change };
    for (const listener of this.#listeners) listener(this.#snapshot);
  }

  /** Stops counting this session's queue among the pending edits (once it is idle). */
  dispose(): void {
    this.#stopListening();
    this.queue.idle().then(this.#unregister, this.#unregister);
  }

  /** Resolves when every edit made so far is saved (or has failed). */
  flush(): Promise<void> {
    return this.queue.idle();
  }

  /** Reads everything again (after a failed save, or when surveys changed elsewhere). */
  async reload(): Promise<void> {
    const [portfolio, headers] = await Promise.all([this.store.getPortfolio(this.portfolioId), this.store.listSurveys()]);
    const { surveys, missing } = await readSurveys(this.store, portfolio.surveyIds, headers, new Map());
    this.#set({ portfolio, headers, surveys, missing });
  }

  /** Changes portfolio fields. Returns a message, or null when accepted. */
  update(patch: PortfolioPatch): string | null {
    const current = this.#snapshot.portfolio;
    const next = applyPatch(current, patch as Patch<Portfolio>);
    const [problem] = problemsAgainst(portfolioSchema, next);
    if (problem) return `${problem.path}: ${problem.message}`;
    this.#set({ portfolio: next });
    this.queue
      .patch(`portfolio:${current.id}`, patch, (merged) => this.store.updatePortfolio(current.id, merged))
      .catch(() => this.queue.idle().then(() => this.reload()).catch(() => undefined));
    if (patch.surveyIds) this.#loadSurveys(next.surveyIds);
    return null;
  }

  #loadSurveys(ids: readonly string[]): void {
    readSurveys(this.store, ids, this.#snapshot.headers, this.#snapshot.surveys).then(
      ({ surveys, missing }) => this.#set({ surveys, missing }),
      (error: unknown) => this.#set({ status: { ...this.#snapshot.status, error: messageOf(error) } }),
    );
  }
}

async function readSurveys(
  store: SurveyStore,
  ids: readonly string[],
  headers: readonly SurveyHeader[],
  known: ReadonlyMap<string, Survey>,
): Promise<{ surveys: Map<string, Survey>; missing: string[] }> {
  const onDevice = new Set(headers.map((header) => header.id));
  const surveys = new Map<string, Survey>();
  const missing: string[] = [];
  for (const id of ids) {
    if (!onDevice.has(id)) {
      missing.push(id);
      continue;
    }
    const had = known.get(id);
    surveys.set(id, had ?? (await store.loadSurvey(id)));
  }
  return { surveys, missing };
}

/** Portfolio sessions for `useKeptSession`: the one kept while the user moves between a portfolio's screens. */
const portfolioSessions: KeptSessionKind<PortfolioSession> = {
  kept: { current: null },
  idOf: (session) => session.portfolioId,
  open: (store, id) => PortfolioSession.open(store, id),
  async reused(session) {
    await session.flush();
    await session.reload();
  },
};

export type PortfolioState = KeptSessionState<PortfolioSession, PortfolioSnapshot>;

/**
 * Opens (or reuses) the session of `portfolioId` and re-renders on every
 * change. Surveys are read afresh each time a portfolio screen opens, so
 * edits made to them since show in the roll-up.
 *
 * @example usePortfolioSession(store, id).snapshot?.portfolio.name //=> 'North estate'
 */
export function usePortfolioSession(store: SurveyStore, portfolioId: string): PortfolioState {
  return useKeptSession<PortfolioSnapshot, PortfolioSession>(store, portfolioId, portfolioSessions);
}
