/**
 * The one IndexedDB schema of Lampwalk, its migrations and the only way the
 * database is opened ({@link openLampwalkDb}). Screens never use this file:
 * they call the repository in `src/survey/store.ts`.
 *
 * Transaction discipline (see {@link Connection}): every transaction is
 * awaited to completion, nothing unrelated (no calculation, timer, network or
 * Blob reading) is awaited inside one, and every failure leaves as a
 * {@link StoreError} with nothing of the failed transaction written.
 */
import { openDB, unwrap, type DBSchema, type IDBPDatabase, type IDBPTransaction, type StoreNames, type StoreValue } from 'idb';
import type {
  AppSettings,
  CatalogProduct,
  Photo,
  PhotoThumbnail,
  Portfolio,
  StoredEntry,
  StoredRoom,
  SurveyHeader,
  TrashItem,
} from './model.ts';
import { StoreError, toStoreError } from './store-error.ts';

/** Name of the database the app uses. Tests pass their own names. */
export const defaultDatabaseName = 'lampwalk';

/** Key of the one settings record. */
export const settingsKey = 'app';

/** The settings record as stored. */
export interface StoredSettings extends AppSettings {
  key: typeof settingsKey;
}

/** A photo as stored: the full image, without the thumbnail (which has a store of its own). */
export type StoredPhoto = Omit<Photo, 'thumbnail' | 'thumbnailMimeType'>;

/** The database, store by store. Indexes: survey → rooms, room → entries, survey → entries, owner → photos. */
export interface LampwalkDB extends DBSchema {
  surveys: { key: string; value: SurveyHeader };
  rooms: { key: string; value: StoredRoom; indexes: { bySurvey: string } };
  entries: { key: string; value: StoredEntry; indexes: { byRoom: string; bySurvey: string } };
  catalog: { key: string; value: CatalogProduct };
  photos: { key: string; value: StoredPhoto; indexes: { byOwner: string; bySurvey: string } };
  thumbnails: { key: string; value: PhotoThumbnail; indexes: { byOwner: string; bySurvey: string } };
  trash: { key: string; value: TrashItem; indexes: { byDeletedAt: string } };
  settings: { key: string; value: StoredSettings };
  portfolios: { key: string; value: Portfolio };
}

/** Names of the stores. */
export type StoreName = StoreNames<LampwalkDB>;

/** Every store, for transactions that touch them all. */
export const allStores = [
  'surveys',
  'rooms',
  'entries',
  'catalog',
  'photos',
  'thumbnails',
  'trash',
  'settings',
  'portfolios',
] as const satisfies readonly StoreName[];

/**
 * One schema upgrade: step n (at index n − 1) takes a database from version
 * n − 1 to n. The database handed over is untyped on purpose: a step describes
 * the schema as it was when that version shipped, not as it is now.
 */
export type Migration = (
  database: IDBPDatabase<unknown>,
  transaction: IDBPTransaction<unknown, string[], 'versionchange'>,
) => void;

/**
 * Every schema version, cumulative: opening a database at version k runs the
 * steps k + 1 … current in order (the `if (oldVersion < n)` blocks). Never
 * delete or change a step once released: add a new one, a fixture of the
 * version before it in `tests/store/fixtures/`, and a test that the fixture's
 * records survive.
 */
export const lampwalkMigrations: readonly Migration[] = [
  // Version 1: the first schema.
  (database) => {
    database.createObjectStore('surveys', { keyPath: 'id' });
    const rooms = database.createObjectStore('rooms', { keyPath: 'id' });
    rooms.createIndex('bySurvey', 'surveyId');
    const entries = database.createObjectStore('entries', { keyPath: 'id' });
    entries.createIndex('byRoom', 'roomId');
    entries.createIndex('bySurvey', 'surveyId');
    database.createObjectStore('catalog', { keyPath: 'id' });
    const photos = database.createObjectStore('photos', { keyPath: 'id' });
    photos.createIndex('byOwner', 'ownerId');
    photos.createIndex('bySurvey', 'surveyId');
    const thumbnails = database.createObjectStore('thumbnails', { keyPath: 'id' });
    thumbnails.createIndex('byOwner', 'ownerId');
    thumbnails.createIndex('bySurvey', 'surveyId');
    const trash = database.createObjectStore('trash', { keyPath: 'id' });
    trash.createIndex('byDeletedAt', 'deletedAt');
    database.createObjectStore('settings', { keyPath: 'key' });
  },
  // Version 2: portfolios (groups of surveys planned together). Surveys gain
  // an optional `layout` field in their own records, which needs no step.
  (database) => {
    database.createObjectStore('portfolios', { keyPath: 'id' });
  },
];

/** The schema version this build creates and reads. */
export const schemaVersion: number = lampwalkMigrations.length;

