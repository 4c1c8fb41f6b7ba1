/**
 * Hostile fixture schedules (CSV). Schedules written by `fixtureScheduleCsv`
 * from varied demo surveys (every delimiter and decimal separator) are
 * mutated — bad numbers in number cells, formula injections, huge cells,
 * headers renamed to `__proto__` and friends, short and long rows, broken
 * quotes, swapped delimiters, truncation, random bytes, BOMs — and read
 * with `previewSchedule`, then `commitRows`. Nothing may throw except a
 * `ScheduleImportError`; every row problem gives its spreadsheet row number
 * and, when it concerns a cell, the column; a single broken cell is reported
 * at its own row and column; every entry `commitRows` returns passes the
 * survey file's entry schema and calculates to finite figures; an unmutated
 * schedule imports whole.
 *
 * Run size: `LAMPWALK_FUZZ_SCHEDULE_RUNS` (default 4,200). Expected outcomes
 * are properties of the import described in src/export/schedule.ts (common
 * practice, no published source).
 */
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { utf8BytesOver } from '../../src/export/csv.ts';
import {
  commitRows,
  fixtureScheduleCsv,
  previewSchedule,
  scheduleInputColumns,
  scheduleMaxFileBytes,
  ScheduleImportError,
  type ScheduleImportOptions,
  type SchedulePreview,
} from '../../src/export/schedule.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import type { FixtureEntry, Survey } from '../../src/survey/model.ts';
import { fixtureEntrySchema, problemsAgainst } from '../../src/survey/validate.ts';
import {
  checkPrototypesAfterAll,
  mutateText,
  nonFiniteNumbers,
  plainObjectPolluted,
  Tally,
  textMutation,
  validFile,
  validVariation,
  type TextMutation,
  type ValidVariation,
} from './support-files/hostile.ts';

const scheduleRuns = Number(process.env.LAMPWALK_FUZZ_SCHEDULE_RUNS ?? 4200);

checkPrototypesAfterAll();

const signal = () => new AbortController().signal;

/** A survey with at least one room and entry, varied within the file format's ranges. */
function surveyFor(variation: ValidVariation): Survey {
  const survey = validFile({ ...variation, copies: 1, roomsKept: Math.max(1, variation.roomsKept) }).surveys[0];
  if (!survey) throw new Error('validFile gave no survey');
  return survey;
}

interface Format {
  delimiter: ',' | ';' | '\t';
  decimalSeparator: '.' | ',';
}

const format: fc.Arbitrary<Format> = fc.record({ delimiter: fc.constantFrom(',', ';', '\t'), decimalSeparator: fc.constantFrom('.', ',') });

/** Cells that are wrong in number, yes/no or choice columns, and awkward in text ones. */
const hostileCells = [
  'NaN',
  'Infinity',
  '-Infinity',
  '1e308',
  '1e400',
  '-1',
  '0',
  '',
  ' ',
  '1,5',
  '1.5',
  '1,500',
  '1.500,5',
  '1 500',
  '0x10',
  '١٢',
  '½',
  '=1+1',
  '+1',
  '-1+1',
  '@SUM(A1)',
  "'=cmd|' /C calc'!A0",
  '=HYPERLINK("http://example.invalid","x")',
  '\t=1',
  '\r=1',
  '"',
  '""',
  'a"b',
  '__proto__',
  'constructor',
  'prototype',
  'toString',
  'yes',
  'maybe',
  'LED',
  'x'.repeat(20_000),
  '\u0000',
  '\ud800',
  '\u202e',
];

const headerNames = ['__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', 'count', 'Qty', '', 'room_name', 'calc_x'];

type CellMutation =
  | { op: 'cell'; row: number; column: number; value: number }
  | { op: 'header'; column: number; name: number }
  | { op: 'shorten'; row: number; keep: number }
  | { op: 'lengthen'; row: number; extra: string }
  | { op: 'duplicateRow'; row: number }
  | { op: 'blankRow'; row: number };

