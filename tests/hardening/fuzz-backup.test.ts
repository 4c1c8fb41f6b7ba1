/**
 * Hostile backup files. Thousands of survey files generated from the demo
 * survey and mutated (missing keys, wrong types, bad numbers, `__proto__`
 * keys, duplicate ids, deep nesting, truncation, random bytes, BOMs) go
 * (photos, a repeated layout and a portfolio included) through
 * `readBackupText`, and a subset through the whole
 * `SurveyStore.importBackup` on fake-indexeddb against a store that already
 * holds data. Each file is either accepted (then it is clean: plain objects,
 * finite numbers, a calculation with finite figures or a named input error)
 * or refused with an `invalid-file` StoreError whose problems each carry a
 * path; nothing else may be thrown, a refused import leaves the stored data
 * exactly as it was, and the built-in prototypes stay untouched.
 *
 * Run sizes: `LAMPWALK_FUZZ_BACKUP_RUNS` (default 6,000) and
 * `LAMPWALK_FUZZ_STORE_RUNS` (default 150); a failing run prints its
 * fast-check seed to replay. The expected outcomes are properties of the
 * file format (docs/file-format.md), not figures from a published source
 * (common practice, no published source).
 */
import 'fake-indexeddb/auto';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import { calculateLayout, calculatePortfolio } from '../../src/calc/portfolio.ts';
import { backupMaxFileBytes, checkBackupSize, readBackupText } from '../../src/survey/backup.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { makeSurveyFile, type SurveyFile } from '../../src/survey/format.ts';
import { StoreError, startLampwalk, type ClashChoice, type SurveyStore } from '../../src/survey/store.ts';
import { parseSurveyFileText } from '../../src/survey/validate.ts';
import { dumpDatabase } from '../store/fixtures/harness.ts';
import { fakeEnvironment, testClock, uniqueName } from '../store/helpers.ts';
import {
  checkPrototypesAfterAll,
  hostileCase,
  inheritedSurprises,
  jsonText,
  locatedPath,
  nonFiniteNumbers,
  onSameBranch,
  plainObjectPolluted,
  renamedSurvey,
  Tally,
  type HostileCase,
  type Json,
} from './support-files/hostile.ts';

const backupRuns = Number(process.env.LAMPWALK_FUZZ_BACKUP_RUNS ?? 6000);
const storeRuns = Number(process.env.LAMPWALK_FUZZ_STORE_RUNS ?? 150);

checkPrototypesAfterAll();

/** One level up: `a.b[2].c` → `a.b[2]`. */
function parentPath(path: string): string {
  const cut = Math.max(path.lastIndexOf('.'), path.lastIndexOf('['));
  return cut <= 0 ? '(file)' : path.slice(0, cut);
}

