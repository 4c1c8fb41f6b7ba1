/**
 * One open survey: the survey as the screens see it, its calculated results,
 * and every edit the screens make to it.
 *
 * An edit is checked first (the same schema the store uses, then the
 * calculation); a value either check refuses comes back as a message for the
 * field and nothing is saved. An accepted edit shows at once (one entry is
 * recalculated with `recalculateEntry`, anything wider with
 * `calculateSurvey`) and is saved through the autosave queue: one store call
 * per edit, awaited. When a save fails, the survey is read back from the
 * store so the screen shows what is really saved, and the failure is shown.
 */
import type * as v from 'valibot';
import { CalcInputError } from '../../calc/errors.ts';
import { calculateSurvey, recalculateEntry, type SurveyResult } from '../../calc/survey.ts';
import type { FixtureEntry, Room, StoredEntry, StoredRoom, Survey } from '../../survey/model.ts';
import { entryFields, roomFields } from '../../survey/records.ts';
import type { NewEntry, NewRoom, NewSurvey, Patch, SurveyStore } from '../../survey/store.ts';
import { fixtureEntrySchema, problemsAgainst, roomSchema, surveySchema } from '../../survey/validate.ts';
import { messageOf } from './errors.ts';
import { registerQueue } from './flush.ts';
import { SaveQueue, type QueueStatus } from './queue.ts';

/** What the screens render from. A new object after every change. */
export interface SessionSnapshot {
  survey: Survey;
  /** Null when the calculation refused the survey (see `calcError`). */
  result: SurveyResult | null;
  calcError: string | null;
  /** The entry added or changed last (for "repeat last fixture"). */
  lastEntryId: string | null;
  status: QueueStatus;
}

/**
 * `current` with `patch` applied; a field given as undefined is removed.
 *
 * @example applyPatch({ a: 1, b: 2 }, { b: undefined, c: 3 }) //=> { a: 1, c: 3 }
 */
export function applyPatch<T extends object>(current: T, patch: Patch<T>): T {
  const next = { ...current } as Record<string, unknown>;
  for (const [key, value] of Object.entries(patch)) {
    if (key === '__proto__' || key === 'constructor') continue;
    if (value === undefined) delete next[key];
    else next[key] = value;
  }
  return next as T;
}

function firstProblem(schema: v.GenericSchema, value: unknown): string | null {
  const [problem] = problemsAgainst(schema, value);
  return problem ? `${problem.path}: ${problem.message}` : null;
}

function calculate(survey: Survey): { result: SurveyResult | null; calcError: string | null } {
  try {
    return { result: calculateSurvey(survey), calcError: null };
  } catch (error) {
    if (error instanceof CalcInputError) return { result: null, calcError: messageOf(error) };
    throw error;
  }
}

function withoutEntries(room: Room): Omit<Room, 'entries'> {
  const { entries: _entries, ...rest } = room;
  return rest;
}

/**
 * An entry's fields without its id (to add it again elsewhere).
 *
 * @example 'id' in entryCopy(entry) //=> false
 */
export function entryCopy(entry: FixtureEntry): NewEntry {
  const { id: _id, ...fields } = entry;
  return structuredClone(fields);
}

/**
 * One open survey, its results and its edits (see the file comment).
 *
 * @example (await SurveySession.open(store, 'demo-tallowmere')).snapshot.result?.totals.fixtures //=> 40
 */
export class SurveySession {
  readonly queue: SaveQueue;
  #snapshot: SessionSnapshot;
  #listeners = new Set<(snapshot: SessionSnapshot) => void>();
  #reloading: Promise<void> | null = null;
  #unregister: () => void;

  private constructor(
    readonly store: SurveyStore,
    survey: Survey,
  ) {
    this.queue = new SaveQueue(messageOf);
    this.#unregister = registerQueue(this.queue);
    const calculated = calculate(survey);
    this.#snapshot = { survey, ...calculated, lastEntryId: null, status: this.queue.status };
    this.queue.subscribe((status) => this.#set({ status }));
  }

  /** Reads a survey from the store and calculates it. */
  static async open(store: SurveyStore, surveyId: string): Promise<SurveySession> {
    return new SurveySession(store, await store.loadSurvey(surveyId));
  }

  get snapshot(): SessionSnapshot {
    return this.#snapshot;
  }

  get surveyId(): string {
    return this.#snapshot.survey.id;
  }

  subscribe(listener: (snapshot: SessionSnapshot) => void): () => void {
    this.#listeners.add(listener);
    return () => this.#listeners.delete(listener);
  }

  #set(change: Partial<SessionSnapshot>): void {
    this.#snapshot = { ...this.#snapshot, ...change };
    for (const listener of this.#listeners) listener(this.#snapshot);
  }

  #show(survey: Survey, extra: Partial<SessionSnapshot> = {}): void {
    this.#set({ survey, ...calculate(survey), ...extra });
  }

