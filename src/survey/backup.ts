/**
 * Backup and restore in the project's own survey file format (the file the
 * `lampwalk` command line reads; `docs/file-format.md`), photos included.
 *
 * Export reads everything in one read-only transaction and only then reads
 * the photo Blobs. Import checks the whole file (valibot schemas in
 * `validate.ts`) before anything is written, then writes it in ONE
 * transaction: a file is restored whole or not at all.
 */
import { lightFormat } from 'date-fns';
import { addAll, settingsKey, tracked, type Connection, type StoredSettings, type WriteTx } from './db.ts';
import { makeSurveyFile, type SurveyFile } from './format.ts';
import type { CatalogProduct, FixtureEntry, Photo, Portfolio, StoredEntry, StoredRoom, Survey, SurveyHeader } from './model.ts';
import { photoFromFile, photoToFile } from './photos.ts';
import { assembleSurvey, splitSurvey } from './records.ts';
import { StoreError } from './store-error.ts';
import { joinPhoto, makeTrashItem, moveToTrash, splitPhoto, surveyParts } from './trash.ts';
import { maxTextLength, parseSurveyFileText, type FileProblem } from './validate.ts';

/** Largest backup the app restores, in bytes of UTF-8 (photos make backups large; the command line keeps its 50 MB limit). */
export const backupMaxFileBytes = 500_000_000;

/**
 * Refuses a backup file of `bytes` bytes over {@link backupMaxFileBytes}
 * before it is read (the screens pass `File.size`); the text check in
 * `parseSurveyFileText` catches the rest.
 *
 * @example checkBackupSize(600_000_000) // throws invalid-file: "… over the 500 MB limit …"
 */
export function checkBackupSize(bytes: number): void {
  if (bytes > backupMaxFileBytes) {
    const problems: FileProblem[] = [
      { path: '(file)', message: `is too large: over the ${backupMaxFileBytes / 1_000_000} MB limit for a backup file (${backupMaxFileBytes} bytes)` },
    ];
    throw new StoreError('invalid-file', problemsMessage(problems), problems);
  }
}

/** Problems listed in an `invalid-file` message before "and N more". */
const problemsInMessage = 5;

/** A backup ready to hand to the user. */
export interface BackupFile {
  file: SurveyFile;
  /** The JSON text to save. */
  text: string;
  /** A suggested file name, e.g. "lampwalk-backup-2024-05-01-0930.json". */
  fileName: string;
}

/** What to do when records of the file are already stored. */
export type ClashChoice =
  /** Write nothing and fail with a `conflict` StoreError naming the surveys (the default: the user decides). */
  | 'refuse'
  /** Give every imported survey, room, entry and photo a new id, so the copy sits beside what is stored (a survey already here gets " (copy)" after its name). */
  | 'copy'
  /** Stored surveys with the same ids are moved to the trash (restorable) and the file's versions written. */
  | 'replace';

/** What a file would bring, for the screen that asks the user how to import it. */
export interface ImportPreview {
  exportedAt: string;
  surveys: { id: string; name: string; rooms: number; entries: number; photos: number; alreadyStored: boolean }[];
  catalogProducts: number;
  /** Catalog products stored under the same id with different details. */
  catalogDiffering: number;
  photos: number;
  /** Portfolios in the file. */
  portfolios: number;
  /** Of those, how many are stored under the same id. */
  portfoliosAlreadyStored: number;
  /** True when importing needs a choice ("as a copy" or "replace"). */
  needsChoice: boolean;
}

/** What an import wrote. */
export interface ImportReport {
  /** Ids of the surveys written (new ids when imported as a copy), in file order. */
  surveyIds: string[];
  rooms: number;
  entries: number;
  photos: number;
  catalogAdded: number;
  catalogReplaced: number;
  /** Trash items holding the stored surveys a "replace" import pushed aside. */
  trashItemIds: string[];
  /** Ids of the portfolios written (new ids when imported as a copy), in file order. */
  portfolioIds: string[];
}

function problemsMessage(problems: readonly FileProblem[]): string {
  const shown = problems.slice(0, problemsInMessage).map((problem) => `${problem.path}: ${problem.message}`);
  const more = problems.length > problemsInMessage ? ` (and ${problems.length - problemsInMessage} more)` : '';
  return `This file cannot be restored, so nothing was changed. ${shown.join('; ')}${more}.`;
}

