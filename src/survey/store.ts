/**
 * The survey store: the repository the screens call to read and change
 * surveys, rooms, fixture entries, photos, the catalog and the trash, to back
 * up and restore, and to start the app ({@link startLampwalk}).
 *
 * Every user edit is one awaited transaction: when the promise resolves the
 * edit is saved; when it rejects (always with a {@link StoreError}) nothing of
 * it was written. Values are checked with the same schemas as the survey file
 * before they are written, so anything stored can be backed up and restored.
 * Bulk changes (copy a room to N units, restore a backup) are one transaction.
 * Nothing here calculates: load a survey, then call `calculateSurvey`.
 */
import { addDays, formatISO, parseISO } from 'date-fns';
import type * as v from 'valibot';
import { conflictMessage, exportBackup, importBackup, previewImport, type BackupFile, type ClashChoice, type ImportPreview, type ImportReport } from './backup.ts';
import { allStores, defaultDatabaseName, openLampwalkDb, settingsKey, tracked, type Connection, type Migration, type OpenHooks, type StoredSettings, type WriteTx } from './db.ts';
import {
  backupStatus,
  browserEnvironment,
  readMarker,
  requestPersistence,
  storageUsage,
  writeMarkers,
  type BackupStatus,
  type DurabilityEnvironment,
  type StorageUsage,
  type UsageMarker,
} from './durability.ts';
import type {
  AppSettings,
  CatalogProduct,
  FixtureEntry,
  Photo,
  PhotoThumbnail,
  Portfolio,
  Room,
  StoredEntry,
  StoredRoom,
  Survey,
  SurveyHeader,
  TrashItem,
  TrashKind,
} from './model.ts';
import { newPhotoProblems, type NewPhoto } from './photos.ts';
import { assembleSurvey, byOrder, entryFields, ordersBetween, roomFields, splitSurvey } from './records.ts';
import { StoreError } from './store-error.ts';
import { joinPhoto, makeTrashItem, moveToTrash, photosOf, purgeExpired, putBack, splitPhoto, surveyParts, trashRetentionDays } from './trash.ts';
import { forgetLayoutEntries, removeSurveyFromPortfolios } from './trash.ts';
import {
  catalogProductSchema,
  fixtureEntrySchema,
  layoutLinkProblems,
  maxTextLength,
  parseSurvey,
  portfolioLinkProblems,
  portfolioSchema,
  problemsAgainst,
  roomSchema,
  surveySchema,
  type FileProblem,
} from './validate.ts';

export { StoreError, type StoreErrorKind } from './store-error.ts';
export type { ClosedReason } from './db.ts';
export type { BackupFile, ClashChoice, ImportPreview, ImportReport } from './backup.ts';
export type { BackupStatus, StorageUsage } from './durability.ts';
export type { NewPhoto } from './photos.ts';

/** Most units one "copy room to units" makes at once. */
export const maxUnitsPerCopy = 500;

/** Changes to a record: each field given is set; a field given as `undefined` is removed (for optional fields). */
export type Patch<T> = { [K in keyof T]?: T[K] | undefined };

/**
 * Changes to some fields of an object-valued field (e.g. an entry's
 * `existing`): the fields given are set (`undefined` removes an optional one)
 * and the others keep the values stored when the edit commits, so two windows
 * changing different fields of the same object both keep their change. Make
 * one with {@link changeFields}; a plain object value replaces the whole field.
 */
export class FieldChanges<T extends object> {
  constructor(readonly changes: Patch<T>) {}
}

/**
 * Only these fields of an object-valued field, for {@link NestedPatch}.
 *
 * @example await store.updateEntry(id, { existing: changeFields({ lumensPerLamp: 2600 }) }) //=> the entry, its other `existing` fields as stored
 */
export function changeFields<T extends object>(changes: Patch<T>): FieldChanges<T> {
  return new FieldChanges(changes);
}

type NestedChange<V> = V extends readonly unknown[] ? never : V extends object ? FieldChanges<V> : never;

/** A {@link Patch} whose object-valued fields may also be given as {@link FieldChanges} (per-field, later write wins). */
export type NestedPatch<T> = { [K in keyof T]?: T[K] | undefined | NestedChange<T[K]> };

/** What one committed edit changed: `entry`, `room` or `survey` name the records changed in place; `layout` is anything else (added, removed, moved, restored). */
export interface StoreChange {
  surveyId: string;
  kind: 'entry' | 'room' | 'survey' | 'layout';
  ids: string[];
}

/**
 * A committed edit that created, changed, deleted or restored a portfolio
 * (portfolios belong to no survey, so they are announced apart from
 * {@link StoreChange}; see {@link SurveyStore.onPortfolioChange}).
 */
export interface PortfolioChange {
  kind: 'portfolio';
  portfolioId: string;
}

/** A new survey: everything but its id, rooms and timestamps. */
export type NewSurvey = Omit<Survey, 'id' | 'rooms' | 'createdAt' | 'updatedAt'>;
/** A new room: everything but its id and entries. */
export type NewRoom = Omit<Room, 'id' | 'entries'>;
/** A new fixture entry: everything but its id. */
export type NewEntry = Omit<FixtureEntry, 'id'>;
/** A new catalog product: everything but its id. */
export type NewProduct = Omit<CatalogProduct, 'id'>;
/** A new portfolio: everything but its id and timestamps. */
export type NewPortfolio = Omit<Portfolio, 'id' | 'createdAt' | 'updatedAt'>;

/** A line of the trash list (without the records it holds). */
export interface TrashSummary {
  id: string;
  kind: TrashKind;
  label: string;
  deletedAt: string;
  /** Removed for good after this time (ISO 8601). */
  restorableUntil: string;
  surveyId: string;
  parentId: string | null;
  rooms: number;
  entries: number;
  photos: number;
}

/** Options for opening the store. */
export interface StoreOptions extends OpenHooks {
  /** Database name (tests give each test its own). Default "lampwalk". */
  databaseName?: string;
  /** Browser facilities for durability; default {@link browserEnvironment}. */
  environment?: DurabilityEnvironment;
  /** The time now; default `new Date()`. */
  clock?: () => Date;
  /** See `OpenOptions.blockedTimeoutMs` in `db.ts`. */
  blockedTimeoutMs?: number;
  /** For tests acting as another build: the schema steps to apply. */
  migrations?: readonly Migration[];
}

type RecordSchema = v.GenericSchema;

function notFound(what: string): StoreError {
  return new StoreError('not-found', `That ${what} is no longer on this device (it may have been deleted, or changed in another tab).`);
}

function invalid(what: string, problems: FileProblem[]): StoreError {
  const first = problems[0];
  const detail = first ? ` ${first.path}: ${first.message}.` : '';
  return new StoreError('invalid', `${what} was not saved.${detail}`, problems);
}

function checkRecord(schema: RecordSchema, value: unknown, what: string): void {
  const problems = problemsAgainst(schema, value);
  if (problems.length > 0) throw invalid(what, problems);
}

/**
 * `current` with `patch` applied (undefined removes a field; {@link FieldChanges}
 * change only the fields they name); `__proto__` and `constructor` keys are ignored.
 */
