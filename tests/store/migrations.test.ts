/**
 * Schema migrations, opening order and version checks. Each fixture in
 * `fixtures/` is a database exactly as a released schema version wrote it;
 * every one is opened with today's code: every fixture of a version older
 * than this build's is upgraded to the current version (its stores and
 * indexes must then be exactly those a new database gets) and every record
 * must survive. New fixtures are picked up from the folder by name (`vN.json`).
 * (With schema version 1 only, the v1 fixture checks the harness and that
 * opening an existing database changes nothing.) The run prints
 * "migrations: upgraded from versions [...] to N, M records checked".
 */
import { readdirSync, readFileSync } from 'node:fs';
import { openDB } from 'idb';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { lampwalkMigrations, schemaVersion, type Migration } from '../../src/survey/db.ts';
import { StoreError, openSurveyStore, startLampwalk } from '../../src/survey/store.ts';
import { dumpDatabase, structureOf, writeFixtureDatabase, type DatabaseFixture } from './fixtures/harness.ts';
import { bytesOf, fakeEnvironment, uniqueName } from './helpers.ts';

const fixturesDir = new URL('./fixtures/', import.meta.url);
const fixtureVersions = readdirSync(fixturesDir)
  .map((file) => /^v(\d+)\.json$/.exec(file)?.[1])
  .filter((version): version is string => version !== undefined)
  .map(Number)
  .sort((a, b) => a - b);

function loadFixture(version: number): DatabaseFixture {
  return JSON.parse(readFileSync(new URL(`v${version}.json`, fixturesDir), 'utf8')) as DatabaseFixture;
}

/**
 * The fixture's records as today's schema should hold them after the
 * upgrade. When a migration rewrites records, apply the same change here for
 * fixtures older than its version (and keep the old branches).
 */
function expectedAfterUpgrade(fixture: DatabaseFixture): DatabaseFixture {
  return fixture;
}

/** Records of a store keyed by their key path value. */
function byKey(fixture: DatabaseFixture, storeName: string): Map<string, unknown> {
  const store = fixture.stores[storeName];
  if (!store || typeof store.keyPath !== 'string') throw new Error(`fixture has no store ${storeName} with a simple key path`);
  const keyPath = store.keyPath;
  return new Map(store.records.map((record) => [String((record as Record<string, unknown>)[keyPath]), record]));
}

/** A hypothetical next schema version, for the opening-order tests: adds a store and an index. */
const nextVersionStep: Migration = (database, transaction) => {
  database.createObjectStore('sketches', { keyPath: 'id' });
  transaction.objectStore('rooms').createIndex('byName', 'name');
};

describe('fixtures', () => {
  it('there is a fixture for every schema version, 1 to the current one', () => {
    expect(schemaVersion).toBeGreaterThanOrEqual(1);
    expect(fixtureVersions).toEqual(Array.from({ length: schemaVersion }, (_, index) => index + 1));
  });

  it('the newest fixture has exactly the stores and indexes this build creates (a released step was not edited)', async () => {
    const name = uniqueName('structure');
    const store = await openSurveyStore({ databaseName: name, environment: fakeEnvironment() });
    store.close();
    const fresh = await dumpDatabase(name);
    const newest = loadFixture(schemaVersion);
    expect(fresh.schemaVersion).toBe(newest.schemaVersion);
    expect(structureOf(fresh)).toEqual(structureOf(newest));
  });

  it('the harness recreates a fixture byte for byte (dump of the written database equals the fixture)', async () => {
    const fixture = loadFixture(1);
    const name = uniqueName('harness');
    await writeFixtureDatabase(name, fixture);
    const dumped = await dumpDatabase(name, fixture.description);
    expect(dumped).toEqual(fixture);
    expect(fixture.stores.photos?.records.length).toBeGreaterThan(0);
    expect(fixture.stores.trash?.records.length).toBeGreaterThan(0);
  });
});

/** What the upgrade loop below checked, printed at the end. */
const upgrades = { fromVersions: new Set<number>(), recordsChecked: 0, currentVersionRecords: 0 };

afterAll(() => {
  const from = [...upgrades.fromVersions].sort((a, b) => a - b);
  console.log(
    `migrations: upgraded from versions [${from.join(', ')}] to ${schemaVersion}, ${upgrades.recordsChecked} records checked` +
      ` (and ${upgrades.currentVersionRecords} records of the version ${schemaVersion} fixture reopened unchanged)`,
  );
});

