/**
 * Phasing figures for `npm run bench` (key `phasing`): the heuristic on 500
 * generated measures over 5 years (time, NPV, the relaxation bound and the
 * gap to it), and the exact branch and bound on the largest generated
 * instance it proves optimal within its node limit. Invented data.
 */
import { performance } from 'node:perf_hooks';
import { defaultNodeLimit, planPhases, type PlanMeasure } from '../src/calc/phasing.ts';
import { seededRandom } from './synthetic.ts';

/** `count` invented measures: costs 200–20,000, simple paybacks 1–15 years, typical real rates. */
export function generatedMeasures(count: number, seed: number): PlanMeasure[] {
  const rnd = seededRandom(seed);
  return Array.from({ length: count }, (_, i) => {
    const cost = Math.round(200 + rnd() * 19_800);
    const payback = 1 + rnd() * 14;
    const savings = cost / payback;
    const maintenanceShare = rnd() * 0.3;
    return {
      id: `m${i}`,
      label: `Measure ${i}`,
      cost,
      energySavingsPerYear: savings * (1 - maintenanceShare),
      maintenanceSavingsPerYear: savings * maintenanceShare,
      discountRatePerYear: [0.03, 0.05, 0.07][i % 3]!,
      escalationPerYear: [0, 0.01, 0.02][Math.floor(rnd() * 3)]!,
      analysisYears: 10 + Math.floor(rnd() * 11),
    };
  });
}

function budgetFor(measures: readonly PlanMeasure[], years: number): number {
  // Enough for about 60 % of the work over the plan: the plan has to choose.
  return Math.round((0.6 * measures.reduce((s, m) => s + m.cost, 0)) / years);
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

const round = (n: number, digits = 3) => Math.round(n * 10 ** digits) / 10 ** digits;

export function phasingBench(): Record<string, unknown> {
  const years = 5;
  const measures = generatedMeasures(500, 500);
  const settings = { budgetPerYear: budgetFor(measures, years), years };
  planPhases(measures, settings); // warm-up
  const times: number[] = [];
  let plan = planPhases(measures, settings);
  for (let i = 0; i < 5; i++) {
    const t0 = performance.now();
    plan = planPhases(measures, settings);
    times.push(performance.now() - t0);
  }
  // The exact search on growing instances until it no longer proves optimality within its node limit.
  let exact: Record<string, unknown> | null = null;
  for (const n of [10, 15, 20, 25, 30, 40, 50, 60, 80]) {
    const small = generatedMeasures(n, 1000 + n);
    const s = { budgetPerYear: budgetFor(small, years), years };
    const t0 = performance.now();
    const p = planPhases(small, s, { method: 'exact' });
    const ms = performance.now() - t0;
    if (!p.optimal) {
      if (exact) exact.firstUnprovenMeasures = n;
      break;
    }
    const h = planPhases(small, s, { method: 'heuristic' });
    exact = {
      measures: n,
      years,
      ms: round(ms),
      nodes: p.nodes,
      npv: round(p.npv, 2),
      heuristicNpv: round(h.npv, 2),
      heuristicGapToOptimum: round((p.npv - h.npv) / p.npv, 6),
      heuristicStatedGap: round(h.gapFraction, 6),
    };
  }
  return {
    measures: measures.length,
    years,
    budgetPerYear: settings.budgetPerYear,
    method: plan.method,
    optimal: plan.optimal,
    ms: round(median(times)),
    npv: round(plan.npv, 2),
    upperBound: round(plan.upperBound, 2),
    gapFraction: round(plan.gapFraction, 6),
    chosen: Object.values(plan.assignments).filter((y) => y !== null).length,
    exactLargest: exact,
    exactNodeLimit: defaultNodeLimit,
  };
}
