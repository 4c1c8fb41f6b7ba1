/**
 * Generators for the hostile-file tests: valid survey files built from the
 * demo survey and the example catalog, and mutations of them (missing keys,
 * wrong types, bad numbers, `__proto__` / `constructor` / `prototype` keys,
 * duplicate ids, deep nesting, truncation, random bytes, byte-order marks).
 *
 * Tree mutations record the path they touched, in the notation the file
 * validator reports (`surveys[0].rooms[2].entries[1].count`), so a test can
 * check that a refusal points at (or around) the value that was broken.
 * Keys and raw JSON tokens that a JavaScript object cannot hold safely
 * (`__proto__`, `NaN`, `1e400`, 5,000 levels of nesting) are written as
 * placeholder strings and swapped in the JSON text.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, expect } from 'vitest';
import { demoSurvey } from '../../../src/survey/demo.ts';
import { exampleCatalog } from '../../../src/survey/examples.ts';
import { makeSurveyFile, type SurveyFile } from '../../../src/survey/format.ts';
import type { Portfolio, Survey } from '../../../src/survey/model.ts';

export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
export type PathKey = string | number;

/** A 1 × 1 PNG, made by hand (the same picture the store tests use). */
const tinyPngBase64 = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==';

/** Raw JSON tokens put in place of placeholder strings (`"\u0000raw:N"`). */
export const rawTokens: readonly string[] = [
  'NaN',
  'Infinity',
  '-Infinity',
  '1e400',
  '-1e400',
  '1e-400',
  '-0',
  '01',
  '0x10',
  '1.',
  '.5',
  '+1',
  'undefined',
  `${'['.repeat(5000)}${']'.repeat(5000)}`,
  `${'{"a":'.repeat(2000)}1${'}'.repeat(2000)}`,
  '"\\ud800"',
  '"\\u0000"',
  '9'.repeat(400),
];
const rawPlaceholder = (index: number): string => `\u0000raw:${index}`;

/** Keys that must never reach an object's prototype. */
export const pollutingKeys = ['__proto__', 'constructor', 'prototype'] as const;
const keyPlaceholder = (key: string): string => `\u0000key:${key}`;

/** Values that are wrong almost anywhere in a survey file. */
export const hostileValues: readonly Json[] = [
  null,
  true,
  false,
  0,
  -0.000001,
  -1,
  1e308,
  -1e308,
  5e-324,
  2 ** 53 + 1,
  1.5,
  0.5,
  '',
  ' ',
  'NaN',
  'Infinity',
  '-Infinity',
  '1e308',
  '1,5',
  '1.5',
  '1,500',
  '1.500,5',
  '12',
  '-1',
  'null',
  'true',
  '=HYPERLINK("x")',
  // Valid ids and names that are also the names of built-in properties.
  '__proto__',
  'constructor',
  'hasOwnProperty',
  '<script>alert(1)</script>',
  '\u202e\u0000\ud800',
  'x'.repeat(10_001),
  'y'.repeat(201),
  [],
  {},
  [1, 2, 3],
  { kind: 'annual' },
  { polluted: true },
  ...rawTokens.map((_, index) => rawPlaceholder(index)),
];

/** The bad numbers every numeric field must refuse or read correctly. */
export const badNumbers: readonly Json[] = [
  rawPlaceholder(0), // NaN
  rawPlaceholder(1), // Infinity
  rawPlaceholder(2), // -Infinity
  rawPlaceholder(3), // 1e400, which JSON.parse reads as Infinity
  1e308,
  -1e308,
  -1,
  0,
  -0.5,
  '',
  '1,5',
  '1.5',
  '1,500',
  '1.500,5',
  '1 500',
  '1e308',
  null,
];

/** The JSON text of a tree, with placeholders swapped for raw tokens and hostile keys. */
export function jsonText(tree: Json): string {
  return JSON.stringify(tree)
    .replace(/"\\u0000raw:(\d+)"/g, (_, index: string) => rawTokens[Number(index)]!)
    .replace(/"\\u0000key:([^"]*)"/g, (_, key: string) => JSON.stringify(key));
}

