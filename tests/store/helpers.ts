/**
 * Shared pieces of the store tests: a fresh database name per test, a fake
 * browser environment, a settable clock, small photos, a counter of the
 * transactions a call opens, and the StoreError a call must fail with.
 */
import 'fake-indexeddb/auto';
import { vi } from 'vitest';
import type { DurabilityEnvironment, MarkerPlace, StorageManagerLike, UsageMarker } from '../../src/survey/durability.ts';
import type { NewPhoto } from '../../src/survey/photos.ts';
import { StoreError, openSurveyStore, type StoreOptions, type SurveyStore } from '../../src/survey/store.ts';

/** A database name no other test uses. */
export function uniqueName(label = 'store'): string {
  return `lampwalk-test-${label}-${crypto.randomUUID()}`;
}

/** A marker place kept in memory. */
export function memoryMarker(name: string): MarkerPlace & { value: UsageMarker | null } {
  const place = {
    name,
    value: null as UsageMarker | null,
    read: () => place.value,
    write: (marker: UsageMarker) => {
      place.value = marker;
    },
  };
  return place;
}

/** A fake `navigator.storage` that records what was asked. */
export function fakeStorage(answer: boolean, usage = 1_234_567, quota = 1_000_000_000): StorageManagerLike & { persistCalls: number } {
  const storage = {
    persistCalls: 0,
    persisted: async () => false,
    persist: async () => {
      storage.persistCalls++;
      return answer;
    },
    estimate: async () => ({ usage, quota }),
  };
  return storage;
}

/** A browser environment with in-memory markers and a fake storage manager. */
export function fakeEnvironment(storage: StorageManagerLike | null = fakeStorage(true)): DurabilityEnvironment & {
  local: ReturnType<typeof memoryMarker>;
  cookie: ReturnType<typeof memoryMarker>;
} {
  const local = memoryMarker('localStorage');
  const cookie = memoryMarker('cookie');
  return { storage, markers: [local, cookie], local, cookie };
}

/** A clock the test moves by hand. */
export function testClock(start = '2026-03-02T08:00:00.000Z'): { now: () => Date; set: (iso: string) => void; advanceDays: (days: number) => void } {
  let current = new Date(start);
  return {
    now: () => new Date(current.getTime()),
    set: (iso) => {
      current = new Date(iso);
    },
    advanceDays: (days) => {
      current = new Date(current.getTime() + days * 86_400_000);
    },
  };
}

/** Opens a store on a fresh database with a fake environment. */
export async function freshStore(options: StoreOptions = {}): Promise<SurveyStore> {
  return openSurveyStore({ databaseName: uniqueName(), environment: fakeEnvironment(), ...options });
}

/** The bytes of a 1 × 1 PNG (a valid image, made by hand). */
export const tinyPngBase64 = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==';

/** Deterministic pseudo-photo bytes of a given size (content is not an image; the store does not decode pictures). */
export function patternBytes(size: number, seed: number): Uint8Array<ArrayBuffer> {
  const bytes = new Uint8Array(size);
  let state = seed >>> 0;
  for (let index = 0; index < size; index++) {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    bytes[index] = state >>> 24;
  }
  return bytes;
}

/** A new photo of `ownerId` with distinct image and thumbnail bytes (every byte value 0–255 appears). */
export function newPhoto(ownerKind: 'room' | 'entry', ownerId: string, seed = 1): NewPhoto {
  return {
    ownerKind,
    ownerId,
    mimeType: 'image/jpeg',
    widthPixels: 1600,
    heightPixels: 1200,
    image: new Blob([patternBytes(40_000, seed)], { type: 'image/jpeg' }),
    thumbnailMimeType: 'image/webp',
    thumbnail: new Blob([patternBytes(3_000, seed + 1000)], { type: 'image/webp' }),
  };
}

/** The bytes of a Blob. */
export async function bytesOf(blob: Blob): Promise<Uint8Array> {
  return new Uint8Array(await blob.arrayBuffer());
}

/** Stores that hold the user's survey data (the settings store, written in the background, is not one of them). */
const dataStores = new Set(['surveys', 'rooms', 'entries', 'catalog', 'photos', 'thumbnails', 'trash']);

/**
 * Counts the transactions opened while `run` runs, by mode: all of them, and
 * those whose scope includes survey data (leaving out the background
 * transaction that records the persistent-storage answer in the settings).
 * Counts the database's own `transaction()` calls, so nothing the store does
 * can hide one.
 */
export async function countTransactions<T>(
  run: () => Promise<T>,
): Promise<{ result: T; readwrite: number; readonly: number; dataWrites: number; dataReads: number }> {
  const spy = vi.spyOn(IDBDatabase.prototype, 'transaction');
  try {
    const result = await run();
    let readwrite = 0;
    let readonly = 0;
    let dataWrites = 0;
    let dataReads = 0;
    for (const [scope, mode] of spy.mock.calls) {
      const names = typeof scope === 'string' ? [scope] : [...scope];
      const touchesData = names.some((name) => dataStores.has(name));
      if (mode === 'readwrite') {
        readwrite++;
        if (touchesData) dataWrites++;
      } else {
        readonly++;
        if (touchesData) dataReads++;
      }
    }
    return { result, readwrite, readonly, dataWrites, dataReads };
  } finally {
    spy.mockRestore();
  }
}

/**
 * The StoreError `promise` rejects with; throws when it resolves or rejects with anything else.
 *
 * @example (await failure(store.loadSurvey('nope'))).kind //=> 'not-found'
 */
export async function failure(promise: Promise<unknown>): Promise<StoreError> {
  const error = await promise.then(
    () => new Error('expected a StoreError, but the call succeeded'),
    (caught: unknown) => caught,
  );
  if (!(error instanceof StoreError)) throw error;
  return error;
}
