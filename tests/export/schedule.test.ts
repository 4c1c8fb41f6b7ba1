import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { isAbortError } from '../../src/export/abort.ts';
import { neutraliseCell, restoreCell, toCsv } from '../../src/export/csv.ts';
import {
  autoMapColumns,
  commitRows,
  fixtureScheduleCsv,
  fixtureScheduleExporter,
  previewSchedule,
  ScheduleImportError,
  scheduleInputColumns,
} from '../../src/export/schedule.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import type { FixtureEntry, Survey } from '../../src/survey/model.ts';

const signal = () => new AbortController().signal;

/** The demo survey with awkward text in it: formulas, quotes, line breaks, unicode, apostrophes. */
function awkwardSurvey(): Survey {
  const survey = demoSurvey();
  const e = survey.rooms[0]!.entries;
  e[0]!.existing.description = '=HYPERLINK("http://example.invalid","click")';
  e[0]!.notes = '-5 lamps out\nsecond line, with a comma and "quotes"';
  e[1]!.notes = "'=already escaped?";
  e[1]!.existing.description = '@SUM(A1:A2)';
  e[1]!.conditions.circuitLabel = '+Panel A; 5';
  survey.rooms[1]!.entries[0]!.notes = '\tTabbed μ ≥ 90 € ° ² – 灯';
  survey.rooms[2]!.entries[0]!.notes = "''+two apostrophes";
  survey.rooms[2]!.entries[0]!.existing.ballastFactor = 0.875;
  survey.rooms[2]!.entries[0]!.controlSavingsFraction = 0.3;
  survey.rooms[3]!.entries[0]!.existing.lumensPerLamp = 1234.5678;
  survey.rooms[4]!.entries[0]!.notes = '  leading and trailing spaces  ';
  return survey;
}

const allEntries = (survey: Survey): FixtureEntry[] => survey.rooms.flatMap((r) => r.entries);

