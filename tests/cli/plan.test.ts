import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import { measuresFromSurveys, planPhases, type PhasePlan } from '../../src/calc/phasing.ts';
import { figuresFor } from '../../src/export/figures.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { makeSurveyFile } from '../../src/survey/format.ts';
import type { Portfolio, Survey } from '../../src/survey/model.ts';
import { pdfText, printed } from '../export/pdf-helpers.ts';
import { fakeIo, runLampwalk, runLampwalkFailure } from './support.ts';

/** The demo survey under a new id, with room and entry ids of its own (a file needs unique ids). */
function copyOfDemo(id: string): Survey {
  const s = demoSurvey();
  return {
    ...s,
    id,
    rooms: s.rooms.map((r) => ({ ...r, id: `${id}-${r.id}`, entries: r.entries.map((e) => ({ ...e, id: `${id}-${e.id}` })) })),
  };
}

/** Invented estate: 10 flats of the demo layout, a one-off hall, and a third survey outside the portfolio. */
function estate(): { surveys: Survey[]; portfolio: Portfolio } {
  const flats = copyOfDemo('flats');
  flats.name = 'Larchfield Row flats (demo)';
  flats.layout = { unitCount: 10, exceptions: [] };
  const hall = copyOfDemo('hall');
  hall.name = 'Quillby Hall (demo)';
  const other = copyOfDemo('other');
  other.name = 'Not in the portfolio (demo)';
  const stamp = '2026-11-20T09:00:00.000Z';
  return {
    surveys: [flats, hall, other],
    portfolio: {
      id: 'estate',
      name: 'Example estate (demo)',
      client: { name: 'Invented Housing Co-op', contact: '' },
      surveyIds: ['hall', 'flats'],
      plan: { budgetPerYear: 15000, years: 3 },
      notes: '',
      createdAt: stamp,
      updatedAt: stamp,
    },
  };
}

interface PlanOutput {
  format: string;
  version: number;
  portfolio: { id: string; name: string } | null;
  currency: string;
  surveys: { id: string }[];
  measures: { id: string }[];
  plan: PhasePlan;
}