const cellMutation: fc.Arbitrary<CellMutation> = fc.oneof(
  { weight: 6, arbitrary: fc.record({ op: fc.constant('cell' as const), row: fc.nat(), column: fc.nat(), value: fc.nat({ max: hostileCells.length - 1 }) }) },
  fc.record({ op: fc.constant('header' as const), column: fc.nat(), name: fc.nat({ max: headerNames.length - 1 }) }),
  fc.record({ op: fc.constant('shorten' as const), row: fc.nat(), keep: fc.nat() }),
  fc.record({ op: fc.constant('lengthen' as const), row: fc.nat(), extra: fc.constantFrom('x', '', '=1', '1,5') }),
  fc.record({ op: fc.constant('duplicateRow' as const), row: fc.nat() }),
  fc.record({ op: fc.constant('blankRow' as const), row: fc.nat() }),
);

interface ScheduleCase {
  /** `hostileMapping`: a valid schedule read with a mapping that names `__proto__` and `constructor` (must be refused as a file problem). */
  kind: 'valid' | 'hostileMapping' | 'cells' | 'text';
  text: string;
  options: ScheduleImportOptions;
  /** For a single changed data cell: its spreadsheet row number and header. */
  cell: { rowNumber: number; header: string } | null;
  entries: number;
}

function applyCells(rows: string[][], mutation: CellMutation): { rowNumber: number; header: string } | null {
  const header = rows[0]!;
  const data = (n: number) => 1 + (n % Math.max(1, rows.length - 1));
  switch (mutation.op) {
    case 'cell': {
      const row = data(mutation.row);
      const column = mutation.column % header.length;
      if (!rows[row]) return null;
      rows[row]![column] = hostileCells[mutation.value]!;
      return { rowNumber: row + 1, header: header[column]! };
    }
    case 'header':
      header[mutation.column % header.length] = headerNames[mutation.name]!;
      return null;
    case 'shorten': {
      const row = rows[data(mutation.row)];
      if (row) row.length = mutation.keep % Math.max(1, row.length);
      return null;
    }
    case 'lengthen':
      rows[data(mutation.row)]?.push(mutation.extra);
      return null;
    case 'duplicateRow': {
      const row = rows[data(mutation.row)];
      if (row) rows.push([...row]);
      return null;
    }
    case 'blankRow':
      rows.splice(data(mutation.row), 0, []);
      return null;
  }
}

/**
 * Valid schedules to start from: varied demo surveys in every format, made
 * once (writing a schedule calculates the survey, which would otherwise
 * dominate the run time).
 */
const schedulePool: { text: string; format: Format; entries: number }[] = fc
  .sample(fc.tuple(validVariation, format), { numRuns: 36, seed: 20_270_203 })
  .map(([variation, csv]) => {
    const survey = surveyFor(variation);
    return {
      text: fixtureScheduleCsv(survey, calculateSurvey(survey), csv),
      format: csv,
      entries: survey.rooms.reduce((sum, room) => sum + room.entries.length, 0),
    };
  });