/** Why this tab's connection was closed. */
export type ClosedReason = 'newer-version-elsewhere' | 'deleted-elsewhere' | 'terminated' | 'closed';

/** What the screens hear about while the database is open. */
export interface OpenHooks {
  /**
   * Another tab has an older Lampwalk open and has not let go of the
   * database. Ask the user to close that tab; opening goes on by itself as
   * soon as it does (nothing is upgraded before then).
   */
  onBlocked?: () => void;
  /**
   * This tab's connection was closed: a newer Lampwalk opened the database in
   * another tab (running transactions finish first, so nothing is cut short),
   * or the browser closed it. Ask the user to reload.
   */
  onClosed?: (reason: ClosedReason) => void;
}

const closedMessages: Record<ClosedReason, string> = {
  'newer-version-elsewhere':
    'Lampwalk was updated in another tab, so this tab has stopped saving. Reload this page to continue; everything saved so far is kept.',
  'deleted-elsewhere':
    'Lampwalk’s saved data was deleted (in another tab, or by clearing the browser’s site data). Reload this page; you can restore a backup there.',
  terminated: 'The browser closed Lampwalk’s saved data unexpectedly. Reload this page; everything saved so far is kept.',
  closed: 'Lampwalk’s saved data is closed in this tab. Reload this page to continue.',
};

/** A transaction over any stores of the database. */
export type AnyTx<M extends IDBTransactionMode> = IDBPTransaction<LampwalkDB, StoreName[], M>;
/** A read-only transaction. */
export type ReadTx = AnyTx<'readonly'>;
/** A read-write transaction. */
export type WriteTx = AnyTx<'readwrite'>;

/**
 * Keeps a request's promise from being reported as unhandled when the
 * transaction aborts; await the tracked promises together with `Promise.all`.
 *
 * @example
 * await Promise.all([tracked(store.put(a)), tracked(store.put(b))]) //=> [a.id, b.id]
 */
export function tracked<T>(promise: Promise<T>): Promise<T> {
  promise.catch(() => undefined);
  return promise;
}

/**
 * Adds many records to one store of a read-write transaction without a
 * promise per record (for bulk writes of thousands of records). A record that
 * cannot be added aborts the whole transaction; the failure then reaches the
 * caller of {@link Connection.write} as a StoreError (`conflict` for an id
 * already stored).
 *
 * @example
 * addAll(tx, 'entries', records.entries) //=> undefined (the records are written when `tx` commits)
 */
export function addAll<N extends StoreName>(tx: WriteTx, storeName: N, values: Iterable<StoreValue<LampwalkDB, N>>): void {
  const store = unwrap(tx.objectStore(storeName));
  for (const value of values) store.add(value);
}

/**
 * An open database with the transaction discipline built in. Use
 * {@link Connection.read} and {@link Connection.write}; both await the whole
 * transaction and turn every failure into a {@link StoreError}.
 */
export class Connection {
  #closed: ClosedReason | null = null;

  constructor(
    private readonly db: IDBPDatabase<LampwalkDB>,
    readonly name: string,
  ) {}

  /** Why the connection is closed, or null while it is open. */
  get closedReason(): ClosedReason | null {
    return this.#closed;
  }