/**
 * Reads and checks backup text. Throws an `invalid-file` StoreError whose
 * `problems` give the path of every bad value.
 *
 * @example
 * readBackupText('{"format":"lampwalk-survey-file","version":2,"exportedAt":"2024-05-01T09:30:00Z","surveys":[],"catalog":[],"photos":[]}').surveys
 * //=> []
 */
export function readBackupText(text: string): SurveyFile {
  const parsed = parseSurveyFileText(text, backupMaxFileBytes);
  if (!parsed.ok) throw new StoreError('invalid-file', problemsMessage(parsed.problems), parsed.problems);
  return parsed.file;
}

function fileNameFor(label: string, now: Date): string {
  const slug = label
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .toLowerCase()
    .replace(/[\s_-]+/g, '-')
    .slice(0, 60);
  return `lampwalk-${slug || 'survey'}-${lightFormat(now, 'yyyy-MM-dd-HHmm')}.json`;
}

function byCreated(a: { createdAt: string; id: string }, b: { createdAt: string; id: string }): number {
  const at = Date.parse(a.createdAt);
  const bt = Date.parse(b.createdAt);
  return at - bt || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/**
 * Writes a backup of every survey, the whole catalog and every photo (`which`
 * = 'all'), or of one survey with its photos and the catalog products its
 * entries name. Returns the file and how many edits the settings counted when
 * it was read (the caller resets the counter by that much).
 *
 * @example
 * (await exportBackup(connection, { surveyId: 'demo-tallowmere' }, new Date())).file.surveys.length //=> 1
 */
export async function exportBackup(
  connection: Connection,
  which: 'all' | { surveyId: string },
  now: Date,
): Promise<BackupFile & { editsCounted: number }> {
  const read = await connection.read(
    ['surveys', 'rooms', 'entries', 'catalog', 'photos', 'thumbnails', 'settings', 'portfolios'],
    'read the data for the backup',
    async (tx) => {
      const settings = tracked(tx.objectStore('settings').get('app'));
      if (which === 'all') {
        const [surveys, rooms, entries, catalog, images, thumbs, stored, portfolios] = await Promise.all([
          tracked(tx.objectStore('surveys').getAll()),
          tracked(tx.objectStore('rooms').getAll()),
          tracked(tx.objectStore('entries').getAll()),
          tracked(tx.objectStore('catalog').getAll()),
          tracked(tx.objectStore('photos').getAll()),
          tracked(tx.objectStore('thumbnails').getAll()),
          settings,
          tracked(tx.objectStore('portfolios').getAll()),
        ]);
        return { surveys, rooms, entries, catalog, images, thumbs, edits: stored?.editsSinceBackup ?? 0, portfolios };
      }
      const parts = await surveyParts(tx, which.surveyId);
      const catalogIds = [...new Set(parts.entries.flatMap((entry) => (entry.proposed?.catalogId ? [entry.proposed.catalogId] : [])))];
      const products = await Promise.all(catalogIds.map((id) => tracked(tx.objectStore('catalog').get(id))));
      const photos = parts.photos.map((photo) => splitPhoto(photo));
      return {
        surveys: [parts.survey],
        rooms: parts.rooms,
        entries: parts.entries,
        catalog: products.filter((product): product is CatalogProduct => product !== undefined),
        images: photos.map((photo) => photo.image),
        thumbs: photos.map((photo) => photo.thumbnail),
        edits: (await settings)?.editsSinceBackup ?? 0,
        // A one-survey file carries no portfolio: a portfolio groups surveys of one device or backup.
        portfolios: [] as Portfolio[],
      };
    },
  );
  // The transaction is over: now assemble and read the Blobs.
  const surveys = assembleAll(read.surveys, read.rooms, read.entries);
  const thumbsById = new Map(read.thumbs.map((thumb) => [thumb.id, thumb]));
  const photos = read.images.map((image) => joinPhoto(image, thumbsById.get(image.id))).sort(byCreated);
  const filePhotos = await Promise.all(photos.map((photo) => photoToFile(photo)));
  const portfolios = [...read.portfolios].sort(byCreated);
  const file = makeSurveyFile(surveys, read.catalog, now, filePhotos, portfolios);
  const label = which === 'all' ? 'backup' : (surveys[0]?.name ?? 'survey');
  return { file, text: JSON.stringify(file), fileName: fileNameFor(label, now), editsCounted: read.edits };
}

/**
 * Nested surveys from flat records, oldest survey first.
 *
 * @example
 * assembleAll([header], rooms, entries) //=> [{ ...header, rooms: [...] }]
 */
export function assembleAll(headers: readonly SurveyHeader[], rooms: readonly StoredRoom[], entries: readonly StoredEntry[]): Survey[] {
  const roomsBySurvey = new Map<string, StoredRoom[]>();
  for (const room of rooms) {
    const list = roomsBySurvey.get(room.surveyId);
    if (list) list.push(room);
    else roomsBySurvey.set(room.surveyId, [room]);
  }
  const entriesBySurvey = new Map<string, StoredEntry[]>();
  for (const entry of entries) {
    const list = entriesBySurvey.get(entry.surveyId);
    if (list) list.push(entry);
    else entriesBySurvey.set(entry.surveyId, [entry]);
  }
  return [...headers]
    .sort(byCreated)
    .map((header) => assembleSurvey(header, roomsBySurvey.get(header.id) ?? [], entriesBySurvey.get(header.id) ?? []));
}

/** True when two JSON-like values are equal field for field (key order ignored). */
function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  const aKeys = Object.keys(a);
  const bKeys = Object.keys(b);
  if (aKeys.length !== bKeys.length) return false;
  return aKeys.every((key) => Object.hasOwn(b, key) && sameData((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key]));
}

