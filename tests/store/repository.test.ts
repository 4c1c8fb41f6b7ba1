/**
 * The repository API: create, read, update, delete, lists by parent,
 * duplicate, copy to units, move, trash, photos and catalog — each user edit
 * one transaction, every failure a typed StoreError with nothing written.
 * Expected values are counts and fields of invented test data (common
 * practice, no published source).
 */
import { formatISO } from 'date-fns';
import { describe, expect, it } from 'vitest';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { demoLandlordSurveys, demoPortfolio, demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import type { FixtureEntry, StoredEntry } from '../../src/survey/model.ts';
import { assembleSurvey, ordersBetween, splitSurvey } from '../../src/survey/records.ts';
import { maxUnitsPerCopy, openSurveyStore, startLampwalk, type NewEntry, type SurveyStore } from '../../src/survey/store.ts';
import { bytesOf, countTransactions, failure, fakeEnvironment, newPhoto, testClock, uniqueName } from './helpers.ts';

/** A stamp as the store writes it: ISO 8601 in the device's time zone (date-fns formatISO). */
function iso(utc: string): string {
  return formatISO(new Date(utc));
}

/** A fresh store holding the demo survey alone (the landlord scenario left out), or all the demo data. */
async function demoStore(clock = testClock(), seedDemoPortfolio = false): Promise<SurveyStore> {
  const { store } = await startLampwalk({ databaseName: uniqueName('repo'), environment: fakeEnvironment(), clock: clock.now, seedDemoPortfolio });
  return store;
}

function newEntry(description: string, count = 4): NewEntry {
  return {
    count,
    existing: { technology: 'incandescent', description, lampsPerFixture: 1, ratedWattsPerLamp: 60, ballast: 'none' },
    conditions: { enclosed: false, dimmer: 'none', location: 'dry', emergencyCircuit: false, insulationContact: false, circuitVolts: 120 },
    proposed: null,
    control: 'none',
    notes: '',
  };
}

describe('records: split and assemble', () => {
  it('a survey split into flat records and assembled again is the same survey', () => {
    const survey = demoSurvey();
    const records = splitSurvey(survey);
    expect(records.rooms).toHaveLength(survey.rooms.length);
    expect(records.entries).toHaveLength(survey.rooms.reduce((sum, room) => sum + room.entries.length, 0));
    expect(records.rooms.map((room) => room.order)).toEqual(survey.rooms.map((_, index) => index));
    // Shuffled record order does not matter: order fields decide.
    expect(assembleSurvey(records.survey, [...records.rooms].reverse(), [...records.entries].reverse())).toEqual(survey);
  });

  it('ordersBetween places keys strictly between neighbours and says when floating point runs out', () => {
    expect(ordersBetween(1, 2, 3)).toEqual([1.25, 1.5, 1.75]);
    expect(ordersBetween(null, null, 3)).toEqual([0, 1, 2]);
    expect(ordersBetween(5, null, 2)).toEqual([6, 7]);
    expect(ordersBetween(null, 5, 2)).toEqual([3, 4]);
    expect(ordersBetween(1, 1 + Number.EPSILON, 4)).toBeNull();
  });
});

describe('first run', () => {
  it('seeds the example catalog (marked as examples), the demo survey, the landlord layouts and the demo portfolio, which calculate', async () => {
    const store = await demoStore(testClock(), true);
    const catalog = await store.listCatalog();
    expect(catalog.map((product) => product.id).sort()).toEqual(exampleCatalog.map((product) => product.id).sort());
    expect(catalog.every((product) => product.example)).toBe(true);
    const [header] = await store.listSurveys();
    expect(header?.id).toBe('demo-tallowmere');
    const survey = await store.loadSurvey('demo-tallowmere');
    expect(survey).toEqual(demoSurvey());
    expect(calculateSurvey(survey)).toEqual(calculateSurvey(demoSurvey()));
    // The landlord scenario, walked earlier, lists after the demo survey and reads back exactly.
    expect((await store.listSurveys()).map((item) => item.id)).toEqual(['demo-tallowmere', ...demoLandlordSurveys().map((item) => item.id).sort((a, b) => {
      const name = (id: string) => demoLandlordSurveys().find((item) => item.id === id)?.name ?? '';
      return name(a).localeCompare(name(b));
    })]);
    for (const layout of demoLandlordSurveys()) expect(await store.loadSurvey(layout.id)).toEqual(layout);
    expect(await store.listPortfolios()).toEqual([demoPortfolio()]);
    // Seeding is not a user edit.
    expect((await store.settings())?.editsSinceBackup).toBe(0);
  });

  it('a second start neither re-seeds nor duplicates anything', async () => {
    const name = uniqueName('restart');
    const environment = fakeEnvironment();
    const first = await startLampwalk({ databaseName: name, environment });
    await first.store.deleteSurvey('demo-tallowmere');
    await first.store.deletePortfolio(demoPortfolio().id);
    first.store.close();
    const second = await startLampwalk({ databaseName: name, environment });
    expect(second.state).toBe('returning');
    // The deleted demo survey and portfolio stay deleted; the layouts are there once each.
    expect((await second.store.listSurveys()).map((survey) => survey.id).sort()).toEqual(demoLandlordSurveys().map((survey) => survey.id).sort());
    expect(await second.store.listPortfolios()).toEqual([]);
    expect(await second.store.listCatalog()).toHaveLength(exampleCatalog.length);
  });
});

describe('surveys', () => {
  it('create, read, update (stamping updatedAt via the clock), list newest first, delete to the trash', async () => {
    // The demo survey carries its own stamps (2026-11-18); this clock runs later.
    const clock = testClock('2027-04-01T10:00:00.000Z');
    const store = await demoStore(clock);
    const { rooms: _rooms, id: _id, createdAt: _created, updatedAt: _updated, ...fields } = demoSurvey();
    clock.set('2027-04-02T10:00:00.000Z');
    const created = await store.createSurvey({ ...fields, name: 'Second building' });
    expect(created.createdAt).toBe(iso('2027-04-02T10:00:00Z'));
    expect(await store.getSurvey(created.id)).toEqual(created);
    expect((await store.listSurveys()).map((survey) => survey.name)).toEqual(['Second building', demoSurvey().name]);

    clock.set('2027-04-03T10:00:00.000Z');
    const updated = await store.updateSurvey(created.id, { notes: 'Roof space not checked.', preparedBy: 'B. Auditor' });
    expect(updated).toMatchObject({ notes: 'Roof space not checked.', preparedBy: 'B. Auditor', createdAt: iso('2027-04-02T10:00:00Z') });
    expect((await store.getSurvey(created.id)).updatedAt).toBe(iso('2027-04-03T10:00:00Z'));
    // An edit to the demo survey brings it to the top.
    clock.set('2027-04-04T10:00:00.000Z');
    await store.updateEntry('demo-shop-display', { count: 9 });
    expect((await store.listSurveys()).map((survey) => survey.name)).toEqual([demoSurvey().name, 'Second building']);

    const trashId = await store.deleteSurvey(created.id);
    expect((await failure(store.getSurvey(created.id))).kind).toBe('not-found');
    expect((await store.listTrash()).map((item) => item.id)).toEqual([trashId]);
  });

  it('a bad value is refused with the path of the field, and nothing is written', async () => {
    const store = await demoStore();
    const before = await store.getSurvey('demo-tallowmere');
    const error = await failure(store.updateSurvey('demo-tallowmere', { money: { ...before.money, analysisYears: 41 } }));
    expect(error.kind).toBe('invalid');
    expect(error.problems).toEqual([{ path: 'money.analysisYears', message: 'must be a whole number between 1 and 40 (got 41)' }]);
    expect(error.message).toContain('money.analysisYears');
    expect(await store.getSurvey('demo-tallowmere')).toEqual(before);
    expect((await store.settings())?.editsSinceBackup).toBe(0);
  });

  it('an unknown id is a "not-found" StoreError', async () => {
    const store = await demoStore();
    for (const call of [store.getSurvey('nope'), store.loadSurvey('nope'), store.updateSurvey('nope', { notes: '' }), store.deleteSurvey('nope')]) {
      expect((await failure(call)).kind).toBe('not-found');
    }
  });
});

describe('rooms and entries', () => {
  it('lists by parent in order, adds at a position, and each edit is exactly one transaction', async () => {
    const store = await demoStore();
    const rooms = await store.listRooms('demo-tallowmere');
    expect(rooms.map((room) => room.id)).toEqual(demoSurvey().rooms.map((room) => room.id));
    const shop = rooms[0];
    if (!shop) throw new Error('no shop');
    expect((await store.listEntries(shop.id)).map((entry) => entry.id)).toEqual(['demo-shop-troffers', 'demo-shop-display']);

    const added = await countTransactions(() => store.addEntry(shop.id, newEntry('Exit sign', 1), 1));
    expect(added.dataWrites).toBe(1);
    expect(added.dataReads).toBe(0);
    expect((await store.listEntries(shop.id)).map((entry) => entry.id)).toEqual(['demo-shop-troffers', added.result.id, 'demo-shop-display']);

    await store.whenIdle();
    // Once the storage answer is recorded, an edit is exactly one transaction of any kind.
    const edit = await countTransactions(() => store.updateEntry('demo-shop-display', { count: 10 }));
    expect(edit.readwrite).toBe(1);
    expect(edit.readonly).toBe(0);
    expect((await store.getEntry('demo-shop-display')).count).toBe(10);

    const { entries: _entries, id: _id, ...roomFields } = demoSurvey().rooms[1]!;
    const room = await store.addRoom('demo-tallowmere', { ...roomFields, name: 'Loft' }, 0);
    expect((await store.listRooms('demo-tallowmere'))[0]?.id).toBe(room.id);
  });

  it('an entry edit stamps its survey and counts one edit; a patch value of undefined removes an optional field', async () => {
    const clock = testClock('2026-05-01T09:00:00.000Z');
    const store = await demoStore(clock);
    clock.set('2026-05-01T09:30:00.000Z');
    await store.updateEntry('demo-shop-troffers', { notes: 'Two lenses cracked.', controlSavingsFraction: 0.3 });
    await store.updateEntry('demo-shop-troffers', { controlSavingsFraction: undefined });
    const entry = await store.getEntry('demo-shop-troffers');
    expect(entry.notes).toBe('Two lenses cracked.');
    expect('controlSavingsFraction' in entry).toBe(false);
    expect((await store.getSurvey('demo-tallowmere')).updatedAt).toBe(iso('2026-05-01T09:30:00Z'));
    expect(await store.settings()).toMatchObject({ editsSinceBackup: 2, lastEditAt: iso('2026-05-01T09:30:00Z') });
  });

  it('refuses a bad entry with the field path (count -1, unknown field), keeping the stored one', async () => {
    const store = await demoStore();
    const before = await store.getEntry('demo-stair-bulkheads');
    const error = await failure(store.updateEntry('demo-stair-bulkheads', { count: -1 }));
    expect(error.kind).toBe('invalid');
    expect(error.problems[0]).toEqual({ path: 'count', message: 'must be a whole number between 0 and 100000 (got -1)' });
    const typo = { ...newEntry('x'), wats: 40 } as NewEntry;
    const added = await failure(store.addEntry('demo-stair', typo));
    expect(added.problems[0]?.path).toBe('wats');
    expect(await store.getEntry('demo-stair-bulkheads')).toEqual(before);
    expect(await store.listEntries('demo-stair')).toHaveLength(1);
  });

  it('duplicates an entry right after it, and a room with all its entries right after it', async () => {
    const store = await demoStore();
    const copy = await store.duplicateEntry('demo-shop-troffers');
    expect((await store.listEntries('demo-shop')).map((entry) => entry.id)).toEqual(['demo-shop-troffers', copy.id, 'demo-shop-display']);
    const { id: _a, order: _b, ...copied } = copy;
    const { id: _c, order: _d, ...original } = await store.getEntry('demo-shop-troffers');
    expect(copied).toEqual(original);

    const room = await store.duplicateRoom('demo-shop');
    expect(room.name).toBe('Shop floor (copy)');
    const ids = (await store.listRooms('demo-tallowmere')).map((item) => item.id);
    expect(ids.slice(0, 3)).toEqual(['demo-shop', room.id, 'demo-stair']);
    const copiedEntries = await store.listEntries(room.id);
    expect(copiedEntries.map((entry) => entry.existing.description)).toEqual(
      (await store.listEntries('demo-shop')).map((entry) => entry.existing.description),
    );
    expect(new Set(copiedEntries.map((entry) => entry.id)).size).toBe(3);
  });

  it('copies a room to 40 units: exactly 40 rooms and 40 × its entries, in one transaction', async () => {
    const store = await demoStore();
    await store.addEntry('demo-flat1-living', newEntry('Wall light', 2));
    await store.addEntry('demo-flat1-living', newEntry('Hall pendant', 1));
    const entriesPerRoom = (await store.listEntries('demo-flat1-living')).length;
    expect(entriesPerRoom).toBe(3);
    const roomsBefore = (await store.listRooms('demo-tallowmere')).length;
    const entriesBefore = calculateSurvey(await store.loadSurvey('demo-tallowmere')).totals.entries;

    const { result: copies, dataWrites, dataReads } = await countTransactions(() => store.copyRoomToUnits('demo-flat1-living', 40));
    expect(dataWrites).toBe(1);
    expect(dataReads).toBe(0);
    expect(copies).toHaveLength(40);
    expect(copies[0]?.name).toBe('Flat 1 — living room — unit 2');
    expect(copies[39]?.name).toBe('Flat 1 — living room — unit 41');

    const rooms = await store.listRooms('demo-tallowmere');
    expect(rooms).toHaveLength(roomsBefore + 40);
    // Placed right after the original, in unit order.
    const at = rooms.findIndex((room) => room.id === 'demo-flat1-living');
    expect(rooms.slice(at + 1, at + 41).map((room) => room.id)).toEqual(copies.map((room) => room.id));
    const survey = await store.loadSurvey('demo-tallowmere');
    const result = calculateSurvey(survey);
    expect(result.totals.entries).toBe(entriesBefore + 40 * entriesPerRoom);
    for (const copy of copies) expect(await store.listEntries(copy.id)).toHaveLength(entriesPerRoom);
    const allIds = survey.rooms.flatMap((room) => [room.id, ...room.entries.map((entry) => entry.id)]);
    expect(new Set(allIds).size).toBe(allIds.length);
  });

  it('copy to units: given names are used; a bad unit count or name list is refused before anything is written', async () => {
    const store = await demoStore();
    const names = ['Flat 2 — bathroom', 'Flat 3 — bathroom'];
    const copies = await store.copyRoomToUnits('demo-flat1-bath', 2, names);
    expect(copies.map((room) => room.name)).toEqual(names);
    for (const units of [0, 1.5, maxUnitsPerCopy + 1]) {
      const error = await failure(store.copyRoomToUnits('demo-flat1-bath', units));
      expect(error.kind).toBe('invalid');
      expect(error.problems[0]?.path).toBe('units');
    }
    expect((await failure(store.copyRoomToUnits('demo-flat1-bath', 3, names))).problems[0]?.path).toBe('names');
    expect((await failure(store.copyRoomToUnits('no-such-room', 3))).kind).toBe('not-found');
    expect(await store.listRooms('demo-tallowmere')).toHaveLength(demoSurvey().rooms.length + 2);
  });

  it('moves an entry to another room (at a position), and to a room of another survey with its photos', async () => {
    const store = await demoStore();
    const moved = await store.moveEntry('demo-shop-display', 'demo-stair', 0);
    expect(moved).toMatchObject({ roomId: 'demo-stair', surveyId: 'demo-tallowmere' });
    expect((await store.listEntries('demo-stair')).map((entry) => entry.id)).toEqual(['demo-shop-display', 'demo-stair-bulkheads']);
    expect((await store.listEntries('demo-shop')).map((entry) => entry.id)).toEqual(['demo-shop-troffers']);

    const { rooms: _rooms, id: _id, createdAt: _c, updatedAt: _u, ...fields } = demoSurvey();
    const other = await store.createSurvey({ ...fields, name: 'Other building' });
    const { entries: _entries, id: _roomId, ...roomFields } = demoSurvey().rooms[0]!;
    const otherRoom = await store.addRoom(other.id, roomFields);
    const photo = await store.addPhoto(newPhoto('entry', 'demo-shop-display'));
    const across = await store.moveEntry('demo-shop-display', otherRoom.id);
    expect(across.surveyId).toBe(other.id);
    expect((await store.getPhoto(photo.id)).surveyId).toBe(other.id);
    expect((await store.loadSurvey(other.id)).rooms[0]?.entries.map((entry: FixtureEntry) => entry.id)).toEqual(['demo-shop-display']);
  });

  it('reorders within a room', async () => {
    const store = await demoStore();
    await store.moveEntry('demo-shop-troffers', 'demo-shop', 1);
    expect((await store.listEntries('demo-shop')).map((entry) => entry.id)).toEqual(['demo-shop-display', 'demo-shop-troffers']);
  });

  it('keeps order correct after many inserts at the same place (renumbering when keys run out)', async () => {
    const store = await demoStore();
    const added: StoredEntry[] = [];
    for (let index = 0; index < 60; index++) added.push(await store.addEntry('demo-stair', newEntry(`Inserted ${index}`, 1), 1));
    const order = (await store.listEntries('demo-stair')).map((entry) => entry.existing.description);
    expect(order[0]).toBe('Enclosed bulkhead, 26 W CFL');
    // Each insert went in at position 1, so the newest comes first after the original.
    expect(order.slice(1)).toEqual(added.map((entry) => entry.existing.description).reverse());
  });
});

describe('trash', () => {
  it('a deleted room comes back whole (entries and photos), and the survey calculates as before', async () => {
    const store = await demoStore();
    const before = await store.loadSurvey('demo-tallowmere');
    const roomPhoto = await store.addPhoto(newPhoto('room', 'demo-shop', 1));
    const entryPhoto = await store.addPhoto(newPhoto('entry', 'demo-shop-troffers', 2));

    const trashId = await store.deleteRoom('demo-shop');
    expect((await failure(store.getRoom('demo-shop'))).kind).toBe('not-found');
    expect((await failure(store.getEntry('demo-shop-troffers'))).kind).toBe('not-found');
    expect((await failure(store.getPhoto(roomPhoto.id))).kind).toBe('not-found');
    const [summary] = await store.listTrash();
    expect(summary).toMatchObject({ id: trashId, kind: 'room', label: 'Shop floor', rooms: 1, entries: 2, photos: 2 });

    await store.restoreFromTrash(trashId);
    expect(await store.loadSurvey('demo-tallowmere')).toEqual({ ...before, updatedAt: expect.any(String) });
    expect(await bytesOf((await store.getPhoto(entryPhoto.id)).image)).toEqual(await bytesOf(entryPhoto.image));
    expect(await store.listTrash()).toEqual([]);
  });

  it('an entry cannot come back into a deleted room until the room is restored', async () => {
    const store = await demoStore();
    const entryTrash = await store.deleteEntry('demo-stair-bulkheads');
    const roomTrash = await store.deleteRoom('demo-stair');
    const error = await failure(store.restoreFromTrash(entryTrash));
    expect(error.kind).toBe('not-found');
    expect(error.message).toMatch(/Restore the room from the trash first/);
    await store.restoreFromTrash(roomTrash);
    await store.restoreFromTrash(entryTrash);
    expect((await store.listEntries('demo-stair')).map((entry) => entry.id)).toEqual(['demo-stair-bulkheads']);
  });

  it('keeps deleted things for 30 days: still restorable on day 30, removed after', async () => {
    const clock = testClock('2026-06-01T12:00:00.000Z');
    const name = uniqueName('purge');
    const environment = fakeEnvironment();
    const { store } = await startLampwalk({ databaseName: name, environment, clock: clock.now });
    await store.deleteEntry('demo-flat2-cans');
    clock.advanceDays(30);
    expect(await store.purgeTrash()).toBe(0);
    const [item] = await store.listTrash();
    expect(item?.restorableUntil).toBe(iso('2026-07-01T12:00:00Z'));
    clock.advanceDays(0.01);
    store.close();
    const restarted = await startLampwalk({ databaseName: name, environment, clock: clock.now });
    expect(restarted.trashPurged).toBe(1);
    expect(await restarted.store.listTrash()).toEqual([]);
  });

  it('deleting a survey and restoring it brings back rooms, entries and photos', async () => {
    const store = await demoStore();
    const photo = await store.addPhoto(newPhoto('room', 'demo-basement', 5));
    const before = await store.loadSurvey('demo-tallowmere');
    const trashId = await store.deleteSurvey('demo-tallowmere');
    expect(await store.listSurveys()).toEqual([]);
    await store.restoreFromTrash(trashId);
    expect(await store.loadSurvey('demo-tallowmere')).toEqual({ ...before, updatedAt: expect.any(String) });
    expect((await store.listThumbnails('demo-basement')).map((thumb) => thumb.id)).toEqual([photo.id]);
  });
});

describe('photos', () => {
  it('stores image and thumbnail apart: thumbnail lists do not carry the image; bytes come back equal', async () => {
    const store = await demoStore();
    const first = await store.addPhoto(newPhoto('entry', 'demo-basement-strips', 11));
    const second = await store.addPhoto(newPhoto('entry', 'demo-basement-strips', 12));
    const thumbs = await store.listThumbnails('demo-basement-strips');
    expect(thumbs.map((thumb) => thumb.id).sort()).toEqual([first.id, second.id].sort());
    for (const thumb of thumbs) {
      expect('image' in thumb).toBe(false);
      expect(thumb.thumbnail.size).toBe(3_000);
    }
    const stored = await store.getPhoto(first.id);
    expect(stored).toMatchObject({ ownerKind: 'entry', ownerId: 'demo-basement-strips', surveyId: 'demo-tallowmere', widthPixels: 1600 });
    expect(await bytesOf(stored.image)).toEqual(await bytesOf(first.image));
    expect(await bytesOf(stored.thumbnail)).toEqual(await bytesOf(first.thumbnail));
  });

  it('refuses a photo with bad dimensions, an empty image, or no owner', async () => {
    const store = await demoStore();
    const bad = { ...newPhoto('room', 'demo-shop'), widthPixels: 0, image: new Blob([]) };
    const error = await failure(store.addPhoto(bad));
    expect(error.kind).toBe('invalid');
    expect(error.problems.map((problem) => problem.path)).toEqual(['widthPixels', 'image']);
    expect((await failure(store.addPhoto(newPhoto('room', 'no-such-room')))).kind).toBe('not-found');
    expect(await store.listThumbnails('demo-shop')).toEqual([]);
  });

  it('a deleted photo goes to the trash and can be restored', async () => {
    const store = await demoStore();
    const photo = await store.addPhoto(newPhoto('room', 'demo-shop'));
    const trashId = await store.deletePhoto(photo.id);
    expect(await store.listThumbnails('demo-shop')).toEqual([]);
    await store.restoreFromTrash(trashId);
    expect((await store.listThumbnails('demo-shop')).map((thumb) => thumb.id)).toEqual([photo.id]);
  });
});

describe('catalog', () => {
  it('adds, edits, retires and deletes products; entries keep their own copy of a product', async () => {
    const store = await demoStore();
    const { id: _id, ...fields } = exampleCatalog[0]!;
    const mine = await store.addProduct({ ...fields, name: 'My A19 9 W', sku: 'MY-1', example: false });
    expect(await store.getProduct(mine.id)).toEqual(mine);
    const edited = await store.updateProduct(mine.id, { unitCost: 3.1, retired: true });
    expect(edited).toMatchObject({ unitCost: 3.1, retired: true });
    expect((await failure(store.updateProduct(mine.id, { cri: 101 }))).problems[0]?.path).toBe('cri');

    const proposed = (await store.getEntry('demo-flat1-pendants')).proposed;
    await store.deleteProduct('example-a19-basic');
    expect((await failure(store.getProduct('example-a19-basic'))).kind).toBe('not-found');
    expect((await store.getEntry('demo-flat1-pendants')).proposed).toEqual(proposed);
    expect((await store.listCatalog()).map((product) => product.id)).toContain(mine.id);
  });
});

describe('closing', () => {
  it('after close, every call fails with a "closed" StoreError', async () => {
    const store = await openSurveyStore({ databaseName: uniqueName('closed'), environment: fakeEnvironment() });
    store.close();
    const error = await failure(store.listSurveys());
    expect(error.kind).toBe('closed');
  });
});
