/**
 * Survey file validation: a complete valid file passes and round-trips, and
 * each kind of bad value is refused at its exact path with a plain message.
 * The ranges checked here are Lampwalk's own file-format rules
 * (docs/file-format.md); no published source, common practice.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import { fileFormatName, fileFormatVersion, makeSurveyFile, type SurveyFile } from '../../src/survey/format.ts';
import type { CatalogProduct, FixtureEntry, Room, Survey } from '../../src/survey/model.ts';
import {
  defaultMaxFileBytes,
  maxProblems,
  parseSurvey,
  parseSurveyFile,
  parseSurveyFileText,
  surveyFileSchema,
  type FileProblem,
  type ParseResult,
} from '../../src/survey/validate.ts';

// ---------------------------------------------------------------------------
// Fixture: an invented two-room parish-hall survey (all names made up).

function catalogTube(): CatalogProduct {
  return {
    id: 'cat-tube-4ft',
    sku: 'TST-T8-4-15',
    name: 'Test tube 4 ft 15 W 2100 lm 4000 K',
    form: 'linear-tube',
    tubeType: 'type-b',
    unitsPerFixture: 2,
    wattsPerUnit: 15,
    lumensPerUnit: 2100,
    cctKelvin: 4000,
    cri: 82,
    powerFactor: 0.95,
    dimmable: false,
    enclosedRated: true,
    moistureRating: 'damp',
    insulationContactRated: false,
    emergencyListed: false,
    ratedLifeHours: 50_000,
    distribution: 'direct-wide',
    unitCost: 7.5,
    installMinutesPerFixture: 20,
    rebatePerFixture: 3,
    example: false,
    retired: false,
  };
}

function catalogDownlight(): CatalogProduct {
  return {
    id: 'cat-downlight',
    sku: 'TST-DL-12',
    name: 'Test downlight 12 W',
    form: 'luminaire',
    tubeType: 'not-a-tube',
    unitsPerFixture: 1,
    wattsPerUnit: 12,
    lumensPerUnit: 1000,
    cctKelvin: 3000,
    cri: 90,
    powerFactor: 0.9,
    dimmable: true,
    enclosedRated: true,
    moistureRating: 'wet',
    insulationContactRated: true,
    emergencyListed: false,
    ratedLifeHours: 40_000,
    distribution: 'direct-narrow',
    unitCost: 28,
    installMinutesPerFixture: 30,
    rebatePerFixture: 0,
    example: true,
    retired: true,
  };
}

function troffers(): FixtureEntry {
  const { id: _id, example: _example, retired: _retired, sku: _sku, ...spec } = catalogTube();
  return {
    id: 'entry-troffer',
    count: 12,
    existing: {
      technology: 'linear-t8',
      description: '2x4 troffer, 2-lamp 32 W T8',
      lampsPerFixture: 2,
      ratedWattsPerLamp: 32,
      fixtureInputWatts: 59,
      lumensPerLamp: 2800,
      ballast: 'electronic',
      ballastFactor: 0.88,
      ballastYear: 2009,
      luminaireEfficiency: 0.7,
      powerFactor: 0.98,
      cctKelvin: 3500,
      cri: 78,
      lampLifeHours: 24_000,
      lampPrice: 4.25,
    },
    conditions: {
      enclosed: true,
      dimmer: 'none',
      location: 'dry',
      emergencyCircuit: false,
      insulationContact: false,
      circuitVolts: 230,
      breakerAmps: 16,
      circuitLabel: 'DB1 / 3',
    },
    proposed: { catalogId: 'cat-tube-4ft', ...spec },
    control: 'occupancy-sensor',
    controlSavingsFraction: 0.25,
    notes: 'Two lenses cracked.',
  };
}

function exitSign(): FixtureEntry {
  return {
    id: 'entry-exit',
    count: 1,
    existing: {
      technology: 'led',
      description: 'Exit sign',
      lampsPerFixture: 1,
      ratedWattsPerLamp: 3,
      meteredWattsPerFixture: 3.4,
      ballast: 'none',
    },
    conditions: {
      enclosed: true,
      dimmer: 'unknown',
      location: 'dry',
      emergencyCircuit: true,
      insulationContact: false,
      circuitVolts: 230,
    },
    proposed: null,
    control: 'none',
    notes: '',
  };
}

function hall(): Room {
  return {
    id: 'room-hall',
    name: 'Main hall',
    spaceType: 'gymnasium',
    floor: { kind: 'rectangle', lengthMetres: 18, widthMetres: 9.5 },
    ceilingHeightMetres: 4.2,
    workPlaneHeightMetres: 0,
    hours: { kind: 'weekly', days: [4, 4, 6, 4, 8, 10, 2], weeksPerYear: 48 },
    colourCritical: false,
    photometry: { coefficientOfUtilisation: 0.62, luminaireDirtDepreciation: 0.9 },
    entries: [troffers(), exitSign()],
    notes: 'Used for classes and events.',
  };
}

function office(): Room {
  return {
    id: 'room-office',
    name: 'Office',
    spaceType: 'office-enclosed',
    floor: { kind: 'area', squareMetres: 14.5 },
    ceilingHeightMetres: 2.7,
    workPlaneHeightMetres: 0.76,
    hours: { kind: 'annual', hoursPerYear: 2500 },
    colourCritical: false,
    photometry: {},
    entries: [],
    notes: '',
  };
}

function survey(): Survey {
  return {
    id: 'survey-hall',
    name: 'Example parish hall',
    site: { name: 'Example parish hall', address: '1 Sample Street, Testford' },
    client: { name: 'Testford Hall Committee', contact: 'Treasurer' },
    preparedBy: 'A. Surveyor',
    buildingType: 'other',
    heatingType: 'fossil',
    cooled: false,
    units: 'si',
    locale: 'en-GB',
    money: {
      currency: 'GBP',
      energyRatePerKwh: 0.28,
      demandChargePerKwMonth: 0,
      energyEscalationPerYear: 0.01,
      discountRatePerYear: 0.035,
      analysisYears: 10,
      labourRatePerHour: 45,
      markupFraction: 0.15,
      taxFraction: 0.2,
      taxBase: 'everything',
      lampRecyclingCostEach: 0.5,
      ballastDisposalCostEach: 1.5,
      relampMinutes: 10,
    },
    savings: { coincidenceFactor: 0.7, gasThermsPerKwhSaved: -0.02 },
    grid: { kind: 'uk', year: 2023 },
    rooms: [hall(), office()],
    notes: 'Walked on a weekday morning.',
    createdAt: '2024-05-01T09:30:00.000Z',
    updatedAt: '2024-05-01T11:05:12+01:00',
  };
}

function validFile(): SurveyFile {
  return makeSurveyFile([survey()], [catalogTube(), catalogDownlight()], new Date(Date.UTC(2024, 4, 2, 8, 0, 0)));
}

/** The file as a plain mutable JSON tree, for planting bad values. */
type Json = Record<string, unknown>;
function fileTree(): Json {
  return JSON.parse(JSON.stringify(validFile())) as Json;
}
function at(tree: unknown, ...keys: (string | number)[]): Json {
  let node: unknown = tree;
  for (const key of keys) node = (node as Record<string | number, unknown>)[key];
  return node as Json;
}
const entry0 = ['surveys', 0, 'rooms', 0, 'entries', 0] as const;