function applyPatch<T extends object>(current: T, patch: NestedPatch<T>): T {
  const next = { ...current } as Record<string, unknown>;
  for (const [key, value] of Object.entries(patch)) {
    if (key === '__proto__' || key === 'constructor') continue;
    if (value === undefined) delete next[key];
    else if (value instanceof FieldChanges) {
      const base: unknown = next[key];
      const fields = typeof base === 'object' && base !== null && !Array.isArray(base) ? (base as Record<string, unknown>) : {};
      next[key] = applyPatch(fields, value.changes as Patch<Record<string, unknown>>);
    } else next[key] = value;
  }
  return next as T;
}

/** Keeps "(copy)" names within the text limit. */
function withSuffix(name: string, suffix: string): string {
  return `${name.slice(0, maxTextLength - suffix.length)}${suffix}`;
}

/**
 * Sort keys for `count` new items placed at `index` among `siblings` (sorted,
 * without the items themselves); renumbers the siblings through `save` when
 * there is no room left between two of them.
 */
async function placeAmong<R extends { id: string; order: number }>(
  siblings: R[],
  index: number,
  count: number,
  save: (record: R) => Promise<unknown>,
): Promise<number[]> {
  const at = Math.max(0, Math.min(siblings.length, Math.trunc(index)));
  const orders = ordersBetween(siblings[at - 1]?.order ?? null, siblings[at]?.order ?? null, count);
  if (orders) return orders;
  await Promise.all(siblings.map((sibling, position) => tracked(save({ ...sibling, order: position }))));
  return ordersBetween(at > 0 ? at - 1 : null, at < siblings.length ? at : null, count) ?? [];
}

function freshSettings(stamp: string): StoredSettings {
  return {
    key: settingsKey,
    installId: crypto.randomUUID(),
    firstUsedAt: stamp,
    exampleCatalogSeededAt: null,
    demoSeededAt: null,
    persistence: null,
    lastBackupAt: null,
    editsSinceBackup: 0,
    lastEditAt: null,
  };
}

function settingsFields(stored: StoredSettings): AppSettings {
  const { key: _key, ...settings } = stored;
  return settings;
}

/** Marks a survey as changed by this edit (its `updatedAt` is stamped when the edit commits). */
type Touch = (surveyId: string) => void;

/** Marks a portfolio as changed by this edit (announced once it commits). */
type TouchPortfolio = (portfolioId: string) => void;

/** Surveys by currency, each with the names of the surveys using it (in the order given). */
function currencyGroups(headers: readonly SurveyHeader[]): Map<string, string[]> {
  const groups = new Map<string, string[]>();
  for (const header of headers) groups.set(header.money.currency, [...(groups.get(header.money.currency) ?? []), `“${header.name || 'Untitled survey'}”`]);
  return groups;
}

/** "“A” and “B” use USD; “C” uses EUR". */
function describeCurrencies(groups: ReadonlyMap<string, string[]>): string {
  return [...groups]
    .map(([currency, names]) => `${names.length > 1 ? `${names.slice(0, -1).join(', ')} and ${names.at(-1) ?? ''} use` : `${names[0] ?? ''} uses`} ${currency}`)
    .join('; ');
}

/**
 * The repository. Get one with {@link startLampwalk} (the app) or
 * {@link openSurveyStore} (tests, tools).
 */
export class SurveyStore {
  #persistence: Promise<void> | null = null;

  constructor(
    private readonly connection: Connection,
    /** Browser facilities used for durability. */
    readonly environment: DurabilityEnvironment,
    private readonly clock: () => Date,
  ) {}

  /** Closes the database connection; later calls fail with a `closed` StoreError. */
  close(): void {
    this.connection.close();
  }

  /** Name of the open database. */
  get databaseName(): string {
    return this.connection.name;
  }

  private stamp(): string {
    return formatISO(this.clock());
  }

  /**
   * One user edit: one read-write transaction. The body marks the surveys it
   * changed; their `updatedAt` and the edit counter are written in the same
   * transaction. After the commit, the first real save asks for persistent storage.
   * Durability is 'strict': the browser reports the commit only once the data
   * is flushed to disk, so an edit the screen shows as saved also survives a
   * power cut or an operating-system crash, not only a browser crash.
   */
  private async userEdit<T>(
    doing: string,
    body: (tx: WriteTx, touch: Touch, touchPortfolio: TouchPortfolio) => Promise<T>,
    changed: Omit<StoreChange, 'surveyId'> = { kind: 'layout', ids: [] },
  ): Promise<T> {
    const stamp = this.stamp();
    let persistenceRecorded = false;
    const touched = new Set<string>();
    const portfoliosTouched = new Set<string>();
    const result = await this.connection.write(allStores, doing, async (tx) => {
      touched.clear();
      portfoliosTouched.clear();
      const value = await body(
        tx,
        (surveyId) => touched.add(surveyId),
        (portfolioId) => portfoliosTouched.add(portfolioId),
      );
      const surveys = tx.objectStore('surveys');
      const [settings, ...headers] = await Promise.all([
        tracked(tx.objectStore('settings').get(settingsKey)),
        ...[...touched].map((id) => tracked(surveys.get(id))),
      ]);
      const writes: Promise<unknown>[] = [];
      for (const header of headers) if (header) writes.push(tracked(surveys.put({ ...header, updatedAt: stamp })));
      const base = settings ?? freshSettings(stamp);
      persistenceRecorded = base.persistence !== null;
      writes.push(tracked(tx.objectStore('settings').put({ ...base, editsSinceBackup: base.editsSinceBackup + 1, lastEditAt: stamp })));
      await Promise.all(writes);
      return value;
    }, 'strict');
    this.afterRealSave(persistenceRecorded);
    for (const surveyId of touched) this.announce({ surveyId, ...changed });
    for (const portfolioId of portfoliosTouched) this.announcePortfolio({ kind: 'portfolio', portfolioId });
    return result;
  }

  #changeListeners = new Set<(change: StoreChange) => void>();
  #portfolioListeners = new Set<(change: PortfolioChange) => void>();

  /**
   * Calls `listener` after each committed edit, once per portfolio it
   * created, changed, deleted or restored (deleting a survey changes the
   * portfolios that listed it). Returns the function that stops it.
   */
  onPortfolioChange(listener: (change: PortfolioChange) => void): () => void {
    this.#portfolioListeners.add(listener);
    return () => this.#portfolioListeners.delete(listener);
  }

  private announcePortfolio(change: PortfolioChange): void {
    for (const listener of this.#portfolioListeners) {
      try {
        listener(change);
      } catch {
        // A listener's failure must not turn a saved edit into a failed one.
      }
    }
  }

  /**
   * Calls `listener` after each committed edit, once per survey it changed
   * (other windows learn of it through this; see `src/ui/state/broadcast.ts`).
   * Returns the function that stops it.
   */
  onChange(listener: (change: StoreChange) => void): () => void {
    this.#changeListeners.add(listener);
    return () => this.#changeListeners.delete(listener);
  }

  private announce(change: StoreChange): void {
    for (const listener of this.#changeListeners) {
      try {
        listener(change);
      } catch {
        // A listener's failure must not turn a saved edit into a failed one.
      }
    }
  }

