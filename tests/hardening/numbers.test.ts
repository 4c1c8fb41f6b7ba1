/**
 * Bad numbers in every numeric field. A survey with every optional numeric
 * field filled in (existing equipment, conditions, proposal, photometry,
 * savings and money assumptions, hours, floor, grid factor, layout, catalog
 * products, photos) is walked for its numeric fields; each gets NaN,
 * ±Infinity, 1e308, -1, 0, empty text, "1,5", "1.5", "1,500", "1.500,5"
 * and null, through
 * (a) the survey file validator: refused with a problem at exactly that
 *     field's path, or accepted as a finite number;
 * (b) `calculateSurvey`: a `CalcInputError` naming the field, or results in
 *     which every number is finite (a deep walk of the result);
 * (c) `parseDecimal` and the screens' `readNumber` for every field rule.
 * A fast-check property then checks that any survey the validator accepts
 * calculates to finite figures or a `CalcInputError`, never NaN, Infinity or
 * another exception.
 *
 * The expectations are the ranges of docs/file-format.md and the rule in
 * DEVELOPERS.md ("every calculation throws CalcInputError instead of
 * returning NaN or Infinity") — common practice, no published source.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import { calculateLayout, calculatePortfolio } from '../../src/calc/portfolio.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { parseDecimal } from '../../src/calc/units.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import { makeSurveyFile, type SurveyFile } from '../../src/survey/format.ts';
import type { Survey } from '../../src/survey/model.ts';
import { parseSurveyFile } from '../../src/survey/validate.ts';
import { readNumber, rules, type NumberRule } from '../../src/ui/state/fields.ts';
import { nonFiniteNumbers, pathText, Tally, type PathKey } from './support-files/hostile.ts';

const tinyPngBase64 = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==';

/** The demo survey with every optional numeric field given a valid value (invented demo data). */
function fullSurvey(): Survey {
  const survey = demoSurvey();
  survey.savings = { hvacEnergyFactor: 0.2, hvacDemandFactor: 0.3, coincidenceFactor: 0.8, gasThermsPerKwhSaved: -0.01, defaultHoursPerYear: 3000 };
  survey.grid = { kind: 'custom', kgCo2PerKwh: 0.4, label: 'invented factor' };
  const [shop, stair] = survey.rooms;
  if (!shop || !stair) throw new Error('the demo survey lost its rooms');
  shop.photometry = { coefficientOfUtilisation: 0.6, lightLossFactor: 0.8, luminaireDirtDepreciation: 0.9, roomSurfaceDirtDepreciation: 0.95 };
  shop.hours = { kind: 'weekly', days: [10, 10, 10, 10, 10, 6, 0], weeksPerYear: 50 };
  const troffers = shop.entries[0]!;
  troffers.existing = {
    ...troffers.existing,
    fixtureInputWatts: 120,
    meteredWattsPerFixture: 118,
    lumensPerLamp: 2800,
    ballastFactor: 0.88,
    ballastYear: 2004,
    luminaireEfficiency: 0.7,
    powerFactor: 0.95,
    cctKelvin: 4100,
    cri: 78,
    lampLifeHours: 24_000,
    lampPrice: 3.2,
  };
  troffers.conditions = { ...troffers.conditions, breakerAmps: 20 };
  troffers.controlSavingsFraction = 0.3;
  troffers.control = 'occupancy-sensor';
  survey.layout = {
    unitCount: 4,
    exceptions: [{ id: 'flat-2', unitLabel: 'Flat 2', entryCounts: [{ entryId: troffers.id, count: 3 }], notes: '' }],
  };
  return survey;
}

function fullFile(): SurveyFile {
  const survey = fullSurvey();
  const ukSurvey: Survey = { ...demoSurvey(), id: 'uk-copy', rooms: [], grid: { kind: 'uk', year: 2024 } };
  const portfolio = {
    id: 'estate',
    name: 'Invented estate',
    client: { name: 'Invented client', contact: '' },
    surveyIds: [survey.id, ukSurvey.id],
    plan: { budgetPerYear: 25_000, years: 3 },
    notes: '',
    createdAt: '2027-02-03T04:05:06.000Z',
    updatedAt: '2027-02-03T04:05:06.000Z',
  };
  return makeSurveyFile([survey, ukSurvey], exampleCatalog.slice(0, 1), new Date('2027-02-03T04:05:06.000Z'), [
    {
      id: 'photo-1',
      ownerKind: 'room',
      ownerId: survey.rooms[0]!.id,
      surveyId: survey.id,
      mimeType: 'image/png',
      widthPixels: 1,
      heightPixels: 1,
      createdAt: '2027-02-03T04:05:06.000Z',
      imageBase64: tinyPngBase64,
      thumbnailMimeType: 'image/png',
      thumbnailBase64: tinyPngBase64,
    },
  ], [portfolio]);
}