/** The problems of a failed parse (fails the test when the parse succeeded). */
function problemsOf(result: ParseResult | ReturnType<typeof parseSurvey>): FileProblem[] {
  expect(result.ok).toBe(false);
  return result.ok ? [] : result.problems;
}

/** Asserts that `path` is reported, with a message containing `words`, and returns that message. */
function expectProblem(result: ParseResult | ReturnType<typeof parseSurvey>, path: string, words: string): string {
  const problems = problemsOf(result);
  const found = problems.find((problem) => problem.path === path);
  expect(found, `no problem at ${path}; got ${JSON.stringify(problems)}`).toBeDefined();
  expect(found?.message).toContain(words);
  return found?.message ?? '';
}

// ---------------------------------------------------------------------------

describe('makeSurveyFile', () => {
  it('wraps surveys and catalog with the format name, version and a UTC timestamp', () => {
    const file = makeSurveyFile([], [], new Date(Date.UTC(2024, 4, 1, 9, 30)));
    expect(file).toEqual({
      format: 'lampwalk-survey-file',
      version: 3,
      exportedAt: '2024-05-01T09:30:00.000Z',
      surveys: [],
      catalog: [],
      photos: [],
      portfolios: [],
    });
    expect(fileFormatName).toBe('lampwalk-survey-file');
    expect(fileFormatVersion).toBe(3);
  });

  it('refuses an invalid date, naming exportedAt', () => {
    expect(() => makeSurveyFile([], [], new Date(Number.NaN))).toThrow(CalcInputError);
    expect(() => makeSurveyFile([], [], new Date(Number.NaN))).toThrow(/^exportedAt: /);
    expect(() => makeSurveyFile([], [], new Date(Date.UTC(10_000, 0, 1)))).toThrow(/^exportedAt: must be in the years 0 to 9999/);
  });
});

