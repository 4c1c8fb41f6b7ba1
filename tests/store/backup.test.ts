/**
 * Backup and restore: a backup restores losslessly (deep-equal, photo bytes
 * equal) in one transaction; the command line reads the same file; a tampered
 * file is refused whole with the path of the bad value and nothing written;
 * ids already present are handled as the user chooses. Expected values are
 * invented test data (common practice, no published source).
 */
import { describe, expect, it } from 'vitest';
import { main, type CliIo } from '../../src/cli/main.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { fileFormatVersion, type SurveyFile } from '../../src/survey/format.ts';
import { openSurveyStore, startLampwalk, type SurveyStore } from '../../src/survey/store.ts';
import { dumpDatabase } from './fixtures/harness.ts';
import { bytesOf, countTransactions, failure, fakeEnvironment, newPhoto, testClock, uniqueName } from './helpers.ts';

/** A store with the demo, a second survey, photos of rooms and entries, and a product of the user's own. */
async function fullStore(): Promise<SurveyStore> {
  const clock = testClock('2027-01-10T08:00:00.000Z');
  const { store } = await startLampwalk({ databaseName: uniqueName('backup-src'), environment: fakeEnvironment(), clock: clock.now, seedDemoPortfolio: false });
  const { rooms, id: _id, createdAt: _c, updatedAt: _u, ...fields } = demoSurvey();
  const second = await store.createSurvey({ ...fields, name: 'Annex', units: 'si', locale: 'en-GB' });
  const { entries, id: _roomId, ...roomFields } = rooms[0]!;
  const room = await store.addRoom(second.id, { ...roomFields, name: 'Annex hall' });
  const [first] = entries;
  if (!first) throw new Error('demo shop has no entries');
  const { id: _entryId, ...entryFields } = first;
  const entry = await store.addEntry(room.id, { ...entryFields, notes: 'Annex troffers' });
  await store.addPhoto(newPhoto('room', room.id, 1));
  await store.addPhoto(newPhoto('entry', entry.id, 2));
  await store.addPhoto(newPhoto('entry', 'demo-basement-strips', 3));
  const product = (await store.listCatalog())[0]!;
  const { id: _productId, ...productFields } = product;
  await store.addProduct({ ...productFields, name: 'Own product', sku: 'OWN-1', example: false });
  return store;
}

/** Every photo of a store, by id, with its bytes. */
async function photoBytes(store: SurveyStore, file: SurveyFile): Promise<Map<string, { image: Uint8Array; thumbnail: Uint8Array; type: string }>> {
  const out = new Map<string, { image: Uint8Array; thumbnail: Uint8Array; type: string }>();
  for (const { id } of file.photos) {
    const photo = await store.getPhoto(id);
    out.set(id, { image: await bytesOf(photo.image), thumbnail: await bytesOf(photo.thumbnail), type: photo.image.type });
  }
  return out;
}

function tree(text: string): Record<string, unknown> & { surveys: Record<string, unknown>[]; photos: Record<string, unknown>[] } {
  return JSON.parse(text) as Record<string, unknown> & { surveys: Record<string, unknown>[]; photos: Record<string, unknown>[] };
}