  /** Closes the connection (transactions already running finish first). */
  close(reason: ClosedReason = 'closed'): void {
    if (this.#closed) return;
    this.#closed = reason;
    this.db.close();
  }

  private begin<M extends IDBTransactionMode>(
    stores: readonly StoreName[],
    mode: M,
    doing: string,
    durability: IDBTransactionDurability,
  ): { tx: AnyTx<M>; ended: Promise<void> } {
    if (this.#closed) throw new StoreError('closed', closedMessages[this.#closed]);
    let tx: AnyTx<M>;
    try {
      tx = this.db.transaction([...stores], mode, { durability });
    } catch (error) {
      throw toStoreError(error, doing);
    }
    // Settles when the transaction has really ended (committed or aborted), when `tx.error` holds the cause.
    const ended = new Promise<void>((resolve) => {
      tx.addEventListener('complete', () => resolve());
      tx.addEventListener('abort', () => resolve());
    });
    return { tx, ended };
  }

  /**
   * Runs `body` in one read-only transaction over `stores` and returns its
   * result once the transaction has completed. `doing` completes
   * "Could not …" in error messages.
   */
  async read<T>(stores: readonly StoreName[], doing: string, body: (tx: ReadTx) => Promise<T>): Promise<T> {
    return this.finish(this.begin(stores, 'readonly', doing, 'default'), doing, body);
  }

  /**
   * Runs `body` in one read-write transaction over `stores`: either
   * everything it wrote is saved (the promise resolves after the commit) or
   * nothing is (the transaction is aborted and the promise rejects with a
   * StoreError). The body must only await requests of `tx`.
   */
  async write<T>(
    stores: readonly StoreName[],
    doing: string,
    body: (tx: WriteTx) => Promise<T>,
    durability: IDBTransactionDurability = 'default',
  ): Promise<T> {
    return this.finish(this.begin(stores, 'readwrite', doing, durability), doing, body);
  }

  private async finish<M extends IDBTransactionMode, T>(
    { tx, ended }: { tx: AnyTx<M>; ended: Promise<void> },
    doing: string,
    body: (tx: AnyTx<M>) => Promise<T>,
  ): Promise<T> {
    try {
      const result = await body(tx);
      await tx.done;
      return result;
    } catch (error) {
      try {
        tx.abort();
      } catch {
        // Already finished or aborted by the failing request.
      }
      await tx.done.catch(() => undefined);
      await ended;
      // The failure often arrives as a bare AbortError (a request's error
      // event bubbling up, or a quota failure at commit) while the
      // transaction's own `error` names the cause.
      const cause = tx.error;
      const generic = !(error instanceof StoreError) && (!(error instanceof Error) || error.name === 'AbortError');
      const reason = cause && (generic || cause.name === 'QuotaExceededError') ? cause : error;
      throw toStoreError(reason, doing);
    }
  }
}

/** Options of {@link openLampwalkDb}. */
export interface OpenOptions extends OpenHooks {
  /**
   * Give up waiting for another tab after this many milliseconds once
   * blocked, failing with a `blocked` StoreError (the pending open is closed
   * as soon as it completes). Default: wait until the other tab lets go.
   */
  blockedTimeoutMs?: number;
  /** The schema steps to apply; tests pass extra steps to act as a newer build. Defaults to {@link lampwalkMigrations}. */
  migrations?: readonly Migration[];
}

const blockedMessage =
  'Lampwalk is open in another tab with an older version, which keeps this one from starting. Close the other Lampwalk tabs, then reload this page.';

/**
 * Opens (creating or upgrading as needed) the database `name`: the only place
 * the app opens IndexedDB. Fails with a StoreError: `newer-version` when a
 * newer Lampwalk wrote it (nothing is touched), `unavailable` when the browser
 * offers no IndexedDB, `blocked` when another tab kept it past
 * `blockedTimeoutMs`, `unknown` for anything else. A failed upgrade is rolled
 * back whole by the browser.
 *
 * @example
 * const connection = await openLampwalkDb('lampwalk', { onClosed: () => showReloadBanner() })
 * connection.closedReason //=> null
 */
export async function openLampwalkDb(name: string, options: OpenOptions = {}): Promise<Connection> {
  const steps = options.migrations ?? lampwalkMigrations;
  if (typeof indexedDB === 'undefined') {
    throw new StoreError(
      'unavailable',
      'This browser does not let Lampwalk keep data here (a private window, or storage turned off in the settings). Open Lampwalk in a normal window.',
    );
  }
  let connection: Connection | null = null;
  let abandoned = false;
  let timer: ReturnType<typeof setTimeout> | undefined;
  let giveUp: ((error: StoreError) => void) | undefined;
  const gaveUp = new Promise<never>((_resolve, reject) => {
    giveUp = reject;
  });
  gaveUp.catch(() => undefined);
  const opening = openDB<LampwalkDB>(name, steps.length, {
    upgrade(database, oldVersion, _newVersion, transaction) {
      const untypedDb = database as unknown as IDBPDatabase<unknown>;
      const untypedTx = transaction as unknown as IDBPTransaction<unknown, string[], 'versionchange'>;
      for (let version = oldVersion; version < steps.length; version++) steps[version]?.(untypedDb, untypedTx);
    },
    blocked() {
      options.onBlocked?.();
      if (options.blockedTimeoutMs !== undefined && timer === undefined) {
        timer = setTimeout(() => giveUp?.(new StoreError('blocked', blockedMessage)), options.blockedTimeoutMs);
      }
    },
    blocking(_currentVersion, blockedVersion) {
      // A newer Lampwalk wants to upgrade (or someone deletes the database):
      // let go at once (running transactions still complete) and tell this tab to reload.
      const reason: ClosedReason = blockedVersion === null ? 'deleted-elsewhere' : 'newer-version-elsewhere';
      connection?.close(reason);
      options.onClosed?.(reason);
    },
    terminated() {
      connection?.close('terminated');
      options.onClosed?.('terminated');
    },
  });
  // If this call gave up, close the database whenever the open does complete.
  opening.then(
    (db) => {
      if (abandoned) db.close();
    },
    () => undefined,
  );
  let db: IDBPDatabase<LampwalkDB>;
  try {
    db = await Promise.race([opening, gaveUp]);
  } catch (error) {
    abandoned = true;
    throw toStoreError(error, 'open the saved data');
  } finally {
    clearTimeout(timer);
  }
  connection = new Connection(db, name);
  return connection;
}