  /**
   * After a real save (a user edit or a restore, not seeding): unless the
   * answer is already recorded, asks the browser once for persistent storage,
   * in the background, and records the answer in the settings.
   */
  private afterRealSave(persistenceRecorded: boolean): void {
    if (this.#persistence) return;
    if (persistenceRecorded) {
      this.#persistence = Promise.resolve();
      return;
    }
    this.#persistence = (async () => {
      const granted = await requestPersistence(this.environment.storage);
      const requestedAt = this.stamp();
      await this.connection.write(['settings'], 'record the storage answer', async (tx) => {
        const current = (await tx.objectStore('settings').get(settingsKey)) ?? freshSettings(requestedAt);
        // Another tab may have asked meanwhile: keep the first answer.
        if (!current.persistence) await tx.objectStore('settings').put({ ...current, persistence: { requestedAt, granted } });
      });
    })().catch(() => undefined);
  }

  /** Resolves when background work started by earlier saves (the persistence request) has finished. */
  async whenIdle(): Promise<void> {
    await this.#persistence;
  }

  // -------------------------------------------------------------------------
  // Start-up, settings and durability

  /** The settings, or null when this database has never been set up (first run, or evicted). */
  async settings(): Promise<AppSettings | null> {
    const stored = await this.connection.read(['settings'], 'read the settings', (tx) => tx.objectStore('settings').get(settingsKey));
    return stored ? settingsFields(stored) : null;
  }

  /**
   * Sets up a database that has no settings yet, in one transaction: the
   * settings record, the example catalog products, the demo survey and the
   * landlord scenario (its layout surveys and the demo portfolio grouping
   * them with the demo survey; asked with `demoPortfolio`, default: with
   * the demo survey), each only if asked and not already there. Then writes the usage markers kept
   * outside IndexedDB. Does nothing to a database already set up.
   */
  async initialise(seed: { exampleCatalog: boolean; demoSurvey: boolean; demoPortfolio?: boolean }): Promise<AppSettings> {
    const stamp = this.stamp();
    // The demo data and example catalog load only on a first run, before the
    // transaction (which may await nothing but its own requests), so a
    // returning start does not carry them.
    const firstRun = (seed.exampleCatalog || seed.demoSurvey) && (await this.settings()) === null;
    const [{ exampleCatalog }, { demoLandlordSurveys, demoPortfolio, demoSurvey }] = firstRun
      ? await Promise.all([import('./examples.ts'), import('./demo.ts')])
      : [{ exampleCatalog: [] }, { demoLandlordSurveys: () => [], demoPortfolio: null, demoSurvey: null }];
    const settings = await this.connection.write(allStores, 'set up Lampwalk on this device', async (tx) => {
      const existing = await tx.objectStore('settings').get(settingsKey);
      if (existing) return existing;
      const created = freshSettings(stamp);
      const requests: Promise<unknown>[] = [];
      if (seed.exampleCatalog) {
        const catalog = tx.objectStore('catalog');
        const present = await Promise.all(exampleCatalog.map((product) => tracked(catalog.getKey(product.id))));
        exampleCatalog.forEach((product, index) => {
          if (present[index] === undefined) requests.push(tracked(catalog.add({ ...product })));
        });
        created.exampleCatalogSeededAt = stamp;
      }
      if (seed.demoSurvey && demoSurvey && demoPortfolio) {
        // The demo building, and with the landlord scenario its layouts and the portfolio grouping them.
        const landlord = seed.demoPortfolio ?? true;
        const surveys = [demoSurvey(), ...(landlord ? demoLandlordSurveys() : [])].map((survey) => splitSurvey(survey));
        const present = await Promise.all(surveys.map((demo) => tracked(tx.objectStore('surveys').getKey(demo.survey.id))));
        surveys.forEach((demo, index) => {
          if (present[index] !== undefined) return;
          requests.push(tracked(tx.objectStore('surveys').add(demo.survey)));
          for (const room of demo.rooms) requests.push(tracked(tx.objectStore('rooms').add(room)));
          for (const entry of demo.entries) requests.push(tracked(tx.objectStore('entries').add(entry)));
        });
        const portfolio = demoPortfolio();
        if (landlord && (await tx.objectStore('portfolios').getKey(portfolio.id)) === undefined) {
          requests.push(tracked(tx.objectStore('portfolios').add(portfolio)));
        }
        created.demoSeededAt = stamp;
      }
      requests.push(tracked(tx.objectStore('settings').add(created)));
      await Promise.all(requests);
      return created;
    });
    writeMarkers(this.environment, { installId: settings.installId, firstUsedAt: settings.firstUsedAt });
    return settingsFields(settings);
  }

  /** "Time since last backup" and "edits since last backup", for the reminder. */
  async backupStatus(): Promise<BackupStatus> {
    const settings = await this.settings();
    return backupStatus(settings?.lastBackupAt ?? null, settings?.editsSinceBackup ?? 0, this.clock());
  }

  /** Storage use reported by the browser (`navigator.storage.estimate()`), or null where it says nothing. */
  async storageUsage(): Promise<StorageUsage | null> {
    return storageUsage(this.environment.storage);
  }

  // -------------------------------------------------------------------------
  // Surveys

  /** Every survey (without rooms), most recently changed first. */
  async listSurveys(): Promise<SurveyHeader[]> {
    const headers = await this.connection.read(['surveys'], 'list the surveys', (tx) => tx.objectStore('surveys').getAll());
    return headers.sort((a, b) => Date.parse(b.updatedAt) - Date.parse(a.updatedAt) || a.name.localeCompare(b.name));
  }

  /** One survey without its rooms. */
  async getSurvey(surveyId: string): Promise<SurveyHeader> {
    const header = await this.connection.read(['surveys'], 'read the survey', (tx) => tx.objectStore('surveys').get(surveyId));
    if (!header) throw notFound('survey');
    return header;
  }

  /**
   * A whole survey, nested, ready for `calculateSurvey`: one read
   * transaction, then the stored records are checked against the file schema.
   */
  async loadSurvey(surveyId: string): Promise<Survey> {
    const parts = await this.connection.read(['surveys', 'rooms', 'entries'], 'open the survey', async (tx) => {
      const [header, rooms, entries] = await Promise.all([
        tracked(tx.objectStore('surveys').get(surveyId)),
        tracked(tx.objectStore('rooms').index('bySurvey').getAll(surveyId)),
        tracked(tx.objectStore('entries').index('bySurvey').getAll(surveyId)),
      ]);
      return { header, rooms, entries };
    });
    if (!parts.header) throw notFound('survey');
    const survey = assembleSurvey(parts.header, parts.rooms, parts.entries);
    const checked = parseSurvey(survey);
    if (!checked.ok) {
      throw new StoreError(
        'invalid',
        `The saved survey “${parts.header.name}” is damaged and cannot be opened (${checked.problems[0]?.path}: ${checked.problems[0]?.message}). Restore it from a backup.`,
        checked.problems,
      );
    }
    return survey;
  }

  /** Creates an empty survey. */
  async createSurvey(fields: NewSurvey): Promise<SurveyHeader> {
    const stamp = this.stamp();
    const header: SurveyHeader = { ...fields, id: crypto.randomUUID(), createdAt: stamp, updatedAt: stamp };
    checkRecord(surveySchema, { ...header, rooms: [] }, 'The survey');
    // A new survey has no entries yet, so its differing units can name none.
    const layoutProblems = layoutLinkProblems(header, '', new Set());
    if (layoutProblems.length > 0) throw invalid('The survey', layoutProblems);
    return this.userEdit('save the new survey', async (tx) => {
      await tx.objectStore('surveys').add(header);
      return header;
    });
  }

  /**
   * Saves a complete survey under its own ids (e.g. from a template); fails
   * with `conflict` when any of its ids is already stored.
   */
  async addWholeSurvey(survey: Survey): Promise<SurveyHeader> {
    const checked = parseSurvey(survey);
    if (!checked.ok) throw invalid('The survey', checked.problems);
    const records = splitSurvey(checked.survey);
    return this.userEdit('save the survey', async (tx) => {
      await Promise.all([
        tracked(tx.objectStore('surveys').add(records.survey)),
        ...records.rooms.map((room) => tracked(tx.objectStore('rooms').add(room))),
        ...records.entries.map((entry) => tracked(tx.objectStore('entries').add(entry))),
      ]);
      return records.survey;
    });
  }

  /** Changes survey fields (not its id or timestamps); stamps `updatedAt`. */
  async updateSurvey(surveyId: string, patch: NestedPatch<NewSurvey>): Promise<SurveyHeader> {
    return this.userEdit('save the survey', async (tx, touch) => {
      const current = await tx.objectStore('surveys').get(surveyId);
      if (!current) throw notFound('survey');
      const next: SurveyHeader = { ...applyPatch<SurveyHeader>(current, patch), id: current.id, createdAt: current.createdAt, updatedAt: this.stamp() };
      checkRecord(surveySchema, { ...next, rooms: [] }, 'The survey');
      if (next.layout && Object.hasOwn(patch, 'layout')) {
        // Differing units may only name entries stored in this survey now.
        const entryIds = await tx.objectStore('entries').index('bySurvey').getAllKeys(surveyId);
        const problems = layoutLinkProblems(next, '', new Set(entryIds));
        if (problems.length > 0) throw invalid('The survey', problems);
      }
      if (next.money.currency !== current.money.currency) await this.checkCurrencyChange(tx, current, next.money.currency);
      await tx.objectStore('surveys').put(next);
      touch(surveyId);
      return next;
    }, { kind: 'survey', ids: [surveyId] });
  }

  /**
   * Moves a survey, its rooms, entries and photos to the trash and takes it
   * out of every portfolio, in one transaction; returns the trash item id.
   * Restoring it from the trash does not put it back in those portfolios.
   */
  async deleteSurvey(surveyId: string): Promise<string> {
    const stamp = this.stamp();
    return this.userEdit('delete the survey', async (tx, touch, touchPortfolio) => {
      // Marked so other windows hear of it (the header is gone, so nothing is stamped).
      touch(surveyId);
      const parts = await surveyParts(tx, surveyId);
      const item = makeTrashItem('survey', { label: parts.survey.name, surveyId, parentId: null, ...parts }, stamp);
      await moveToTrash(tx, item);
      for (const portfolioId of await removeSurveyFromPortfolios(tx, surveyId, stamp)) touchPortfolio(portfolioId);
      return item.id;
    });
  }

  // -------------------------------------------------------------------------
  // Rooms

  /** A survey's rooms in order (without entries). */
  async listRooms(surveyId: string): Promise<StoredRoom[]> {
    const rooms = await this.connection.read(['rooms'], 'list the rooms', (tx) => tx.objectStore('rooms').index('bySurvey').getAll(surveyId));
    return rooms.sort(byOrder);
  }

  /** One room (without entries). */
  async getRoom(roomId: string): Promise<StoredRoom> {
    const room = await this.connection.read(['rooms'], 'read the room', (tx) => tx.objectStore('rooms').get(roomId));
    if (!room) throw notFound('room');
    return room;
  }

  /** Adds a room to a survey at `position` (default: last). */
  async addRoom(surveyId: string, fields: NewRoom, position?: number): Promise<StoredRoom> {
    const room = { ...fields, id: crypto.randomUUID() };
    checkRecord(roomSchema, { ...room, entries: [] }, 'The room');
    return this.userEdit('save the new room', async (tx, touch) => {
      const rooms = tx.objectStore('rooms');
      const [survey, siblings] = await Promise.all([tracked(tx.objectStore('surveys').getKey(surveyId)), tracked(rooms.index('bySurvey').getAll(surveyId))]);
      if (survey === undefined) throw notFound('survey');
      siblings.sort(byOrder);
      const [order = siblings.length] = await placeAmong(siblings, position ?? siblings.length, 1, (record) => rooms.put(record));
      const stored: StoredRoom = { ...room, surveyId, order };
      await rooms.add(stored);
      touch(surveyId);
      return stored;
    });
  }

  /** Changes room fields (not its id, survey or place). */
  async updateRoom(roomId: string, patch: NestedPatch<NewRoom>): Promise<StoredRoom> {
    return this.userEdit('save the room', async (tx, touch) => {
      const current = await tx.objectStore('rooms').get(roomId);
      if (!current) throw notFound('room');
      const next: StoredRoom = { ...applyPatch<StoredRoom>(current, patch), id: current.id, surveyId: current.surveyId, order: current.order };
      checkRecord(roomSchema, { ...roomFields(next), entries: [] }, 'The room');
      await tx.objectStore('rooms').put(next);
      touch(current.surveyId);
      return next;
    }, { kind: 'room', ids: [roomId] });
  }

  /** Moves a room with its entries and their photos to the trash; returns the trash item id. */
  async deleteRoom(roomId: string): Promise<string> {
    const stamp = this.stamp();
    return this.userEdit('delete the room', async (tx, touch) => {
      const room = await tx.objectStore('rooms').get(roomId);
      if (!room) throw notFound('room');
      const entries = await tx.objectStore('entries').index('byRoom').getAll(roomId);
      const photos = await photosOf(tx, [roomId, ...entries.map((entry) => entry.id)]);
      const item = makeTrashItem('room', { label: room.name, surveyId: room.surveyId, parentId: room.surveyId, rooms: [room], entries, photos }, stamp);
      await moveToTrash(tx, item);
      await forgetLayoutEntries(tx, room.surveyId, entries.map((entry) => entry.id));
      touch(room.surveyId);
      return item.id;
    });
  }

  /**
   * Copies a room with all its entries (new ids; photos stay with the
   * original) into `names.length` new rooms placed right after it, in ONE
   * transaction.
   */
  private async copyRoom(roomId: string, names: (original: string) => string[], doing: string): Promise<StoredRoom[]> {
    return this.userEdit(doing, async (tx, touch) => {
      const rooms = tx.objectStore('rooms');
      const entriesStore = tx.objectStore('entries');
      const room = await rooms.get(roomId);
      if (!room) throw notFound('room');
      const [siblings, entries] = await Promise.all([
        tracked(rooms.index('bySurvey').getAll(room.surveyId)),
        tracked(entriesStore.index('byRoom').getAll(roomId)),
      ]);
      siblings.sort(byOrder);
      entries.sort(byOrder);
      const copyNames = names(room.name);
      const at = siblings.findIndex((sibling) => sibling.id === roomId) + 1;
      const orders = await placeAmong(siblings, at, copyNames.length, (record) => rooms.put(record));
      const made: StoredRoom[] = [];
      const requests: Promise<unknown>[] = [];
      copyNames.forEach((name, index) => {
        const copy: StoredRoom = { ...room, id: crypto.randomUUID(), name, order: orders[index] ?? room.order };
        made.push(copy);
        requests.push(tracked(rooms.add(copy)));
        for (const entry of entries) requests.push(tracked(entriesStore.add({ ...entry, id: crypto.randomUUID(), roomId: copy.id })));
      });
      await Promise.all(requests);
      touch(room.surveyId);
      return made;
    });
  }

  /** Copies a room and its entries right after it, named "… (copy)". */
  async duplicateRoom(roomId: string): Promise<StoredRoom> {
    const [copy] = await this.copyRoom(roomId, (name) => [withSuffix(name, ' (copy)')], 'duplicate the room');
    if (!copy) throw notFound('room');
    return copy;
  }

  /**
   * Copies a room with its entries to `units` identical units (for identical
   * apartments), all in ONE transaction, placed right after the room. Names
   * are `names` when given (one per unit), else "‹room› — unit 2", "— unit 3"…
   */
  async copyRoomToUnits(roomId: string, units: number, names?: readonly string[]): Promise<StoredRoom[]> {
    if (!Number.isInteger(units) || units < 1 || units > maxUnitsPerCopy) {
      throw invalid('The copies', [{ path: 'units', message: `must be a whole number between 1 and ${maxUnitsPerCopy} (got ${String(units)})` }]);
    }
    if (names !== undefined) {
      if (names.length !== units) {
        throw invalid('The copies', [{ path: 'names', message: `must hold one name per unit: ${units} (got ${names.length})` }]);
      }
      const bad = names.findIndex((name) => typeof name !== 'string' || name.length > maxTextLength);
      if (bad >= 0) throw invalid('The copies', [{ path: `names[${bad}]`, message: `must be text of at most ${maxTextLength} characters` }]);
    }
    return this.copyRoom(
      roomId,
      (name) => (names ? [...names] : Array.from({ length: units }, (_, index) => withSuffix(name, ` — unit ${index + 2}`))),
      `copy the room to ${units} units`,
    );
  }

  // -------------------------------------------------------------------------
  // Fixture entries

  /** A room's entries in order. */
  async listEntries(roomId: string): Promise<StoredEntry[]> {
    const entries = await this.connection.read(['entries'], 'list the fixture entries', (tx) => tx.objectStore('entries').index('byRoom').getAll(roomId));
    return entries.sort(byOrder);
  }

  /** One entry. */
  async getEntry(entryId: string): Promise<StoredEntry> {
    const entry = await this.connection.read(['entries'], 'read the fixture entry', (tx) => tx.objectStore('entries').get(entryId));
    if (!entry) throw notFound('fixture entry');
    return entry;
  }

  /** Adds an entry to a room at `position` (default: last). */
  async addEntry(roomId: string, fields: NewEntry, position?: number): Promise<StoredEntry> {
    const entry: FixtureEntry = { ...fields, id: crypto.randomUUID() };
    checkRecord(fixtureEntrySchema, entry, 'The fixture entry');
    return this.userEdit('save the new fixture entry', async (tx, touch) => {
      const entries = tx.objectStore('entries');
      const [room, siblings] = await Promise.all([tracked(tx.objectStore('rooms').get(roomId)), tracked(entries.index('byRoom').getAll(roomId))]);
      if (!room) throw notFound('room');
      siblings.sort(byOrder);
      const [order = siblings.length] = await placeAmong(siblings, position ?? siblings.length, 1, (record) => entries.put(record));
      const stored: StoredEntry = { ...entry, roomId, surveyId: room.surveyId, order };
      await entries.add(stored);
      touch(room.surveyId);
      return stored;
    });
  }

  /**
   * Adds several entries at the end of a room in ONE transaction (a fixture
   * schedule import): every entry is checked first, and a bad one (its path
   * starts with `entries[i]`) or a missing room writes nothing. Each entry
   * gets a fresh id, whatever id it carried. An empty list writes nothing.
   */
  async addEntries(roomId: string, fieldsList: readonly NewEntry[]): Promise<StoredEntry[]> {
    const entries: FixtureEntry[] = fieldsList.map((fields) => ({ ...fields, id: crypto.randomUUID() }));
    const problems = entries.flatMap((entry, index) => problemsAgainst(fixtureEntrySchema, entry, `entries[${index}]`));
    if (problems.length > 0) throw invalid('The fixture entries', problems);
    if (entries.length === 0) return [];
    return this.userEdit(`save ${entries.length} new fixture entries`, async (tx, touch) => {
      const store = tx.objectStore('entries');
      const [room, siblings] = await Promise.all([tracked(tx.objectStore('rooms').get(roomId)), tracked(store.index('byRoom').getAll(roomId))]);
      if (!room) throw notFound('room');
      siblings.sort(byOrder);
      const orders = await placeAmong(siblings, siblings.length, entries.length, (record) => store.put(record));
      const stored = entries.map((entry, index): StoredEntry => ({ ...entry, roomId, surveyId: room.surveyId, order: orders[index] ?? siblings.length + index }));
      await Promise.all(stored.map((entry) => tracked(store.add(entry))));
      touch(room.surveyId);
      return stored;
    });
  }

  /** Changes entry fields (not its id, room or place). The one-field edit of the field screens. */
  async updateEntry(entryId: string, patch: NestedPatch<NewEntry>): Promise<StoredEntry> {
    return this.userEdit('save the fixture entry', async (tx, touch) => {
      const entries = tx.objectStore('entries');
      const current = await entries.get(entryId);
      if (!current) throw notFound('fixture entry');
      const next: StoredEntry = {
        ...applyPatch<StoredEntry>(current, patch),
        id: current.id,
        roomId: current.roomId,
        surveyId: current.surveyId,
        order: current.order,
      };
      checkRecord(fixtureEntrySchema, entryFields(next), 'The fixture entry');
      await entries.put(next);
      touch(current.surveyId);
      return next;
    }, { kind: 'entry', ids: [entryId] });
  }

  /** Moves an entry and its photos to the trash; returns the trash item id. */
  async deleteEntry(entryId: string): Promise<string> {
    const stamp = this.stamp();
    return this.userEdit('delete the fixture entry', async (tx, touch) => {
      const entry = await tx.objectStore('entries').get(entryId);
      if (!entry) throw notFound('fixture entry');
      const photos = await photosOf(tx, [entryId]);
      const label = entry.existing.description || `${entry.count} × ${entry.existing.technology}`;
      const item = makeTrashItem('entry', { label, surveyId: entry.surveyId, parentId: entry.roomId, entries: [entry], photos }, stamp);
      await moveToTrash(tx, item);
      // Its counts in differing units of the layout go too (restoring the entry does not bring them back).
      await forgetLayoutEntries(tx, entry.surveyId, [entryId]);
      touch(entry.surveyId);
      return item.id;
    });
  }

  /** Copies an entry (new id, no photos) right after it. */
  async duplicateEntry(entryId: string): Promise<StoredEntry> {
    return this.userEdit('duplicate the fixture entry', async (tx, touch) => {
      const entries = tx.objectStore('entries');
      const entry = await entries.get(entryId);
      if (!entry) throw notFound('fixture entry');
      const siblings = (await entries.index('byRoom').getAll(entry.roomId)).sort(byOrder);
      const at = siblings.findIndex((sibling) => sibling.id === entryId) + 1;
      const [order = entry.order] = await placeAmong(siblings, at, 1, (record) => entries.put(record));
      const copy: StoredEntry = { ...entry, id: crypto.randomUUID(), order };
      await entries.add(copy);
      touch(entry.surveyId);
      return copy;
    });
  }

  /**
   * Moves an entry (with its photos) to another room, possibly of another
   * survey, at `position` (default: last); also reorders within a room.
   */
  async moveEntry(entryId: string, toRoomId: string, position?: number): Promise<StoredEntry> {
    return this.userEdit('move the fixture entry', async (tx, touch) => {
      const entries = tx.objectStore('entries');
      const [entry, room] = await Promise.all([tracked(entries.get(entryId)), tracked(tx.objectStore('rooms').get(toRoomId))]);
      if (!entry) throw notFound('fixture entry');
      if (!room) throw notFound('room');
      const siblings = (await entries.index('byRoom').getAll(toRoomId)).filter((sibling) => sibling.id !== entryId).sort(byOrder);
      const [order = siblings.length] = await placeAmong(siblings, position ?? siblings.length, 1, (record) => entries.put(record));
      const moved: StoredEntry = { ...entry, roomId: toRoomId, surveyId: room.surveyId, order };
      const writes: Promise<unknown>[] = [tracked(entries.put(moved))];
      if (room.surveyId !== entry.surveyId) {
        for (const photo of await photosOf(tx, [entryId])) {
          const { image, thumbnail } = splitPhoto({ ...photo, surveyId: room.surveyId });
          writes.push(tracked(tx.objectStore('photos').put(image)), tracked(tx.objectStore('thumbnails').put(thumbnail)));
        }
      }
      await Promise.all(writes);
      if (room.surveyId !== entry.surveyId) await forgetLayoutEntries(tx, entry.surveyId, [entryId]);
      touch(entry.surveyId);
      touch(room.surveyId);
      return moved;
    });
  }

  // -------------------------------------------------------------------------
  // Photos

  /** Stores a photo (already downscaled, with its thumbnail) of a room or entry. */
  async addPhoto(photo: NewPhoto): Promise<Photo> {
    const problems = newPhotoProblems(photo);
    if (problems.length > 0) throw invalid('The photo', problems);
    const stamp = this.stamp();
    return this.userEdit('save the photo', async (tx, touch) => {
      const owner =
        photo.ownerKind === 'room' ? await tx.objectStore('rooms').get(photo.ownerId) : await tx.objectStore('entries').get(photo.ownerId);
      if (!owner) throw notFound(photo.ownerKind === 'room' ? 'room' : 'fixture entry');
      const stored: Photo = { ...photo, id: crypto.randomUUID(), surveyId: owner.surveyId, createdAt: stamp };
      const { image, thumbnail } = splitPhoto(stored);
      await Promise.all([tracked(tx.objectStore('photos').add(image)), tracked(tx.objectStore('thumbnails').add(thumbnail))]);
      touch(owner.surveyId);
      return stored;
    });
  }

  /** One photo with its full image. */
  async getPhoto(photoId: string): Promise<Photo> {
    const found = await this.connection.read(['photos', 'thumbnails'], 'read the photo', async (tx) =>
      Promise.all([tracked(tx.objectStore('photos').get(photoId)), tracked(tx.objectStore('thumbnails').get(photoId))]),
    );
    const [image, thumbnail] = found;
    if (!image) throw notFound('photo');
    return joinPhoto(image, thumbnail);
  }

  /** Thumbnails of a room's or entry's photos, oldest first (the full images are not read). */
  async listThumbnails(ownerId: string): Promise<PhotoThumbnail[]> {
    const thumbnails = await this.connection.read(['thumbnails'], 'list the photos', (tx) => tx.objectStore('thumbnails').index('byOwner').getAll(ownerId));
    return thumbnails.sort((a, b) => Date.parse(a.createdAt) - Date.parse(b.createdAt) || (a.id < b.id ? -1 : 1));
  }

  /** Moves a photo to the trash; returns the trash item id. */
  async deletePhoto(photoId: string): Promise<string> {
    const stamp = this.stamp();
    return this.userEdit('delete the photo', async (tx, touch) => {
      const [image, thumbnail] = await Promise.all([tracked(tx.objectStore('photos').get(photoId)), tracked(tx.objectStore('thumbnails').get(photoId))]);
      if (!image) throw notFound('photo');
      const photo = joinPhoto(image, thumbnail);
      const item = makeTrashItem('photo', { label: 'Photo', surveyId: photo.surveyId, parentId: photo.ownerId, photos: [photo] }, stamp);
      await moveToTrash(tx, item);
      touch(photo.surveyId);
      return item.id;
    });
  }

  // -------------------------------------------------------------------------
  // Trash

  /** What is in the trash, most recently deleted first. */
  async listTrash(): Promise<TrashSummary[]> {
    const items = await this.connection.read(['trash'], 'list the trash', (tx) => tx.objectStore('trash').getAll());
    return items
      .map((item) => ({
        id: item.id,
        kind: item.kind,
        label: item.label,
        deletedAt: item.deletedAt,
        restorableUntil: formatISO(addDays(parseISO(item.deletedAt), trashRetentionDays)),
        surveyId: item.surveyId,
        parentId: item.parentId,
        rooms: item.rooms.length,
        entries: item.entries.length,
        photos: item.photos.length,
      }))
      .sort((a, b) => Date.parse(b.deletedAt) - Date.parse(a.deletedAt));
  }

  /**
   * Puts a deleted survey, room, entry, photo or portfolio back where it was.
   * Fails with `not-found` when what it belonged to is gone (restore that
   * first). A portfolio comes back without the surveys that are no longer
   * on this device. `portfolioId` names a restored portfolio (null otherwise).
   */
  async restoreFromTrash(trashId: string): Promise<{ kind: TrashKind; surveyId: string; portfolioId: string | null }> {
    return this.userEdit('restore from the trash', async (tx, touch, touchPortfolio) => {
      const item: TrashItem | undefined = await tx.objectStore('trash').get(trashId);
      if (!item) throw notFound('trash item');
      if (item.kind === 'room' && (await tx.objectStore('surveys').getKey(item.surveyId)) === undefined) {
        throw new StoreError('not-found', `The survey of “${item.label}” is not here any more. Restore the survey from the trash first.`);
      }
      if (item.kind === 'entry' && item.parentId !== null && (await tx.objectStore('rooms').getKey(item.parentId)) === undefined) {
        throw new StoreError('not-found', `The room of “${item.label}” is not here any more. Restore the room from the trash first.`);
      }
      if (item.kind === 'photo' && item.parentId !== null) {
        const [room, entry] = await Promise.all([tracked(tx.objectStore('rooms').getKey(item.parentId)), tracked(tx.objectStore('entries').getKey(item.parentId))]);
        if (room === undefined && entry === undefined) {
          throw new StoreError('not-found', 'The room or fixture entry of this photo is not here any more. Restore it from the trash first.');
        }
      }
      try {
        await putBack(tx, item);
      } catch (error) {
        if (error instanceof Error && error.name === 'ConstraintError') {
          throw new StoreError('conflict', `“${item.label}” cannot be restored: something with the same id is saved now (perhaps restored from a backup).`, [], { cause: error });
        }
        throw error;
      }
      if (item.portfolio) touchPortfolio(item.portfolio.id);
      else touch(item.surveyId);
      return { kind: item.kind, surveyId: item.surveyId, portfolioId: item.portfolio?.id ?? null };
    });
  }

  /** Deletes a trash item for good. */
  async deleteFromTrash(trashId: string): Promise<void> {
    await this.connection.write(['trash'], 'empty the trash item', async (tx) => {
      if ((await tx.objectStore('trash').getKey(trashId)) === undefined) throw notFound('trash item');
      await tx.objectStore('trash').delete(trashId);
    });
  }

  /** Deletes trash items older than the retention period; returns how many. */
  async purgeTrash(): Promise<number> {
    const now = this.clock();
    return this.connection.write(['trash'], 'clear old items from the trash', (tx) => purgeExpired(tx, now));
  }

  // -------------------------------------------------------------------------
  // Catalog

  /** The catalog, by name. */
  async listCatalog(): Promise<CatalogProduct[]> {
    const products = await this.connection.read(['catalog'], 'list the catalog', (tx) => tx.objectStore('catalog').getAll());
    return products.sort((a, b) => a.name.localeCompare(b.name) || (a.id < b.id ? -1 : 1));
  }

  /** One catalog product. */
  async getProduct(productId: string): Promise<CatalogProduct> {
    const product = await this.connection.read(['catalog'], 'read the product', (tx) => tx.objectStore('catalog').get(productId));
    if (!product) throw notFound('catalog product');
    return product;
  }

  /** Adds a product to the catalog. */
  async addProduct(fields: NewProduct): Promise<CatalogProduct> {
    const product: CatalogProduct = { ...fields, id: crypto.randomUUID() };
    checkRecord(catalogProductSchema, product, 'The product');
    return this.userEdit('save the product', async (tx) => {
      await tx.objectStore('catalog').add(product);
      return product;
    });
  }

  /** Changes a product. Entries already proposing it keep their own copy (a quote does not change under them). */
  async updateProduct(productId: string, patch: Patch<NewProduct>): Promise<CatalogProduct> {
    return this.userEdit('save the product', async (tx) => {
      const current = await tx.objectStore('catalog').get(productId);
      if (!current) throw notFound('catalog product');
      const next: CatalogProduct = { ...applyPatch<CatalogProduct>(current, patch), id: current.id };
      checkRecord(catalogProductSchema, next, 'The product');
      await tx.objectStore('catalog').put(next);
      return next;
    });
  }

  /** Removes a product from the catalog (entries keep their copy of its details). To hide it instead, set `retired`. */
  async deleteProduct(productId: string): Promise<void> {
    await this.userEdit('delete the product', async (tx) => {
      if ((await tx.objectStore('catalog').getKey(productId)) === undefined) throw notFound('catalog product');
      await tx.objectStore('catalog').delete(productId);
    });
  }

  // -------------------------------------------------------------------------
  // Portfolios

  /** Every portfolio, most recently changed first. */
  async listPortfolios(): Promise<Portfolio[]> {
    const portfolios = await this.connection.read(['portfolios'], 'list the portfolios', (tx) => tx.objectStore('portfolios').getAll());
    return portfolios.sort((a, b) => Date.parse(b.updatedAt) - Date.parse(a.updatedAt) || a.name.localeCompare(b.name));
  }

  /** One portfolio. */
  async getPortfolio(portfolioId: string): Promise<Portfolio> {
    const portfolio = await this.connection.read(['portfolios'], 'read the portfolio', (tx) => tx.objectStore('portfolios').get(portfolioId));
    if (!portfolio) throw notFound('portfolio');
    return portfolio;
  }

  /**
   * Checks a portfolio about to be written: the file schema, then (inside the
   * transaction) that its surveys are stored, each listed once, and that the
   * edit does not mix currencies: the surveys must use one currency, unless
   * the portfolio already held several (a file from elsewhere) and the edit
   * brings in none of its own (`before`: the survey ids stored before the edit).
   */
  private async checkPortfolio(tx: WriteTx, portfolio: Portfolio, before: readonly string[] = []): Promise<void> {
    checkRecord(portfolioSchema, portfolio, 'The portfolio');
    const headers = await Promise.all(portfolio.surveyIds.map((id) => tracked(tx.objectStore('surveys').get(id))));
    const stored = headers.filter((header): header is SurveyHeader => header !== undefined);
    const known = new Set(stored.map((header) => header.id));
    const problems = portfolioLinkProblems([portfolio], known, { path: () => '', place: 'device' });
    if (problems.length > 0) throw invalid('The portfolio', problems);
    const groups = currencyGroups(stored);
    if (groups.size < 2) return;
    const had = new Set(stored.filter((header) => before.includes(header.id)).map((header) => header.money.currency));
    if ([...groups.keys()].every((currency) => had.has(currency))) return;
    const detail = `its surveys would use different currencies: ${describeCurrencies(groups)}`;
    throw new StoreError(
      'invalid',
      `The portfolio was not saved: ${detail}. A portfolio adds up money and plans under one budget, so its surveys must use one currency. Change the survey’s currency (under Assumptions) first, or leave it out.`,
      [{ path: 'surveyIds', message: `must name surveys of one currency (${describeCurrencies(groups)})` }],
    );
  }

  /**
   * Refuses to change the currency of a survey to `currency` when that would
   * bring a new currency into a portfolio listing it with other surveys.
   */
  private async checkCurrencyChange(tx: WriteTx, survey: SurveyHeader, currency: string): Promise<void> {
    const portfolios = (await tx.objectStore('portfolios').getAll()).filter((portfolio) => portfolio.surveyIds.includes(survey.id));
    for (const portfolio of portfolios) {
      const others = (
        await Promise.all(portfolio.surveyIds.filter((id) => id !== survey.id).map((id) => tracked(tx.objectStore('surveys').get(id))))
      ).filter((header): header is SurveyHeader => header !== undefined);
      const otherCurrencies = new Set(others.map((header) => header.money.currency));
      // Allowed when the others already use this currency (even in a portfolio already mixed by a file from elsewhere).
      if (others.length === 0 || otherCurrencies.has(currency)) continue;
      const groups = currencyGroups(others);
      const name = `“${survey.name || 'Untitled survey'}”`;
      const portfolioName = `“${portfolio.name || 'Untitled portfolio'}”`;
      throw new StoreError(
        'invalid',
        `The survey was not saved: ${name} is in the portfolio ${portfolioName}, where ${describeCurrencies(groups)}, so its currency cannot become ${currency}. Take it out of that portfolio first, or choose ${[...otherCurrencies].join(' or ')}.`,
        [{ path: 'money.currency', message: `must be ${[...otherCurrencies].join(' or ')} while the survey is in the portfolio ${portfolioName}` }],
      );
    }
  }

  /** Creates a portfolio of stored surveys. */
  async createPortfolio(fields: NewPortfolio): Promise<Portfolio> {
    const stamp = this.stamp();
    const portfolio: Portfolio = { ...fields, surveyIds: [...fields.surveyIds], id: crypto.randomUUID(), createdAt: stamp, updatedAt: stamp };
    checkRecord(portfolioSchema, portfolio, 'The portfolio');
    return this.userEdit('save the new portfolio', async (tx, _touch, touchPortfolio) => {
      await this.checkPortfolio(tx, portfolio);
      await tx.objectStore('portfolios').add(portfolio);
      touchPortfolio(portfolio.id);
      return portfolio;
    });
  }

  /** Changes portfolio fields (not its id or timestamps); stamps `updatedAt`. `surveyIds` replaces the whole list. */
  async updatePortfolio(portfolioId: string, patch: NestedPatch<NewPortfolio>): Promise<Portfolio> {
    return this.userEdit('save the portfolio', async (tx, _touch, touchPortfolio) => {
      const current = await tx.objectStore('portfolios').get(portfolioId);
      if (!current) throw notFound('portfolio');
      const next: Portfolio = { ...applyPatch<Portfolio>(current, patch), id: current.id, createdAt: current.createdAt, updatedAt: this.stamp() };
      await this.checkPortfolio(tx, next, current.surveyIds);
      await tx.objectStore('portfolios').put(next);
      touchPortfolio(portfolioId);
      return next;
    });
  }

  /**
   * Moves a portfolio to the trash (its surveys stay where they are);
   * returns the trash item id. Restoring it brings it back without the
   * surveys deleted meanwhile.
   */
  async deletePortfolio(portfolioId: string): Promise<string> {
    const stamp = this.stamp();
    return this.userEdit('delete the portfolio', async (tx, _touch, touchPortfolio) => {
      const portfolio = await tx.objectStore('portfolios').get(portfolioId);
      if (!portfolio) throw notFound('portfolio');
      const item = makeTrashItem('portfolio', { label: portfolio.name || 'Untitled portfolio', surveyId: '', parentId: null, portfolio }, stamp);
      await moveToTrash(tx, item);
      touchPortfolio(portfolioId);
      return item.id;
    });
  }

  // -------------------------------------------------------------------------
  // Backup and restore

  /**
   * A backup of everything (all surveys, the catalog, all photos) as one
   * survey file. Resets "edits since last backup" and stamps the backup time.
   */
  async exportEverything(): Promise<BackupFile> {
    const now = this.clock();
    const { editsCounted, ...backup } = await exportBackup(this.connection, 'all', now);
    const stamp = formatISO(now);
    await this.connection.write(['settings'], 'record the backup', async (tx) => {
      const current = (await tx.objectStore('settings').get(settingsKey)) ?? freshSettings(stamp);
      await tx.objectStore('settings').put({ ...current, lastBackupAt: stamp, editsSinceBackup: Math.max(0, current.editsSinceBackup - editsCounted) });
    });
    return backup;
  }

  /** One survey with its photos and the catalog products its entries name, as one survey file. */
  async exportSurvey(surveyId: string): Promise<BackupFile> {
    const { editsCounted: _edits, ...backup } = await exportBackup(this.connection, { surveyId }, this.clock());
    return backup;
  }

  /** What a backup file would bring and whether importing it needs a choice. Throws `invalid-file` for a bad file. */
  async previewImport(text: string): Promise<ImportPreview> {
    return previewImport(this.connection, text);
  }

  /**
   * Restores a backup file: checked whole first (a bad file throws
   * `invalid-file` with the path of every problem and writes nothing), then
   * written in ONE transaction. When its records are already here: 'refuse'
   * (default) throws `conflict`, 'copy' imports under new ids, 'replace' puts
   * the stored surveys in the trash and writes the file's.
   */
  async importBackup(text: string, choice: ClashChoice = 'refuse'): Promise<ImportReport> {
    const stamp = this.stamp();
    try {
      const { report, persistenceRecorded } = await importBackup(this.connection, text, choice, stamp, freshSettings(stamp));
      this.afterRealSave(persistenceRecorded);
      for (const surveyId of report.surveyIds) this.announce({ surveyId, kind: 'layout', ids: [] });
      return report;
    } catch (error) {
      // An id taken while writing (the clash checks passed): say what to do about it.
      if (error instanceof StoreError && error.kind === 'conflict' && error.cause !== undefined) {
        throw new StoreError('conflict', conflictMessage([]), [], { cause: error.cause });
      }
      throw error;
    }
  }
}