describe('backup → restore', () => {
  it('is lossless: surveys and catalog deep-equal, photo bytes equal, and written in one transaction', async () => {
    const source = await fullStore();
    const backup = await source.exportEverything();
    expect(backup.fileName).toMatch(/^lampwalk-backup-\d{4}-\d{2}-\d{2}-\d{4}\.json$/);
    expect(backup.file.surveys).toHaveLength(2);
    expect(backup.file.photos).toHaveLength(3);

    const target = await openSurveyStore({ databaseName: uniqueName('backup-dst'), environment: fakeEnvironment() });
    const { result: report, dataWrites, dataReads } = await countTransactions(() => target.importBackup(backup.text));
    expect(dataWrites).toBe(1);
    expect(dataReads).toBe(0);
    expect(report).toMatchObject({ rooms: 7, entries: 8, photos: 3, catalogAdded: 9, catalogReplaced: 0, trashItemIds: [] });

    const again = await target.exportEverything();
    expect({ ...again.file, exportedAt: '' }).toEqual({ ...backup.file, exportedAt: '' });
    for (const { id } of backup.file.surveys) expect(await target.loadSurvey(id)).toEqual(await source.loadSurvey(id));
    expect(await target.listCatalog()).toEqual(await source.listCatalog());
    const before = await photoBytes(source, backup.file);
    const after = await photoBytes(target, backup.file);
    expect(after).toEqual(before);
    expect([...after.values()].every((photo) => photo.image.length === 40_000)).toBe(true);
  });

  it('writes the file the command line reads (same format, photos and all)', async () => {
    const backup = await (await fullStore()).exportEverything();
    const io: CliIo & { out: string; err: string } = {
      out: '',
      err: '',
      stdout(text) {
        io.out += text;
      },
      stderr(text) {
        io.err += text;
      },
      readFile: async () => backup.text,
      readStdin: async () => '',
    };
    expect(await main(['calc', 'backup.json', '--survey', 'demo-tallowmere'], io)).toBe(0);
    expect(io.err).toBe('');
    const printed = JSON.parse(io.out) as { surveys: { totals: unknown }[] };
    expect(printed.surveys[0]?.totals).toEqual(JSON.parse(JSON.stringify(calculateSurvey(demoSurvey()).totals)));
  });

  it('a version-1 file (no photos) is restored', async () => {
    const text = (await (await fullStore()).exportSurvey('demo-tallowmere')).text;
    const { photos, ...old } = tree(text);
    expect(photos).toHaveLength(1);
    old.version = 1;
    const target = await openSurveyStore({ databaseName: uniqueName('v1'), environment: fakeEnvironment() });
    const report = await target.importBackup(JSON.stringify(old));
    expect(report.photos).toBe(0);
    // (Adding the photo in the source stamped the survey's updatedAt.)
    expect(await target.loadSurvey('demo-tallowmere')).toEqual({ ...demoSurvey(), updatedAt: expect.any(String) });
  });

  it('one survey exports with its photos and only the catalog products it names, and does not count as a full backup', async () => {
    const store = await fullStore();
    const editsBefore = (await store.settings())?.editsSinceBackup;
    const single = await store.exportSurvey('demo-tallowmere');
    expect(single.file.surveys.map((survey) => survey.id)).toEqual(['demo-tallowmere']);
    expect(single.file.photos.map((photo) => photo.ownerId)).toEqual(['demo-basement-strips']);
    const named = new Set(demoSurvey().rooms.flatMap((room) => room.entries.flatMap((entry) => (entry.proposed?.catalogId ? [entry.proposed.catalogId] : []))));
    expect(new Set(single.file.catalog.map((product) => product.id))).toEqual(named);
    expect(single.fileName).toMatch(/^lampwalk-tallowmere-corner-shop-and-flats-demo-\d{4}-/);
    expect((await store.settings())?.editsSinceBackup).toBe(editsBefore);
    expect((await store.settings())?.lastBackupAt).toBeNull();
  });
});

