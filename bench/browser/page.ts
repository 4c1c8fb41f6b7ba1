/**
 * The store benchmark, run inside headless Chromium (fake-indexeddb in Node
 * hides what a transaction really costs). `bench/store.ts` builds this page,
 * opens it and calls `lampwalkStoreBench()`.
 *
 * The raw baseline for "open a survey" reads the same records with bare
 * IndexedDB calls on purpose: it is the floor the store is compared with.
 */
import { calculateSurvey } from '../../src/calc/survey.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import { makeSurveyFile } from '../../src/survey/format.ts';
import { readBackupText } from '../../src/survey/backup.ts';
import { splitSurvey } from '../../src/survey/records.ts';
import { openSurveyStore } from '../../src/survey/store.ts';
import type { DurabilityEnvironment } from '../../src/survey/durability.ts';
import { seededRandom, syntheticSurvey } from '../synthetic.ts';

/** The figures the page reports. */
export interface StoreFigures {
  userAgent: string;
  saveEdit: { edits: number; medianMs: number; p95Ms: number; goalMedianMs: number };
  openSurvey: { entries: number; rooms: number; runs: number; loadAndCalculateMs: number; rawGetAllMs: number; ratioToRawGetAll: number; ratioGoal: number };
  importBackup: {
    entries: number;
    fileBytes: number;
    runs: number;
    medianMs: number;
    goalMs: number;
    checkFileMedianMs: number;
    rawWriteMedianMs: number;
    ratioToRawWrite: number;
  };
}

const environment: DurabilityEnvironment = { storage: null, markers: [] };

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

function percentile(values: readonly number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

const round = (n: number): number => Math.round(n * 1000) / 1000;

function request<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error);
  });
}

/** Bare IndexedDB: the survey record, its rooms and its entries, in one read-only transaction. */
async function rawGetAll(db: IDBDatabase, surveyId: string): Promise<number> {
  const tx = db.transaction(['surveys', 'rooms', 'entries'], 'readonly');
  const [survey, rooms, entries] = await Promise.all([
    request(tx.objectStore('surveys').get(surveyId)),
    request(tx.objectStore('rooms').getAll()),
    request(tx.objectStore('entries').getAll()),
  ]);
  return (survey ? 1 : 0) + rooms.length + entries.length;
}

async function benchEdits(): Promise<{ edits: StoreFigures['saveEdit']; open: StoreFigures['openSurvey'] }> {
  const entryCount = 1000;
  const store = await openSurveyStore({ databaseName: 'bench-survey-1000', environment });
  const survey = syntheticSurvey(entryCount, 10, 7);
  await store.addWholeSurvey(survey);
  await store.whenIdle();

  // Saving one edit: each its own transaction, awaited.
  const entryIds = survey.rooms.flatMap((room) => room.entries.map((entry) => entry.id));
  const rnd = seededRandom(3);
  const pick = (): string => entryIds[Math.floor(rnd() * entryIds.length)]!;
  for (let i = 0; i < 20; i++) await store.updateEntry(pick(), { count: 1 + (i % 30) });
  const edits: number[] = [];
  for (let i = 0; i < 300; i++) {
    const id = pick();
    const count = 1 + Math.floor(rnd() * 30);
    const t0 = performance.now();
    await store.updateEntry(id, { count });
    edits.push(performance.now() - t0);
  }

  // Opening the survey (records → nested survey → checked → every result) against bare getAll, interleaved.
  const raw = await new Promise<IDBDatabase>((resolve, reject) => {
    const open = indexedDB.open('bench-survey-1000');
    open.onsuccess = () => resolve(open.result);
    open.onerror = () => reject(open.error);
  });
  let records = 0;
  let rooms = 0;
  for (let i = 0; i < 3; i++) {
    records = await rawGetAll(raw, survey.id);
    rooms = calculateSurvey(await store.loadSurvey(survey.id)).rooms.length;
  }
  const full: number[] = [];
  const bare: number[] = [];
  for (let i = 0; i < 15; i++) {
    let t0 = performance.now();
    records = await rawGetAll(raw, survey.id);
    bare.push(performance.now() - t0);
    t0 = performance.now();
    const result = calculateSurvey(await store.loadSurvey(survey.id));
    full.push(performance.now() - t0);
    rooms = result.rooms.length;
  }
  raw.close();
  store.close();
  if (records !== 1 + rooms + entryCount) throw new Error(`bench: raw read found ${records} records`);
  const loadMs = median(full);
  const rawMs = median(bare);
  return {
    edits: { edits: edits.length, medianMs: round(median(edits)), p95Ms: round(percentile(edits, 95)), goalMedianMs: 5 },
    open: {
      entries: entryCount,
      rooms,
      runs: full.length,
      loadAndCalculateMs: round(loadMs),
      rawGetAllMs: round(rawMs),
      ratioToRawGetAll: round(loadMs / rawMs),
      ratioGoal: 3,
    },
  };
}