/** Paths of every number in a value. */
function numericPaths(value: unknown, path: PathKey[] = [], out: PathKey[][] = []): PathKey[][] {
  if (typeof value === 'number') out.push(path);
  else if (Array.isArray(value)) value.forEach((item, index) => numericPaths(item, [...path, index], out));
  else if (value !== null && typeof value === 'object') for (const [key, item] of Object.entries(value)) numericPaths(item, [...path, key], out);
  return out;
}

/** One path per field kind (`surveys[].rooms[].entries[].count` once, not once per entry), the first met. */
function oneOfEachKind(paths: readonly PathKey[][]): PathKey[][] {
  const seen = new Set<string>();
  return paths.filter((path) => {
    const kind = pathText(path).replace(/\[\d+\]/g, '[]');
    if (seen.has(kind)) return false;
    seen.add(kind);
    return true;
  });
}

function withValue<T>(tree: T, path: readonly PathKey[], value: unknown): T {
  const copy = structuredClone(tree);
  let node = copy as Record<PathKey, unknown>;
  for (const key of path.slice(0, -1)) node = node[key] as Record<PathKey, unknown>;
  node[path[path.length - 1]!] = value;
  return copy;
}

const badValues: readonly { label: string; value: unknown }[] = [
  { label: 'NaN', value: Number.NaN },
  { label: 'Infinity', value: Infinity },
  { label: '-Infinity', value: -Infinity },
  { label: '1e308', value: 1e308 },
  { label: '-1e308', value: -1e308 },
  { label: '-1', value: -1 },
  { label: '0', value: 0 },
  { label: 'empty text', value: '' },
  { label: '"1,5"', value: '1,5' },
  { label: '"1.5"', value: '1.5' },
  { label: '"1,500"', value: '1,500' },
  { label: '"1.500,5"', value: '1.500,5' },
  { label: 'null', value: null },
];

/** Fields whose number feeds no calculation (sizes of pictures, the catalog until a product is chosen). */
const notCalculated = /^(photos|catalog|version$)/;

function calcOutcome(survey: Survey): { kind: 'finite' } | { kind: 'refused'; field: string } | { kind: 'non-finite'; where: string[] } | { kind: 'crash'; error: unknown } {
  try {
    const bad = nonFiniteNumbers(calculateSurvey(survey));
    return bad.length === 0 ? { kind: 'finite' } : { kind: 'non-finite', where: bad };
  } catch (error) {
    if (error instanceof CalcInputError) return { kind: 'refused', field: error.field };
    return { kind: 'crash', error };
  }
}

/** True when a calculation error's field (`rooms[0].entries[1].count`, `money.energyRatePerKwh`) is a path in the survey (an optional field may be absent). */
function fieldExists(survey: Survey, field: string): boolean {
  const keys = field.split(/\.|\[(\d+)\]/).filter((key) => key !== undefined && key !== '');
  let node: unknown = survey;
  for (const [index, key] of keys.entries()) {
    if (node === null || typeof node !== 'object') return false;
    if (!Object.hasOwn(node, key)) return index === keys.length - 1;
    node = (node as Record<string, unknown>)[key];
  }
  return true;
}

/** True when a calculation error names the changed field: the same path, or its last parts (`existing.lampPrice`). */
function namesField(errorField: string, surveyPath: string): boolean {
  const parts = surveyPath.split('.');
  for (let keep = parts.length; keep >= 1; keep--) {
    const tail = parts.slice(parts.length - keep).join('.');
    if (errorField === tail || errorField.endsWith(`.${tail}`) || errorField.endsWith(`]${tail}`)) return true;
  }
  return false;
}