/** A path as the validator writes it: `surveys[0].rooms[2].entries[1].count`, `(file)` for the root. */
export function pathText(path: readonly PathKey[]): string {
  let text = '';
  for (const key of path) {
    if (typeof key === 'number') text += `[${key}]`;
    else if (/^[A-Za-z_$][\w$]*$/.test(key)) text += text === '' ? key : `.${key}`;
    else text += `[${JSON.stringify(key)}]`;
  }
  return text === '' ? '(file)' : text;
}

/** Path grammar of a located problem: `(file)` or a validator path. */
export const locatedPath = /^(\(file\)|([A-Za-z_$][\w$]*|\["(?:[^"\\]|\\.)*"\])(\[\d+\]|\.[A-Za-z_$][\w$]*|\["(?:[^"\\]|\\.)*"\])*)$/;

/** True when one path lies on the other's branch (equal, ancestor or descendant). */
export function onSameBranch(a: string, b: string): boolean {
  if (a === '(file)' || b === '(file)') return true;
  const within = (inner: string, outer: string) => inner === outer || inner.startsWith(`${outer}.`) || inner.startsWith(`${outer}[`);
  return within(a, b) || within(b, a);
}

// ---------------------------------------------------------------------------
// Valid files

function photo(id: string, surveyId: string, ownerKind: 'room' | 'entry', ownerId: string): SurveyFile['photos'][number] {
  return {
    id,
    ownerKind,
    ownerId,
    surveyId,
    mimeType: 'image/png',
    widthPixels: 1,
    heightPixels: 1,
    createdAt: '2026-11-18T09:30:00.000Z',
    imageBase64: tinyPngBase64,
    thumbnailMimeType: 'image/png',
    thumbnailBase64: tinyPngBase64,
  };
}

/** A survey with every id prefixed, so several copies can share one file. */
export function renamedSurvey(survey: Survey, prefix: string): Survey {
  return {
    ...survey,
    id: `${prefix}${survey.id}`,
    rooms: survey.rooms.map((room) => ({
      ...room,
      id: `${prefix}${room.id}`,
      entries: room.entries.map((entry) => ({ ...entry, id: `${prefix}${entry.id}` })),
    })),
  };
}

/** Settings that vary a valid file (every value within the file format's ranges). */
export interface ValidVariation {
  copies: number;
  roomsKept: number;
  name: string;
  notes: string;
  energyRatePerKwh: number;
  analysisYears: number;
  count: number;
  hoursPerYear: number;
  ceilingHeightMetres: number;
  catalogKept: number;
  withPhotos: boolean;
  bom: boolean;
  indent: boolean;
}

/** A valid survey file (as a tree) for a variation. */
export function validFile(variation: ValidVariation): SurveyFile {
  const surveys: Survey[] = [];
  const photos: SurveyFile['photos'] = [];
  for (let copy = 0; copy < variation.copies; copy++) {
    const demo = demoSurvey();
    const base: Survey = {
      ...demo,
      name: variation.name,
      notes: variation.notes,
      money: { ...demo.money, energyRatePerKwh: variation.energyRatePerKwh, analysisYears: variation.analysisYears },
      rooms: demo.rooms.slice(0, variation.roomsKept).map((room, roomIndex) => ({
        ...room,
        ceilingHeightMetres: Math.max(variation.ceilingHeightMetres, room.workPlaneHeightMetres + 0.1),
        hours: roomIndex === 0 ? { kind: 'annual', hoursPerYear: variation.hoursPerYear } : room.hours,
        entries: room.entries.map((entry, entryIndex) => (entryIndex === 0 ? { ...entry, count: variation.count } : entry)),
      })),
    };
    const survey = copy === 0 ? base : renamedSurvey(base, `c${copy}-`);
    surveys.push(survey);
    const room = survey.rooms[0];
    if (variation.withPhotos && room) {
      photos.push(photo(`photo-${copy}-room`, survey.id, 'room', room.id));
      const entry = room.entries[0];
      if (entry) photos.push(photo(`photo-${copy}-entry`, survey.id, 'entry', entry.id));
    }
  }
  // The first survey stands for several flats of one layout, one of them different; a portfolio groups every survey.
  const first = surveys[0];
  const firstEntry = first?.rooms[0]?.entries[0];
  if (first && firstEntry) {
    first.layout = { unitCount: 6, exceptions: [{ id: 'flat-4', unitLabel: 'Flat 4', entryCounts: [{ entryId: firstEntry.id, count: 0 }], notes: 'already converted' }] };
  }
  const portfolios: Portfolio[] =
    surveys.length === 0
      ? []
      : [
          {
            id: 'estate',
            name: 'Invented estate',
            client: { name: 'Invented client', contact: '' },
            surveyIds: surveys.map((survey) => survey.id),
            plan: { budgetPerYear: 25_000, years: 3 },
            notes: '',
            createdAt: '2026-11-18T09:30:00.000Z',
            updatedAt: '2026-11-18T09:30:00.000Z',
          },
        ];
  return makeSurveyFile(surveys, exampleCatalog.slice(0, variation.catalogKept), new Date('2027-02-03T04:05:06.000Z'), photos, portfolios);
}