describe('a valid file', () => {
  it('passes and round-trips through JSON text unchanged', () => {
    const original = validFile();
    const text = JSON.stringify(original, null, 2);
    const result = parseSurveyFileText(text);
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    expect(result.file).toEqual(original);
    // And once more: what was read back writes out and reads back the same.
    const again = parseSurveyFileText(JSON.stringify(result.file));
    expect(again).toEqual({ ok: true, file: original });
  });

  it('passes as an object, and an empty file (no surveys, no catalog) passes', () => {
    expect(parseSurveyFile(validFile()).ok).toBe(true);
    expect(parseSurveyFile(makeSurveyFile([], [], new Date())).ok).toBe(true);
  });

  it('accepts the edges of each range', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0, 'rooms', 1, 'hours').hoursPerYear = 8760;
    Object.assign(at(tree, ...entry0, 'existing'), { lampsPerFixture: 24, powerFactor: 0.1, cri: 100, cctKelvin: 10_000 });
    at(tree, ...entry0).count = 0;
    at(tree, 'surveys', 0, 'money').analysisYears = 40;
    at(tree, 'surveys', 0, 'grid').year = 2100;
    expect(parseSurveyFile(tree)).toMatchObject({ ok: true });
  });

  it('ignores a byte-order mark at the start of the text', () => {
    expect(parseSurveyFileText(`\uFEFF${JSON.stringify(validFile())}`).ok).toBe(true);
  });

  it('accepts every grid-factor kind and the other floor and hours kinds', () => {
    for (const grid of [
      { kind: 'egrid', subregion: 'CAMX' },
      { kind: 'custom', kgCo2PerKwh: 0.4, label: 'Utility disclosure' },
    ]) {
      const tree = fileTree();
      at(tree, 'surveys', 0).grid = grid;
      expect(parseSurveyFile(tree).ok).toBe(true);
    }
  });
});