/** Calculates a whole accepted file: every survey with its layout, and every portfolio over the file's surveys. */
function fileCalcOutcome(file: SurveyFile): ReturnType<typeof calcOutcome> {
  try {
    const bad: string[] = [];
    file.surveys.forEach((survey, index) => bad.push(...nonFiniteNumbers(calculateLayout(survey), `surveys[${index}]`)));
    file.portfolios.forEach((portfolio, index) => bad.push(...nonFiniteNumbers(calculatePortfolio(portfolio, file.surveys), `portfolios[${index}]`)));
    return bad.length === 0 ? { kind: 'finite' } : { kind: 'non-finite', where: bad };
  } catch (error) {
    if (error instanceof CalcInputError) return { kind: 'refused', field: error.field };
    return { kind: 'crash', error };
  }
}

describe('bad numbers in every numeric field of a survey file', () => {
  const file = fullFile();
  const paths = oneOfEachKind(numericPaths(file).filter((path) => pathText(path) !== 'version'));

  it('starts from a valid file holding every kind of numeric field', () => {
    expect(parseSurveyFile(structuredClone(file))).toMatchObject({ ok: true });
    const names = new Set(paths.map((path) => pathText(path).replace(/\[\d+\]/g, '[]')));
    // Every numeric field of the model, by where it lives (photos, catalog, money, savings, hours, floor, photometry, layout, grid…).
    for (const expected of [
      'surveys[].money.energyRatePerKwh',
      'surveys[].money.analysisYears',
      'surveys[].savings.gasThermsPerKwhSaved',
      'surveys[].grid.kgCo2PerKwh',
      'surveys[].grid.year',
      'surveys[].rooms[].floor.lengthMetres',
      'surveys[].rooms[].floor.squareMetres',
      'surveys[].rooms[].ceilingHeightMetres',
      'surveys[].rooms[].workPlaneHeightMetres',
      'surveys[].rooms[].hours.days[]',
      'surveys[].rooms[].hours.weeksPerYear',
      'surveys[].rooms[].hours.hoursPerYear',
      'surveys[].rooms[].photometry.lightLossFactor',
      'surveys[].rooms[].entries[].count',
      'surveys[].rooms[].entries[].controlSavingsFraction',
      'surveys[].rooms[].entries[].existing.ballastYear',
      'surveys[].rooms[].entries[].existing.lampPrice',
      'surveys[].rooms[].entries[].conditions.circuitVolts',
      'surveys[].rooms[].entries[].conditions.breakerAmps',
      'surveys[].rooms[].entries[].proposed.wattsPerUnit',
      'surveys[].rooms[].entries[].proposed.rebatePerFixture',
      'surveys[].layout.unitCount',
      'surveys[].layout.exceptions[].entryCounts[].count',
      'catalog[].unitCost',
      'photos[].widthPixels',
      'portfolios[].plan.budgetPerYear',
      'portfolios[].plan.years',
    ]) {
      expect(names).toContain(expected);
    }
  });

  it('(a) the validator refuses each bad value at its own path or accepts a finite number; (b) the calculation names the field or stays finite', () => {
    const tally = new Tally();
    for (const path of paths) {
      const where = pathText(path);
      for (const { label, value } of badValues) {
        tally.add('cases');
        const parsed = parseSurveyFile(withValue(file, path, value));
        if (!parsed.ok) {
          if (parsed.problems.some((problem) => problem.path === where)) tally.add('refused at the field');
          else tally.add('refused elsewhere', `${where} = ${label}: ${JSON.stringify(parsed.problems.slice(0, 3))}`);
          continue;
        }
        tally.add('accepted');
        if (typeof value !== 'number' || !Number.isFinite(value)) tally.add('accepted a non-number', `${where} = ${label}`);
        if (notCalculated.test(where)) continue;
        // The field as the calculation names it: inside its survey (`rooms[0]…`, `layout.unitCount`) or its portfolio (`plan.years`).
        const surveyPath = pathText(path.slice(2));
        const outcome = fileCalcOutcome(parsed.file);
        if (outcome.kind === 'finite') tally.add('calculated: finite');
        else if (outcome.kind === 'refused') {
          if (namesField(outcome.field, surveyPath)) tally.add('calculated: refused naming the field');
          else tally.add('calculated: refused naming another field', `${where} = ${label} → ${outcome.field}`);
        } else if (outcome.kind === 'non-finite') tally.add('calculated: NaN or Infinity', `${where} = ${label} → ${outcome.where.slice(0, 3).join(', ')}`);
        else tally.add('calculated: crash', `${where} = ${label} → ${String(outcome.error)}`);
      }
    }
    console.log(
      `bad numbers (file): ${paths.length} kinds of numeric field × ${badValues.length} bad values = ${tally.get('cases')} files, ` +
        `${tally.get('refused at the field')} refused at the field's own path, ${tally.get('refused elsewhere')} refused elsewhere, ` +
        `${tally.get('accepted')} accepted as a valid number (${tally.get('calculated: finite')} calculated to finite figures, ` +
        `${tally.get('calculated: refused naming the field')} refused by the calculation naming the field), ` +
        `${tally.get('calculated: NaN or Infinity')} with NaN/Infinity, ${tally.get('calculated: crash')} other exceptions`,
    );
    tally.printSamples();
    expect(tally.get('cases')).toBe(paths.length * badValues.length);
    tally.expectNone(['refused elsewhere', 'accepted a non-number', 'calculated: NaN or Infinity', 'calculated: crash', 'calculated: refused naming another field']);
    // Text, null and non-finite numbers are never valid anywhere.
    expect(tally.get('refused at the field')).toBeGreaterThanOrEqual(paths.length * 9);
  });

  it('(b) the calculation itself, given bad numbers directly, throws CalcInputError naming the field or stays finite', () => {
    const survey = fullSurvey();
    const surveyPaths = oneOfEachKind(numericPaths(survey).filter((path) => path[0] !== 'layout'));
    const tally = new Tally();
    for (const path of surveyPaths) {
      const where = pathText(path);
      for (const { label, value } of badValues) {
        tally.add('cases');
        const outcome = calcOutcome(withValue(survey, path, value));
        if (outcome.kind === 'finite') tally.add('finite');
        else if (outcome.kind === 'refused') {
          if (namesField(outcome.field, where)) tally.add('refused naming the field');
          else tally.add('refused naming another field', `${where} = ${label} → ${outcome.field}`);
        } else if (outcome.kind === 'non-finite') tally.add('NaN or Infinity', `${where} = ${label} → ${outcome.where.slice(0, 3).join(', ')}`);
        else tally.add('crash', `${where} = ${label} → ${String(outcome.error)}`);
      }
    }
    console.log(
      `bad numbers (calculation): ${surveyPaths.length} kinds of numeric field × ${badValues.length} bad values = ${tally.get('cases')} surveys, ` +
        `${tally.get('refused naming the field')} refused with a CalcInputError naming the field, ${tally.get('finite')} calculated to finite figures, ` +
        `${tally.get('refused naming another field')} refused naming another field, ${tally.get('NaN or Infinity')} with NaN/Infinity, ${tally.get('crash')} other exceptions`,
    );
    tally.printSamples();
    tally.expectNone(['NaN or Infinity', 'crash', 'refused naming another field']);
    expect(tally.get('refused naming the field')).toBeGreaterThan(0);
  });
});