/**
 * Opens the store without any start-up work (tests, tools). The app uses
 * {@link startLampwalk}.
 *
 * @example
 * const store = await openSurveyStore({ databaseName: 'lampwalk-test-1' })
 * await store.listSurveys() //=> [] on a new database
 */
export async function openSurveyStore(options: StoreOptions = {}): Promise<SurveyStore> {
  const connection = await openLampwalkDb(options.databaseName ?? defaultDatabaseName, {
    ...(options.onBlocked ? { onBlocked: options.onBlocked } : {}),
    ...(options.onClosed ? { onClosed: options.onClosed } : {}),
    ...(options.blockedTimeoutMs !== undefined ? { blockedTimeoutMs: options.blockedTimeoutMs } : {}),
    ...(options.migrations ? { migrations: options.migrations } : {}),
  });
  return new SurveyStore(connection, options.environment ?? browserEnvironment(), options.clock ?? (() => new Date()));
}

/**
 * How start-up found this device:
 * - `first-run`: never used here; the example catalog and demo survey were seeded.
 * - `returning`: the data is here.
 * - `evicted`: Lampwalk was used here before (a marker outside the database says so) but its data is gone,
 *   most likely deleted by the browser to free space. Nothing was seeded: offer to restore a backup
 *   (`importBackup`, then `initialise`) or to start again (`initialise`).
 */