describe('lampwalk plan', () => {
  const { surveys, portfolio } = estate();
  const fileText = JSON.stringify(makeSurveyFile(surveys, [], new Date(Date.UTC(2026, 10, 20)), [], [portfolio]));
  const files = { 'estate.json': fileText };

  it('prints the plan of the named portfolio, with its plan settings, equal to planPhases', async () => {
    const io = fakeIo(files);
    expect(await main(['plan', 'estate.json', '--portfolio', 'estate'], io)).toBe(0);
    expect(io.err).toBe('');
    const out = JSON.parse(io.out) as PlanOutput;
    expect(out.format).toBe('lampwalk-phase-plan');
    expect(out.portfolio).toEqual({ id: 'estate', name: 'Example estate (demo)' });
    expect(out.surveys.map((s) => s.id)).toEqual(['hall', 'flats']);
    expect(out.plan.settings).toEqual({ budgetPerYear: 15000, years: 3 });
    const expected = planPhases(measuresFromSurveys([surveys[1]!, surveys[0]!]), portfolio.plan, { locale: 'en-US', currency: 'USD' });
    expect(out.plan.npv).toBeCloseTo(expected.npv, 6);
    expect(out.plan.assignments).toEqual(expected.assignments);
    for (const y of out.plan.years) expect(y.budgetLeft).toBeGreaterThanOrEqual(-1e-6);
    // 10 flats + the hall: more work than 3 × 15,000 buys, so some measures wait, each with a reason.
    const notFirst = Object.values(out.plan.assignments).filter((y) => y !== 1).length;
    expect(notFirst).toBeGreaterThan(0);
    expect(out.plan.deferred.length).toBe(notFirst);
  });

  it('--budget and --years override the portfolio; --method picks the method', async () => {
    const io = fakeIo(files);
    expect(await main(['plan', 'estate.json', '--portfolio', 'estate', '--budget', '2500.50', '--years', '2', '--method', 'heuristic', '--compact'], io)).toBe(0);
    const out = JSON.parse(io.out) as PlanOutput;
    expect(io.out.trim().split('\n').length).toBe(1);
    expect(out.plan.settings).toEqual({ budgetPerYear: 2500.5, years: 2 });
    expect(out.plan.method).toBe('heuristic');
    expect(out.plan.upperBound).toBeGreaterThanOrEqual(out.plan.npv);
  });

  it('without --portfolio plans every survey in the file', async () => {
    const io = fakeIo(files);
    expect(await main(['plan', 'estate.json', '--budget', '20000', '--years', '4'], io)).toBe(0);
    const out = JSON.parse(io.out) as PlanOutput;
    expect(out.portfolio).toBeNull();
    expect(out.surveys.map((s) => s.id)).toEqual(['flats', 'hall', 'other']);
    expect(out.plan.years.length).toBe(4);
  });

  it.each([
    [['plan', 'estate.json'], /--budget <amount per year> and --years <n>/],
    [['plan', 'estate.json', '--budget', '-5', '--years', '2'], /--budget needs a value/],
    [['plan', 'estate.json', '--budget', '1,000', '--years', '2'], /--budget must be an amount of 0 or more/],
    [['plan', 'estate.json', '--budget', '1000', '--years', '0'], /--years must be a whole number from 1 to 20 \(got "0"\)/],
    [['plan', 'estate.json', '--budget', '1000', '--years', '21'], /--years must be a whole number from 1 to 20/],
    [['plan', 'estate.json', '--portfolio', 'nope'], /no portfolio with id "nope" in estate\.json \(it has estate\)/],
    [['plan', 'estate.json', '--budget', '1', '--years', '1', '--method', 'best'], /--method must be auto, exact or heuristic/],
    [['plan', 'missing.json', '--budget', '1', '--years', '1'], /missing\.json: no such file/],
    [['plan', 'estate.json', '--budget', '1', '--years', '1', '--spare', '5'], /unknown option --spare for plan/],
    [['plan'], /plan needs a survey file/],
    [['summary', 'estate.json', '--portfolio', 'estate'], /summary writes a PDF: name it with -o <file\.pdf>/],
  ])('refuses %j with exit code 2 and a clear message', async (args, message) => {
    const io = fakeIo(files);
    expect(await main(args, io)).toBe(2);
    expect(io.err).toMatch(message);
    expect(io.err).toMatch(/Run "lampwalk help" for usage\./);
    expect(io.out).toBe('');
  });

  it('names the survey in the file when the surveys use two currencies', async () => {
    const { surveys: s, portfolio: p } = estate();
    s[2]!.money = { ...s[2]!.money, currency: 'EUR' };
    const io = fakeIo({ 'mixed.json': JSON.stringify(makeSurveyFile(s, [], new Date(), [], [p])) });
    expect(await main(['plan', 'mixed.json', '--budget', '1000', '--years', '2'], io)).toBe(2);
    expect(io.err).toMatch(/surveys\[2\]\.money\.currency: is EUR but surveys\[0\] uses USD/);
  });

  it('writes the portfolio summary PDF and the order list by phase', async () => {
    const io = fakeIo(files);
    expect(await main(['summary', 'estate.json', '--portfolio', 'estate', '-o', 'summary.pdf', '--company', 'Brightwell (invented)', '--date', '2026-11-20'], io)).toBe(0);
    const text = await pdfText(io.written.get('summary.pdf')!);
    const plan = planPhases(measuresFromSurveys([surveys[1]!, surveys[0]!]), portfolio.plan, { locale: 'en-US', currency: 'USD' });
    const fig = figuresFor(surveys[0]!);
    expect(printed(text, fig.money(plan.npv))).toBe(true);
    expect(printed(text, 'Example estate (demo)')).toBe(true);

    const csvIo = fakeIo(files);
    expect(await main(['phase-orders', 'estate.json', '--portfolio', 'estate', '--spare', '0'], csvIo)).toBe(0);
    const rows = Papa.parse<Record<string, string>>(csvIo.out, { header: true, skipEmptyLines: true }).data;
    const years = new Set(rows.map((r) => Number(r.phase_year)));
    for (const y of plan.years) expect(years.has(y.year)).toBe(y.measures.length > 0 && rows.some((r) => Number(r.phase_year) === y.year));
    // Spare 0: quantities needed equal the product units of the measures done, year by year.
    const measures = measuresFromSurveys([surveys[1]!, surveys[0]!]);
    for (const y of plan.years) {
      const units = measures.filter((m) => plan.assignments[m.id] === y.year).reduce((s, m) => s + m.productUnits, 0);
      expect(rows.filter((r) => Number(r.phase_year) === y.year).reduce((s, r) => s + Number(r.order_quantity), 0)).toBe(units);
    }

    const pdfIo = fakeIo(files);
    expect(await main(['phase-orders', 'estate.json', '--portfolio', 'estate', '-o', 'orders.pdf'], pdfIo)).toBe(0);
    expect(printed(await pdfText(pdfIo.written.get('orders.pdf')!), 'Order list by phase')).toBe(true);
  });

  it('runs as a real process: JSON on stdout, exit code 2 on bad input', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'lampwalk-plan-'));
    const path = join(dir, 'estate.json');
    await writeFile(path, fileText);
    const ok = await runLampwalk(['plan', path, '--portfolio', 'estate']);
    expect((JSON.parse(ok.stdout) as PlanOutput).plan.years.length).toBe(3);
    const bad = await runLampwalkFailure(['plan', path, '--years', 'three']);
    expect(bad?.code).toBe(2);
    expect(bad?.stderr).toMatch(/--years must be a whole number from 1 to 20 \(got "three"\)/);
  }, 30_000);
});