describe('(c) typed numbers', () => {
  const typed = ['NaN', 'Infinity', '-Infinity', '1e308', '-1', '0', '', '1,5', '1.5', '1,500', '1.500,5', '1 500', '١٢', '0x10', '--1', '1..5'];

  it('parseDecimal reads "1,5" and "1.5" as 1.5 and refuses the rest with the field named', () => {
    // "1,5" and "1.5": one and a half, in a decimal-comma or decimal-point locale (ISO 80000-1 allows either decimal sign).
    expect(parseDecimal('1,5', 'watts')).toBe(1.5);
    expect(parseDecimal('1.5', 'watts')).toBe(1.5);
    expect(parseDecimal('-1', 'watts')).toBe(-1);
    expect(parseDecimal('0', 'watts')).toBe(0);
    for (const text of ['NaN', 'Infinity', '-Infinity', '1e308', '', '1 500', '١٢', '0x10', '--1', '1..5']) {
      expect(() => parseDecimal(text, 'watts'), text).toThrow(CalcInputError);
      expect(() => parseDecimal(text, 'watts'), text).toThrow(/^watts: /);
    }
    // Thousands separators are refused with what to type instead.
    expect(() => parseDecimal('1,500', 'count')).toThrow('count: "1,500" could be 1500 or 1.5: for 1500, type it with no separator; for 1.5, type 1.5');
    expect(() => parseDecimal('1.500', 'count')).toThrow(/could be 1500 or 1\.5/);
    expect(() => parseDecimal('1.500,5', 'count')).toThrow(/write 1500\.5 without separators/);
    expect(() => parseDecimal('1,500,000', 'count')).toThrow(/write 1500000 without separators/);
    expect(() => parseDecimal('12,345.67', 'count')).toThrow(/write 12345\.67 without separators/);
    // Not ambiguous: a leading zero, or more or fewer than three decimals.
    expect(parseDecimal('0,125', 'x')).toBe(0.125);
    expect(parseDecimal('1,25', 'x')).toBe(1.25);
    expect(parseDecimal('1.2500', 'x')).toBe(1.25);
    // A file that declares its decimal separator reads "1.500" as 1.5 and refuses the other separator.
    expect(parseDecimal('1.500', 'x', '.')).toBe(1.5);
    expect(parseDecimal('1,500', 'x', ',')).toBe(1.5);
    expect(() => parseDecimal('1,5', 'x', '.')).toThrow(/one "\." for decimals/);
    // Many digits overflow to Infinity: refused, never returned.
    expect(() => parseDecimal('9'.repeat(400), 'x')).toThrow(/out of range/);
  });

  it('readNumber gives a field message or a finite value within the rule, for every field rule of the screens', () => {
    const tally = new Tally();
    for (const [name, rule] of Object.entries(rules) as [string, NumberRule][]) {
      for (const text of typed) {
        tally.add('cases');
        const reading = readNumber(text, rule);
        if (!reading.ok) {
          if (reading.message.trim().length < 10) tally.add('bad messages', `${name} ${text}: ${reading.message}`);
          tally.add('refused with a message');
          continue;
        }
        tally.add('accepted');
        const value = reading.value;
        if (value === undefined) {
          if (!(text === '' && rule.optional)) tally.add('wrongly empty', `${name} ${JSON.stringify(text)}`);
          continue;
        }
        const low = rule.minExclusive ? value <= rule.min : value < rule.min;
        if (!Number.isFinite(value) || low || value > rule.max || (rule.integer && !Number.isInteger(value))) tally.add('out of rule', `${name} ${text} → ${value}`);
        if (!['0', '1,5', '1.5'].includes(text)) tally.add('accepted garbage', `${name} ${JSON.stringify(text)} → ${value}`);
        if ((text === '1,5' || text === '1.5') && value !== 1.5) tally.add('misread 1.5', `${name} ${text} → ${value}`);
      }
      // Specific answers, the same for every rule.
      expect(readNumber('1,500', rule)).toEqual({ ok: false, message: '“1,500” could be 1500 or 1.5: for 1500, type it with no separator; for 1.5, type 1.5.' });
      expect(readNumber('1.500,5', rule)).toEqual({ ok: false, message: '“1.500,5” is not a number as written: it groups thousands; write 1500.5 without separators.' });
      expect(readNumber('NaN', rule)).toMatchObject({ ok: false, message: expect.stringContaining('is not a number') });
      expect(readNumber('-1', rule)).toMatchObject({ ok: false, message: expect.stringMatching(/^Must be (between|more than)/) });
    }
    console.log(
      `bad numbers (typed): ${Object.keys(rules).length} field rules × ${typed.length} typed values = ${tally.get('cases')} readings, ` +
        `${tally.get('refused with a message')} refused with a message beside the field, ${tally.get('accepted')} accepted (only "0", "1,5", "1.5" or empty where optional, each within its rule)`,
    );
    tally.printSamples();
    tally.expectNone(['bad messages', 'wrongly empty', 'out of rule', 'accepted garbage', 'misread 1.5']);
  });
});

