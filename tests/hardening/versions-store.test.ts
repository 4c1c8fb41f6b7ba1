/**
 * A database one schema version newer than this build, in fake-indexeddb:
 * this build's newest fixture (every store, index and record as this version
 * writes them) re-created at `schemaVersion + 1` with raw `indexedDB.open`,
 * plus a store this build does not know, as a newer Lampwalk would leave it.
 * Every way in (the app's start-up, the plain store, and a second attempt
 * after the first failed) must fail with the `newer-version` StoreError and
 * leave the version and every record as they were: no upgrade, no seeding,
 * no deletion, no usage marker. (tests/store/migrations.test.ts checks a
 * version three ahead through `idb`; tests/hardening/versions-browser.test.ts
 * does this in Chromium.)
 * Common practice, no published source: an app must never downgrade data it
 * does not understand.
 */
import 'fake-indexeddb/auto';
import { readdirSync, readFileSync } from 'node:fs';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { schemaVersion } from '../../src/survey/db.ts';
import { StoreError, openSurveyStore, startLampwalk } from '../../src/survey/store.ts';
import { decodeValue, dumpDatabase, type DatabaseFixture } from '../store/fixtures/harness.ts';
import { fakeEnvironment, uniqueName } from '../store/helpers.ts';

const fixturesDir = new URL('../store/fixtures/', import.meta.url);
const newest = Math.max(...readdirSync(fixturesDir).map((file) => Number(/^v(\d+)\.json$/.exec(file)?.[1] ?? 0)));
const fixture = JSON.parse(readFileSync(new URL(`v${newest}.json`, fixturesDir), 'utf8')) as DatabaseFixture;
let refusals = 0;
let recordsKept = 0;

/** Writes the fixture's stores and records, plus one unknown store, at `version`, with raw IndexedDB calls. */
function writeNewer(name: string, version: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const request = indexedDB.open(name, version);
    request.onupgradeneeded = () => {
      const db = request.result;
      for (const [storeName, store] of Object.entries(fixture.stores)) {
        const created = db.createObjectStore(storeName, { keyPath: store.keyPath, autoIncrement: store.autoIncrement });
        for (const index of store.indexes) created.createIndex(index.name, index.keyPath, { unique: index.unique, multiEntry: index.multiEntry });
      }
      db.createObjectStore('floorPlans', { keyPath: 'id' });
    };
    request.onerror = () => reject(request.error);
    request.onsuccess = () => {
      const db = request.result;
      const names = [...Object.keys(fixture.stores), 'floorPlans'];
      const tx = db.transaction(names, 'readwrite');
      for (const [storeName, store] of Object.entries(fixture.stores)) {
        for (const record of store.records) tx.objectStore(storeName).put(decodeValue(record));
      }
      tx.objectStore('floorPlans').put({ id: 'plan-1', svg: '<svg/>', surveyId: 'written-by-a-newer-build' });
      tx.oncomplete = () => {
        db.close();
        resolve();
      };
      tx.onerror = () => reject(tx.error);
    };
  });
}

afterAll(() => {
  console.log(
    `versions (fake-indexeddb): database at version ${schemaVersion + 1} (this build: ${schemaVersion}) refused ${refusals} times with "newer-version"; ` +
      `version and ${recordsKept} records unchanged`,
  );
});

describe(`a database at schema version ${schemaVersion} + 1`, () => {
  it('is refused by start-up and by the plain store, again and again, and nothing in it changes', async () => {
    const name = uniqueName('newer-by-one');
    await writeNewer(name, schemaVersion + 1);
    const before = await dumpDatabase(name);
    expect(before.schemaVersion).toBe(schemaVersion + 1);
    const records = Object.values(before.stores).reduce((sum, store) => sum + store.records.length, 0);
    expect(records).toBeGreaterThan(20);

    const environment = fakeEnvironment();
    const onBlocked = vi.fn();
    const onClosed = vi.fn();
    const attempts = [
      () => startLampwalk({ databaseName: name, environment, onBlocked, onClosed }),
      () => openSurveyStore({ databaseName: name, environment, onBlocked, onClosed }),
      () => startLampwalk({ databaseName: name, environment, seedDemo: true }),
    ];
    for (const attempt of attempts) {
      const failure = await attempt().catch((error: unknown) => error);
      expect(failure).toBeInstanceOf(StoreError);
      expect((failure as StoreError).kind).toBe('newer-version');
      expect((failure as StoreError).message).toBe(
        'The data on this device was saved by a newer version of Lampwalk, so this version cannot open it. Nothing was changed. ' +
          'Reload the page to get the newer version (or open Lampwalk where you used the newer one).',
      );
      refusals++;
    }
    expect(await dumpDatabase(name)).toEqual(before);
    recordsKept += records;
    expect(onBlocked).not.toHaveBeenCalled();
    expect(onClosed).not.toHaveBeenCalled();
    expect(environment.local.value).toBeNull();
    expect(environment.cookie.value).toBeNull();
    expect(environment.storage && 'persistCalls' in environment.storage ? environment.storage.persistCalls : 0).toBe(0);
  });
});
