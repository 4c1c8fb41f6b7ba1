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
 *
 * Two windows on the same survey: every edit saves only the fields it
 * changed (nested fields such as `existing.lumensPerLamp` through
 * `FieldChanges`), applied by the store to the record as stored when the
 * edit commits, so edits to different fields are all kept and, for the same
 * field, the later write wins. After each save the store tells the other
 * windows which records changed (`broadcast.ts`); this session then reads
 * those records again, keeps the edits of its own that are still waiting to
 * be saved (they will be the later write), and, when a value this window
 * edited was replaced by the other window's, says so through
 * `onOtherWindow` ("Count was changed in another window: now 12").
 */
import type * as v from 'valibot';
import { CalcInputError } from '../../calc/errors.ts';
import { calculateSurvey, recalculateEntry, type SurveyResult } from '../../calc/survey.ts';
import type { FixtureEntry, Room, StoredEntry, StoredRoom, Survey, SurveyHeader } from '../../survey/model.ts';
import { entryFields, roomFields } from '../../survey/records.ts';
import { FieldChanges, StoreError, type NestedPatch, type NewEntry, type NewRoom, type NewSurvey, type Patch, type StoreChange, type SurveyStore } from '../../survey/store.ts';
import { fixtureEntrySchema, problemsAgainst, roomSchema, surveySchema } from '../../survey/validate.ts';
import { listenForChanges } from './broadcast.ts';
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

type Fields = Record<string, unknown>;

function isFields(value: unknown): value is Fields {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && !(value instanceof FieldChanges);
}

/**
 * `current` with `patch` applied; a field given as undefined is removed, and
 * `FieldChanges` change only the nested fields they name.
 *
 * @example applyPatch({ a: 1, b: 2 }, { b: undefined, c: 3 }) //=> { a: 1, c: 3 }
 */
export function applyPatch<T extends object>(current: T, patch: NestedPatch<T>): T {
  const next = { ...current } as Fields;
  for (const [key, value] of Object.entries(patch)) {
    if (key === '__proto__' || key === 'constructor') continue;
    if (value === undefined) delete next[key];
    else if (value instanceof FieldChanges) {
      const base = next[key];
      next[key] = applyPatch(isFields(base) ? base : {}, value.changes as Patch<Fields>);
    } else next[key] = value;
  }
  return next as T;
}

/**
 * One patch with a later one on top (for edits of the same record still
 * waiting their turn): nested field changes are merged, a whole value set
 * later replaces what came before.
 *
 * @example combinePatches({ existing: changeFields({ lumensPerLamp: 900 }) }, { existing: changeFields({ lampPrice: 3 }) }) //=> { existing: changeFields({ lumensPerLamp: 900, lampPrice: 3 }) }
 */
export function combinePatches(earlier: Fields, later: Fields): Fields {
  const out: Fields = { ...earlier };
  for (const [key, value] of Object.entries(later)) {
    const before = out[key];
    if (value instanceof FieldChanges && before instanceof FieldChanges) {
      out[key] = new FieldChanges(combinePatches(before.changes as Fields, value.changes as Fields));
    } else if (value instanceof FieldChanges && isFields(before)) {
      out[key] = applyPatch(before, value.changes as Patch<Fields>);
    } else out[key] = value;
  }
  return out;
}

/**
 * The field paths a patch changes ("count", "existing.lumensPerLamp").
 *
 * @example pathsOf({ count: 3, existing: changeFields({ lumensPerLamp: 900 }) }) //=> ['count', 'existing.lumensPerLamp']
 */
export function pathsOf(patch: Fields, prefix = ''): string[] {
  return Object.entries(patch).flatMap(([key, value]) => (value instanceof FieldChanges ? pathsOf(value.changes as Fields, `${prefix}${key}.`) : [`${prefix}${key}`]));
}

function valueAt(record: unknown, path: string): unknown {
  let value: unknown = record;
  for (const key of path.split('.')) value = isFields(value) ? value[key] : undefined;
  return value;
}

function sameValue(a: unknown, b: unknown): boolean {
  if (Object.is(a, b)) return true;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((item, index) => sameValue(item, b[index]));
  if (isFields(a) && isFields(b)) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    return [...keys].every((key) => sameValue(a[key], b[key]));
  }
  return false;
}