/** True when a problem lies on the branch of a touched value or beside it (a sibling such as the work plane under a changed ceiling). */
function nearMutation(problemPath: string, touched: readonly string[]): boolean {
  return touched.some((path) => {
    if (onSameBranch(problemPath, path) || onSameBranch(problemPath, parentPath(path))) return true;
    // A survey, room or entry id changed or removed: what names it elsewhere no longer finds it — photos and
    // portfolios (naming surveys, rooms and entries of the file) and the survey's own layout (naming its entries).
    const survey = /^surveys\[\d+\]/.exec(path)?.[0];
    return survey !== undefined && (/^(photos|portfolios)\[/.test(problemPath) || problemPath.startsWith(`${survey}.layout`));
  });
}

type Outcome =
  | { accepted: true; file: SurveyFile }
  | { accepted: false; error: StoreError }
  | { accepted: null; error: unknown };

function readOutcome(text: string): Outcome {
  try {
    return { accepted: true, file: readBackupText(text) };
  } catch (error) {
    if (error instanceof StoreError) return { accepted: false, error };
    return { accepted: null, error };
  }
}

/** Checks a refusal: kind, at least one problem, every path well formed, the message quoting the first path. */
function refusalProblems(error: StoreError): string[] {
  const faults: string[] = [];
  if (error.kind !== 'invalid-file') faults.push(`kind ${error.kind}`);
  if (error.problems.length === 0) faults.push('no problems listed');
  for (const problem of error.problems) {
    if (!locatedPath.test(problem.path)) faults.push(`bad path ${JSON.stringify(problem.path)}`);
    if (problem.message.trim() === '') faults.push(`empty message at ${problem.path}`);
  }
  const first = error.problems[0];
  if (first && !error.message.includes(`${first.path}: ${first.message}`)) faults.push('message does not quote the first problem');
  return faults;
}

/** Calculates an accepted file (each survey with its layout, each portfolio): finite figures or a CalcInputError naming a field. */
function calculationFault(file: SurveyFile): string | null {
  const runs: [string, () => unknown][] = [
    ...file.surveys.map((survey, index): [string, () => unknown] => [`surveys[${index}]`, () => calculateLayout(survey)]),
    ...file.portfolios.map((portfolio, index): [string, () => unknown] => [`portfolios[${index}]`, () => calculatePortfolio(portfolio, file.surveys)]),
  ];
  for (const [path, run] of runs) {
    try {
      const bad = nonFiniteNumbers(run(), path);
      if (bad.length > 0) return `non-finite figures: ${bad.slice(0, 3).join(', ')}`;
    } catch (error) {
      if (!(error instanceof CalcInputError) || error.field === '') return `calculation of ${path} threw ${String(error)}`;
    }
  }
  return null;
}

describe('backup files, generated and mutated', () => {
  it('accepts each file or refuses it with located problems, and never throws anything else', () => {
    const tally = new Tally();
    fc.assert(
      fc.property(hostileCase, (hostile: HostileCase) => {
        tally.add('files');
        tally.add(`files:${hostile.kind}`);
        const outcome = readOutcome(hostile.text);
        if (outcome.accepted === null) {
          tally.add('crashes', `${String(outcome.error)} ← ${hostile.text.slice(0, 200)}`);
          return false;
        }
        if (outcome.accepted) {
          tally.add('accepted');
          const surprises = inheritedSurprises(outcome.file);
          if (surprises.length > 0) tally.add('accepted with surprises', surprises.join('; '));
          const calc = calculationFault(outcome.file);
          if (calc !== null) tally.add('calculation faults', calc);
          // Reading is stable: the accepted file, written out again, reads back the same.
          const again = readBackupText(JSON.stringify(outcome.file));
          if (JSON.stringify(again) !== JSON.stringify(outcome.file)) tally.add('unstable', hostile.text.slice(0, 200));
          return surprises.length === 0 && calc === null;
        }
        tally.add('refused');
        if (hostile.kind === 'valid') tally.add('valid files refused', outcome.error.message);
        const faults = refusalProblems(outcome.error);
        if (faults.length > 0) tally.add('badly located refusals', `${faults.join('; ')} ← ${outcome.error.message}`);
        else tally.add('refused with a located problem');
        if (hostile.kind === 'tree') {
          const near = outcome.error.problems.some((problem) => nearMutation(problem.path, hostile.touched));
          tally.add(near ? 'tree refusals at the mutation' : 'tree refusals elsewhere', near ? undefined : `${hostile.touched.join(', ')} → ${outcome.error.message}`);
        }
        return faults.length === 0 && hostile.kind !== 'valid';
      }),
      { numRuns: backupRuns },
    );
    console.log(
      `backup fuzz: ${tally.get('files')} files (${tally.get('files:valid')} valid, ${tally.get('files:tree')} with mutated fields, ` +
        `${tally.get('files:text')} with mutated text), ${tally.get('refused with a located problem')} refused with a located problem ` +
        `(${tally.get('tree refusals at the mutation')} of ${tally.get('tree refusals at the mutation') + tally.get('tree refusals elsewhere')} refusals of mutated fields name the mutated value or its neighbour), ` +
        `${tally.get('accepted')} accepted, ${tally.get('crashes')} crashes, ${tally.get('badly located refusals')} refusals without a path, ` +
        `${tally.get('calculation faults')} calculations with NaN/Infinity or a stray exception, ${tally.get('accepted with surprises')} accepted files with inherited surprises`,
    );
    tally.printSamples();
    expect(tally.get('files')).toBe(backupRuns);
    tally.expectNone(['crashes', 'badly located refusals', 'valid files refused', 'tree refusals elsewhere', 'calculation faults', 'accepted with surprises', 'unstable']);
    // The generator really exercises both outcomes.
    expect(tally.get('accepted')).toBeGreaterThan(backupRuns * 0.05);
    expect(tally.get('refused')).toBeGreaterThan(backupRuns * 0.5);
  }, 240_000);

  it('never lets __proto__, constructor or prototype keys reach a prototype, wherever they are', () => {
    const base = JSON.stringify(makeSurveyFile([demoSurvey()], [], new Date('2027-02-03T04:05:06.000Z')));
    const planted = '{"polluted":true,"kind":"annual","hoursPerYear":1,"prototype":{"polluted":true}}';
    const places = ['{"format"', '"rooms":[{', '"entries":[{', '"existing":{', '"money":{', '"hours":{', '"floor":{'];
    let refused = 0;
    for (const key of ['__proto__', 'constructor', 'prototype']) {
      for (const place of places) {
        const text = base.replace(place, `${place.startsWith('{"') ? '{' : place}"${key}":${planted},${place.startsWith('{"') ? place.slice(1) : ''}`);
        expect(text).not.toBe(base);
        const outcome = readOutcome(text);
        // Unknown keys are reported by name, so the file is refused at the key's path.
        expect(outcome.accepted).toBe(false);
        if (outcome.accepted !== false) continue;
        expect(outcome.error.problems.some((problem) => problem.path.endsWith(key) && /is not a field/.test(problem.message))).toBe(true);
        refused++;
      }
    }
    // A version-1 file goes through the upgrade step (an object spread) before it is checked.
    const old = base.replace('"version":2', '"version":1').replace('{"format"', '{"__proto__":{"polluted":true},"format"');
    const outcome = readOutcome(old);
    expect(outcome.accepted).toBe(false);
    if (outcome.accepted === false) expect(outcome.error.problems.map((problem) => problem.path)).toContain('__proto__');
    expect(plainObjectPolluted()).toBe(false);
    console.log(`prototype keys: ${refused + 1} files with __proto__/constructor/prototype keys at ${places.length} places, all refused at the key's path, Object.prototype untouched`);
  });

  it('refuses an oversized backup before parsing it, saying the limit in MB', () => {
    expect(backupMaxFileBytes).toBe(500_000_000);
    // By File.size, before the file is read at all (what the file picker does).
    expect(() => checkBackupSize(backupMaxFileBytes + 1)).toThrow(/over the 500 MB limit/);
    expect(() => checkBackupSize(backupMaxFileBytes)).not.toThrow();
    // By the bytes of the text: a text of one byte over the limit is refused without JSON.parse being reached
    // (the text is not JSON at all, and the problem is its size, not its syntax).
    const limit = 1000;
    const over = parseSurveyFileText('x'.repeat(limit + 1), limit);
    expect(over).toEqual({ ok: false, problems: [{ path: '(file)', message: expect.stringMatching(/too large: over the 1 kB limit/) }] });
    // Counted in UTF-8 bytes, not characters: 400 "é" are 800 bytes.
    expect(parseSurveyFileText(`"${'é'.repeat(499)}"`, 1000).ok).toBe(false);
    const atLimit = parseSurveyFileText(`"${'é'.repeat(499)}"`, 1001);
    expect(atLimit.ok === false && atLimit.problems[0]!.message).toMatch(/must be a JSON object/);
    const bigOver = parseSurveyFileText('x'.repeat(2_000_001), 2_000_000);
    expect(bigOver.ok === false && bigOver.problems[0]!.message).toMatch(/over the 2 MB limit/);
  });
});

describe('backup import into a store that holds data', () => {
  it('writes a whole file or nothing: a refused import leaves the store exactly as it was', async () => {
    const clock = testClock('2027-03-01T08:00:00.000Z');
    const tally = new Tally();
    let store: SurveyStore;
    let name = '';
    let before = '';
    const fresh = async () => {
      name = uniqueName('fuzz-backup');
      ({ store } = await startLampwalk({ databaseName: name, environment: fakeEnvironment(), clock: clock.now }));
      // A second survey of the user's own, so clashes can hit records of a survey the file does not name.
      const annex = renamedSurvey(demoSurvey(), 'annex-');
      const { rooms: _rooms, id: _id, createdAt: _c, updatedAt: _u, ...fields } = annex;
      await store.createSurvey({ ...fields, name: 'Annex' });
      before = JSON.stringify(await dumpDatabase(name));
    };
    await fresh();

    // Files that pass the check but clash with stored records of another survey (the write itself fails
    // part-way and must roll back), and hostile files of every kind.
    const clashing = fc.constantFrom<ClashChoice>('refuse', 'copy', 'replace').map((choice) => {
      const file = makeSurveyFile([renamedSurvey(demoSurvey(), 'other-')], [], new Date('2027-02-03T04:05:06.000Z'));
      const tree = JSON.parse(JSON.stringify(file)) as { surveys: { rooms: { id: string }[] }[] };
      tree.surveys[0]!.rooms[0]!.id = 'demo-shop';
      return { text: jsonText(tree as unknown as Json), choice, kind: 'clash' as const };
    });
    const hostile = fc
      .tuple(hostileCase, fc.constantFrom<ClashChoice>('refuse', 'copy', 'replace'))
      .map(([item, choice]) => ({ text: item.text, choice, kind: item.kind }));

    await fc.assert(
      fc.asyncProperty(fc.oneof({ weight: 1, arbitrary: clashing }, { weight: 5, arbitrary: hostile }), async ({ text, choice, kind }) => {
        tally.add('imports');
        tally.add(`imports:${kind}`);
        try {
          await store.importBackup(text, choice);
          tally.add('accepted');
          if (kind === 'clash' && choice !== 'copy') tally.add('clash accepted', choice);
          await store.close();
          await fresh();
          return kind !== 'clash' || choice === 'copy';
        } catch (error) {
          if (!(error instanceof StoreError) || !['invalid-file', 'conflict'].includes(error.kind)) {
            tally.add('crashes', `${String(error)} ← ${text.slice(0, 200)}`);
            return false;
          }
          tally.add(`refused:${error.kind}`);
          const after = JSON.stringify(await dumpDatabase(name));
          if (after !== before) {
            tally.add('partial writes', `${choice} ${error.message}`);
            return false;
          }
          if (error.kind === 'invalid-file' && refusalProblems(error).length > 0) {
            tally.add('badly located refusals', error.message);
            return false;
          }
          return true;
        }
      }),
      { numRuns: storeRuns },
    );
    await store!.close();
    const refused = tally.get('refused:invalid-file') + tally.get('refused:conflict');
    console.log(
      `backup import fuzz (store): ${tally.get('imports')} files (${tally.get('imports:clash')} clashing with stored records of another survey), ` +
        `${refused} refused (${tally.get('refused:invalid-file')} invalid, ${tally.get('refused:conflict')} clashing), ${tally.get('accepted')} accepted, ` +
        `${tally.get('crashes')} crashes, ${tally.get('partial writes')} partial writes (stored data compared record for record after each refusal)`,
    );
    tally.printSamples();
    expect(tally.get('imports')).toBe(storeRuns);
    tally.expectNone(['crashes', 'partial writes', 'badly located refusals', 'clash accepted']);
    expect(refused).toBeGreaterThan(storeRuns * 0.3);
    expect(tally.get('refused:conflict')).toBeGreaterThan(0);
  }, 240_000);
});