export const validVariation: fc.Arbitrary<ValidVariation> = fc.record({
  copies: fc.integer({ min: 0, max: 3 }),
  roomsKept: fc.integer({ min: 0, max: 6 }),
  name: fc.string({ maxLength: 60, unit: 'grapheme' }),
  notes: fc.oneof(fc.string({ maxLength: 200, unit: 'binary' }), fc.constantFrom('', '__proto__', 'constructor', '=1+1', '\u0000')),
  energyRatePerKwh: fc.double({ min: 0, max: 100, noNaN: true, noDefaultInfinity: true }),
  analysisYears: fc.integer({ min: 1, max: 40 }),
  count: fc.integer({ min: 0, max: 100_000 }),
  hoursPerYear: fc.double({ min: 0, max: 8760, noNaN: true, noDefaultInfinity: true }),
  ceilingHeightMetres: fc.double({ min: 1, max: 100, noNaN: true, noDefaultInfinity: true }),
  catalogKept: fc.integer({ min: 0, max: exampleCatalog.length }),
  withPhotos: fc.boolean(),
  bom: fc.boolean(),
  indent: fc.boolean(),
});

/** The text of a valid file, as the app or a text editor would save it. */
export function validText(variation: ValidVariation): string {
  const file = validFile(variation);
  const text = variation.indent ? JSON.stringify(file, null, 2).replace(/\n/g, '\r\n') : JSON.stringify(file);
  return variation.bom ? `\uFEFF${text}` : text;
}

// ---------------------------------------------------------------------------
// Tree mutations

export type TreeMutation =
  | { op: 'delete'; pick: number }
  | { op: 'replace'; pick: number; value: number }
  | { op: 'badNumber'; pick: number; value: number }
  | { op: 'retype'; pick: number }
  | { op: 'addKey'; pick: number; key: number; value: number }
  | { op: 'duplicateId'; from: number; to: number }
  | { op: 'duplicateItem'; pick: number };

const extraKeys = [...pollutingKeys, 'Count', 'photo', 'rooms ', ''] as const;

export const treeMutation: fc.Arbitrary<TreeMutation> = fc.oneof(
  fc.record({ op: fc.constant('delete' as const), pick: fc.nat() }),
  fc.record({ op: fc.constant('replace' as const), pick: fc.nat(), value: fc.nat({ max: hostileValues.length - 1 }) }),
  { weight: 3, arbitrary: fc.record({ op: fc.constant('badNumber' as const), pick: fc.nat(), value: fc.nat({ max: badNumbers.length - 1 }) }) },
  fc.record({ op: fc.constant('retype' as const), pick: fc.nat() }),
  {
    weight: 2,
    arbitrary: fc.record({
      op: fc.constant('addKey' as const),
      pick: fc.nat(),
      key: fc.nat({ max: extraKeys.length - 1 }),
      value: fc.nat({ max: hostileValues.length - 1 }),
    }),
  },
  fc.record({ op: fc.constant('duplicateId' as const), from: fc.nat(), to: fc.nat() }),
  fc.record({ op: fc.constant('duplicateItem' as const), pick: fc.nat() }),
);

interface Trail {
  key: PathKey;
  up: Trail | null;
}

/** A value in the tree and how to reach it (a linked trail, turned into a path only when picked). */
class Node {
  constructor(
    readonly value: Json,
    private readonly trail: Trail | null,
  ) {}