describe('any survey the validator accepts calculates to finite figures or a CalcInputError', () => {
  it('holds for surveys with extreme values in random numeric fields', () => {
    const base = fullSurvey();
    const paths = numericPaths(base).filter((path) => path[0] !== 'layout');
    const extreme = fc.oneof(
      fc.constantFrom(0, 5e-324, 1e-300, 1e-9, 0.01, 0.1, 0.3, 0.5, 0.9, 1, 1.5, 2.5, 3, 12, 24, 40, 53, 100, 600, 1000, 1900, 2100, 6000, 8760, 10_000, 1e5, 1e6, 1e7, 1e9, 1e12, 1e15, 1e308, -0.5, -1),
      fc.double({ min: 0, max: 1e7, noNaN: true }),
      fc.double(),
    );
    const tally = new Tally();
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat({ max: paths.length - 1 }), extreme), { minLength: 1, maxLength: 4 }), (changes) => {
        tally.add('surveys');
        let survey = base;
        for (const [index, value] of changes) survey = withValue(survey, paths[index]!, value);
        const parsed = parseSurveyFile(makeSurveyFile([survey], [], new Date('2027-02-03T04:05:06.000Z')));
        if (!parsed.ok) {
          tally.add('refused by the validator');
          return true;
        }
        tally.add('accepted');
        const outcome = calcOutcome(parsed.file.surveys[0]!);
        if (outcome.kind === 'refused' && !fieldExists(parsed.file.surveys[0]!, outcome.field)) tally.add('calc:refused naming no field of the survey', outcome.field);
        tally.add(`calc:${outcome.kind}`, outcome.kind === 'non-finite' ? `${JSON.stringify(changes.map(([i, v]) => [pathText(paths[i]!), v]))} → ${outcome.where.slice(0, 3).join(', ')}` : outcome.kind === 'crash' ? String(outcome.error) : undefined);
        return outcome.kind === 'finite' || outcome.kind === 'refused';
      }),
      { numRuns: 1000 },
    );
    console.log(
      `finite-or-error property: ${tally.get('surveys')} surveys with extreme values, ${tally.get('accepted')} accepted by the validator ` +
        `(${tally.get('calc:finite')} calculated to finite figures, ${tally.get('calc:refused')} refused with a CalcInputError, ` +
        `${tally.get('calc:non-finite')} with NaN/Infinity, ${tally.get('calc:crash')} other exceptions), ${tally.get('refused by the validator')} refused by the validator`,
    );
    expect(tally.get('accepted')).toBeGreaterThan(150);
    tally.expectNone(['calc:non-finite', 'calc:refused naming no field of the survey', 'calc:crash']);
    expect(tally.get('calc:finite')).toBeGreaterThan(50);
  });

  it('holds with every numeric field at the top and at the bottom of its range together', () => {
    // Top and bottom found per field: the largest and smallest of a ladder of values the validator accepts and the calculation takes alone.
    const base = fullSurvey();
    const paths = numericPaths(base).filter((path) => path[0] !== 'layout');
    const ladder = [0, 5e-324, 1e-6, 0.01, 0.1, 0.3, 1, 12, 24, 40, 53, 100, 600, 1000, 1900, 2000, 2100, 6000, 8760, 10_000, 100_000, 1e6, 1e7, 1e9, 1e12, 1e300, 1e308];
    const accepted = (survey: Survey) => parseSurveyFile(makeSurveyFile([survey], [], new Date('2027-02-03T04:05:06.000Z'))).ok;
    let top = base;
    let bottom = base;
    const kinds = new Map<string, PathKey[][]>();
    for (const path of paths) {
      const kind = pathText(path).replace(/\[\d+\]/g, '[]');
      kinds.set(kind, [...(kinds.get(kind) ?? []), path]);
    }
    const setAll = (survey: Survey, all: readonly PathKey[][], value: number) => all.reduce((next, path) => withValue(next, path, value), survey);
    for (const all of kinds.values()) {
      // Values both the validator and the calculation take (the calculation's own limits can be narrower).
      const fits = (value: number) => {
        const survey = withValue(base, all[0]!, value);
        return accepted(survey) && calcOutcome(survey).kind === 'finite';
      };
      const highest = [...ladder].reverse().find(fits);
      const lowest = ladder.find(fits);
      if (highest === undefined || lowest === undefined) continue;
      const high = setAll(top, all, highest);
      if (accepted(high)) top = high;
      const low = setAll(bottom, all, lowest);
      if (accepted(low)) bottom = low;
    }
    // The top of everything but one fixture per entry: large figures everywhere, within the load an entry may hold.
    const countPaths = paths.filter((path) => path[path.length - 1] === 'count');
    const topButOne = setAll(top, countPaths, 1);
    for (const survey of [top, topButOne, bottom]) {
      expect(accepted(survey)).toBe(true);
      // Every field at its limit together: nothing overflows to Infinity or divides 0 by 0; a combination the
      // calculation cannot take (a load too large for one entry) is refused naming a field the survey really has.
      const outcome = calcOutcome(survey);
      if (outcome.kind === 'refused') expect(fieldExists(survey, outcome.field), outcome.field).toBe(true);
      else expect(outcome).toEqual({ kind: 'finite' });
    }
    const describeOutcome = (survey: Survey) => {
      const outcome = calcOutcome(survey);
      return outcome.kind === 'refused' ? `refused with a CalcInputError naming ${outcome.field}` : outcome.kind;
    };
    console.log(`range extremes: ${paths.length} numeric fields (${kinds.size} kinds) all at their top → ${describeOutcome(top)}; the same with one fixture per entry → ${describeOutcome(topButOne)}; all at their bottom → ${describeOutcome(bottom)}`);
  });
});