const fieldNames: Record<string, string> = {
  count: 'Count',
  existing: 'Existing equipment',
  conditions: 'Conditions',
  proposed: 'Proposed product',
  control: 'Control',
  controlSavingsFraction: 'Control savings',
  hours: 'Hours of use',
  site: 'Site',
  client: 'Client',
  money: 'Money assumptions',
  savings: 'Savings assumptions',
  grid: 'Grid emission factor',
  'existing.ratedWattsPerLamp': 'Watts per lamp',
  'existing.technology': 'Lamp type',
  'site.name': 'Site',
  'site.address': 'Site address',
  'client.name': 'Client',
  'client.contact': 'Client contact',
};

/**
 * The name of a field path for a notice.
 *
 * @example fieldName('existing.lumensPerLamp') //=> 'Lumens per lamp'
 */
export function fieldName(path: string): string {
  const known = fieldNames[path];
  if (known) return known;
  const last = path.split('.').pop() ?? path;
  const words = last.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

function shownValue(value: unknown, locale: string): string | null {
  if (typeof value === 'number') {
    try {
      return new Intl.NumberFormat(locale, { maximumFractionDigits: 6 }).format(value);
    } catch {
      return String(value);
    }
  }
  if (typeof value === 'boolean') return value ? 'on' : 'off';
  if (typeof value === 'string') return value.length > 40 ? `“${value.slice(0, 39)}…”` : `“${value}”`;
  if (value === undefined || value === null) return 'empty';
  return null;
}

/** The record a pending edit belongs to. */
type RecordKey = `survey:${string}` | `room:${string}` | `entry:${string}`;

interface WaitingEdit {
  patch: Fields;
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
  #otherWindowListeners = new Set<(message: string) => void>();
  #reloading: Promise<void> | null = null;
  #unregister: () => void;
  #stopListening: () => void = () => undefined;
  /** Edits accepted here and not yet handed to the store, by record (merged while they wait). */
  #waiting = new Map<RecordKey, WaitingEdit>();
  /** Field paths this window has edited, by record: a change from another window to one of them is announced. */
  #edited = new Map<RecordKey, Set<string>>();
  /** Changes saved by other windows, not yet read. */
  #incoming: StoreChange[] = [];

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

  /** Reads a survey from the store, calculates it, and follows what other windows save to it. */
  static async open(store: SurveyStore, surveyId: string): Promise<SurveySession> {
    const session = new SurveySession(store, await store.loadSurvey(surveyId));
    session.#stopListening = listenForChanges(store, (change) => session.applyChange(change));
    return session;
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

  /**
   * Calls `listener` with a message when another window replaced a value
   * this window had edited (the later write won there); returns the
   * function that stops it.
   */
  onOtherWindow(listener: (message: string) => void): () => void {
    this.#otherWindowListeners.add(listener);
    return () => this.#otherWindowListeners.delete(listener);
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

  /** Reads the survey from the store again and recalculates (edits still waiting to be saved stay on screen). */
  async reload(): Promise<void> {
    const survey = await this.store.loadSurvey(this.surveyId);
    this.#show(this.#withWaiting(survey));
  }

  /** Stops counting this session's queue among the pending edits (once it is idle) and stops following other windows. */
  dispose(): void {
    this.#stopListening();
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
  // Saving: one store call per record at a time, in the order of the edits.

  /**
   * Queues the save of `patch` to record `key`. While an earlier edit of the
   * same record waits its turn the two are merged (nested fields too), so
   * typing "120" saves once or twice, not three times.
   */
  #save(key: RecordKey, patch: Fields, write: (merged: Fields) => Promise<unknown>): void {
    let paths = this.#edited.get(key);
    if (!paths) this.#edited.set(key, (paths = new Set()));
    for (const path of pathsOf(patch)) paths.add(path);
    const waiting = this.#waiting.get(key);
    if (waiting) {
      waiting.patch = combinePatches(waiting.patch, patch);
      return;
    }
    const edit: WaitingEdit = { patch };
    this.#waiting.set(key, edit);
    this.queue
      .run(async () => {
        // From here on later edits of this record wait for the next call.
        this.#waiting.delete(key);
        await write(edit.patch);
      })
      .catch(() => this.#failed());
  }

  /** A record read from the store with this window's edits that are still waiting applied on top. */
  #waitingOn<T extends object>(key: RecordKey, record: T): T {
    const waiting = this.#waiting.get(key);
    return waiting ? applyPatch(record, waiting.patch as NestedPatch<T>) : record;
  }

  #withWaiting(survey: Survey): Survey {
    if (this.#waiting.size === 0) return survey;
    const { rooms, ...header } = survey;
    return {
      ...this.#waitingOn<SurveyHeader>(`survey:${survey.id}`, header),
      rooms: rooms.map((room) => {
        const { entries, ...fields } = room;
        return {
          ...this.#waitingOn<Omit<Room, 'entries'>>(`room:${room.id}`, fields),
          entries: entries.map((entry) => this.#waitingOn<FixtureEntry>(`entry:${entry.id}`, entry)),
        };
      }),
    };
  }

  // ---------------------------------------------------------------------------
  // Changes saved by other windows.

  /**
   * Reads again what another window saved (`change`, from `broadcast.ts`)
   * and shows it; this window's waiting edits stay on top (they are saved
   * after, so they win), and a value this window edited that the other
   * window replaced is announced through {@link onOtherWindow}. Runs in turn
   * with this window's saves, so it never reads between an edit and its save.
   */
  async applyChange(change: StoreChange): Promise<void> {
    if (change.surveyId !== this.surveyId) return;
    this.#incoming.push(change);
    if (this.#incoming.length > 1) return this.queue.idle();
    await this.queue.run(() => this.#readIncoming()).catch(() => undefined);
  }

  async #readIncoming(): Promise<void> {
    const changes = this.#incoming.splice(0);
    const entryIds = new Set<string>();
    const roomIds = new Set<string>();
    let header = false;
    let whole = false;
    for (const change of changes) {
      if (change.kind === 'entry') change.ids.forEach((id) => entryIds.add(id));
      else if (change.kind === 'room') change.ids.forEach((id) => roomIds.add(id));
      else if (change.kind === 'survey') header = true;
      else whole = true;
    }
    const before = this.#snapshot.survey;
    let after: Survey;
    let onlyEntries = false;
    try {
      const known = [...entryIds].every((id) => this.findEntry(id)) && [...roomIds].every((id) => this.findRoom(id));
      if (whole || !known) after = this.#withWaiting(await this.store.loadSurvey(this.surveyId));
      else {
        const [entries, rooms, surveyHeader] = await Promise.all([
          Promise.all([...entryIds].map((id) => this.store.getEntry(id))),
          Promise.all([...roomIds].map((id) => this.store.getRoom(id))),
          header ? this.store.getSurvey(this.surveyId) : Promise.resolve(null),
        ]);
        after = this.#merged(this.#snapshot.survey, entries, rooms, surveyHeader);
        onlyEntries = rooms.length === 0 && surveyHeader === null;
      }
    } catch (error) {
      if (!(error instanceof StoreError && error.kind === 'not-found')) {
        this.#tell(`Another window changed this survey, and it could not be read again here: ${messageOf(error)}`);
        return;
      }
      try {
        after = this.#withWaiting(await this.store.loadSurvey(this.surveyId));
      } catch (failure) {
        this.#tell(messageOf(failure));
        return;
      }
    }
    const replaced = this.#replacedHere(before, after);
    let result: SurveyResult | null = null;
    if (onlyEntries && this.#snapshot.result) {
      try {
        result = this.#snapshot.result;
        for (const id of entryIds) result = recalculateEntry(result, after, id);
      } catch (error) {
        if (!(error instanceof CalcInputError)) throw error;
        result = null;
      }
    }
    if (result) this.#set({ survey: after, result, calcError: null });
    else this.#show(after);
    if (replaced.length > 0) this.#tell(replaced.join(' '));
  }

  /** The shown survey with fresh records (and this window's waiting edits on top). */
  #merged(survey: Survey, entries: StoredEntry[], rooms: StoredRoom[], header: SurveyHeader | null): Survey {
    const freshEntries = new Map(entries.map((entry) => [entry.id, this.#waitingOn<FixtureEntry>(`entry:${entry.id}`, entryFields(entry))]));
    const freshRooms = new Map(rooms.map((room) => [room.id, this.#waitingOn<Omit<Room, 'entries'>>(`room:${room.id}`, roomFields(room))]));
    const { rooms: shownRooms, ...shownHeader } = survey;
    return {
      ...(header ? this.#waitingOn<SurveyHeader>(`survey:${survey.id}`, header) : shownHeader),
      rooms: shownRooms.map((room) => {
        const fields = freshRooms.get(room.id);
        const changed = room.entries.some((entry) => freshEntries.has(entry.id));
        if (!fields && !changed) return room;
        return {
          ...(fields ?? room),
          entries: changed ? room.entries.map((entry) => freshEntries.get(entry.id) ?? entry) : room.entries,
        };
      }),
    };
  }

  /** Messages for the values this window edited that another window's save replaced. */
  #replacedHere(before: Survey, after: Survey): string[] {
    const messages: string[] = [];
    const locale = after.locale;
    const check = (key: RecordKey, was: object | undefined, now: object | undefined, where: string) => {
      const paths = this.#edited.get(key);
      if (!paths || !was || !now) return;
      const waiting = this.#waiting.get(key);
      const pending = new Set(waiting ? pathsOf(waiting.patch) : []);
      for (const path of paths) {
        if (pending.has(path)) continue;
        const value = valueAt(now, path);
        if (sameValue(valueAt(was, path), value)) continue;
        const shown = shownValue(value, locale);
        messages.push(`${fieldName(path)}${where} was changed in another window${shown === null ? '.' : `: now ${shown}.`}`);
      }
    };
    check(`survey:${after.id}`, before, after, '');
    const roomsBefore = new Map(before.rooms.map((room) => [room.id, room]));
    const entriesBefore = new Map(before.rooms.flatMap((room) => room.entries.map((entry) => [entry.id, entry] as const)));
    for (const room of after.rooms) {
      check(`room:${room.id}`, roomsBefore.get(room.id), room, ` of room “${room.name}”`);
      for (const entry of room.entries) check(`entry:${entry.id}`, entriesBefore.get(entry.id), entry, '');
    }
    return messages;
  }

  #tell(message: string): void {
    for (const listener of this.#otherWindowListeners) listener(message);
  }

  // ---------------------------------------------------------------------------
  // Field edits: checked, shown at once, saved in the background (in order).

  /** Changes survey fields (details and assumptions). Returns a message, or null when accepted. */
  updateSurvey(patch: NestedPatch<NewSurvey>): string | null {
    const current = this.#snapshot.survey;
    const next = applyPatch(current, patch as NestedPatch<Survey>);
    const problem = firstProblem(surveySchema, { ...next, rooms: [] });
    if (problem) return problem;
    const calculated = calculate(next);
    if (calculated.calcError) return calculated.calcError;
    this.#set({ survey: next, ...calculated });
    this.#save(`survey:${current.id}`, patch, (merged) => this.store.updateSurvey(current.id, merged as NestedPatch<NewSurvey>));
    return null;
  }

  /** Changes room fields. Returns a message, or null when accepted. */
  updateRoom(roomId: string, patch: NestedPatch<NewRoom>): string | null {
    const survey = this.#snapshot.survey;
    const room = this.findRoom(roomId);
    if (!room) return 'This room is no longer in the survey.';
    const next = applyPatch(room, patch as NestedPatch<Room>);
    const problem = firstProblem(roomSchema, { ...withoutEntries(next), entries: [] });
    if (problem) return problem;
    const nextSurvey: Survey = { ...survey, rooms: survey.rooms.map((item) => (item.id === roomId ? next : item)) };
    const calculated = calculate(nextSurvey);
    if (calculated.calcError) return calculated.calcError;
    this.#set({ survey: nextSurvey, ...calculated });
    this.#save(`room:${roomId}`, patch, (merged) => this.store.updateRoom(roomId, merged as NestedPatch<NewRoom>));
    return null;
  }

  /** Changes entry fields; recalculates only this entry and its room. Returns a message, or null when accepted. */
  updateEntry(entryId: string, patch: NestedPatch<NewEntry>): string | null {
    const found = this.findEntry(entryId);
    if (!found) return 'This fixture entry is no longer in the survey.';
    const next = applyPatch(found.entry, patch as NestedPatch<FixtureEntry>);
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
    this.#save(`entry:${entryId}`, patch, (merged) => this.store.updateEntry(entryId, merged as NestedPatch<NewEntry>));
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