describe('a tampered or wrong file', () => {
  const tamperings: { what: string; change: (file: ReturnType<typeof tree>) => void; path: string; words: string }[] = [
    {
      what: 'a negative count deep inside',
      change: (file) => {
        const rooms = file.surveys[0]?.rooms as { entries: { count: number }[] }[];
        rooms[2]!.entries[0]!.count = -5;
      },
      path: 'surveys[0].rooms[2].entries[0].count',
      words: 'must be a whole number between 0 and 100000 (got -5)',
    },
    {
      what: 'photo bytes that are not base64',
      change: (file) => {
        file.photos[1]!.imageBase64 = 'not base64!';
      },
      path: 'photos[1].imageBase64',
      words: 'must be non-empty base64 text',
    },
    {
      what: 'a photo of a room that is not in the file',
      change: (file) => {
        file.photos[0]!.ownerKind = 'room';
        file.photos[0]!.ownerId = 'room-that-was-never-there';
      },
      path: 'photos[0].ownerId',
      words: 'has no room "room-that-was-never-there"',
    },
    {
      what: 'a file from a newer Lampwalk',
      change: (file) => {
        file.version = fileFormatVersion + 1;
      },
      path: 'version',
      words: 'written by a newer Lampwalk',
    },
  ];

  it.each(tamperings)('$what: refused whole with the path of the bad value, nothing written', async ({ change, path, words }) => {
    const source = await fullStore();
    const file = tree((await source.exportEverything()).text);
    change(file);
    const name = uniqueName('tampered');
    const { store: target } = await startLampwalk({ databaseName: name, environment: fakeEnvironment(), seedDemoPortfolio: false });
    await target.updateEntry('demo-shop-troffers', { count: 13 });
    await target.whenIdle();
    const before = await dumpDatabase(name);

    const error = await failure(target.importBackup(JSON.stringify(file), 'replace'));
    expect(error.kind).toBe('invalid-file');
    const problem = error.problems.find((item) => item.path === path);
    expect(problem?.message, JSON.stringify(error.problems)).toContain(words);
    expect(error.message).toContain(path);
    expect(error.message).toMatch(/nothing was changed/);
    expect(await dumpDatabase(name)).toEqual(before);
  });

  it('text that is not JSON is refused at "(file)", nothing written', async () => {
    const name = uniqueName('not-json');
    const { store } = await startLampwalk({ databaseName: name, environment: fakeEnvironment(), seedDemoPortfolio: false });
    const text = (await store.exportEverything()).text;
    const before = await dumpDatabase(name);
    const error = await failure(store.importBackup(text.slice(0, text.length / 2)));
    expect(error.kind).toBe('invalid-file');
    expect(error.problems[0]?.path).toBe('(file)');
    expect(error.problems[0]?.message).toMatch(/^not JSON: /);
    expect(await dumpDatabase(name)).toEqual(before);
  });

  it('a valid file that fails while writing (an id taken by another survey) writes nothing at all', async () => {
    const source = await fullStore();
    const file = tree((await source.exportEverything()).text);
    const name = uniqueName('late-clash');
    const { store: target } = await startLampwalk({ databaseName: name, environment: fakeEnvironment(), seedDemo: false });
    // Stored: another survey whose room uses an id that the file's annex survey also uses.
    const annex = file.surveys.find((survey) => survey.name === 'Annex')!;
    const annexRoomId = (annex.rooms as { id: string }[])[0]!.id;
    const { rooms: _rooms, ...header } = demoSurvey();
    await target.addWholeSurvey({ ...header, id: 'other-survey', rooms: [{ ...demoSurvey().rooms[1]!, id: annexRoomId, entries: [] }] });
    await target.whenIdle();
    const before = await dumpDatabase(name);

    const error = await failure(target.importBackup(JSON.stringify(file), 'replace'));
    expect(error.kind).toBe('conflict');
    expect(error.message).toMatch(/Nothing was imported/);
    expect(await dumpDatabase(name)).toEqual(before);
  });
});