const scheduleCase: fc.Arbitrary<ScheduleCase> = fc
  .record({
    start: fc.nat({ max: schedulePool.length - 1 }),
    declared: fc.boolean(),
    keepIds: fc.boolean(),
    defaultVolts: fc.option(fc.constantFrom(12, 120, 230, 277, 1000), { nil: undefined }),
    withCatalog: fc.boolean(),
    hostileMapping: fc.integer({ min: 0, max: 9 }).map((n) => n === 0),
    bom: fc.boolean(),
    shape: fc.oneof(
      { weight: 1, arbitrary: fc.constant<{ kind: 'valid' }>({ kind: 'valid' }) },
      { weight: 6, arbitrary: fc.record({ kind: fc.constant('cells' as const), mutations: fc.array(cellMutation, { minLength: 1, maxLength: 3 }) }) },
      {
        weight: 3,
        arbitrary: fc.record({
          kind: fc.constant('text' as const),
          mutations: fc.array(
            fc.oneof(
              textMutation.map((mutation): TextMutation | 'swapDelimiter' | 'crOnly' | 'openQuote' => mutation),
              fc.constantFrom<'swapDelimiter' | 'crOnly' | 'openQuote'>('swapDelimiter', 'crOnly', 'openQuote'),
            ),
            { minLength: 1, maxLength: 3 },
          ),
        }),
      },
    ),
  })
  .map(({ start, declared, keepIds, defaultVolts, withCatalog, hostileMapping, bom, shape }): ScheduleCase => {
    const { text, format: csv, entries } = schedulePool[start]!;
    const options: ScheduleImportOptions = {
      decimalSeparator: csv.decimalSeparator,
      ...(declared ? { delimiter: csv.delimiter } : {}),
      ids: keepIds ? 'keep' : 'new',
      ...(defaultVolts !== undefined ? { defaultCircuitVolts: defaultVolts } : {}),
      ...(withCatalog ? { catalog: exampleCatalog } : {}),
      // Own `__proto__` / `constructor` keys, as JSON.parse makes them (a mapping saved by a screen and read back).
      ...(hostileMapping ? { mapping: JSON.parse('{"__proto__":"count","constructor":"notes","count":"count"}') as NonNullable<ScheduleImportOptions['mapping']> } : {}),
    };
    if (shape.kind === 'valid') return { kind: hostileMapping ? 'hostileMapping' : 'valid', text: bom ? `\uFEFF${text}` : text, options, cell: null, entries };
    if (shape.kind === 'cells') {
      const rows = Papa.parse<string[]>(text, { delimiter: csv.delimiter }).data;
      const cells = shape.mutations.map((mutation) => applyCells(rows, mutation));
      const cell = shape.mutations.length === 1 ? (cells[0] ?? null) : null;
      const written = Papa.unparse(rows, { delimiter: csv.delimiter, newline: '\r\n', escapeFormulae: false });
      return { kind: 'cells', text: bom ? `\uFEFF${written}` : written, options, cell, entries };
    }
    let mutated = text;
    for (const mutation of shape.mutations) {
      if (mutation === 'swapDelimiter') mutated = mutated.split(csv.delimiter).join(csv.delimiter === ',' ? ';' : ',');
      else if (mutation === 'crOnly') mutated = mutated.replace(/\r\n/g, '\r');
      else if (mutation === 'openQuote') mutated = mutated.replace(/\r\n/, '\r\n"');
      else mutated = mutateText(mutated, mutation);
    }
    return { kind: 'text', text: mutated, options, cell: null, entries };
  });

/** Structural problems that concern a whole row rather than one cell. */
const rowLevel = /cells but the header names|\((MissingQuotes|InvalidQuotes|TooFewFields|TooManyFields|UndetectableDelimiter)\)/;

function problemFaults(preview: SchedulePreview, rowCount: number): string[] {
  const faults: string[] = [];
  for (const row of preview.rows) {
    for (const problem of row.problems) {
      if (!Number.isInteger(problem.rowNumber) || problem.rowNumber < 2 || problem.rowNumber > rowCount + 1) faults.push(`row number ${problem.rowNumber}`);
      if (problem.rowNumber !== row.rowNumber) faults.push(`problem of row ${problem.rowNumber} listed under row ${row.rowNumber}`);
      if (problem.column === null && !rowLevel.test(problem.message)) faults.push(`no column: ${problem.message}`);
      if (problem.message.trim() === '') faults.push('empty message');
    }
    if (row.problems.length > 0 && row.entry !== null) faults.push(`row ${row.rowNumber} has problems and an entry`);
  }
  return faults;
}