  get path(): PathKey[] {
    const keys: PathKey[] = [];
    for (let step = this.trail; step; step = step.up) keys.push(step.key);
    return keys.reverse();
  }

  get last(): PathKey | undefined {
    return this.trail?.key;
  }
}

function nodes(tree: Json, trail: Trail | null = null, out: Node[] = []): Node[] {
  out.push(new Node(tree, trail));
  if (Array.isArray(tree)) tree.forEach((item, index) => nodes(item, { key: index, up: trail }, out));
  else if (tree !== null && typeof tree === 'object') for (const key of Object.keys(tree)) nodes(tree[key]!, { key, up: trail }, out);
  return out;
}

function parentOf(tree: Json, path: readonly PathKey[]): Json {
  let node = tree;
  for (const key of path.slice(0, -1)) node = (node as Record<string, Json>)[key as string]!;
  return node;
}

function setAt(tree: Json, path: readonly PathKey[], value: Json): Json {
  if (path.length === 0) return value;
  (parentOf(tree, path) as Record<string | number, Json>)[path[path.length - 1]!] = value;
  return tree;
}

function retyped(value: Json): Json {
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string') return /^-?\d/.test(value) ? Number.parseFloat(value) : [value];
  if (typeof value === 'boolean') return value ? 'yes' : 0;
  if (value === null) return 'null';
  if (Array.isArray(value)) return Object.fromEntries(value.map((item, index) => [String(index), item]));
  return [value];
}

/**
 * Applies one mutation to a tree (in place, except at the root) and says
 * which paths it touched; null when it found nothing to act on.
 */
export function mutateTree(tree: Json, mutation: TreeMutation): { tree: Json; paths: string[] } | null {
  const all = nodes(tree);
  switch (mutation.op) {
    case 'delete': {
      const candidates = all.filter((node) => node.last !== undefined);
      const node = candidates[mutation.pick % candidates.length];
      if (!node) return null;
      const parent = parentOf(tree, node.path);
      const key = node.path[node.path.length - 1]!;
      if (Array.isArray(parent)) parent.splice(key as number, 1);
      else delete (parent as Record<string, Json>)[key as string];
      return { tree, paths: [pathText(node.path)] };
    }
    case 'replace': {
      const node = all[mutation.pick % all.length]!;
      return { tree: setAt(tree, node.path, hostileValues[mutation.value]!), paths: [pathText(node.path)] };
    }
    case 'badNumber': {
      const numeric = all.filter((node) => typeof node.value === 'number');
      const node = numeric[mutation.pick % numeric.length];
      if (!node) return null;
      return { tree: setAt(tree, node.path, badNumbers[mutation.value]!), paths: [pathText(node.path)] };
    }
    case 'retype': {
      const node = all[mutation.pick % all.length]!;
      return { tree: setAt(tree, node.path, retyped(node.value)), paths: [pathText(node.path)] };
    }
    case 'addKey': {
      const objects = all.filter((node) => node.value !== null && typeof node.value === 'object' && !Array.isArray(node.value));
      const node = objects[mutation.pick % objects.length];
      if (!node) return null;
      const key = extraKeys[mutation.key]!;
      const stored = (pollutingKeys as readonly string[]).includes(key) ? keyPlaceholder(key) : key;
      (node.value as Record<string, Json>)[stored] = hostileValues[mutation.value]!;
      return { tree, paths: [pathText([...node.path, key])] };
    }
    case 'duplicateId': {
      const withIds = all.filter((node) => node.last === 'id' && typeof node.value === 'string');
      const from = withIds[mutation.from % withIds.length];
      const to = withIds[mutation.to % withIds.length];
      if (!from || !to || from === to) return null;
      setAt(tree, to.path, from.value);
      // The duplicate is reported at the later of the two; photos that named the overwritten id lose their owner.
      return { tree, paths: [pathText(from.path), pathText(to.path), 'photos'] };
    }
    case 'duplicateItem': {
      const items = all.filter((node) => typeof node.last === 'number');
      const node = items[mutation.pick % items.length];
      if (!node) return null;
      const parent = parentOf(tree, node.path) as Json[];
      parent.push(JSON.parse(JSON.stringify(node.value)) as Json);
      return { tree, paths: [pathText([...node.path.slice(0, -1), parent.length - 1]), pathText(node.path)] };
    }
  }
}