describe('ids already on this device', () => {
  it('preview says what the file brings and that a choice is needed', async () => {
    const store = await fullStore();
    const text = (await store.exportEverything()).text;
    const fresh = await openSurveyStore({ databaseName: uniqueName('preview'), environment: fakeEnvironment() });
    const clean = await fresh.previewImport(text);
    expect(clean.needsChoice).toBe(false);
    expect(clean.surveys.map((survey) => [survey.name, survey.entries, survey.photos, survey.alreadyStored])).toEqual([
      ['Tallowmere Corner — shop and flats (demo)', 7, 1, false],
      ['Annex', 1, 2, false],
    ]);
    const same = await store.previewImport(text);
    expect(same.needsChoice).toBe(true);
    expect(same.surveys.every((survey) => survey.alreadyStored)).toBe(true);
    expect(same.catalogDiffering).toBe(0);
  });

  it('"refuse" (the default) writes nothing and names the surveys', async () => {
    const store = await fullStore();
    const text = (await store.exportEverything()).text;
    const before = await store.loadSurvey('demo-tallowmere');
    const error = await failure(store.importBackup(text));
    expect(error.kind).toBe('conflict');
    expect(error.message).toContain('“Tallowmere Corner — shop and flats (demo)”');
    expect(error.message).toMatch(/import as a copy/);
    expect(await store.listSurveys()).toHaveLength(2);
    expect(await store.loadSurvey('demo-tallowmere')).toEqual(before);
  });

  it('"copy" adds the surveys again under new ids, with photos linked to the copies', async () => {
    const store = await fullStore();
    const backup = await store.exportEverything();
    const report = await store.importBackup(backup.text, 'copy');
    expect(report.surveyIds).toHaveLength(2);
    expect(report.surveyIds).not.toContain('demo-tallowmere');
    expect(await store.listSurveys()).toHaveLength(4);
    const copy = await store.loadSurvey(report.surveyIds[0]!);
    expect(copy.name).toBe('Tallowmere Corner — shop and flats (demo) (copy)');
    const original = demoSurvey();
    // Same content, new ids everywhere.
    const strip = (survey: typeof original) => survey.rooms.map((room) => ({ ...room, id: '', entries: room.entries.map((entry) => ({ ...entry, id: '' })) }));
    expect(strip(copy)).toEqual(strip(original));
    const copiedPhotoRoom = copy.rooms.find((room) => room.name === 'Basement store')!;
    const [thumb] = await store.listThumbnails(copiedPhotoRoom.entries[0]!.id);
    expect(thumb?.surveyId).toBe(copy.id);
    expect(await bytesOf((await store.getPhoto(thumb!.id)).image)).toEqual(
      await bytesOf((await store.getPhoto(backup.file.photos.find((photo) => photo.ownerId === 'demo-basement-strips')!.id)).image),
    );
  });

  it('"replace" puts the stored survey in the trash (restorable later) and writes the file’s version', async () => {
    const store = await fullStore();
    const text = (await store.exportEverything()).text;
    await store.updateEntry('demo-shop-troffers', { count: 77 });
    const report = await store.importBackup(text, 'replace');
    expect(report.trashItemIds).toHaveLength(2);
    expect((await store.getEntry('demo-shop-troffers')).count).toBe(12);
    const trash = await store.listTrash();
    const pushedAside = trash.find((item) => item.label === demoSurvey().name);
    expect(pushedAside).toMatchObject({ kind: 'survey', rooms: 6, entries: 7, photos: 1 });
    // Getting the pushed-aside version back means deleting the current one first.
    expect((await failure(store.restoreFromTrash(pushedAside!.id))).kind).toBe('conflict');
    await store.deleteSurvey('demo-tallowmere');
    await store.restoreFromTrash(pushedAside!.id);
    expect((await store.getEntry('demo-shop-troffers')).count).toBe(77);
  });

  it('a catalog product stored with different details: refused, copied under a new id (entries follow), or replaced', async () => {
    const source = await fullStore();
    const text = (await source.exportSurvey('demo-tallowmere')).text;

    const name = uniqueName('catalog-clash');
    const { store } = await startLampwalk({ databaseName: name, environment: fakeEnvironment(), seedDemo: false });
    await store.updateProduct('example-troffer-kit', { unitCost: 70 });
    const preview = await store.previewImport(text);
    expect(preview.catalogDiffering).toBe(1);
    expect(preview.needsChoice).toBe(true);
    expect((await failure(store.importBackup(text))).message).toContain('2×4 troffer retrofit kit');

    const copied = await store.importBackup(text, 'copy');
    const entry = (await store.loadSurvey(copied.surveyIds[0]!)).rooms[0]!.entries[0]!;
    expect(entry.proposed?.catalogId).not.toBe('example-troffer-kit');
    expect((await store.getProduct(entry.proposed!.catalogId!)).unitCost).toBe(62);
    expect((await store.getProduct('example-troffer-kit')).unitCost).toBe(70);

    await store.importBackup(text, 'replace');
    expect((await store.getProduct('example-troffer-kit')).unitCost).toBe(62);
  });
});
