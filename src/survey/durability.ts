/**
 * Keeping the data through a life in the field: persistent storage, storage
 * usage, eviction detection and backup reminders.
 *
 * Browsers may delete a site's storage under pressure, or after days without
 * a visit unless the storage is persistent. Lampwalk asks for persistence on
 * the first real save, and keeps a small marker outside IndexedDB (in
 * localStorage and a first-party cookie): when a marker says the app was used
 * before but the database has no settings record, the data was evicted and
 * the user is told so, with the offer to restore a backup.
 */
import { formatDistanceStrict, parseISO } from 'date-fns';

/** The parts of the browser's StorageManager the store uses. */
export interface StorageManagerLike {
  persist(): Promise<boolean>;
  persisted(): Promise<boolean>;
  estimate(): Promise<{ usage?: number; quota?: number }>;
}

/** Proof, kept outside IndexedDB, that Lampwalk was used on this device. */
export interface UsageMarker {
  installId: string;
  /** ISO 8601 timestamp of the first use. */
  firstUsedAt: string;
}

/** One place a usage marker is kept. */
export interface MarkerPlace {
  /** Shown in diagnostics, e.g. "localStorage". */
  readonly name: string;
  read(): UsageMarker | null;
  write(marker: UsageMarker): void;
}

/** What the store needs from the browser for durability; tests pass fakes. */
export interface DurabilityEnvironment {
  /** `navigator.storage`, or null where the browser has none. */
  storage: StorageManagerLike | null;
  /** Where markers are kept (several, because each can be cleared on its own). */
  markers: readonly MarkerPlace[];
}

const markerKey = 'lampwalk.usage';
const cookieName = 'lampwalk_usage';
/** Browsers cap cookie lifetimes at 400 days (RFC 6265bis draft, from memory); the marker is rewritten at every start. */
const cookieMaxAgeSeconds = 400 * 24 * 60 * 60;

function parseMarker(text: string | null | undefined): UsageMarker | null {
  if (!text) return null;
  try {
    const value: unknown = JSON.parse(text);
    if (typeof value !== 'object' || value === null) return null;
    const installId = 'installId' in value ? value.installId : undefined;
    const firstUsedAt = 'firstUsedAt' in value ? value.firstUsedAt : undefined;
    if (typeof installId !== 'string' || typeof firstUsedAt !== 'string' || installId === '') return null;
    return { installId, firstUsedAt };
  } catch {
    return null;
  }
}

/**
 * A marker kept in `localStorage` (or any Web Storage). Never throws: where
 * the storage is missing or refuses writes, it reads nothing and writes nothing.
 *
 * @example
 * webStorageMarker(window.localStorage).read() //=> { installId: '…', firstUsedAt: '…' } or null
 */
export function webStorageMarker(storage: Pick<Storage, 'getItem' | 'setItem'> | undefined): MarkerPlace {
  return {
    name: 'localStorage',
    read() {
      try {
        return parseMarker(storage?.getItem(markerKey));
      } catch {
        return null;
      }
    },
    write(marker) {
      try {
        storage?.setItem(markerKey, JSON.stringify(marker));
      } catch {
        // Full or refused: the cookie marker still holds.
      }
    },
  };
}

/**
 * A marker kept in a first-party cookie (`document.cookie`), which some
 * browsers keep when they evict site storage. Never throws.
 *
 * @example
 * cookieMarker(document, location.protocol === 'https:').write({ installId: 'a1', firstUsedAt: '2024-05-01T09:30:00Z' })
 */
export function cookieMarker(doc: { cookie: string } | undefined, secure: boolean): MarkerPlace {
  return {
    name: 'cookie',
    read() {
      try {
        for (const part of (doc?.cookie ?? '').split(';')) {
          const [name, ...rest] = part.trim().split('=');
          if (name === cookieName) return parseMarker(decodeURIComponent(rest.join('=')));
        }
      } catch {
        // Unreadable cookie: treat as absent.
      }
      return null;
    },
    write(marker) {
      try {
        if (!doc) return;
        const value = encodeURIComponent(JSON.stringify(marker));
        doc.cookie = `${cookieName}=${value}; Max-Age=${cookieMaxAgeSeconds}; Path=/; SameSite=Strict${secure ? '; Secure' : ''}`;
      } catch {
        // Cookies off: localStorage still holds.
      }
    },
  };
}

/**
 * The real browser: `navigator.storage`, `localStorage` and `document.cookie`
 * where they exist; in Node (tests, CLI) storage is null and markers are inert.
 *
 * @example
 * browserEnvironment().markers.map((place) => place.name) //=> ['localStorage', 'cookie']
 */