describe.each(fixtureVersions)('a database written by schema version %i', (version) => {
  it(version < schemaVersion ? 'upgrades to the current version with this build and every record survives' : 'opens with this build and every record survives', async () => {
    const fixture = loadFixture(version);
    const name = uniqueName(`v${version}`);
    await writeFixtureDatabase(name, fixture);

    const store = await openSurveyStore({ databaseName: name, environment: fakeEnvironment() });
    store.close();
    const after = await dumpDatabase(name);
    expect(after.schemaVersion).toBe(schemaVersion);

    const expected = expectedAfterUpgrade(fixture);
    let checked = 0;
    for (const storeName of Object.keys(expected.stores)) {
      const want = byKey(expected, storeName);
      const got = byKey(after, storeName);
      expect(got.size, `records in ${storeName}`).toBe(want.size);
      for (const [key, record] of want) {
        expect(got.get(key), `${storeName} ${key}`).toEqual(record);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(20);
    if (version < schemaVersion) {
      // Upgraded all the way: exactly the stores and indexes a new database of this build has.
      const freshName = uniqueName(`v${version}-fresh`);
      const fresh = await openSurveyStore({ databaseName: freshName, environment: fakeEnvironment() });
      fresh.close();
      expect(structureOf(after)).toEqual(structureOf(await dumpDatabase(freshName)));
      upgrades.fromVersions.add(version);
      upgrades.recordsChecked += checked;
    } else {
      upgrades.currentVersionRecords += checked;
    }
  });

  it('its surveys load, calculate, and its photos, trash and settings read back through the store', async () => {
    const fixture = loadFixture(version);
    const name = uniqueName(`v${version}-api`);
    await writeFixtureDatabase(name, fixture);
    const environment = fakeEnvironment();
    const { store, state } = await startLampwalk({ databaseName: name, environment, clock: () => new Date('2026-03-06T08:00:00Z') });
    // Data and settings are there: not a first run (nothing re-seeded), not an eviction.
    expect(state).toBe('returning');

    const surveys = await store.listSurveys();
    expect(surveys.map((survey) => survey.id).sort()).toEqual([...byKey(fixture, 'surveys').keys()].sort());
    let entries = 0;
    for (const header of surveys) {
      const survey = await store.loadSurvey(header.id);
      const result = calculateSurvey(survey);
      expect(result.surveyId).toBe(header.id);
      entries += result.totals.entries;
    }
    expect(entries).toBe(fixture.stores.entries?.records.length);

    for (const record of fixture.stores.photos?.records ?? []) {
      const stored = record as { id: string; image: { $blob: { base64: string } } };
      const photo = await store.getPhoto(stored.id);
      expect(Buffer.from(await bytesOf(photo.image)).toString('base64')).toBe(stored.image.$blob.base64);
    }
    expect((await store.listTrash()).length).toBe(fixture.stores.trash?.records.length);
    const { key: _key, ...settings } = fixture.stores.settings?.records[0] as Record<string, unknown>;
    expect(await store.settings()).toEqual(settings);
    // The markers outside the database are written from the stored install id.
    expect(environment.local.value?.installId).toBe(settings.installId);
    store.close();
  });
});

describe('a database written by a newer Lampwalk', () => {
  it('is refused with a clear message, and nothing in it is touched', async () => {
    const name = uniqueName('newer');
    const future = await openDB(name, schemaVersion + 3, {
      upgrade(database) {
        database.createObjectStore('surveys', { keyPath: 'id' });
        database.createObjectStore('floorPlans', { keyPath: 'id' });
      },
    });
    await future.put('surveys', { id: 'future-survey', name: 'Written by a newer build', shape: 'unknown to us' });
    await future.put('floorPlans', { id: 'plan-1', svg: '<svg/>' });
    future.close();
    const before = await dumpDatabase(name);

    const environment = fakeEnvironment();
    const failure = await startLampwalk({ databaseName: name, environment }).catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(StoreError);
    expect((failure as StoreError).kind).toBe('newer-version');
    expect((failure as StoreError).message).toMatch(/saved by a newer version of Lampwalk/);
    expect((failure as StoreError).message).toMatch(/Nothing was changed/);

    expect(await dumpDatabase(name)).toEqual(before);
    expect(before.schemaVersion).toBe(schemaVersion + 3);
    // Nothing was seeded and no marker was written.
    expect(environment.local.value).toBeNull();
    expect(environment.cookie.value).toBeNull();
  });
});

describe('another tab holding the database', () => {
  it('blocked: an older tab that does not let go holds the upgrade back; it runs when that tab closes, and every record survives', async () => {
    const fixture = loadFixture(schemaVersion);
    const name = uniqueName('blocked');
    await writeFixtureDatabase(name, fixture);
    // An older build in another tab, with no versionchange handling at all.
    const oldTab = await openDB(name);
    const onBlocked = vi.fn();
    const opening = openSurveyStore({
      databaseName: name,
      environment: fakeEnvironment(),
      migrations: [...lampwalkMigrations, nextVersionStep],
      onBlocked,
    });
    await vi.waitFor(() => expect(onBlocked).toHaveBeenCalledTimes(1));
    // While blocked, the old tab still reads everything at the old version.
    expect(oldTab.version).toBe(schemaVersion);
    expect(await oldTab.count('entries')).toBe(fixture.stores.entries?.records.length);

    oldTab.close();
    const store = await opening;
    store.close();
    const after = await dumpDatabase(name);
    expect(after.schemaVersion).toBe(schemaVersion + 1);
    expect(after.stores.sketches?.records).toEqual([]);
    expect(after.stores.rooms?.indexes.map((index) => index.name)).toContain('byName');
    for (const storeName of Object.keys(fixture.stores)) {
      expect(after.stores[storeName]?.records, storeName).toEqual(fixture.stores[storeName]?.records);
    }
  });

  it('blocked past the time limit: fails with a "blocked" StoreError and leaves the database as it was', async () => {
    const fixture = loadFixture(schemaVersion);
    const name = uniqueName('blocked-timeout');
    await writeFixtureDatabase(name, fixture);
    const oldTab = await openDB(name);
    const failure = await openSurveyStore({
      databaseName: name,
      environment: fakeEnvironment(),
      migrations: [...lampwalkMigrations, nextVersionStep],
      blockedTimeoutMs: 50,
    }).catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(StoreError);
    expect((failure as StoreError).kind).toBe('blocked');
    expect((failure as StoreError).message).toMatch(/Close the other Lampwalk tabs/);
    expect(oldTab.version).toBe(schemaVersion);
    expect(await oldTab.getAll('surveys')).toEqual(fixture.stores.surveys?.records);
    oldTab.close();
    // The abandoned open completes once the old tab let go, and closes itself: a later open is not blocked.
    const onBlocked = vi.fn();
    const again = await openSurveyStore({ databaseName: name, environment: fakeEnvironment(), migrations: [...lampwalkMigrations, nextVersionStep], onBlocked });
    expect(onBlocked).not.toHaveBeenCalled();
    expect(await again.listSurveys()).toHaveLength(fixture.stores.surveys?.records.length ?? -1);
    again.close();
  });

  it('blocking: this tab lets a newer build upgrade, finishes its running edit, then says to reload', async () => {
    const name = uniqueName('blocking');
    const onClosed = vi.fn();
    const { store } = await startLampwalk({ databaseName: name, environment: fakeEnvironment(), onClosed });
    const [entry] = await store.listEntries('demo-shop');
    if (!entry) throw new Error('demo has no shop entry');

    const edit = store.updateEntry(entry.id, { count: 99 }); // running when the newer tab arrives
    const newer = await openSurveyStore({
      databaseName: name,
      environment: fakeEnvironment(),
      migrations: [...lampwalkMigrations, nextVersionStep],
    });
    expect(onClosed).toHaveBeenCalledWith('newer-version-elsewhere');
    await expect(edit).resolves.toMatchObject({ count: 99 });

    const later = await store.listSurveys().catch((error: unknown) => error);
    expect(later).toBeInstanceOf(StoreError);
    expect((later as StoreError).kind).toBe('closed');
    expect((later as StoreError).message).toMatch(/Reload this page/);

    // The newer build sees the finished edit.
    expect((await newer.getEntry(entry.id)).count).toBe(99);
    newer.close();
  });

  it('a deletion from elsewhere (another tab, or clearing site data) closes this tab with its own reason', async () => {
    const name = uniqueName('deleted');
    const onClosed = vi.fn();
    const { store } = await startLampwalk({ databaseName: name, environment: fakeEnvironment(), onClosed });
    await new Promise<void>((resolve, reject) => {
      const request = indexedDB.deleteDatabase(name);
      request.onsuccess = () => resolve();
      request.onerror = () => reject(request.error);
    });
    expect(onClosed).toHaveBeenCalledWith('deleted-elsewhere');
    const later = await store.listSurveys().catch((error: unknown) => error);
    expect((later as StoreError).kind).toBe('closed');
    expect((later as StoreError).message).toMatch(/was deleted/);
  });
});