/** Bare IndexedDB: add the same survey, rooms and entries to an empty database of the same schema, in one transaction. */
async function rawWrite(name: string, records: ReturnType<typeof splitSurvey>): Promise<number> {
  (await openSurveyStore({ databaseName: name, environment })).close();
  const db = await new Promise<IDBDatabase>((resolve, reject) => {
    const open = indexedDB.open(name);
    open.onsuccess = () => resolve(open.result);
    open.onerror = () => reject(open.error);
  });
  const t0 = performance.now();
  const tx = db.transaction(['surveys', 'rooms', 'entries'], 'readwrite', { durability: 'strict' });
  tx.objectStore('surveys').add(records.survey);
  for (const room of records.rooms) tx.objectStore('rooms').add(room);
  for (const entry of records.entries) tx.objectStore('entries').add(entry);
  await new Promise((resolve, reject) => {
    tx.oncomplete = resolve;
    tx.onerror = () => reject(tx.error);
  });
  const ms = performance.now() - t0;
  db.close();
  return ms;
}

async function benchImport(): Promise<StoreFigures['importBackup']> {
  const entryCount = 10_000;
  const survey = syntheticSurvey(entryCount, 10, 42);
  const text = JSON.stringify(makeSurveyFile([survey], [...exampleCatalog], new Date()));
  const records = splitSurvey(survey);
  const times: number[] = [];
  const checks: number[] = [];
  for (let run = 0; run < 3; run++) {
    const t0 = performance.now();
    readBackupText(text);
    checks.push(performance.now() - t0);
  }
  const raw: number[] = [];
  for (let run = 0; run < 3; run++) {
    raw.push(await rawWrite(`bench-raw-write-${run}`, records));
    const store = await openSurveyStore({ databaseName: `bench-import-${run}`, environment });
    const t0 = performance.now();
    const report = await store.importBackup(text);
    times.push(performance.now() - t0);
    if (report.entries !== entryCount) throw new Error(`bench: import wrote ${report.entries} entries`);
    await store.whenIdle();
    store.close();
  }
  return {
    entries: entryCount,
    fileBytes: new TextEncoder().encode(text).length,
    runs: times.length,
    medianMs: round(median(times)),
    goalMs: 2000,
    // Of which: reading and checking the whole file (JSON.parse and the schema), before any write.
    checkFileMedianMs: round(median(checks)),
    // The floor: bare IndexedDB adding the same records in one transaction, no file, no checks.
    rawWriteMedianMs: round(median(raw)),
    ratioToRawWrite: round(median(times) / median(raw)),
  };
}

async function lampwalkStoreBench(): Promise<StoreFigures> {
  const { edits, open } = await benchEdits();
  const importBackup = await benchImport();
  return { userAgent: navigator.userAgent, saveEdit: edits, openSurvey: open, importBackup };
}

Object.assign(globalThis, { lampwalkStoreBench });