/**
 * What importing `text` would bring and whether it needs a choice. Throws an
 * `invalid-file` StoreError for a bad file.
 *
 * @example
 * (await previewImport(connection, backupText)).needsChoice //=> true when its surveys are already stored
 */
export async function previewImport(connection: Connection, text: string): Promise<ImportPreview> {
  const file = readBackupText(text);
  const ids = new Set<string>();
  for (const survey of file.surveys) {
    ids.add(survey.id);
    for (const room of survey.rooms) {
      ids.add(room.id);
      for (const entry of room.entries) ids.add(entry.id);
    }
  }
  const found = await connection.read(['surveys', 'rooms', 'entries', 'photos', 'catalog', 'portfolios'], 'check the backup against the saved data', async (tx) => {
    const [surveyKeys, roomKeys, entryKeys, photoKeys, products, portfolioKeys] = await Promise.all([
      tracked(tx.objectStore('surveys').getAllKeys()),
      tracked(tx.objectStore('rooms').getAllKeys()),
      tracked(tx.objectStore('entries').getAllKeys()),
      tracked(tx.objectStore('photos').getAllKeys()),
      Promise.all(file.catalog.map((product) => tracked(tx.objectStore('catalog').get(product.id)))),
      tracked(tx.objectStore('portfolios').getAllKeys()),
    ]);
    return { stored: new Set([...surveyKeys, ...roomKeys, ...entryKeys]), photoKeys: new Set(photoKeys), surveyKeys: new Set(surveyKeys), products, portfolioKeys: new Set(portfolioKeys) };
  });
  const portfoliosAlreadyStored = file.portfolios.filter((portfolio) => found.portfolioKeys.has(portfolio.id)).length;
  const clashing =
    [...ids].some((id) => found.stored.has(id)) || file.photos.some((photo) => found.photoKeys.has(photo.id)) || portfoliosAlreadyStored > 0;
  const catalogDiffering = file.catalog.filter((product, index) => {
    const stored = found.products[index];
    return stored !== undefined && !sameData(stored, product);
  }).length;
  const photoCounts = new Map<string, number>();
  for (const photo of file.photos) photoCounts.set(photo.surveyId, (photoCounts.get(photo.surveyId) ?? 0) + 1);
  return {
    exportedAt: file.exportedAt,
    surveys: file.surveys.map((survey) => ({
      id: survey.id,
      name: survey.name,
      rooms: survey.rooms.length,
      entries: survey.rooms.reduce((sum, room) => sum + room.entries.length, 0),
      photos: photoCounts.get(survey.id) ?? 0,
      alreadyStored: found.surveyKeys.has(survey.id),
    })),
    catalogProducts: file.catalog.length,
    catalogDiffering,
    photos: file.photos.length,
    portfolios: file.portfolios.length,
    portfoliosAlreadyStored,
    needsChoice: clashing || catalogDiffering > 0,
  };
}

