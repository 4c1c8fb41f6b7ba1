/**
 * `npm run bench`: speed figures as JSON. Goals (from the issues) are printed
 * beside the figures; nothing here fails a build — compare runs instead.
 */
import { performance } from 'node:perf_hooks';
import { calculateSurvey, recalculateEntry } from '../src/calc/survey.ts';
import type { Survey } from '../src/survey/model.ts';
import { seededRandom, syntheticSurvey } from './synthetic.ts';
import { choiceBench } from './choice.ts';
import { exportBench } from './export.ts';
import { phasingBench } from './phasing.ts';
import { storeBench } from './store.ts';
import { uiBench } from './ui.ts';

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

function percentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]!;
}

function time(run: () => void, repeats: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    run();
    out.push(performance.now() - t0);
  }
  return out;
}

/** Only kWh, money and payback, straight off the survey data: the floor any full calculation is compared with. */
function bareLoop(survey: Survey): number {
  const rate = survey.money.energyRatePerKwh;
  let checksum = 0;
  for (const room of survey.rooms) {
    const hours =
      room.hours.kind === 'annual' ? room.hours.hoursPerYear : room.hours.days.reduce((a, b) => a + b, 0) * (365 / 7);
    for (const e of room.entries) {
      const existingWatts = e.existing.meteredWattsPerFixture ?? e.existing.fixtureInputWatts ?? e.existing.lampsPerFixture * e.existing.ratedWattsPerLamp;
      const proposedWatts = e.proposed ? e.proposed.unitsPerFixture * e.proposed.wattsPerUnit : existingWatts;
      const kwhSaved = (e.count * (existingWatts - proposedWatts) * hours) / 1000;
      const money = kwhSaved * rate;
      const cost = e.proposed ? e.count * e.proposed.unitsPerFixture * e.proposed.unitCost : 0;
      const payback = money > 0 ? cost / money : Number.POSITIVE_INFINITY;
      checksum += kwhSaved + (Number.isFinite(payback) ? payback : 0);
    }
  }
  return checksum;
}

const entryCount = 10_000;
const survey = syntheticSurvey(entryCount, 10, 42);

// Warm up both paths so the JIT has compiled them before timing.
for (let i = 0; i < 3; i++) {
  calculateSurvey(survey);
  bareLoop(survey);
}
const fullMs = median(time(() => calculateSurvey(survey), 9));
let sink = 0;
const bareMs = median(time(() => (sink += bareLoop(survey)), 51));

const rnd = seededRandom(9);
let current = calculateSurvey(survey);
const entries = survey.rooms.flatMap((r) => r.entries);
const recalc: number[] = [];
for (let i = 0; i < 300; i++) {
  const entry = entries[Math.floor(rnd() * entries.length)]!;
  entry.count = 1 + Math.floor(rnd() * 30);
  const t0 = performance.now();
  current = recalculateEntry(current, survey, entry.id);
  recalc.push(performance.now() - t0);
}

const round = (n: number) => Math.round(n * 1000) / 1000;
process.stdout.write(
  `${JSON.stringify(
    {
      calc: {
        entries: entryCount,
        fullSurveyMs: round(fullMs),
        bareLoopMs: round(bareMs),
        ratioToBareLoop: round(fullMs / bareMs),
        ratioGoal: 5,
        recalcOneEntryMedianMs: round(median(recalc)),
        recalcOneEntryP95Ms: round(percentile(recalc, 95)),
        recalcGoalMedianMs: 1,
        warnings: current.warnings.length,
        checksum: Math.round(sink) === 0 ? 0 : 1,
      },
      phasing: phasingBench(),
      choice: choiceBench(),
      export: await exportBench(),
      store: await storeBench(),
      offline: await (await import('./offline.ts')).offlineBench(),
      ui: await uiBench(),
      node: process.version,
    },
    null,
    2,
  )}\n`,
);