  /** After a failed save: once the queue is idle, shows what the store really holds. */
  #failed(): void {
    this.#reloading ??= this.queue
      .idle()
      .then(() => this.reload())
      .catch(() => undefined)
      .finally(() => {
        this.#reloading = null;
      });
  }

  /** Reads the survey from the store again and recalculates. */
  async reload(): Promise<void> {
    const survey = await this.store.loadSurvey(this.surveyId);
    this.#show(survey);
  }

  /** Stops counting this session's queue among the pending edits (once it is idle). */
  dispose(): void {
    this.queue.idle().then(this.#unregister, this.#unregister);
  }

  /** Resolves when every edit made so far is saved (or has failed). */
  flush(): Promise<void> {
    return this.queue.idle();
  }

  findRoom(roomId: string): Room | undefined {
    return this.#snapshot.survey.rooms.find((room) => room.id === roomId);
  }

  findEntry(entryId: string): { room: Room; entry: FixtureEntry } | undefined {
    for (const room of this.#snapshot.survey.rooms) {
      const entry = room.entries.find((item) => item.id === entryId);
      if (entry) return { room, entry };
    }
    return undefined;
  }

  // ---------------------------------------------------------------------------
  // Field edits: checked, shown at once, saved in the background (in order).

  /** Changes survey fields (details and assumptions). Returns a message, or null when accepted. */
  updateSurvey(patch: Patch<NewSurvey>): string | null {
    const current = this.#snapshot.survey;
    const next = applyPatch(current, patch as Patch<Survey>);
    const problem = firstProblem(surveySchema, { ...next, rooms: [] });
    if (problem) return problem;
    const calculated = calculate(next);
    if (calculated.calcError) return calculated.calcError;
    this.#set({ survey: next, ...calculated });
    this.queue.patch(`survey:${current.id}`, patch, (merged) => this.store.updateSurvey(current.id, merged)).catch(() => this.#failed());
    return null;
  }

  /** Changes room fields. Returns a message, or null when accepted. */
  updateRoom(roomId: string, patch: Patch<NewRoom>): string | null {
    const survey = this.#snapshot.survey;
    const room = this.findRoom(roomId);
    if (!room) return 'This room is no longer in the survey.';
    const next = applyPatch(room, patch as Patch<Room>);
    const problem = firstProblem(roomSchema, { ...withoutEntries(next), entries: [] });
    if (problem) return problem;
    const nextSurvey: Survey = { ...survey, rooms: survey.rooms.map((item) => (item.id === roomId ? next : item)) };
    const calculated = calculate(nextSurvey);
    if (calculated.calcError) return calculated.calcError;
    this.#set({ survey: nextSurvey, ...calculated });
    this.queue.patch(`room:${roomId}`, patch, (merged) => this.store.updateRoom(roomId, merged)).catch(() => this.#failed());
    return null;
  }

  /** Changes entry fields; recalculates only this entry and its room. Returns a message, or null when accepted. */
  updateEntry(entryId: string, patch: Patch<NewEntry>): string | null {
    const found = this.findEntry(entryId);
    if (!found) return 'This fixture entry is no longer in the survey.';
    const next = applyPatch(found.entry, patch as Patch<FixtureEntry>);
    const problem = firstProblem(fixtureEntrySchema, next);
    if (problem) return problem;
    const survey = this.#snapshot.survey;
    const nextSurvey: Survey = {
      ...survey,
      rooms: survey.rooms.map((room) =>
        room.id === found.room.id ? { ...room, entries: room.entries.map((entry) => (entry.id === entryId ? next : entry)) } : room,
      ),
    };
    let result: SurveyResult | null;
    try {
      const previous = this.#snapshot.result;
      result = previous ? recalculateEntry(previous, nextSurvey, entryId) : calculateSurvey(nextSurvey);
    } catch (error) {
      if (error instanceof CalcInputError) return messageOf(error);
      throw error;
    }
    this.#set({ survey: nextSurvey, result, calcError: null, lastEntryId: entryId });
    this.queue.patch(`entry:${entryId}`, patch, (merged) => this.store.updateEntry(entryId, merged)).catch(() => this.#failed());
    return null;
  }

  // ---------------------------------------------------------------------------
  // Structural edits: awaited, then shown.

  /** Adds a room at the end; resolves to it. */
  async addRoom(fields: NewRoom): Promise<StoredRoom> {
    const stored = await this.queue.run(() => this.store.addRoom(this.surveyId, fields));
    const survey = this.#snapshot.survey;
    this.#show({ ...survey, rooms: [...survey.rooms, { ...roomFields(stored), entries: [] }] });
    return stored;
  }

  /** Copies a room with its entries right after it. */
  async duplicateRoom(roomId: string): Promise<StoredRoom> {
    const copy = await this.queue.run(() => this.store.duplicateRoom(roomId));
    await this.reload();
    return copy;
  }

  /** Copies a room to `units` identical units (one transaction). */
  async copyRoomToUnits(roomId: string, units: number): Promise<StoredRoom[]> {
    const copies = await this.queue.run(() => this.store.copyRoomToUnits(roomId, units));
    await this.reload();
    return copies;
  }

  /** Moves a room to the trash; resolves to the trash item id (for undo). */
  async deleteRoom(roomId: string): Promise<string> {
    const trashId = await this.queue.run(() => this.store.deleteRoom(roomId));
    const survey = this.#snapshot.survey;
    this.#show({ ...survey, rooms: survey.rooms.filter((room) => room.id !== roomId) });
    return trashId;
  }

  /** Adds an entry at the end of a room; resolves to it. */
  async addEntry(roomId: string, fields: NewEntry): Promise<StoredEntry> {
    const stored = await this.queue.run(() => this.store.addEntry(roomId, fields));
    this.#appendEntries(roomId, [stored]);
    return stored;
  }

  /** Adds several entries at the end of a room in one transaction (schedule import). */
  async addEntries(roomId: string, list: readonly NewEntry[]): Promise<StoredEntry[]> {
    const stored = await this.queue.run(() => this.store.addEntries(roomId, list));
    if (stored.length > 0) this.#appendEntries(roomId, stored);
    return stored;
  }

  #appendEntries(roomId: string, stored: readonly StoredEntry[]): void {
    const survey = this.#snapshot.survey;
    const added = stored.map(entryFields);
    const nextSurvey: Survey = {
      ...survey,
      rooms: survey.rooms.map((room) => (room.id === roomId ? { ...room, entries: [...room.entries, ...added] } : room)),
    };
    const last = added[added.length - 1];
    const previous = this.#snapshot.result;
    if (added.length === 1 && last && previous) {
      try {
        this.#set({ survey: nextSurvey, result: recalculateEntry(previous, nextSurvey, last.id), calcError: null, lastEntryId: last.id });
        return;
      } catch (error) {
        if (!(error instanceof CalcInputError)) throw error;
      }
    }
    this.#show(nextSurvey, { lastEntryId: last?.id ?? this.#snapshot.lastEntryId });
  }

  /**
   * Logs the same fixture again at the end of `roomId` (any room of the
   * survey): same equipment, conditions, proposal and count.
   */
  async repeatEntry(entryId: string, roomId: string): Promise<StoredEntry> {
    const found = this.findEntry(entryId);
    if (!found) throw new Error('That fixture entry is no longer in the survey.');
    return this.addEntry(roomId, entryCopy(found.entry));
  }

  /** Moves an entry to the trash; resolves to the trash item id (for undo). */
  async deleteEntry(entryId: string): Promise<string> {
    const trashId = await this.queue.run(() => this.store.deleteEntry(entryId));
    const survey = this.#snapshot.survey;
    const lastEntryId = this.#snapshot.lastEntryId === entryId ? null : this.#snapshot.lastEntryId;
    this.#show(
      { ...survey, rooms: survey.rooms.map((room) => ({ ...room, entries: room.entries.filter((entry) => entry.id !== entryId) })) },
      { lastEntryId },
    );
    return trashId;
  }

  /** Puts something deleted back and shows the survey as stored. */
  async restore(trashId: string): Promise<void> {
    await this.queue.run(() => this.store.restoreFromTrash(trashId));
    await this.reload();
  }
}