describe('bad values are refused at their exact path', () => {
  it('negative rated watts', () => {
    const tree = fileTree();
    at(tree, ...entry0, 'existing').ratedWattsPerLamp = -40;
    const message = expectProblem(
      parseSurveyFile(tree),
      'surveys[0].rooms[0].entries[0].existing.ratedWattsPerLamp',
      'must be a number greater than 0 and at most 100000 (got -40)',
    );
    expect(message).toBe('must be a number greater than 0 and at most 100000 (got -40)');
  });

  it('a product whose lowest input voltage lies above its highest', () => {
    // A 120–277 V universal driver is a common rating; 277 V down to 120 V is a typing slip (common practice, no published source).
    const tree = fileTree();
    at(tree, 'catalog', 0).inputVoltsMin = 277;
    at(tree, 'catalog', 0).inputVoltsMax = 120;
    expect(problemsOf(parseSurveyFile(tree))).toEqual([
      { path: 'catalog[0].inputVoltsMax', message: 'must not be below the lowest input voltage of 277 V (got 120)' },
    ]);
    at(tree, 'catalog', 0).inputVoltsMax = 277;
    expect(parseSurveyFile(tree).ok).toBe(true);
    // A bad value is reported once, by its own range check.
    at(tree, 'catalog', 0).inputVoltsMax = -5;
    expect(problemsOf(parseSurveyFile(tree)).map((p) => p.path)).toEqual(['catalog[0].inputVoltsMax']);
  });

  it('annual hours of 9000', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0, 'rooms', 1, 'hours').hoursPerYear = 9000;
    const problems = problemsOf(parseSurveyFile(tree));
    expect(problems).toEqual([
      { path: 'surveys[0].rooms[1].hours.hoursPerYear', message: 'must be a number between 0 and 8760 (got 9000)' },
    ]);
  });

  it('NaN and Infinity in a JavaScript object', () => {
    const file = validFile();
    const entry = file.surveys[0]?.rooms[0]?.entries[0];
    if (!entry) throw new Error('fixture has no entry');
    entry.count = Number.NaN;
    entry.existing.ratedWattsPerLamp = Number.POSITIVE_INFINITY;
    const result = parseSurveyFile(file);
    expectProblem(result, 'surveys[0].rooms[0].entries[0].count', 'must be a whole number between 0 and 100000 (got NaN)');
    expectProblem(result, 'surveys[0].rooms[0].entries[0].existing.ratedWattsPerLamp', '(got Infinity)');
  });

  it('a number written as text with a decimal comma', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0, 'rooms', 1).ceilingHeightMetres = '1,5';
    const message = expectProblem(parseSurveyFile(tree), 'surveys[0].rooms[1].ceilingHeightMetres', '(got text "1,5")');
    expect(message).toContain('greater than 0 and at most 100');
    expect(message).toContain('without quotes');
  });

  it('a whole number with a fraction, and a boolean written as text', () => {
    const tree = fileTree();
    at(tree, ...entry0, 'existing').lampsPerFixture = 2.5;
    at(tree, ...entry0, 'conditions').enclosed = 'yes';
    const result = parseSurveyFile(tree);
    expectProblem(result, 'surveys[0].rooms[0].entries[0].existing.lampsPerFixture', 'must be a whole number between 1 and 24 (got 2.5)');
    expectProblem(result, 'surveys[0].rooms[0].entries[0].conditions.enclosed', 'must be true or false (got text "yes")');
  });

  it('null for a required and for an optional number, and undefined for an optional one', () => {
    const tree = fileTree();
    at(tree, ...entry0, 'existing').lampsPerFixture = null;
    at(tree, ...entry0, 'existing').lumensPerLamp = null;
    at(tree, ...entry0, 'conditions').breakerAmps = undefined;
    const result = parseSurveyFile(tree);
    expectProblem(result, 'surveys[0].rooms[0].entries[0].existing.lampsPerFixture', '(got null)');
    expectProblem(result, 'surveys[0].rooms[0].entries[0].existing.lumensPerLamp', 'must be a number between 0 and 10000000 (got null)');
    expectProblem(result, 'surveys[0].rooms[0].entries[0].conditions.breakerAmps', 'must be a number between 1 and 1000 (got nothing)');
  });

  it('an unknown key (a typo)', () => {
    const tree = fileTree();
    at(tree, ...entry0, 'existing').wats = 32;
    const message = expectProblem(parseSurveyFile(tree), 'surveys[0].rooms[0].entries[0].existing.wats', 'is not a field of existing equipment');
    expect(message).toContain('ratedWattsPerLamp');
  });

  it('a missing field', () => {
    const tree = fileTree();
    delete at(tree, 'surveys', 0, 'rooms', 1).name;
    delete at(tree, 'surveys', 0, 'money').currency;
    const result = parseSurveyFile(tree);
    expectProblem(result, 'surveys[0].rooms[1].name', 'is missing: required in a room');
    expectProblem(result, 'surveys[0].money.currency', 'is missing');
  });

  it('duplicate ids among surveys, rooms and entries, and among catalog products', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0, 'rooms', 1).id = 'room-hall';
    at(tree, 'surveys', 0, 'rooms', 0, 'entries', 1).id = 'survey-hall';
    at(tree, 'catalog', 1).id = 'cat-tube-4ft';
    const problems = problemsOf(parseSurveyFile(tree));
    expect(problems).toEqual([
      {
        path: 'surveys[0].rooms[0].entries[1].id',
        message: 'id "survey-hall" is already used by surveys[0]; every survey, room and fixture entry needs an id of its own',
      },
      {
        path: 'surveys[0].rooms[1].id',
        message: 'id "room-hall" is already used by surveys[0].rooms[0]; every survey, room and fixture entry needs an id of its own',
      },
      {
        path: 'catalog[1].id',
        message: 'id "cat-tube-4ft" is already used by catalog[0]; every catalog product needs an id of its own',
      },
    ]);
  });

  it('duplicate ids across two surveys', () => {
    const file = validFile();
    file.surveys.push({ ...survey(), id: 'survey-second' });
    const problems = problemsOf(parseSurveyFile(file));
    expect(problems.map((problem) => problem.path)).toEqual([
      'surveys[1].rooms[0].id',
      'surveys[1].rooms[0].entries[0].id',
      'surveys[1].rooms[0].entries[1].id',
      'surveys[1].rooms[1].id',
    ]);
  });

  it('empty and overlong ids, and overlong text', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0).id = '';
    at(tree, 'catalog', 0).id = 'x'.repeat(201);
    at(tree, 'surveys', 0).notes = 'n'.repeat(10_001);
    const result = parseSurveyFile(tree);
    expectProblem(result, 'surveys[0].id', 'must be an id: non-empty text of at most 200 characters (got text "")');
    expectProblem(result, 'catalog[0].id', '(got 201 characters)');
    expectProblem(result, 'surveys[0].notes', 'must be text of at most 10000 characters (got 10001 characters)');
  });

  it('the wrong format name: only that is reported', () => {
    const tree = fileTree();
    tree.format = 'some-other-app-backup';
    at(tree, 'surveys', 0).id = 42;
    expect(problemsOf(parseSurveyFile(tree))).toEqual([
      {
        path: 'format',
        message: 'not a Lampwalk survey file: "format" must be "lampwalk-survey-file" (got text "some-other-app-backup")',
      },
    ]);
    delete tree.format;
    expectProblem(parseSurveyFile(tree), 'format', 'not a Lampwalk survey file');
  });

  it('a newer version: refused, saying to open it with the newer Lampwalk', () => {
    const tree = fileTree();
    tree.version = 4;
    tree.sketches = [];
    const problems = problemsOf(parseSurveyFile(tree));
    expect(problems).toHaveLength(1);
    expect(problems[0]?.path).toBe('version');
    expect(problems[0]?.message).toContain('written by a newer Lampwalk (file format version 4)');
    expect(problems[0]?.message).toContain('Open it with the newer Lampwalk');
  });

  it('a version that is not a version number', () => {
    for (const version of ['1', 0, 1.5, null]) {
      const tree = fileTree();
      tree.version = version;
      expectProblem(parseSurveyFile(tree), 'version', 'must be the file format version, a whole number from 1 to 3 for this Lampwalk');
    }
  });

  it('text that is not JSON', () => {
    const problems = problemsOf(parseSurveyFileText('{"format": "lampwalk-survey-file", '));
    expect(problems).toHaveLength(1);
    expect(problems[0]?.path).toBe('(file)');
    expect(problems[0]?.message).toMatch(/^not JSON: ./);
    expect(problemsOf(parseSurveyFileText(''))[0]?.message).toMatch(/^not JSON: /);
  });

  it('JSON that is not an object', () => {
    expect(problemsOf(parseSurveyFileText('[1, 2]'))).toEqual([
      { path: '(file)', message: 'must be a JSON object with "format": "lampwalk-survey-file" (got a list of 2 items)' },
    ]);
  });

  it('oversized text, before parsing, saying the limit', () => {
    const text = JSON.stringify(validFile());
    const problems = problemsOf(parseSurveyFileText(text, 1000));
    expect(problems).toEqual([
      { path: '(file)', message: 'is too large: over the 1 kB limit for a survey file (1000 bytes)' },
    ]);
    // Counted in UTF-8 bytes, not characters: 600 "é" are 1200 bytes.
    expect(problemsOf(parseSurveyFileText(`"${'é'.repeat(600)}"`, 1000))[0]?.message).toContain('too large');
    expect(problemsOf(parseSurveyFileText(`"${'é'.repeat(499)}"`, 1000))[0]?.message).not.toContain('too large');
    // Text that is not JSON and too big is refused for its size (never parsed).
    expect(problemsOf(parseSurveyFileText('x'.repeat(1001), 1000))[0]?.message).toContain('1 kB limit');
    expect(defaultMaxFileBytes).toBe(50_000_000);
    expect(() => parseSurveyFileText('{}', 0)).toThrow(CalcInputError);
  });

  it('a work plane at or above the ceiling', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0, 'rooms', 1).workPlaneHeightMetres = 2.7;
    expect(problemsOf(parseSurveyFile(tree))).toEqual([
      {
        path: 'surveys[0].rooms[1].workPlaneHeightMetres',
        message: 'must be below the ceiling height of 2.7 m (got 2.7)',
      },
    ]);
  });

  it('a work plane check does not pile onto a height outside its range', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0, 'rooms', 1).ceilingHeightMetres = -1;
    at(tree, 'surveys', 0, 'rooms', 0).workPlaneHeightMetres = 150;
    expect(problemsOf(parseSurveyFile(tree)).map((problem) => problem.path)).toEqual([
      'surveys[0].rooms[0].workPlaneHeightMetres',
      'surveys[0].rooms[1].ceilingHeightMetres',
    ]);
  });

  it('an unknown or lower-case currency', () => {
    for (const currency of ['XYZ', 'usd', 'EURO']) {
      const tree = fileTree();
      at(tree, 'surveys', 0, 'money').currency = currency;
      expectProblem(parseSurveyFile(tree), 'surveys[0].money.currency', `must be an ISO 4217 currency code in capitals, such as "USD", "EUR" or "GBP" (got text "${currency}")`);
    }
  });

  it('a locale that Intl refuses', () => {
    for (const locale of ['en_GB', '', 'x']) {
      const tree = fileTree();
      at(tree, 'surveys', 0).locale = locale;
      expectProblem(parseSurveyFile(tree), 'surveys[0].locale', 'must be a BCP 47 language tag');
    }
  });

  it('timestamps that are not ISO 8601, have no zone, or name a day that does not exist', () => {
    for (const stamp of ['01/05/2024 09:30', '2024-05-01T09:30:00', '2024-02-30T10:00:00Z', '2023-02-29T10:00:00Z']) {
      const tree = fileTree();
      at(tree, 'surveys', 0).createdAt = stamp;
      expectProblem(parseSurveyFile(tree), 'surveys[0].createdAt', 'must be an ISO 8601 date and time with a time zone');
    }
    const leapDay = fileTree();
    at(leapDay, 'surveys', 0).createdAt = '2024-02-29T10:00:00Z';
    expect(parseSurveyFile(leapDay).ok).toBe(true);
  });

  it('a weekly schedule without exactly 7 days, or a day over 24 hours', () => {
    const short = fileTree();
    at(short, 'surveys', 0, 'rooms', 0, 'hours').days = [8, 8, 8, 8, 8, 0];
    expectProblem(parseSurveyFile(short), 'surveys[0].rooms[0].hours.days[6]', 'must be a number between 0 and 24 (got nothing)');
    const long = fileTree();
    at(long, 'surveys', 0, 'rooms', 0, 'hours').days = [8, 8, 8, 8, 8, 0, 0, 5];
    expectProblem(parseSurveyFile(long), 'surveys[0].rooms[0].hours.days[7]', 'a week has 7 days');
    const over = fileTree();
    at(over, 'surveys', 0, 'rooms', 0, 'hours').days = [8, 8, 25, 8, 8, 0, 0];
    expectProblem(parseSurveyFile(over), 'surveys[0].rooms[0].hours.days[2]', '(got 25)');
  });

  it('an unknown kind of grid factor, floor or hours', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0).grid = { kind: 'national', kgCo2PerKwh: 0.2 };
    at(tree, 'surveys', 0, 'rooms', 1).floor = { squareMetres: 20 };
    const result = parseSurveyFile(tree);
    expectProblem(result, 'surveys[0].grid.kind', 'must be one of "egrid", "uk", "custom" (got text "national")');
    expectProblem(result, 'surveys[0].rooms[1].floor.kind', 'must be one of "area", "rectangle" (got nothing)');
  });

  it('a value outside a closed set', () => {
    const tree = fileTree();
    at(tree, 'surveys', 0, 'rooms', 1).spaceType = 'Office';
    expectProblem(parseSurveyFile(tree), 'surveys[0].rooms[1].spaceType', '"office-enclosed", "office-open"');
  });

  it('each money range names its bounds', () => {
    const tree = fileTree();
    Object.assign(at(tree, 'surveys', 0, 'money'), {
      energyEscalationPerYear: 0.6,
      discountRatePerYear: -0.01,
      analysisYears: 41,
      taxFraction: 1.2,
      lampRecyclingCostEach: -1,
    });
    const result = parseSurveyFile(tree);
    expectProblem(result, 'surveys[0].money.energyEscalationPerYear', 'must be a number between -0.5 and 0.5 (got 0.6)');
    expectProblem(result, 'surveys[0].money.discountRatePerYear', 'must be a number between 0 and 0.5 (got -0.01)');
    expectProblem(result, 'surveys[0].money.analysisYears', 'must be a whole number between 1 and 40 (got 41)');
    expectProblem(result, 'surveys[0].money.taxFraction', 'must be a number between 0 and 1 (got 1.2)');
    expectProblem(result, 'surveys[0].money.lampRecyclingCostEach', 'must be a number of 0 or more (got -1)');
  });

  it('a proposed product that is neither an object nor null', () => {
    const tree = fileTree();
    at(tree, ...entry0).proposed = 'LED tube';
    expectProblem(parseSurveyFile(tree), 'surveys[0].rooms[0].entries[0].proposed', 'must be a JSON object describing a proposed product');
  });

  it(`lists at most ${maxProblems} problems, the last one counting the rest`, () => {
    const tree = fileTree();
    const entries = at(tree, 'surveys', 0, 'rooms', 0).entries as Json[];
    const template = entries[1];
    for (let index = 0; index < 80; index++) entries.push({ ...template, id: `bad-${index}`, count: -1 });
    const problems = problemsOf(parseSurveyFile(tree));
    expect(problems).toHaveLength(maxProblems);
    expect(problems[0]?.path).toBe('surveys[0].rooms[0].entries[2].count');
    expect(problems[maxProblems - 1]).toEqual({
      path: '(file)',
      message: '31 more problems not listed; fix the ones above and check again',
    });
  });
});

