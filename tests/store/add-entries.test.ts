/**
 * `addEntries`: several fixture entries written to a room in one transaction
 * (the fixture schedule import), all or nothing. Expected values are counts
 * and fields of invented test data (common practice, no published source).
 */
import { describe, expect, it } from 'vitest';
import { startLampwalk, type NewEntry, type SurveyStore } from '../../src/survey/store.ts';
import { countTransactions, failure, fakeEnvironment, uniqueName } from './helpers.ts';

async function demoStore(): Promise<SurveyStore> {
  const { store } = await startLampwalk({ databaseName: uniqueName('add-entries'), environment: fakeEnvironment() });
  await store.whenIdle();
  return store;
}

function newEntry(description: string, count: number): NewEntry {
  return {
    count,
    existing: { technology: 'halogen', description, lampsPerFixture: 1, ratedWattsPerLamp: 50, ballast: 'none' },
    conditions: { enclosed: false, dimmer: 'none', location: 'dry', emergencyCircuit: false, insulationContact: false, circuitVolts: 230 },
    proposed: null,
    control: 'none',
    notes: '',
  };
}

describe('addEntries', () => {
  it('appends every entry after the room’s own, in order, with fresh ids, in one transaction', async () => {
    const store = await demoStore();
    const before = (await store.listEntries('demo-shop')).map((entry) => entry.id);
    const withOldId = { ...newEntry('B', 2), id: 'from-the-file' } as NewEntry;
    const { result, dataWrites, readwrite } = await countTransactions(() =>
      store.addEntries('demo-shop', [newEntry('A', 1), withOldId, newEntry('C', 3)]),
    );
    expect(dataWrites).toBe(1);
    expect(readwrite).toBe(1);
    expect(result.map((entry) => entry.existing.description)).toEqual(['A', 'B', 'C']);
    expect(result.map((entry) => entry.id)).not.toContain('from-the-file');
    const after = await store.listEntries('demo-shop');
    expect(after.map((entry) => entry.id)).toEqual([...before, ...result.map((entry) => entry.id)]);
    expect(after.slice(-3).map((entry) => entry.count)).toEqual([1, 2, 3]);
    expect(result.every((entry) => entry.surveyId === 'demo-tallowmere' && entry.roomId === 'demo-shop')).toBe(true);
  });

  it('one bad entry rejects all of them with its index in the path; nothing is written', async () => {
    const store = await demoStore();
    const before = await store.listEntries('demo-shop');
    const error = await failure(store.addEntries('demo-shop', [newEntry('fine', 1), newEntry('bad', -4)]));
    expect(error.kind).toBe('invalid');
    expect(error.problems[0]?.path).toBe('entries[1].count');
    expect(await store.listEntries('demo-shop')).toEqual(before);
  });

  it('a room that is gone is "not-found" and nothing is written; an empty list writes nothing', async () => {
    const store = await demoStore();
    const error = await failure(store.addEntries('no-such-room', [newEntry('x', 1)]));
    expect(error.kind).toBe('not-found');
    const edits = (await store.settings())?.editsSinceBackup;
    const { result, readwrite } = await countTransactions(() => store.addEntries('demo-shop', []));
    expect(result).toEqual([]);
    expect(readwrite).toBe(0);
    expect((await store.settings())?.editsSinceBackup).toBe(edits);
  });
});