/**
 * The file with every survey, room, entry, photo and portfolio under a new id
 * (the links between them kept: photos, layout counts and portfolio members
 * follow their new ids).
 */
function asCopy(surveys: Survey[], photos: Photo[], portfolios: Portfolio[]): { surveys: Survey[]; photos: Photo[]; portfolios: Portfolio[] } {
  const newIds = new Map<string, string>();
  const fresh = (id: string): string => {
    const made = crypto.randomUUID();
    newIds.set(id, made);
    return made;
  };
  const copied = surveys.map((survey) => ({
    ...survey,
    id: fresh(survey.id),
    rooms: survey.rooms.map((room) => ({
      ...room,
      id: fresh(room.id),
      entries: room.entries.map((entry): FixtureEntry => ({ ...entry, id: fresh(entry.id) })),
    })),
  }));
  const copiedPhotos = photos.map((photo) => ({
    ...photo,
    id: crypto.randomUUID(),
    surveyId: newIds.get(photo.surveyId) ?? photo.surveyId,
    ownerId: newIds.get(photo.ownerId) ?? photo.ownerId,
  }));
  for (const survey of copied) {
    if (!survey.layout) continue;
    survey.layout = {
      ...survey.layout,
      exceptions: survey.layout.exceptions.map((unit) => ({
        ...unit,
        entryCounts: unit.entryCounts.map((item) => ({ ...item, entryId: newIds.get(item.entryId) ?? item.entryId })),
      })),
    };
  }
  const copiedPortfolios = portfolios.map((portfolio) => ({
    ...portfolio,
    id: crypto.randomUUID(),
    surveyIds: portfolio.surveyIds.map((id) => newIds.get(id) ?? id),
  }));
  return { surveys: copied, photos: copiedPhotos, portfolios: copiedPortfolios };
}

/** Why an import was refused because of ids already stored (`names`: the surveys or products concerned, when known). */
export const conflictMessage = (names: string[]): string =>
  `${names.length > 0 ? `Already on this device: ${names.map((name) => `“${name}”`).join(', ')}. ` : 'Some surveys, rooms, entries, photos or catalog products in this file are already on this device. '}` +
  'Nothing was imported. Choose “import as a copy” to keep both, or “replace” to put the stored versions in the trash and use the file’s.';

/**
 * Restores backup text: checks the whole file first (a bad file throws
 * `invalid-file` and writes nothing), then writes everything in one
 * transaction. Records already stored are handled as `choice` says; with
 * 'refuse' (the default) any clash throws `conflict` and writes nothing.
 * `stamp` gives the time for trash items; `settingsIfMissing` is stored when
 * the database has no settings yet (a restore sets the device up). Also says
 * whether the persistent-storage answer is already recorded.
 *
 * @example
 * (await importBackup(connection, text, 'copy', stamp, settings)).report.surveyIds //=> ['0b6f…'] (new ids)
 */
