/**
 * Durability: persistent storage asked on the first real save and the answer
 * recorded; storage use reported; eviction told apart from a first run by
 * markers kept outside IndexedDB; a full device becomes a clear typed error
 * with earlier data intact; the backup reminder. Timings and thresholds here
 * are Lampwalk's own (common practice, no published source).
 */
import { describe, expect, it, vi } from 'vitest';
import {
  backupStatus,
  browserEnvironment,
  cookieMarker,
  requestPersistence,
  storageUsage,
  webStorageMarker,
} from '../../src/survey/durability.ts';
import { demoLandlordSurveys, demoPortfolio, demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import { toStoreError } from '../../src/survey/store-error.ts';
import { startLampwalk } from '../../src/survey/store.ts';
import { dumpDatabase } from './fixtures/harness.ts';
import { failure, fakeEnvironment, fakeStorage, testClock, uniqueName } from './helpers.ts';

describe('persistent storage', () => {
  it('is asked on the first real save (not when seeding), once, and the answer is recorded', async () => {
    const storage = fakeStorage(true);
    const environment = fakeEnvironment(storage);
    const name = uniqueName('persist');
    const { store } = await startLampwalk({ databaseName: name, environment });
    await store.whenIdle();
    expect(storage.persistCalls).toBe(0);
    expect((await store.settings())?.persistence).toBeNull();

    await store.updateEntry('demo-shop-troffers', { count: 11 });
    await store.updateEntry('demo-shop-troffers', { count: 12 });
    await store.whenIdle();
    expect(storage.persistCalls).toBe(1);
    expect((await store.settings())?.persistence).toMatchObject({ granted: true });
    store.close();

    // A later session does not ask again.
    const again = await startLampwalk({ databaseName: name, environment });
    await again.store.updateEntry('demo-shop-troffers', { count: 13 });
    await again.store.whenIdle();
    expect(storage.persistCalls).toBe(1);
  });

  it('records a refusal, and "cannot ask" where the browser has no storage manager', async () => {
    for (const [storage, granted] of [
      [fakeStorage(false), false],
      [null, null],
    ] as const) {
      const { store } = await startLampwalk({ databaseName: uniqueName('persist-answer'), environment: fakeEnvironment(storage) });
      await store.updateRoom('demo-stair', { notes: 'Checked.' });
      await store.whenIdle();
      expect((await store.settings())?.persistence?.granted).toBe(granted);
    }
  });

  it('does not ask an origin that is already persistent, and survives a storage manager that throws', async () => {
    const persist = vi.fn(async () => true);
    expect(await requestPersistence({ persisted: async () => true, persist, estimate: async () => ({}) })).toBe(true);
    expect(persist).not.toHaveBeenCalled();
    const broken = { persisted: async () => Promise.reject(new Error('no')), persist, estimate: async () => Promise.reject(new Error('no')) };
    expect(await requestPersistence(broken)).toBeNull();
    expect(await storageUsage(broken)).toBeNull();
  });
});

describe('storage use', () => {
  it('reports navigator.storage.estimate() as bytes and a fraction, or null where there is none', async () => {
    const { store } = await startLampwalk({ databaseName: uniqueName('usage'), environment: fakeEnvironment(fakeStorage(true, 5_000_000, 1_000_000_000)) });
    expect(await store.storageUsage()).toEqual({ usageBytes: 5_000_000, quotaBytes: 1_000_000_000, usedFraction: 0.005 });
    const bare = await startLampwalk({ databaseName: uniqueName('usage-none'), environment: fakeEnvironment(null) });
    expect(await bare.store.storageUsage()).toBeNull();
  });
});

describe('eviction', () => {
  it('first run, then returning; data gone with a marker left is "evicted", and nothing is seeded over it', async () => {
    const environment = fakeEnvironment();
    const first = await startLampwalk({ databaseName: uniqueName('evict'), environment });
    expect(first.state).toBe('first-run');
    const installId = (await first.store.settings())?.installId;
    expect(environment.local.value?.installId).toBe(installId);
    expect(environment.cookie.value?.installId).toBe(installId);
    const backup = await first.store.exportEverything();
    first.store.close();

    // The browser deleted the site's database and its localStorage; the cookie is left.
    environment.local.value = null;
    const after = await startLampwalk({ databaseName: uniqueName('evicted'), environment });
    expect(after.state).toBe('evicted');
    expect(after.previousUse?.installId).toBe(installId);
    expect(await after.store.listSurveys()).toEqual([]);
    expect(await after.store.listCatalog()).toEqual([]);

    // Restoring the backup, then setting up, makes it a returning device again.
    await after.store.importBackup(backup.text);
    await after.store.initialise({ exampleCatalog: false, demoSurvey: false });
    // Everything first run seeded comes back from the backup: the demo survey, the landlord layouts and their portfolio.
    expect((await after.store.listSurveys()).map((survey) => survey.id).sort()).toEqual([demoSurvey(), ...demoLandlordSurveys()].map((survey) => survey.id).sort());
    expect((await after.store.listPortfolios()).map((portfolio) => portfolio.id)).toEqual([demoPortfolio().id]);
    expect(environment.local.value).not.toBeNull();
    const name = after.store.databaseName;
    after.store.close();
    expect((await startLampwalk({ databaseName: name, environment })).state).toBe('returning');
  });

  it('"start again" after an eviction seeds the examples and the demo', async () => {
    const environment = fakeEnvironment();
    environment.cookie.value = { installId: 'old-install', firstUsedAt: '2026-01-01T00:00:00Z' };
    const { store, state } = await startLampwalk({ databaseName: uniqueName('evict-restart'), environment });
    expect(state).toBe('evicted');
    await store.initialise({ exampleCatalog: true, demoSurvey: true });
    expect(await store.listCatalog()).toHaveLength(exampleCatalog.length);
    expect(environment.cookie.value?.installId).not.toBe('old-install');
  });

  it('markers: localStorage and cookie round-trip, the cookie is first-party and long-lived, and failures never throw', () => {
    const items = new Map<string, string>();
    const local = webStorageMarker({ getItem: (key) => items.get(key) ?? null, setItem: (key, value) => void items.set(key, value) });
    local.write({ installId: 'i-1', firstUsedAt: '2026-01-01T00:00:00Z' });
    expect(local.read()).toEqual({ installId: 'i-1', firstUsedAt: '2026-01-01T00:00:00Z' });

    let jar = '';
    const doc = {
      get cookie() {
        return jar;
      },
      set cookie(value: string) {
        jar = `other=1; ${value.split(';')[0]}`;
        written = value;
      },
    };
    let written = '';
    const cookie = cookieMarker(doc, true);
    cookie.write({ installId: 'i-2', firstUsedAt: '2026-02-01T00:00:00Z' });
    expect(written).toMatch(/^lampwalk_usage=[^;]+; Max-Age=34560000; Path=\/; SameSite=Strict; Secure$/);
    expect(cookie.read()).toEqual({ installId: 'i-2', firstUsedAt: '2026-02-01T00:00:00Z' });

    const throwing = webStorageMarker({
      getItem: () => {
        throw new Error('denied');
      },
      setItem: () => {
        throw new Error('full');
      },
    });
    expect(() => throwing.write({ installId: 'x', firstUsedAt: 'y' })).not.toThrow();
    expect(throwing.read()).toBeNull();
    expect(webStorageMarker(undefined).read()).toBeNull();
    items.set('lampwalk.usage', '{not json');
    expect(local.read()).toBeNull();
  });

  it('in Node there is no browser: no storage manager and inert markers', () => {
    const environment = browserEnvironment();
    expect(environment.storage).toBeNull();
    expect(environment.markers.map((place) => place.name)).toEqual(['localStorage', 'cookie']);
    expect(environment.markers.every((place) => place.read() === null)).toBe(true);
  });
});

describe('a full device (QuotaExceededError)', () => {
  function quotaError(): DOMException {
    return new DOMException('The quota has been exceeded.', 'QuotaExceededError');
  }

  it('an edit fails with a clear "quota" StoreError and the stored entry is unchanged', async () => {
    const { store } = await startLampwalk({ databaseName: uniqueName('quota'), environment: fakeEnvironment() });
    const before = await store.getEntry('demo-shop-troffers');
    const edits = (await store.settings())?.editsSinceBackup;
    const put = vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(() => {
      throw quotaError();
    });
    try {
      const error = await failure(store.updateEntry('demo-shop-troffers', { count: 40 }));
      expect(error.kind).toBe('quota');
      expect(error.message).toMatch(/no storage space left/);
      expect(error.message).toMatch(/everything saved before is unchanged/);
      expect(error.cause).toBeInstanceOf(DOMException);
    } finally {
      put.mockRestore();
    }
    expect(await store.getEntry('demo-shop-troffers')).toEqual(before);
    expect((await store.settings())?.editsSinceBackup).toBe(edits);
  });

  it('copying a room to 40 units that runs out of space part-way writes none of it', async () => {
    const name = uniqueName('quota-bulk');
    const { store } = await startLampwalk({ databaseName: name, environment: fakeEnvironment() });
    const before = await dumpDatabase(name);
    const original = IDBObjectStore.prototype.add;
    let calls = 0;
    const add = vi.spyOn(IDBObjectStore.prototype, 'add').mockImplementation(function (this: IDBObjectStore, ...args: Parameters<IDBObjectStore['add']>) {
      calls++;
      if (calls > 30) throw quotaError();
      return original.apply(this, args);
    });
    try {
      expect((await failure(store.copyRoomToUnits('demo-flat1-living', 40))).kind).toBe('quota');
    } finally {
      add.mockRestore();
    }
    expect(calls).toBeGreaterThan(30);
    expect(await dumpDatabase(name)).toEqual(before);
  });

  it('a quota failure reported on the transaction (as some browsers do) is still "quota"', () => {
    expect(toStoreError(quotaError(), 'save the room').kind).toBe('quota');
    expect(toStoreError(new DOMException('Encountered full disk while opening backing store for indexedDB.open. (quota)', 'UnknownError'), 'save').kind).toBe('quota');
    expect(toStoreError(new DOMException('x', 'VersionError'), 'open').kind).toBe('newer-version');
    expect(toStoreError(new DOMException('x', 'InvalidStateError'), 'save').kind).toBe('closed');
    const unknown = toStoreError(new DOMException('x', 'UnknownError'), 'save the entry');
    expect(unknown.kind).toBe('unknown');
    expect(unknown.message).toMatch(/^Could not save the entry: /);
  });
});

describe('backup reminder', () => {
  it('counts edits and time since the last full backup', async () => {
    const clock = testClock('2027-02-01T09:00:00.000Z');
    const { store } = await startLampwalk({ databaseName: uniqueName('reminder'), environment: fakeEnvironment(), clock: clock.now });
    expect(await store.backupStatus()).toEqual({ lastBackupAt: null, editsSinceBackup: 0, timeSinceBackup: null, remind: false });
    await store.updateEntry('demo-shop-troffers', { count: 5 });
    await store.updateRoom('demo-shop', { notes: 'x' });
    expect(await store.backupStatus()).toMatchObject({ editsSinceBackup: 2, remind: true });

    await store.exportEverything();
    clock.advanceDays(2);
    expect(await store.backupStatus()).toMatchObject({ editsSinceBackup: 0, timeSinceBackup: '2 days', remind: false });
    await store.updateEntry('demo-shop-troffers', { count: 6 });
    expect(await store.backupStatus()).toMatchObject({ editsSinceBackup: 1, timeSinceBackup: '2 days', remind: true });
  });

  it('backupStatus reminds only with edits and a backup older than a day', () => {
    const now = new Date('2027-02-05T09:00:00Z');
    expect(backupStatus('2027-02-05T03:00:00Z', 4, now)).toEqual({
      lastBackupAt: '2027-02-05T03:00:00Z',
      editsSinceBackup: 4,
      timeSinceBackup: '6 hours',
      remind: false,
    });
    expect(backupStatus('2027-02-04T09:00:00Z', 1, now).remind).toBe(true);
    expect(backupStatus('2027-01-01T09:00:00Z', 0, now).remind).toBe(false);
  });
});