function entryFaults(entries: readonly FixtureEntry[], keepIds: boolean, calculate: boolean): string[] {
  const faults: string[] = [];
  const ids = new Set<string>();
  for (const entry of entries) {
    const problems = problemsAgainst(fixtureEntrySchema, entry, 'entry');
    if (problems.length > 0) faults.push(`entry fails the file schema: ${problems.map((p) => `${p.path}: ${p.message}`).join('; ')}`);
    if (ids.has(entry.id) && keepIds) faults.push(`id ${entry.id} twice`);
    ids.add(entry.id);
  }
  if (calculate && entries.length > 0) {
    // The imported entries in a room of the demo survey calculate to finite figures or a named input error.
    const survey = demoSurvey();
    survey.rooms = [{ ...survey.rooms[0]!, entries: [...entries] }];
    try {
      const bad = nonFiniteNumbers(calculateSurvey(survey));
      if (bad.length > 0) faults.push(`non-finite figures: ${bad.slice(0, 3).join(', ')}`);
    } catch (error) {
      if (!(error instanceof CalcInputError)) faults.push(`calculation threw ${String(error)}`);
    }
  }
  return faults;
}

describe('fixture schedules, generated and mutated', () => {
  it('previews every file without throwing, locates every problem by row and column, and commits only valid entries', async () => {
    const tally = new Tally();
    let rowProblemTotal = 0;
    await fc.assert(
      fc.asyncProperty(scheduleCase, async (item) => {
        tally.add('files');
        tally.add(`files:${item.kind}`);
        let preview: SchedulePreview;
        try {
          preview = await previewSchedule(signal(), item.text, item.options);
        } catch (error) {
          tally.add('crashes', `${String(error)} ← ${item.text.slice(0, 200)}`);
          return false;
        }
        const rowCount = item.text.split(/\r\n|\r|\n/).length;
        const faults = problemFaults(preview, rowCount);
        if (faults.length > 0) tally.add('badly located problems', faults.join('; '));
        rowProblemTotal += preview.rows.reduce((sum, row) => sum + row.problems.length, 0);

        if (item.cell && preview.fileProblems.length === 0) {
          const row = preview.rows.find((r) => r.rowNumber === item.cell!.rowNumber);
          const mapped = Object.values(preview.mapping).includes(item.cell.header);
          if (mapped && row && row.problems.length > 0) {
            const here = row.problems.some((p) => p.column === item.cell!.header || p.column === null);
            tally.add(here ? 'single-cell refusals at the cell' : 'single-cell refusals elsewhere', here ? undefined : JSON.stringify(row.problems));
          }
        }

        let strict: FixtureEntry[] | null = null;
        try {
          strict = commitRows(preview);
        } catch (error) {
          if (!(error instanceof ScheduleImportError)) {
            tally.add('crashes', `commitRows threw ${String(error)}`);
            return false;
          }
          if (preview.fileProblems.length === 0 && !/row \d+/.test(error.message)) tally.add('refusals without a row', error.message);
        }
        let lenient: FixtureEntry[] = [];
        try {
          lenient = commitRows(preview, { skipBadRows: true });
        } catch (error) {
          if (!(error instanceof ScheduleImportError) || preview.fileProblems.length === 0) {
            tally.add('crashes', `commitRows (skipping bad rows) threw ${String(error)}`);
            return false;
          }
        }
        // Every row `commitRows` returns (whole file or good rows only) passes the schema; the good rows (all rows, when
        // the file is accepted whole) are calculated together.
        const bad = [...entryFaults(strict ?? [], false, false), ...entryFaults(lenient, false, true)];
        const badIds = item.options.ids === 'keep' ? entryFaults(lenient, true, false).filter((f) => f.startsWith('id ')) : [];
        if (bad.length + badIds.length > 0) tally.add('invalid committed entries', [...bad, ...badIds].join('; '));
        if (strict !== null) tally.add('accepted whole');
        else if (preview.fileProblems.length > 0) tally.add('refused: file problem');
        else tally.add('refused: row problems');
        if (item.kind === 'hostileMapping' && !preview.fileProblems.some((problem) => problem.includes('"__proto__", which is not a fixture schedule column'))) {
          tally.add('hostile mappings not refused', preview.fileProblems.join('; '));
        }
        if (item.kind === 'valid' && (strict === null || strict.length !== item.entries)) {
          tally.add('valid schedules refused', [...preview.fileProblems, ...preview.rows.flatMap((r) => r.problems.map((p) => `${p.rowNumber}/${p.column}: ${p.message}`))].join('; '));
        }
        return faults.length === 0 && bad.length === 0 && badIds.length === 0;
      }),
      { numRuns: scheduleRuns },
    );
    const refused = tally.get('refused: file problem') + tally.get('refused: row problems');
    console.log(
      `schedule fuzz: ${tally.get('files')} files (${tally.get('files:valid')} valid, ${tally.get('files:hostileMapping')} valid but read with a __proto__ mapping, ${tally.get('files:cells')} with mutated cells/rows/headers, ` +
        `${tally.get('files:text')} with mutated text), ${refused} refused (${tally.get('refused: row problems')} with ${rowProblemTotal} row problems, ` +
        `each with its row number, ${tally.get('refused: file problem')} with a file problem), ${tally.get('accepted whole')} accepted whole, ` +
        `${tally.get('single-cell refusals at the cell')} single broken cells reported at their row and column ` +
        `(${tally.get('single-cell refusals elsewhere')} elsewhere), ${tally.get('crashes')} crashes, ${tally.get('badly located problems')} files with unlocated problems, ` +
        `${tally.get('invalid committed entries')} files whose committed entries fail the schema or the calculation`,
    );
    tally.printSamples();
    expect(tally.get('files')).toBe(scheduleRuns);
    tally.expectNone(['crashes', 'badly located problems', 'refusals without a row', 'invalid committed entries', 'valid schedules refused', 'hostile mappings not refused', 'single-cell refusals elsewhere']);
    expect(tally.get('single-cell refusals at the cell')).toBeGreaterThan(scheduleRuns * 0.05);
    expect(tally.get('accepted whole')).toBeGreaterThan(scheduleRuns * 0.05);
    expect(refused).toBeGreaterThan(scheduleRuns * 0.4);
  }, 240_000);

  it('refuses an oversized schedule before parsing it, saying the limit in MB', async () => {
    expect(scheduleMaxFileBytes).toBe(20_000_000);
    const header = 'count,existing_technology,rated_watts_per_lamp,circuit_volts\r\n';
    // One byte over: a file problem naming the limit, no rows read.
    const over = `${header}${'4,halogen,50,230\r\n'.repeat(Math.ceil((scheduleMaxFileBytes - header.length) / 18))}`;
    expect(over.length).toBeGreaterThan(scheduleMaxFileBytes);
    const preview = await previewSchedule(signal(), over);
    expect(preview.fileProblems).toEqual([expect.stringContaining('at most 20 MB')]);
    expect(preview.rows).toEqual([]);
    expect(() => commitRows(preview)).toThrow(/at most 20 MB/);
    // Counted in UTF-8 bytes: 7,000,000 "é" are 14 MB (under); 7,000,000 "€" are 21 MB (over).
    expect(utf8BytesOver('é'.repeat(7_000_000), scheduleMaxFileBytes)).toBe(false);
    expect(utf8BytesOver('€'.repeat(7_000_000), scheduleMaxFileBytes)).toBe(true);
    expect(utf8BytesOver('😀'.repeat(5_000_001), scheduleMaxFileBytes)).toBe(true);
    expect(utf8BytesOver('😀'.repeat(5_000_000), scheduleMaxFileBytes)).toBe(false);
    // A schedule just under the limit is read.
    const under = await previewSchedule(signal(), `${header}4,halogen,50,230\r\n`);
    expect(under.fileProblems).toEqual([]);
    expect(under.rows[0]!.entry!.count).toBe(4);
  }, 60_000);

  it('reads numbers by the file’s decimal separator, and refuses thousands separators with the row and column', async () => {
    const header = 'count;existing_technology;rated_watts_per_lamp;circuit_volts;ballast_factor\r\n';
    // A file that declares "." reads "1.125" as one and an eighth (a three-decimal value written by the export).
    const point = await previewSchedule(signal(), 'count,existing_technology,rated_watts_per_lamp,circuit_volts,ballast_factor\r\n4,linear-t8,32,120,1.125\r\n');
    expect(point.rows[0]!.entry!.existing.ballastFactor).toBe(1.125);
    const comma = await previewSchedule(signal(), `${header}4;linear-t8;32;230;1,125\r\n`, { decimalSeparator: ',' });
    expect(comma.rows[0]!.entry!.existing.ballastFactor).toBe(1.125);
    // Thousands separators: refused at their row and column, saying what to write.
    const grouped = await previewSchedule(signal(), `${header}1.500;linear-t8;32;230;0,9\r\n"1,500";linear-t8;32;230;0,9\r\n`, { decimalSeparator: ',' });
    expect(grouped.rows.map((row) => row.problems)).toEqual([
      [{ rowNumber: 2, column: 'count', message: expect.stringContaining('uses "." but the decimal separator for this file is ","') }],
      [{ rowNumber: 3, column: 'count', message: expect.stringContaining('must be a whole number') }],
    ]);
    const pointGrouped = await previewSchedule(signal(), 'count,existing_technology,rated_watts_per_lamp,circuit_volts\r\n"1,500",linear-t8,32,120\r\n4,linear-t8,"1.500,5",120\r\n');
    expect(pointGrouped.rows.map((row) => row.problems.map((p) => [p.rowNumber, p.column, p.message]))).toEqual([
      [[2, 'count', expect.stringMatching(/uses "," .*without thousands separators/)]],
      [[3, 'rated_watts_per_lamp', expect.stringMatching(/uses "," .*without thousands separators/)]],
    ]);
    expect(() => commitRows(pointGrouped)).toThrow(/row 2, count: .*\n.*row 3, rated_watts_per_lamp: /);
  });

  it('keeps hostile header names and mapping keys off the prototypes', async () => {
    const keys = ['__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', 'valueOf'];
    const header = ['count', 'existing_technology', 'rated_watts_per_lamp', 'circuit_volts', ...keys].join(',');
    const text = `${header}\r\n4,halogen,50,230,${keys.map(() => '{"polluted":true}').join(',')}\r\n`;
    const mapping = JSON.parse('{"__proto__":"count","constructor":"notes","toString":"count"}') as NonNullable<ScheduleImportOptions['mapping']>;
    const preview = await previewSchedule(signal(), text, { mapping });
    // Unknown mapping keys are file problems; unknown headers are listed, never used as object keys.
    expect(preview.fileProblems).toEqual(expect.arrayContaining([expect.stringContaining('"__proto__", which is not a fixture schedule column')]));
    const plain = await previewSchedule(signal(), text);
    expect(plain.fileProblems).toEqual([]);
    expect(plain.unmappedHeaders).toEqual(keys);
    expect(Object.getPrototypeOf(plain.rows[0]!.entry) as unknown).toBe(Object.prototype);
    expect(Object.getOwnPropertyNames(plain.rows[0]!.entry).sort()).toEqual(['conditions', 'control', 'count', 'existing', 'id', 'notes', 'proposed']);
    expect(plainObjectPolluted()).toBe(false);
    // Every importable column name is a plain field path (none can walk onto a prototype).
    for (const column of scheduleInputColumns) expect(column).toMatch(/^[a-z][a-z_]*$/);
  });
});