export async function importBackup(
  connection: Connection,
  text: string,
  choice: ClashChoice,
  stamp: string,
  settingsIfMissing: StoredSettings,
): Promise<{ report: ImportReport; persistenceRecorded: boolean }> {
  const file = readBackupText(text);
  let surveys = file.surveys;
  let photos = file.photos.map((photo) => photoFromFile(photo));
  let portfolios = file.portfolios;
  const clashNames = new Map<string, string>();
  if (choice === 'copy') ({ surveys, photos, portfolios } = asCopy(surveys, photos, portfolios));
  const records = surveys.map((survey) => splitSurvey(survey));

  return connection.write(
    ['surveys', 'rooms', 'entries', 'catalog', 'photos', 'thumbnails', 'trash', 'settings', 'portfolios'],
    'restore the backup',
    async (tx: WriteTx) => {
      const surveyStore = tx.objectStore('surveys');
      const catalogStore = tx.objectStore('catalog');
      const portfolioStore = tx.objectStore('portfolios');
      const [storedHeaders, storedProducts, settings, storedPortfolios] = await Promise.all([
        Promise.all(file.surveys.map((survey) => tracked(surveyStore.get(survey.id)))),
        Promise.all(file.catalog.map((product) => tracked(catalogStore.get(product.id)))),
        tracked(tx.objectStore('settings').get(settingsKey)),
        Promise.all(file.portfolios.map((portfolio) => tracked(portfolioStore.get(portfolio.id)))),
      ]);
      // Portfolios clash like surveys: refused, copied under a new id (named "(copy)"), or
      // replaced. A replaced portfolio is overwritten, not trashed (the trash holds survey records only).
      const portfolioClashes: string[] = [];
      const portfolioWrites = portfolios.map((portfolio, index) => {
        const stored = storedPortfolios[index];
        if (!stored) return portfolio;
        portfolioClashes.push(stored.name);
        return choice === 'copy' ? { ...portfolio, name: `${portfolio.name.slice(0, maxTextLength - 7)} (copy)` } : portfolio;
      });
      storedHeaders.forEach((header, index) => {
        if (!header) return;
        clashNames.set(header.id, header.name);
        // A copy of a survey that is already here is told apart by its name.
        const record = records[index];
        if (choice === 'copy' && record) record.survey = { ...record.survey, name: `${record.survey.name.slice(0, maxTextLength - 7)} (copy)` };
      });

      // Catalog: identical products are skipped; differing ones follow the choice.
      const catalogIdMap = new Map<string, string>();
      const catalogWrites: CatalogProduct[] = [];
      let catalogAdded = 0;
      let catalogReplaced = 0;
      const differing: string[] = [];
      file.catalog.forEach((product, index) => {
        const stored = storedProducts[index];
        if (!stored) {
          catalogWrites.push(product);
          catalogAdded++;
        } else if (!sameData(stored, product)) {
          if (choice === 'replace') {
            catalogWrites.push(product);
            catalogReplaced++;
          } else if (choice === 'copy') {
            const id = crypto.randomUUID();
            catalogIdMap.set(product.id, id);
            catalogWrites.push({ ...product, id });
            catalogAdded++;
          } else differing.push(product.name);
        }
      });
      if (choice === 'refuse' && (clashNames.size > 0 || differing.length > 0 || portfolioClashes.length > 0)) {
        throw new StoreError('conflict', conflictMessage([...clashNames.values(), ...portfolioClashes, ...differing]));
      }

      // Replace: push the stored surveys aside into the trash (one item each, restorable).
      const trashItemIds: string[] = [];
      if (choice === 'replace') {
        for (const surveyId of clashNames.keys()) {
          const parts = await surveyParts(tx, surveyId);
          const item = makeTrashItem('survey', { label: parts.survey.name, surveyId, parentId: null, ...parts }, stamp);
          await moveToTrash(tx, item);
          trashItemIds.push(item.id);
        }
      }

      const requests: Promise<unknown>[] = [];
      if (!settings) requests.push(tracked(tx.objectStore('settings').add(settingsIfMissing)));
      for (const product of catalogWrites) requests.push(tracked(catalogStore.put(product)));
      for (const portfolio of portfolioWrites) requests.push(tracked(portfolioStore.put(portfolio)));
      await Promise.all(requests);
      // Thousands of records: added without a promise each. Any failure (an id
      // already stored, a full disk) aborts the transaction, so nothing is kept.
      let rooms = 0;
      let entries = 0;
      for (const record of records) {
        addAll(tx, 'surveys', [record.survey]);
        addAll(tx, 'rooms', record.rooms);
        addAll(
          tx,
          'entries',
          record.entries.map((entry) => {
            const catalogId = entry.proposed?.catalogId;
            const mapped = catalogId === undefined ? undefined : catalogIdMap.get(catalogId);
            return mapped !== undefined && entry.proposed ? { ...entry, proposed: { ...entry.proposed, catalogId: mapped } } : entry;
          }),
        );
        rooms += record.rooms.length;
        entries += record.entries.length;
      }
      const parts = photos.map((photo) => splitPhoto(photo));
      addAll(
        tx,
        'photos',
        parts.map((part) => part.image),
      );
      addAll(
        tx,
        'thumbnails',
        parts.map((part) => part.thumbnail),
      );
      const report: ImportReport = {
        surveyIds: records.map((record) => record.survey.id),
        rooms,
        entries,
        photos: photos.length,
        catalogAdded,
        catalogReplaced,
        trashItemIds,
        portfolioIds: portfolioWrites.map((portfolio) => portfolio.id),
      };
      return { report, persistenceRecorded: (settings ?? settingsIfMissing).persistence !== null };
    },
    'strict',
  );
}