export type StartState = 'first-run' | 'returning' | 'evicted';

/** What {@link startLampwalk} found. */
export interface StartResult {
  store: SurveyStore;
  state: StartState;
  /** The marker of earlier use, when one was found outside the database. */
  previousUse: UsageMarker | null;
  /** Trash items removed because they were older than the retention period. */
  trashPurged: number;
}

/** Options of {@link startLampwalk}. */
export interface StartOptions extends StoreOptions {
  /** Seed the demo survey on first run (default true). */
  seedDemo?: boolean;
  /**
   * With the demo survey, also seed the landlord scenario: three layout
   * surveys and the demo portfolio (default true; tests that need the demo
   * survey alone turn it off).
   */
  seedDemoPortfolio?: boolean;
}

/**
 * Opens the store for the app: removes expired trash, tells first run from
 * eviction using the markers kept outside IndexedDB, seeds the example
 * catalog and the demo data (survey, layouts, portfolio) on first run, and refreshes the markers.
 *
 * @example
 * const { store, state } = await startLampwalk({ onClosed: () => askToReload() })
 * state //=> 'first-run' the first time, 'returning' after
 */
export async function startLampwalk(options: StartOptions = {}): Promise<StartResult> {
  const store = await openSurveyStore(options);
  const trashPurged = await store.purgeTrash();
  const settings = await store.settings();
  const previousUse = readMarker(store.environment);
  if (settings) {
    writeMarkers(store.environment, { installId: settings.installId, firstUsedAt: settings.firstUsedAt });
    return { store, state: 'returning', previousUse, trashPurged };
  }
  if (previousUse) return { store, state: 'evicted', previousUse, trashPurged };
  await store.initialise({ exampleCatalog: true, demoSurvey: options.seedDemo ?? true, demoPortfolio: options.seedDemoPortfolio ?? true });
  return { store, state: 'first-run', previousUse, trashPurged };
}