// ---------------------------------------------------------------------------
// Text mutations

export type TextMutation =
  | { op: 'truncate'; at: number }
  | { op: 'insert'; at: number; text: string }
  | { op: 'cut'; at: number; length: number }
  | { op: 'bom'; times: number }
  | { op: 'bytes'; bytes: Uint8Array }
  | { op: 'flip'; at: number; char: string };

export const textMutation: fc.Arbitrary<TextMutation> = fc.oneof(
  fc.record({ op: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({
    op: fc.constant('insert' as const),
    at: fc.nat(),
    text: fc.oneof(fc.string({ maxLength: 12, unit: 'binary' }), fc.constantFrom('{', '}', '[', ']', ',', '"', ':', '\\', '\u0000', '\ud800', '"__proto__":{"polluted":true},')),
  }),
  fc.record({ op: fc.constant('cut' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 40 }) }),
  fc.record({ op: fc.constant('bom' as const), times: fc.integer({ min: 1, max: 3 }) }),
  fc.record({ op: fc.constant('bytes' as const), bytes: fc.uint8Array({ maxLength: 300 }) }),
  fc.record({ op: fc.constant('flip' as const), at: fc.nat(), char: fc.string({ minLength: 1, maxLength: 1, unit: 'binary' }) }),
);

/** Applies a text mutation (random bytes are read as UTF-8, bad sequences becoming U+FFFD, as `File.text()` does). */
export function mutateText(text: string, mutation: TextMutation): string {
  const at = (n: number) => (text.length === 0 ? 0 : n % text.length);
  switch (mutation.op) {
    case 'truncate':
      return text.slice(0, at(mutation.at));
    case 'insert':
      return `${text.slice(0, at(mutation.at))}${mutation.text}${text.slice(at(mutation.at))}`;
    case 'cut':
      return `${text.slice(0, at(mutation.at))}${text.slice(at(mutation.at) + mutation.length)}`;
    case 'bom':
      return `${'\uFEFF'.repeat(mutation.times)}${text}`;
    case 'bytes':
      return new TextDecoder('utf-8').decode(mutation.bytes);
    case 'flip':
      return `${text.slice(0, at(mutation.at))}${mutation.char}${text.slice(at(mutation.at) + 1)}`;
  }
}

// ---------------------------------------------------------------------------
// Whole cases

/** One generated file: its text and what was done to it. */
export interface HostileCase {
  kind: 'valid' | 'tree' | 'text';
  text: string;
  /** Paths the tree mutations touched (empty for valid and text cases). */
  touched: string[];
  mutations: number;
}

export const hostileCase: fc.Arbitrary<HostileCase> = fc.oneof(
  { weight: 1, arbitrary: validVariation.map((variation): HostileCase => ({ kind: 'valid', text: validText(variation), touched: [], mutations: 0 })) },
  {
    weight: 6,
    arbitrary: fc.tuple(validVariation, fc.array(treeMutation, { minLength: 1, maxLength: 3 })).map(([variation, mutations]): HostileCase => {
      let tree = JSON.parse(JSON.stringify(validFile(variation))) as Json;
      const touched: string[] = [];
      let applied = 0;
      for (const mutation of mutations) {
        const result = mutateTree(tree, mutation);
        if (!result) continue;
        tree = result.tree;
        touched.push(...result.paths);
        applied++;
      }
      return { kind: applied > 0 ? 'tree' : 'valid', text: jsonText(tree), touched, mutations: applied };
    }),
  },
  {
    weight: 3,
    arbitrary: fc.tuple(validVariation, fc.array(textMutation, { minLength: 1, maxLength: 3 })).map(([variation, mutations]): HostileCase => {
      let text = validText(variation);
      for (const mutation of mutations) text = mutateText(text, mutation);
      return { kind: 'text', text, touched: [], mutations: mutations.length };
    }),
  },
);

// ---------------------------------------------------------------------------
// Checks on what was accepted

/**
 * Problems with a parsed value: an object whose prototype is not the plain
 * Object or Array prototype, an own `__proto__` / `constructor` /
 * `prototype` key, or a number that is not finite. Empty when all is well.
 */
export function inheritedSurprises(value: unknown, path = '(file)', out: string[] = []): string[] {
  if (typeof value === 'number' && !Number.isFinite(value)) out.push(`${path}: ${value}`);
  if (value === null || typeof value !== 'object') return out;
  const prototype = Object.getPrototypeOf(value) as unknown;
  if (prototype !== Object.prototype && prototype !== Array.prototype) out.push(`${path}: unexpected prototype`);
  for (const key of Object.getOwnPropertyNames(value)) {
    if ((pollutingKeys as readonly string[]).includes(key)) out.push(`${path}: own key ${key}`);
    if (Array.isArray(value) && key === 'length') continue;
    inheritedSurprises((value as Record<string, unknown>)[key], `${path}.${key}`, out);
  }
  return out;
}

/** What the built-in prototypes hold, to compare before and after a run. */
export function prototypeSnapshot(): string {
  const describe = (target: object) =>
    Object.getOwnPropertyNames(target)
      .sort()
      .map((key) => `${key}:${typeof (Object.getOwnPropertyDescriptor(target, key)?.value as unknown)}`)
      .join(',');
  return [Object.prototype, Array.prototype, Function.prototype, String.prototype].map(describe).join('|');
}

/** True when a plain new object shows any of the keys the mutations tried to plant. */
export function plainObjectPolluted(): boolean {
  const probe: Record<string, unknown> = {};
  return ['polluted', 'a', 'kind'].some((key) => key in probe) || Object.keys(Object.prototype).length > 0;
}

/**
 * Paths of every number in a value that is NaN or ±Infinity (objects,
 * arrays and Maps walked; `path` names the start). Empty when all are finite.
 */
export function nonFiniteNumbers(value: unknown, path = 'result', out: string[] = [], seen = new Set<object>()): string[] {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) out.push(`${path} = ${value}`);
    return out;
  }
  if (value === null || typeof value !== 'object' || seen.has(value)) return out;
  seen.add(value);
  if (value instanceof Map) {
    for (const [key, item] of value) nonFiniteNumbers(item, `${path}.get(${String(key)})`, out, seen);
    return out;
  }
  for (const key of Object.keys(value)) nonFiniteNumbers((value as Record<string, unknown>)[key], `${path}.${key}`, out, seen);
  return out;
}

