import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { demoLandlordSurveys, demoPortfolio, demoSurvey } from '../../src/survey/demo.ts';
import { demoFileText, fakeIo, runLampwalk, runLampwalkFailure } from './support.ts';

describe('lampwalk demo', () => {
  it('prints a survey file that calc accepts', async () => {
    const text = await demoFileText();
    const file = JSON.parse(text);
    expect(file.format).toBe('lampwalk-survey-file');
    expect(file.version).toBe(3);
    expect(file.surveys).toHaveLength(1);
    expect(file.portfolios).toEqual([]);
    expect(file.catalog.length).toBeGreaterThan(0);
  });

  it('with --portfolio: the demo building first, then the landlord layouts, all grouped by the demo portfolio', async () => {
    const file = JSON.parse(await demoFileText('--portfolio'));
    expect(file.surveys.map((survey: { id: string }) => survey.id)).toEqual([demoSurvey().id, ...demoLandlordSurveys().map((survey) => survey.id)]);
    expect(file.portfolios).toEqual([demoPortfolio()]);
    expect(file.portfolios[0].surveyIds).toEqual(file.surveys.map((survey: { id: string }) => survey.id));
    const bad = fakeIo();
    expect(await main(['demo', '--landlord'], bad)).toBe(2);
    expect(bad.err).toMatch(/demo takes only --portfolio/);
  });

  it('calc accepts every demo survey of --portfolio, the layouts counted across their units', async () => {
    const io = fakeIo({ 'demo.json': await demoFileText('--portfolio') });
    expect(await main(['calc', 'demo.json'], io)).toBe(0);
    const printed = JSON.parse(io.out).surveys as { surveyId: string }[];
    expect(printed.map((survey) => survey.surveyId)).toEqual([demoSurvey().id, ...demoLandlordSurveys().map((survey) => survey.id)]);
  });
});

describe('lampwalk calc', () => {
  it('prints totals, economics, rooms, entries, circuits and warnings equal to the engine', async () => {
    const io = fakeIo({ 'demo.json': await demoFileText() });
    expect(await main(['calc', 'demo.json'], io)).toBe(0);
    const out = JSON.parse(io.out);
    expect(out.format).toBe('lampwalk-calc-result');
    const printed = out.surveys[0];
    const direct = JSON.parse(JSON.stringify(calculateSurvey(demoSurvey())));
    expect(printed).toEqual(direct);
    expect(printed.totals.savings.kwhPerYear).toBeGreaterThan(0);
    expect(printed.economics.cashFlows.length).toBe(16);
    expect(printed.rooms[0].entries[0].warnings.length).toBeGreaterThan(0);
    expect(printed.circuits.existing.length).toBeGreaterThan(0);
    expect(printed.warnings.map((w: { code: string }) => w.code)).toContain('dimmer-non-dimmable');
  });

  it('reads standard input with "-"', async () => {
    const io = fakeIo({}, await demoFileText());
    expect(await main(['calc', '-', '--compact'], io)).toBe(0);
    expect(io.out.trim().split('\n')).toHaveLength(1);
  });

  it('selects one survey by id and refuses an unknown id', async () => {
    const files = { 'demo.json': await demoFileText() };
    const ok = fakeIo(files);
    expect(await main(['calc', 'demo.json', '--survey', 'demo-tallowmere'], ok)).toBe(0);
    const bad = fakeIo(files);
    expect(await main(['calc', 'demo.json', '--survey', 'nope'], bad)).toBe(2);
    expect(bad.err).toMatch(/no survey with id "nope"/);
  });

  it('exits 2 naming the field and problem for a bad value', async () => {
    const file = JSON.parse(await demoFileText());
    file.surveys[0].rooms[1].hours.hoursPerYear = 9000;
    const io = fakeIo({ 'bad.json': JSON.stringify(file) });
    expect(await main(['calc', 'bad.json'], io)).toBe(2);
    expect(io.err).toMatch(/surveys\[0\]\.rooms\[1\]\.hours\.hoursPerYear: .*8760.*9000/);
    expect(io.out).toBe('');
  });

  it('exits 2 with the calculation field path when a value passes the file check but not the engine', async () => {
    const file = JSON.parse(await demoFileText());
    file.surveys[0].grid = { kind: 'egrid', subregion: 'NOWHERE' };
    const io = fakeIo({ 'bad.json': JSON.stringify(file) });
    expect(await main(['calc', 'bad.json'], io)).toBe(2);
    expect(io.err).toMatch(/surveys\[0\]\.grid\.subregion/);
  });

  it('exits 2 for a missing file, non-JSON text, and bad usage', async () => {
    const missing = fakeIo();
    expect(await main(['calc', 'nope.json'], missing)).toBe(2);
    expect(missing.err).toMatch(/nope\.json: no such file/);
    const notJson = fakeIo({ 'x.json': '{ not json' });
    expect(await main(['calc', 'x.json'], notJson)).toBe(2);
    expect(notJson.err).toMatch(/not JSON/i);
    for (const args of [['calc'], ['frobnicate'], ['calc', 'a', 'b'], ['calc', 'a', '--bogus'], []]) {
      const io = fakeIo({ a: '{}' });
      expect(await main(args, io)).toBe(2);
      expect(io.err.length).toBeGreaterThan(0);
    }
  });
});

describe('the installed command', () => {
  it('runs through npx-style bin with no build step and never prints a stack trace', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'lampwalk-cli-'));
    const demo = await runLampwalk(['demo']);
    const demoPath = join(dir, 'demo.json');
    await writeFile(demoPath, demo.stdout);
    const calc = await runLampwalk(['calc', demoPath]);
    expect(JSON.parse(calc.stdout).surveys[0].totals.fixtures).toBe(40);

    const file = JSON.parse(await readFile(demoPath, 'utf8'));
    file.surveys[0].rooms[0].entries[0].count = -1;
    const badPath = join(dir, 'bad.json');
    await writeFile(badPath, JSON.stringify(file));
    const failure = await runLampwalkFailure(['calc', badPath]);
    expect(failure?.code).toBe(2);
    expect(failure?.stderr).toMatch(/surveys\[0\]\.rooms\[0\]\.entries\[0\]\.count/);
    expect(failure?.stderr).not.toMatch(/\n\s+at /);
  }, 60_000);
});