describe('bad numbers these tests found, named at the field the user can change', () => {
  // Each of these once came out under an internal name ("firstYearSavings", "watts", "ratedWatts") or not at all.
  it('a lamp price that is not a finite number, or absurdly large, is refused as existing.lampPrice', () => {
    for (const lampPrice of [Number.NaN, Infinity, 1e308, -1]) {
      const survey = fullSurvey();
      survey.rooms[0]!.entries[0]!.existing.lampPrice = lampPrice;
      expect(calcOutcome(survey)).toMatchObject({ kind: 'refused', field: 'rooms[0].entries[0].existing.lampPrice' });
    }
  });

  it('an entry or a room drawing more than 100 MW is refused naming the count or the room’s entries', () => {
    // 100,000 fixtures × 24 lamps × 100,000 W = 2.4e11 W, all within the file format's per-field ranges.
    const survey = fullSurvey();
    const entry = survey.rooms[0]!.entries[0]!;
    entry.count = 100_000;
    entry.existing = { ...entry.existing, lampsPerFixture: 24, ratedWattsPerLamp: 100_000 };
    delete entry.existing.fixtureInputWatts;
    delete entry.existing.meteredWattsPerFixture;
    const outcome = calcOutcome(survey);
    expect(outcome).toMatchObject({ kind: 'refused', field: 'rooms[0].entries[0].count' });
    // Two entries of 60 MW each: each fits, the room does not.
    const room = fullSurvey();
    const [first, second] = room.rooms[0]!.entries;
    for (const item of [first!, second!]) {
      item.count = 600;
      item.existing = { ...item.existing, technology: 'metal-halide', lampsPerFixture: 1, ratedWattsPerLamp: 100_000, lumensPerLamp: 1000 };
      delete item.existing.fixtureInputWatts;
      delete item.existing.meteredWattsPerFixture;
    }
    expect(calcOutcome(room)).toMatchObject({ kind: 'refused', field: 'rooms[0].entries' });
    expect(() => calculateSurvey(room)).toThrow(/^rooms\[0\]\.entries: .*more than the 100000000 W one room may hold/);
  });

  it('a halogen lamp above the watts its light can be estimated from is refused as existing.ratedWattsPerLamp', () => {
    const survey = fullSurvey();
    const entry = survey.rooms[0]!.entries[1]!;
    expect(entry.existing.technology).toBe('halogen');
    entry.existing = { ...entry.existing, ratedWattsPerLamp: 5000 };
    delete entry.existing.lumensPerLamp;
    const outcome = calcOutcome(survey);
    expect(outcome).toMatchObject({ kind: 'refused', field: 'rooms[0].entries[1].existing.ratedWattsPerLamp' });
    // With the lamp's lumens given, nothing needs estimating and the entry calculates.
    entry.existing.lumensPerLamp = 100_000;
    expect(calcOutcome(survey)).toEqual({ kind: 'finite' });
  });
});