describe('fixture schedule CSV', () => {
  it('round-trips every entry field losslessly (comma and semicolon files)', async () => {
    const survey = awkwardSurvey();
    const result = calculateSurvey(survey);
    for (const format of [{}, { delimiter: ';' as const, decimalSeparator: ',' as const }, { delimiter: '\t' as const }]) {
      const csv = fixtureScheduleCsv(survey, result, format);
      const preview = await previewSchedule(signal(), csv, { ...format, ids: 'keep' });
      expect(preview.fileProblems).toEqual([]);
      expect(preview.badRows).toBe(0);
      expect(preview.unmappedHeaders).toEqual([]);
      expect(commitRows(preview)).toEqual(allEntries(survey));
      expect(preview.rows.map((r) => r.roomName)).toEqual(survey.rooms.flatMap((r) => r.entries.map(() => r.name)));
    }
  });

  it('writes one row per entry with its computed figures', () => {
    const survey = demoSurvey();
    const result = calculateSurvey(survey);
    const rows = Papa.parse<Record<string, string>>(fixtureScheduleCsv(survey, result), { header: true }).data;
    expect(rows).toHaveLength(result.totals.entries);
    const first = result.rooms[0]!.entries[0]!;
    expect(Number(rows[0]!.calc_kwh_saved_per_year)).toBeCloseTo(first.savings.kwhPerYear, 1);
    expect(Number(rows[0]!.calc_net_cost)).toBeCloseTo(first.money.cost.net, 2);
    expect(rows[0]!.calc_warnings!.split(' ')).toEqual(first.warnings.map((w) => w.code));
    const total = rows.reduce((s, r) => s + Number(r.calc_kwh_saved_per_year), 0);
    expect(total).toBeCloseTo(result.totals.savings.kwhPerYear, 0);
  });

  it('neutralises formula-injection cells and reads them back unchanged', () => {
    const survey = awkwardSurvey();
    const csv = fixtureScheduleCsv(survey, calculateSurvey(survey));
    const cells = Papa.parse<string[]>(csv).data.flat();
    // OWASP "CSV Injection": cells starting with = + - @ tab or CR are run as formulas by spreadsheets.
    const dangerous = cells.filter((c) => /^[=+\-@\t\r]/.test(c) && !/^-?\d+(\.\d+)?$/.test(c));
    expect(dangerous).toEqual([]);
    expect(cells).toContain('\'=HYPERLINK("http://example.invalid","click")');
    expect(cells).toContain("'@SUM(A1:A2)");
    expect(cells).toContain("''=already escaped?");
    for (const text of ['=1+1', '+1', '-x', '@a', '\tt', '\rr', "'=x", "''-y", "'plain", 'plain', '', "'"]) {
      expect(restoreCell(neutraliseCell(text))).toBe(text);
    }
    expect(neutraliseCell("'plain")).toBe("'plain");
    // Negative numbers stay numbers.
    expect(toCsv([[-5, '-5']])).toBe("-5,'-5");
  });

  it('rejects a file with malformed rows, naming each row number and reason, unless told to skip them', async () => {
    const csv = [
      'count,existing_technology,existing_description,rated_watts_per_lamp,circuit_volts',
      '4,halogen,Track head,50,120', // row 2: good
      'abc,halogen,Track head,50,120', // row 3: count not a number
      '2,halogen,Track head,-7,120', // row 4: negative watts
      '3,sodium-lamp,Yard light,70,120', // row 5: unknown technology
      '', // row 6: blank, skipped
      '1,incandescent,Pendant,60,120,extra', // row 7: too many cells
      '2.5,incandescent,Pendant,60,120', // row 8: count not whole
      '1,incandescent,Pendant,,120', // row 9: required watts empty
    ].join('\r\n');
    const preview = await previewSchedule(signal(), csv);
    expect(preview.fileProblems).toEqual([]);
    const problems = preview.rows.flatMap((r) => r.problems);
    const byRow = new Map(problems.map((p) => [p.rowNumber, p]));
    expect([...byRow.keys()].sort((a, b) => a - b)).toEqual([3, 4, 5, 7, 8, 9]);
    expect(byRow.get(3)).toMatchObject({ column: 'count', message: expect.stringMatching(/"abc" is not a number/) });
    expect(byRow.get(4)).toMatchObject({ column: 'rated_watts_per_lamp' });
    expect(byRow.get(5)!.message).toMatch(/"sodium-lamp" is not one of/);
    expect(byRow.get(7)!.message).toMatch(/6 cells but the header names 5 columns/);
    expect(byRow.get(8)!.message).toMatch(/whole number/);
    expect(byRow.get(9)).toMatchObject({ column: 'rated_watts_per_lamp', message: expect.stringMatching(/is empty/) });
    expect(preview.badRows).toBe(6);

    let error: unknown;
    try {
      commitRows(preview);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ScheduleImportError);
    expect((error as ScheduleImportError).rowProblems.map((p) => p.rowNumber)).toEqual([3, 4, 5, 7, 8, 9]);
    expect((error as Error).message).toMatch(/row 3, count: "abc"/);

    const good = commitRows(preview, { skipBadRows: true });
    expect(good).toHaveLength(1);
    expect(good[0]).toMatchObject({ count: 4, existing: { technology: 'halogen', ratedWattsPerLamp: 50 }, conditions: { circuitVolts: 120 }, proposed: null });
  });

  it('reads "1,5" or "1.5" as the decimal-separator option says', async () => {
    const comma = 'count;existing_technology;rated_watts_per_lamp;circuit_volts;ballast_factor\r\n2;linear-t8;32;230;0,88';
    const ok = await previewSchedule(signal(), comma, { decimalSeparator: ',' });
    expect(commitRows(ok)[0]!.existing.ballastFactor).toBe(0.88);
    const wrong = await previewSchedule(signal(), comma, { decimalSeparator: '.' });
    expect(wrong.rows[0]!.problems[0]).toMatchObject({ rowNumber: 2, column: 'ballast_factor', message: expect.stringMatching(/decimal separator/) });
    const dot = 'count,existing_technology,rated_watts_per_lamp,circuit_volts,ballast_factor\r\n2,linear-t8,32,230,0.88';
    expect(commitRows(await previewSchedule(signal(), dot))[0]!.existing.ballastFactor).toBe(0.88);
  });

  it('maps columns by header name and aliases, lets the caller override, and fills proposals from the catalog', async () => {
    expect(autoMapColumns(['Qty', 'Description', 'Lamp Watts', 'Circuit'])).toMatchObject({
      count: 'Qty',
      existing_description: 'Description',
      rated_watts_per_lamp: 'Lamp Watts',
      circuit_label: 'Circuit',
    });
    const csv = 'Fixtures,Type,Watts,Volts,Catalog ID,Remarks\r\n6,linear-t12,40,120,example-t8-typeb,Basement';
    const preview = await previewSchedule(signal(), csv, {
      mapping: { count: 'Fixtures', existing_technology: 'Type', notes: 'Remarks' },
      catalog: exampleCatalog,
      newId: () => 'new-1',
    });
    expect(preview.fileProblems).toEqual([]);
    const [entry] = commitRows(preview);
    expect(entry).toMatchObject({ id: 'new-1', count: 6, notes: 'Basement', existing: { technology: 'linear-t12', ratedWattsPerLamp: 40 } });
    expect(entry!.proposed).toMatchObject({ catalogId: 'example-t8-typeb', tubeType: 'type-b', wattsPerUnit: 15 });
    // A mapping to a column the file lacks, and a missing required column, reject the file.
    const bad = await previewSchedule(signal(), 'Fixtures,Watts\r\n1,2', { mapping: { count: 'Qty' } });
    expect(bad.fileProblems.join('\n')).toMatch(/count from column "Qty", which is not in the file/);
    expect(bad.fileProblems.join('\n')).toMatch(/no column for existing_technology/);
    expect(() => commitRows(bad)).toThrow(ScheduleImportError);
    // A proposal without the catalog needs every proposed column.
    const partial = await previewSchedule(signal(), 'count,existing_technology,rated_watts_per_lamp,circuit_volts,proposed_name\r\n1,halogen,50,120,Some LED');
    expect(partial.rows[0]!.problems.map((p) => p.column)).toContain('proposed_cri');
  });

  it('gives new ids by default and reports ids used twice when keeping them', async () => {
    const head = 'entry_id,count,existing_technology,rated_watts_per_lamp,circuit_volts';
    let n = 0;
    const fresh = commitRows(await previewSchedule(signal(), `${head}\r\na,1,led,5,120\r\na,2,led,5,120`, { newId: () => `id-${++n}` }));
    expect(fresh.map((e) => e.id)).toEqual(['id-1', 'id-2']);
    const kept = await previewSchedule(signal(), `${head}\r\na,1,led,5,120\r\na,2,led,5,120`, { ids: 'keep' });
    expect(kept.rows[1]!.problems[0]!.message).toMatch(/already used on row 2/);
  });

  it('lists every importable field in the exported header', () => {
    const survey = demoSurvey();
    const header = fixtureScheduleCsv(survey, calculateSurvey(survey)).split('\r\n')[0]!.split(',');
    for (const c of scheduleInputColumns) expect(header).toContain(c);
  });

  it('cancels with an AbortError and exports as a file with a byte-order mark', async () => {
    const survey = demoSurvey();
    const err = await previewSchedule(AbortSignal.abort(), 'count\r\n1').catch((e: unknown) => e);
    expect(isAbortError(err)).toBe(true);
    const file = await fixtureScheduleExporter.run(signal(), { survey, result: calculateSurvey(survey) }, {});
    expect([...file.bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    expect(file.fileName.endsWith('.csv')).toBe(true);
    // Reading back the file with its byte-order mark works too.
    const text = new TextDecoder('utf-8', { ignoreBOM: true }).decode(file.bytes);
    expect(text.startsWith('\uFEFF')).toBe(true);
    const preview = await previewSchedule(signal(), text, { ids: 'keep' });
    expect(commitRows(preview)).toEqual(allEntries(survey));
  });
});