export function browserEnvironment(): DurabilityEnvironment {
  const nav = (globalThis as { navigator?: { storage?: StorageManagerLike } }).navigator;
  const storage = nav?.storage && typeof nav.storage.persist === 'function' ? nav.storage : null;
  let local: Storage | undefined;
  try {
    local = (globalThis as { localStorage?: Storage }).localStorage;
  } catch {
    local = undefined;
  }
  const doc = (globalThis as { document?: { cookie: string } }).document;
  const secure = (globalThis as { location?: { protocol?: string } }).location?.protocol === 'https:';
  return { storage, markers: [webStorageMarker(local), cookieMarker(doc, secure)] };
}

/**
 * The first marker found, or null when none of the places has one.
 *
 * @example
 * readMarker(browserEnvironment()) //=> { installId: '…', firstUsedAt: '…' } after a first run, else null
 */
export function readMarker(environment: DurabilityEnvironment): UsageMarker | null {
  for (const place of environment.markers) {
    const marker = place.read();
    if (marker) return marker;
  }
  return null;
}

/**
 * Writes the marker to every place.
 *
 * @example
 * writeMarkers(environment, { installId: 'a1', firstUsedAt: '2024-05-01T09:30:00Z' }) //=> undefined
 */
export function writeMarkers(environment: DurabilityEnvironment, marker: UsageMarker): void {
  for (const place of environment.markers) place.write(marker);
}

/**
 * Asks the browser to keep Lampwalk's storage (not to evict it under
 * pressure). Returns true when granted, false when refused, null when this
 * browser cannot be asked. An already persistent origin is not asked again.
 *
 * @example
 * await requestPersistence(navigator.storage) //=> true
 */
export async function requestPersistence(storage: StorageManagerLike | null): Promise<boolean | null> {
  if (!storage) return null;
  try {
    if (await storage.persisted()) return true;
    return await storage.persist();
  } catch {
    return null;
  }
}

/** How much the browser says Lampwalk stores, and how much it may. */
export interface StorageUsage {
  usageBytes: number;
  quotaBytes: number;
  /** usage ÷ quota, 0–1. */
  usedFraction: number;
}

/**
 * Storage use from `navigator.storage.estimate()`, or null where the browser
 * does not say. Browsers round and pad these figures on purpose.
 *
 * @example
 * await storageUsage({ …, estimate: async () => ({ usage: 5e6, quota: 1e9 }) })
 * //=> { usageBytes: 5000000, quotaBytes: 1000000000, usedFraction: 0.005 }
 */
export async function storageUsage(storage: StorageManagerLike | null): Promise<StorageUsage | null> {
  if (!storage) return null;
  try {
    const { usage, quota } = await storage.estimate();
    if (typeof usage !== 'number' || typeof quota !== 'number' || !(quota > 0)) return null;
    return { usageBytes: usage, quotaBytes: quota, usedFraction: Math.min(1, usage / quota) };
  } catch {
    return null;
  }
}

/** Hours after which unsaved edits earn a backup reminder (Lampwalk's own choice: once a working day). */
export const backupReminderHours = 24;

/** What the screens show to remind the user to back up. */
export interface BackupStatus {
  lastBackupAt: string | null;
  editsSinceBackup: number;
  /** "3 days", "5 hours"… since the last backup; null when there has been none. */
  timeSinceBackup: string | null;
  /** True when there are edits since the last backup and it is older than {@link backupReminderHours} (or there is none). */
  remind: boolean;
}

/**
 * The backup reminder from the settings' last backup time and edit count.
 *
 * @example
 * backupStatus('2024-05-01T09:00:00Z', 12, new Date('2024-05-04T09:00:00Z'))
 * //=> { lastBackupAt: '2024-05-01T09:00:00Z', editsSinceBackup: 12, timeSinceBackup: '3 days', remind: true }
 */
export function backupStatus(lastBackupAt: string | null, editsSinceBackup: number, now: Date): BackupStatus {
  if (lastBackupAt === null) {
    return { lastBackupAt, editsSinceBackup, timeSinceBackup: null, remind: editsSinceBackup > 0 };
  }
  const last = parseISO(lastBackupAt);
  const hours = (now.getTime() - last.getTime()) / 3_600_000;
  return {
    lastBackupAt,
    editsSinceBackup,
    timeSinceBackup: formatDistanceStrict(last, now),
    remind: editsSinceBackup > 0 && hours >= backupReminderHours,
  };
}
