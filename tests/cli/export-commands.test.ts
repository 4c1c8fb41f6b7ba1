import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { figuresFor } from '../../src/export/figures.ts';
import { orderLines } from '../../src/export/orders.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { pdfText, printed } from '../export/pdf-helpers.ts';
import { demoFileText, fakeIo, runLampwalk, runLampwalkFailure } from './support.ts';

describe('lampwalk report, quote, orders and schedule', async () => {
  const files = { 'demo.json': await demoFileText() };
  const survey = demoSurvey();
  const result = calculateSurvey(survey);
  const fig = figuresFor(survey);

  it('writes the client report with figures equal to the calculation', async () => {
    const io = fakeIo(files);
    expect(await main(['report', 'demo.json', '-o', 'out.pdf', '--company', 'Brightwell (invented)', '--date', '2026-11-20'], io)).toBe(0);
    const text = await pdfText(io.written.get('out.pdf')!);
    expect(printed(text, fig.kwh(result.totals.savings.kwhPerYear))).toBe(true);
    expect(printed(text, fig.money(result.totals.money.cost.net))).toBe(true);
    expect(printed(text, 'Brightwell (invented)')).toBe(true);
    expect(printed(text, 'November 20, 2026')).toBe(true);
  });

  it('writes the quote with --valid-days', async () => {
    const io = fakeIo(files);
    expect(await main(['quote', 'demo.json', '-o', 'q.pdf', '--valid-days', '14', '--date', '2026-11-20', '--survey', 'demo-tallowmere'], io)).toBe(0);
    const text = await pdfText(io.written.get('q.pdf')!);
    expect(printed(text, 'December 4, 2026')).toBe(true); // 20 Nov + 14 days, by hand
    expect(printed(text, fig.money(result.totals.money.cost.net))).toBe(true);
  });

  it('prints the order list and the fixture schedule as CSV', async () => {
    const io = fakeIo(files);
    expect(await main(['orders', 'demo.json', '--spare', '10'], io)).toBe(0);
    const rows = Papa.parse<Record<string, string>>(io.out.trim(), { header: true }).data;
    expect(rows.map((r) => Number(r.order_quantity))).toEqual(orderLines(survey, { sparePercent: 10 }).map((l) => l.toOrder));
    const schedule = fakeIo(files);
    expect(await main(['schedule', 'demo.json'], schedule)).toBe(0);
    const entries = Papa.parse<Record<string, string>>(schedule.out.trim(), { header: true }).data;
    expect(entries.map((e) => e.entry_id)).toEqual(survey.rooms.flatMap((r) => r.entries.map((e) => e.id)));
  });

  it('exits 2 naming the problem, like calc', async () => {
    const cases: [string[], RegExp][] = [
      [['report', 'demo.json'], /-o <file\.pdf>/],
      [['quote', 'demo.json', '-o', 'q.pdf', '--valid-days', '0'], /--valid-days must be a whole number from 1 to 365/],
      [['orders', 'demo.json', '--spare', '150'], /--spare must be a whole number from 0 to 100/],
      [['orders', 'demo.json', '--valid-days', '3'], /unknown option --valid-days for orders/],
      [['schedule'], /schedule needs a survey file/],
      [['schedule', 'nope.json'], /nope\.json: no such file/],
      [['report', 'demo.json', '-o', 'r.pdf', '--survey', 'nope'], /no survey with id "nope"/],
      [['report', 'demo.json', '-o', 'r.pdf', '--date', '2026-02-30'], /--date must be a date written YYYY-MM-DD/],
    ];
    for (const [args, message] of cases) {
      const io = fakeIo(files);
      expect(await main(args, io), args.join(' ')).toBe(2);
      expect(io.err).toMatch(message);
      expect(io.written.size).toBe(0);
    }
    const two = JSON.parse(files['demo.json']);
    two.surveys.push({ ...two.surveys[0], id: 'second', rooms: [] });
    const io = fakeIo({ 'two.json': JSON.stringify(two) });
    expect(await main(['orders', 'two.json'], io)).toBe(2);
    expect(io.err).toMatch(/holds 2 surveys; pick one with --survey <id> \(demo-tallowmere, second\)/);
    const bad = JSON.parse(files['demo.json']);
    bad.surveys[0].grid = { kind: 'egrid', subregion: 'NOWHERE' };
    const badIo = fakeIo({ 'bad.json': JSON.stringify(bad) });
    expect(await main(['report', 'bad.json', '-o', 'r.pdf'], badIo)).toBe(2);
    expect(badIo.err).toMatch(/surveys\[0\]\.grid\.subregion/);
  });

  it('runs through the installed command and never prints a stack trace', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'lampwalk-export-'));
    const demoPath = join(dir, 'demo.json');
    await writeFile(demoPath, files['demo.json']);
    const pdfPath = join(dir, 'report.pdf');
    await runLampwalk(['report', demoPath, '-o', pdfPath]);
    const text = await pdfText(new Uint8Array(await readFile(pdfPath)));
    expect(printed(text, fig.kwh(result.totals.savings.kwhPerYear))).toBe(true);
    const failure = await runLampwalkFailure(['quote', demoPath, '-o', join(dir, 'no-such-folder', 'q.pdf')]);
    expect(failure?.code).toBe(2);
    expect(failure?.stderr).toMatch(/q\.pdf: its folder does not exist/);
    expect(failure?.stderr).not.toMatch(/\n\s+at /);
  }, 60_000);
});