describe('prototype pollution', () => {
  it('__proto__ and constructor keys in JSON text are reported and pollute nothing', () => {
    const file = validFile();
    const text = JSON.stringify(file)
      .replace('{"format"', '{"__proto__":{"pollutedByFile":"yes"},"format"')
      .replace('"name":"Main hall"', '"constructor":{"prototype":{"pollutedByRoom":"yes"}},"name":"Main hall"')
      .replace('"kind":"uk"', '"__proto__":{"pollutedByGrid":"yes"},"kind":"uk"');
    const result = parseSurveyFileText(text);
    expectProblem(result, '__proto__', 'is not a field of a Lampwalk survey file');
    expectProblem(result, 'surveys[0].rooms[0].constructor', 'is not a field of a room');
    expectProblem(result, 'surveys[0].grid.__proto__', 'is not a field of a UK grid factor');
    const plain: Record<string, unknown> = {};
    expect(plain.pollutedByFile).toBeUndefined();
    expect(plain.pollutedByRoom).toBeUndefined();
    expect(plain.pollutedByGrid).toBeUndefined();
    expect(Object.prototype).not.toHaveProperty('pollutedByFile');
  });

  it('the parsed file is made of fresh plain objects', () => {
    const input = validFile();
    const result = parseSurveyFile(input);
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    expect(result.file).not.toBe(input);
    expect(result.file.surveys[0]).not.toBe(input.surveys[0]);
    expect(Object.getPrototypeOf(result.file.surveys[0])).toBe(Object.prototype);
  });
});