/**
 * Snapshots the built-in prototypes before the file's tests and checks after
 * all of them that nothing was planted there (and that a plain object
 * inherits nothing new).
 *
 * @example checkPrototypesAfterAll() //=> the file fails if any run polluted a prototype
 */
export function checkPrototypesAfterAll(): void {
  let prototypesBefore = '';
  beforeAll(() => {
    prototypesBefore = prototypeSnapshot();
  });
  afterAll(() => {
    // After every run: nothing was planted on the built-in prototypes.
    expect(prototypeSnapshot()).toBe(prototypesBefore);
    expect(plainObjectPolluted()).toBe(false);
  });
}

/** Counts kept by a fuzz run and printed at its end. */
export class Tally {
  private readonly counts = new Map<string, number>();
  readonly samples = new Map<string, string[]>();

  add(label: string, sample?: string): void {
    this.counts.set(label, (this.counts.get(label) ?? 0) + 1);
    if (sample !== undefined) {
      const list = this.samples.get(label) ?? [];
      if (list.length < Number(process.env.LAMPWALK_FUZZ_SAMPLES ?? 5)) list.push(sample.slice(0, 400));
      this.samples.set(label, list);
    }
  }

  get(label: string): number {
    return this.counts.get(label) ?? 0;
  }

  /** Prints the kept samples, one label a line, under the run's summary. */
  printSamples(): void {
    for (const [label, samples] of this.samples) console.log(`  ${label}: ${samples.join('\n    ')}`);
  }

  /**
   * Expects a count of 0 for each label (each checked on its own, named in the failure).
   *
   * @example tally.expectNone(['crashes', 'unstable']) //=> passes when neither was ever added
   */
  expectNone(labels: readonly string[]): void {
    for (const label of labels) expect(this.get(label), label).toBe(0);
  }
}