describe('parseSurvey', () => {
  it('accepts a valid survey and returns it', () => {
    const result = parseSurvey(survey());
    expect(result).toEqual({ ok: true, survey: survey() });
  });

  it('prefixes paths and checks ids within the survey', () => {
    const bad = survey();
    const room = bad.rooms[1];
    if (!room) throw new Error('fixture has no second room');
    room.id = 'entry-exit';
    room.ceilingHeightMetres = 0;
    const result = parseSurvey(bad, 'surveys[3]');
    expect(problemsOf(result)).toEqual([
      { path: 'surveys[3].rooms[1].ceilingHeightMetres', message: 'must be a number greater than 0 and at most 100 (got 0)' },
      {
        path: 'surveys[3].rooms[1].id',
        message: 'id "entry-exit" is already used by surveys[3].rooms[0].entries[1]; every survey, room and fixture entry needs an id of its own',
      },
    ]);
  });

  it('without a prefix, paths start at the survey', () => {
    expectProblem(parseSurvey({ ...survey(), cooled: 'no' }), 'cooled', 'must be true or false (got text "no")');
    expectProblem(parseSurvey(7), '(survey)', 'must be a JSON object describing a survey (got 7)');
  });
});

describe('docs/file-format.md', () => {
  const doc = readFileSync(new URL('../../docs/file-format.md', import.meta.url), 'utf8');

  it('its example is a valid survey file', () => {
    const blocks = [...doc.matchAll(/```json\n([\s\S]*?)\n```/g)];
    expect(blocks).toHaveLength(1);
    const result = parseSurveyFileText(blocks[0]?.[1] ?? '');
    expect(result).toMatchObject({ ok: true });
  });

  it('documents every field of every schema', () => {
    const fields = new Set<string>();
    const collect = (schema: unknown): void => {
      if (typeof schema !== 'object' || schema === null) return;
      const node = schema as { entries?: Record<string, unknown>; options?: unknown[]; wrapped?: unknown; item?: unknown; items?: unknown[] };
      for (const [key, value] of Object.entries(node.entries ?? {})) {
        fields.add(key);
        collect(value);
      }
      for (const child of [...(node.options ?? []), ...(node.items ?? []), node.wrapped, node.item]) collect(child);
    };
    collect(surveyFileSchema);
    expect(fields.size).toBeGreaterThan(100);
    const missing = [...fields].filter((field) => !doc.includes(`\`${field}\``));
    expect(missing).toEqual([]);
  });
});
