/**
 * Phased plan under a yearly budget: which measures of a portfolio to do in
 * which year so that the net present value of the whole plan is as large as
 * possible while each year's spending stays within the budget.
 *
 * Measures. A measure is one fixture entry that changes something (a proposed
 * product, or a control change) in one survey. When the survey stands for
 * several units of one layout, the measure covers the entry's fixtures in all
 * units (`fixturesAcrossUnits` in `layout.ts`): all units of an entry are done in the
 * same year (one order, one crew visit per layout), so a measure is never
 * split across years.
 *
 * Conventions (stated in {@link planConventions}, printed with every plan):
 * - Money is real (constant plan-start money), discounted at each site's real
 *   discount rate with NIST Handbook 135 end-of-year discounting, as in
 *   `economics.ts`: plan year t (1-based) starts at time t − 1 and ends at t.
 * - A measure done in plan year t is paid at the start of that year (time
 *   t − 1) and saves at the end of each of the next `analysisYears` years
 *   (times t … t − 1 + analysisYears): the same cash flows as a project
 *   started now, shifted by t − 1 years. Its project cost does not change in
 *   real terms when it waits.
 * - Energy and demand savings follow the energy price, which escalates in
 *   calendar years from the plan start (a measure that waits saves at the
 *   later, escalated price); maintenance savings are constant in real terms.
 * - The value of a measure in a year is its NPV at the plan start; a measure
 *   is only ever placed in a year where that value is positive.
 * - Each year's budget covers the net costs (after rebates) of the measures
 *   done that year; a negative net cost counts as 0 (a rebate surplus is not
 *   spent on other measures). Unspent budget is not carried over.
 *
 * Methods. `exact`: depth-first branch and bound over the measures in order
 * of NPV per unit cost, pruning with the smaller of two upper bounds of the
 * linear-programming relaxation (the fractional knapsack over the pooled
 * remaining budget with each measure at its best year's value, and a
 * Lagrangian bound with one price per year of budget). `heuristic`: greedy by
 * NPV per unit cost into the year with room where the measure is worth most,
 * then local improvement (move a measure to a better year, add, swap a left-out
 * measure for a chosen one, exchange two measures' years) until nothing
 * improves. Either way the plan states an upper bound on the best possible NPV
 * (the smaller of the two relaxation bounds at the root) and the gap to it.
 */
import type { ControlChange, PhasePlanSettings, Survey } from '../survey/model.ts';
import { escalatedUniformPresentValueFactor, maxMoneyAmount, uniformPresentValueFactor } from './economics.ts';
import { CalcInputError, checkInteger, checkRange } from './errors.ts';
import { calculateLayout, type LayoutResult } from './portfolio.ts';
import type { SurveyResult } from './survey.ts';
import { formatMoney, formatNumber } from './units.ts';

// ---------------------------------------------------------------------------
// types

/** What the planner needs to know about one measure. */
export interface PlanMeasure {
  /** Unique within the plan; `<surveyId>/<entryId>` for measures made from surveys. */
  id: string;
  /** Shown in reasons and reports, e.g. "Alder Court · Stair A · 2×4 troffer". */
  label: string;
  /** Net project cost (after rebates) paid in the year the measure is done, plan-start money. */
  cost: number;
  /** Energy and demand savings in the first year of operation at plan-start prices; escalates with the energy price. */
  energySavingsPerYear: number;
  /** Avoided relamping per year, constant in real terms. */
  maintenanceSavingsPerYear: number;
  /** Real discount rate of the measure's site, 0–0.5. */
  discountRatePerYear: number;
  /** Real escalation of the energy price above inflation, −0.5–0.5. */
  escalationPerYear: number;
  /** Years the measure saves once done, 1–40. */
  analysisYears: number;
}

/** A measure made from a survey entry, with everything the reports and the order list need. */
export interface Measure extends PlanMeasure {
  surveyId: string;
  entryId: string;
  roomId: string;
  /** Site name (or the survey name when the site has none). */
  site: string;
  roomName: string;
  /** The existing equipment's description. */
  description: string;
  /** The proposed product, or null for a control change alone. */
  productName: string | null;
  catalogId: string | null;
  control: ControlChange;
  /** Units of the layout (1 without a layout). */
  units: number;
  /** Fixtures changed across all units of the layout. */
  fixtures: number;
  /** Product units to install: fixtures × units per fixture (0 for a control change alone). */
  productUnits: number;
  /** First-year savings: energy + demand + maintenance. */
  savingsPerYear: number;
  kwhPerYear: number;
  peakKw: number;
  co2KgPerYear: number;
  currency: string;
}

/** How to plan. */
export interface PlanOptions {
  /** `auto` (default): exact when the instance is small enough, otherwise the heuristic. */
  method?: 'auto' | 'exact' | 'heuristic';
  /** Largest number of measures `auto` solves exactly (default {@link defaultExactLimit}). */
  exactLimit?: number;
  /** Branch-and-bound nodes after which the search stops with its best plan (default {@link defaultNodeLimit}). */
  nodeLimit?: number;
  /** Locale for numbers in the reasons (default en-US). */
  locale?: string;
  /** Currency for money in the reasons (default: plain numbers). */
  currency?: string;
}

/** One plan year. */
export interface PhaseYear {
  /** 1-based. */
  year: number;
  /** Ids of the measures done this year, in the order given. */
  measures: string[];
  /** Net cost of this year's measures. */
  cost: number;
  /** Budget − what this year's measures take from it. */
  budgetLeft: number;
  /** NPV at the plan start of this year's measures. */
  npv: number;
  /** First-year savings (plan-start prices) of every measure done so far, this year's included. */
  savingsPerYear: number;
  /** Savings actually received this year (escalated energy prices), undiscounted. */
  savings: number;
  /** savings − cost, undiscounted. */
  cashFlow: number;
  cumulativeCashFlow: number;
  /** Each measure's cost and savings this year, discounted at its own site's rate to the plan start. */
  discountedCashFlow: number;
  /** Running sum of `discountedCashFlow`; at the end of the horizon it equals the plan's NPV. */
  cumulativeDiscountedCashFlow: number;
}

/** One year of the plan's cash flow, from year 1 to the last year any chosen measure saves. */
export type HorizonYear = Omit<PhaseYear, 'measures' | 'budgetLeft' | 'npv' | 'savingsPerYear'>;

/** Why a measure is not done in year 1. */
export type DeferralKind =
  /** Done later: the earlier years' budgets were taken by other measures. */
  | 'waited-for-budget'
  /** Done later: it is worth more done then. */
  | 'waited-worth-more'
  /** Done later: worth the same either way. */
  | 'waited-same-value'
  /** Not done: its cost is more than a year's budget. */
  | 'over-budget'
  /** Not done: it saves nothing. */
  | 'no-saving'
  /** Not done: it costs more than it saves over its analysis period. */
  | 'not-worth-it'
  /** Not done: every year's budget went to other measures. */
  | 'budget-spent';

export interface DeferredMeasure {
  measureId: string;
  label: string;
  /** The year it is done, or null when it is not done. */
  year: number | null;
  kind: DeferralKind;
  /** One line, e.g. "waited for year 2: year 1's budget went to measures with higher NPV per unit cost (0.38 vs 0.33)". */
  reason: string;
}

/** Each measure's place in the plan. */
export interface PlannedMeasure {
  measureId: string;
  label: string;
  /** 1-based year, or null when not done. */
  year: number | null;
  cost: number;
  /** NPV at the plan start if done in year 1, 2, … */
  npvByYear: number[];
  /** NPV at the plan start in the year chosen; 0 when not done. */
  npv: number;
  /** Year-1 NPV per unit of cost; null when it costs nothing. */
  npvPerUnitCost: number | null;
}

export type PlanMethod = 'exact' | 'heuristic';

/** The phased plan. */
export interface PhasePlan {
  method: PlanMethod;
  /** True when the plan is proven to have the largest NPV possible (exact search completed). */
  optimal: boolean;
  settings: PhasePlanSettings;
  /** NPV at the plan start of every measure done. */
  npv: number;
  /** No plan within the budget can have a larger NPV than this: `npv` itself when optimal, otherwise the relaxation bound. */
  upperBound: number;
  /** (upperBound − npv) / upperBound; 0 when the bound is 0. The heuristic's stated bound. */
  gapFraction: number;
  /** Branch-and-bound nodes searched (0 for the heuristic). */
  nodes: number;
  years: PhaseYear[];
  /** Cash flow from year 1 until the last saving of any measure done (the plan years first). */
  horizon: HorizonYear[];
  /** Measure id → 1-based year, or null when not done (an object without a prototype, so any id is a plain key). */
  assignments: Record<string, number | null>;
  /** Every measure not done in year 1, with why. */
  deferred: DeferredMeasure[];
  measures: PlannedMeasure[];
  /** The conventions the figures rest on, in plain words. */
  conventions: string[];
}

/** Largest measure count `auto` gives to the exact search. */
export const defaultExactLimit = 30;
/** Node budget of the exact search. */
export const defaultNodeLimit = 2_000_000;
/** Longest plan, years. */
export const maxPlanYears = 20;

/** The conventions every plan states (the report prints them). */
export const planConventions: readonly string[] = [
  'Money is in plan-start terms (real), discounted at each site\u2019s real discount rate, end of year (NIST Handbook 135).',
  'A measure done in year t is paid at the start of year t and saves at the end of each of the following years for its analysis period.',
  'Energy prices escalate from the plan start, so a measure that waits saves at the later price; project costs do not change in real terms.',
  'All units of a repeated layout are done in the same year for each fixture entry.',
  'Each year\u2019s budget covers the net cost (after rebates) of that year\u2019s measures; unspent budget is not carried over.',
  'Measures whose NPV is not positive in any year are never chosen.',
];

// ---------------------------------------------------------------------------
// values

function checkMeasure(m: PlanMeasure, index: number): void {
  const field = `measures[${index}]`;
  if (typeof m.id !== 'string' || m.id === '') throw new CalcInputError(`${field}.id`, 'must be a non-empty text');
  checkRange(`${field}.cost`, m.cost, -maxMoneyAmount, maxMoneyAmount);
  checkRange(`${field}.energySavingsPerYear`, m.energySavingsPerYear, -maxMoneyAmount, maxMoneyAmount);
  checkRange(`${field}.maintenanceSavingsPerYear`, m.maintenanceSavingsPerYear, -maxMoneyAmount, maxMoneyAmount);
  checkRange(`${field}.discountRatePerYear`, m.discountRatePerYear, 0, 0.5);
  checkRange(`${field}.escalationPerYear`, m.escalationPerYear, -0.5, 0.5);
  checkInteger(`${field}.analysisYears`, m.analysisYears, 1, 40);
}

/**
 * NPV at the plan start of doing a measure in each plan year 1…`years`:
 * value(t) = (−cost + maintenance·UPV(d, n)) / (1 + d)^(t−1)
 *          + energy·UPV*(d, e, n)/(1 + e) · ((1 + e)/(1 + d))^(t−1),
 * i.e. NIST Handbook 135 UPV and UPV* for the savings of a project started
 * now, moved t − 1 years later, with energy prices escalating from the plan
 * start. value(1) equals `analyseInvestment(...)`'s net present value.
 *
 * @example
 * measureValueByYear({ id: 'a', label: 'a', cost: 600, energySavingsPerYear: 1000, maintenanceSavingsPerYear: 0,
 *   discountRatePerYear: 0.25, escalationPerYear: 0, analysisYears: 1 }, 2) //=> [200, 160]
 */
export function measureValueByYear(measure: PlanMeasure, years: number): number[] {
  checkMeasure(measure, 0);
  checkInteger('years', years, 1, maxPlanYears);
  return valuesUnchecked(measure, years);
}

function valuesUnchecked(m: PlanMeasure, years: number): number[] {
  const d = m.discountRatePerYear;
  const e = m.escalationPerYear;
  const n = m.analysisYears;
  const fixedNow = -m.cost + m.maintenanceSavingsPerYear * uniformPresentValueFactor(d, n);
  const energyNow = (m.energySavingsPerYear * escalatedUniformPresentValueFactor(d, e, n)) / (1 + e);
  const out: number[] = [];
  for (let t = 0; t < years; t++) out.push(fixedNow / Math.pow(1 + d, t) + energyNow * Math.pow((1 + e) / (1 + d), t));
  return out;
}

// ---------------------------------------------------------------------------
// measures from surveys

function prefixed(prefix: string, err: unknown): unknown {
  return err instanceof CalcInputError ? new CalcInputError(`${prefix}.${err.field}`, err.problem) : err;
}

/**
 * The measures of a set of surveys: one per fixture entry with a proposed
 * product or a control change and at least one fixture across the layout's
 * units. Figures are the entry's across all units from `calculateLayout`
 * (`portfolio.ts`: the entry's own `calculateSurvey` figures × fixtures across
 * units ÷ fixtures in the surveyed unit), reusing `results` (keyed by survey
 * id) when given. Throws a {@link CalcInputError}
 * naming `surveys[i].money.currency` when the surveys use different
 * currencies, and `surveys[i].…` for any input the calculation refuses.
 *
 * @example measuresFromSurveys([demoSurvey()]).length //=> number of entries that change something
 */
export function measuresFromSurveys(surveys: readonly Survey[], results?: ReadonlyMap<string, SurveyResult>): Measure[] {
  const currency = surveys[0]?.money.currency;
  const measures: Measure[] = [];
  const seen = new Set<string>();
  surveys.forEach((survey, si) => {
    if (survey.money.currency !== currency) {
      throw new CalcInputError(
        `surveys[${si}].money.currency`,
        `is ${survey.money.currency} but surveys[0] uses ${currency ?? ''}; a plan needs one currency`,
      );
    }
    let layout: LayoutResult;
    try {
      const given = results?.get(survey.id);
      layout = calculateLayout(survey, given && given.surveyId === survey.id ? given : undefined);
    } catch (err) {
      throw prefixed(`surveys[${si}]`, err);
    }
    const units = layout.units;
    const site = survey.site.name.trim() || survey.name;
    for (const room of survey.rooms) {
      for (const entry of room.entries) {
        if (!entry.proposed && entry.control === 'none') continue;
        const fixtures = layout.fixturesByEntry.get(entry.id) ?? 0;
        const er = layout.entries.get(entry.id);
        if (fixtures <= 0 || !er) continue;
        const id = `${survey.id}/${entry.id}`;
        if (seen.has(id)) throw new CalcInputError(`surveys[${si}].id`, `survey "${survey.id}" is listed twice`);
        seen.add(id);
        const m = er.money;
        const p = entry.proposed;
        const description = entry.existing.description.trim() || 'fixture';
        measures.push({
          id,
          label: `${site} \u00b7 ${room.name} \u00b7 ${description}`,
          surveyId: survey.id,
          entryId: entry.id,
          roomId: room.id,
          site,
          roomName: room.name,
          description,
          productName: p ? p.name : null,
          catalogId: p?.catalogId ?? null,
          control: entry.control,
          units,
          fixtures,
          productUnits: p ? fixtures * p.unitsPerFixture : 0,
          cost: m.cost.net,
          energySavingsPerYear: m.energyPerYear + m.demandPerYear,
          maintenanceSavingsPerYear: m.maintenancePerYear,
          savingsPerYear: m.totalPerYear,
          kwhPerYear: er.savings.kwhPerYear,
          peakKw: er.savings.peakKw,
          co2KgPerYear: er.co2KgPerYear,
          discountRatePerYear: survey.money.discountRatePerYear,
          escalationPerYear: survey.money.energyEscalationPerYear,
          analysisYears: survey.money.analysisYears,
          currency: survey.money.currency,
        });
      }
    }
  });
  return measures;
}

// ---------------------------------------------------------------------------
// the solvers

/** A measure that can go in some year: positive weight, fits a year's budget, positive value in some year. */
interface Item {
  /** Index into the caller's measure list. */
  measure: number;
  weight: number;
  values: number[];
  best: number;
  density: number;
  /** Years by value, best first (ties: earlier first), only those with a positive value. */
  yearOrder: number[];
}

interface Solution {
  /** Per item (same order as the items), 0-based year or −1. */
  years: Int32Array;
  value: number;
}

function sumValue(items: readonly Item[], years: Int32Array): number {
  let v = 0;
  for (let k = 0; k < items.length; k++) {
    const t = years[k]!;
    if (t >= 0) v += items[k]!.values[t]!;
  }
  return v;
}

/** Fractional knapsack over pooled capacity; items sorted by density, from index `from`; items heavier than `maxRoom` left out. */
function pooledBound(items: readonly Item[], from: number, pooled: number, maxRoom: number, tolerance: number): number {
  let cap = pooled;
  let bound = 0;
  for (let j = from; j < items.length; j++) {
    const it = items[j]!;
    if (it.weight > maxRoom + tolerance) continue;
    if (it.weight <= cap) {
      bound += it.best;
      cap -= it.weight;
    } else {
      bound += (it.best * cap) / it.weight;
      break;
    }
  }
  return bound;
}

/**
 * Lagrangian bound Σ_t λ_t·B + Σ_i max(0, max_t(v_it − λ_t·w_i)), valid for
 * any λ ≥ 0. Starts from one price for all years (the pooled fractional
 * knapsack's critical density, where it equals the pooled bound) and lowers it
 * by exact coordinate descent, each year's price in turn.
 */
function lagrangian(items: readonly Item[], budget: number, years: number): { bound: number; prices: number[] } {
  const evaluate = (prices: readonly number[]): number => {
    let f = 0;
    for (const p of prices) f += p * budget;
    for (const it of items) {
      let g = 0;
      for (let t = 0; t < years; t++) g = Math.max(g, it.values[t]! - prices[t]! * it.weight);
      f += g;
    }
    return f;
  };
  // Critical density of the pooled knapsack.
  let cap = budget * years;
  let critical = 0;
  for (const it of items) {
    if (it.weight <= cap) cap -= it.weight;
    else {
      critical = it.density;
      break;
    }
  }
  const prices = new Array<number>(years).fill(critical);
  let best = evaluate(prices);
  let bestPrices = [...prices];
  const points: { p: number; w: number }[] = [];
  for (let sweep = 0; sweep < 30; sweep++) {
    const before = best;
    for (let t = 0; t < years; t++) {
      points.length = 0;
      for (const it of items) {
        let other = 0;
        for (let s = 0; s < years; s++) if (s !== t) other = Math.max(other, it.values[s]! - prices[s]! * it.weight);
        const p = (it.values[t]! - other) / it.weight;
        if (p > 0) points.push({ p, w: it.weight });
      }
      points.sort((a, b) => b.p - a.p);
      let used = 0;
      let price = 0;
      for (const pt of points) {
        if (used + pt.w > budget) {
          price = pt.p;
          break;
        }
        used += pt.w;
      }
      prices[t] = price;
      const f = evaluate(prices);
      if (f < best) {
        best = f;
        bestPrices = [...prices];
      }
    }
    if (before - best <= 1e-12 * Math.max(1, Math.abs(best))) break;
  }
  return { bound: best, prices: bestPrices };
}

/** Greedy by density into the best-valued year with room, then local improvement. */
function heuristic(items: readonly Item[], budget: number, years: number, tolerance: number): Solution {
  const n = items.length;
  const at = new Int32Array(n).fill(-1);
  const room = new Array<number>(years).fill(budget);
  const eps = 1e-12;
  const fits = (w: number, t: number) => w <= room[t]! + tolerance;
  const bestFreeYear = (k: number, extraYear = -1, extra = 0): number => {
    const it = items[k]!;
    for (const t of it.yearOrder) if (it.weight <= room[t]! + (t === extraYear ? extra : 0) + tolerance) return t;
    return -1;
  };
  for (let k = 0; k < n; k++) {
    const t = bestFreeYear(k);
    if (t >= 0) {
      at[k] = t;
      room[t] = room[t]! - items[k]!.weight;
    }
  }
  for (let pass = 0; pass < 100; pass++) {
    let improved = false;
    // Move a chosen measure to a year where it is worth more.
    for (let k = 0; k < n; k++) {
      const s = at[k]!;
      if (s < 0) continue;
      const it = items[k]!;
      for (const t of it.yearOrder) {
        if (it.values[t]! <= it.values[s]! + eps) break;
        if (fits(it.weight, t)) {
          room[s] = room[s]! + it.weight;
          room[t] = room[t]! - it.weight;
          at[k] = t;
          improved = true;
          break;
        }
      }
    }
    // Add any left-out measure that now fits.
    for (let k = 0; k < n; k++) {
      if (at[k]! >= 0) continue;
      const t = bestFreeYear(k);
      if (t >= 0) {
        at[k] = t;
        room[t] = room[t]! - items[k]!.weight;
        improved = true;
      }
    }
    // Swap a left-out measure for a chosen one, re-placing the one taken out where it fits.
    for (let u = 0; u < n; u++) {
      if (at[u]! >= 0) continue;
      const iu = items[u]!;
      let bestGain = eps;
      let bestA = -1;
      let bestT = -1;
      let bestReplace = -1;
      for (let a = 0; a < n; a++) {
        const t = at[a]!;
        if (t < 0) continue;
        const ia = items[a]!;
        const vu = iu.values[t]!;
        if (vu <= 0 || iu.weight > room[t]! + ia.weight + tolerance) continue;
        let gain = vu - ia.values[t]!;
        // Where could the one taken out go instead?
        const roomT = room[t]! + ia.weight - iu.weight;
        let replace = -1;
        for (const s of ia.yearOrder) {
          if (ia.weight <= (s === t ? roomT : room[s]!) + tolerance) {
            replace = s;
            break;
          }
        }
        if (replace >= 0) gain += ia.values[replace]!;
        if (gain > bestGain) {
          bestGain = gain;
          bestA = a;
          bestT = t;
          bestReplace = replace;
        }
      }
      if (bestA >= 0) {
        const ia = items[bestA]!;
        room[bestT] = room[bestT]! + ia.weight - iu.weight;
        at[u] = bestT;
        at[bestA] = bestReplace;
        if (bestReplace >= 0) room[bestReplace] = room[bestReplace]! - ia.weight;
        improved = true;
      }
    }
    // Drop and add: make room for a left-out measure by taking out the chosen measures of a year
    // that are worth least per unit cost, when it is worth more than all of them together.
    for (let u = 0; u < n; u++) {
      if (at[u]! >= 0) continue;
      const iu = items[u]!;
      for (const t of iu.yearOrder) {
        const inYear: number[] = [];
        for (let a = 0; a < n; a++) if (at[a] === t) inYear.push(a);
        inYear.sort((a, b) => items[a]!.values[t]! / items[a]!.weight - items[b]!.values[t]! / items[b]!.weight);
        let free = room[t]!;
        let lost = 0;
        const out: number[] = [];
        for (const a of inYear) {
          if (iu.weight <= free + tolerance) break;
          free += items[a]!.weight;
          lost += items[a]!.values[t]!;
          out.push(a);
        }
        if (iu.weight > free + tolerance || iu.values[t]! - lost <= eps) continue;
        for (const a of out) at[a] = -1;
        at[u] = t;
        room[t] = free - iu.weight;
        improved = true;
        break;
      }
    }
    // Exchange the years of two chosen measures.
    if (years > 1) {
      for (let a = 0; a < n; a++) {
        for (let b = a + 1; b < n; b++) {
          const s = at[a]!;
          const t = at[b]!;
          if (s < 0 || t < 0 || s === t) continue;
          const ia = items[a]!;
          const ib = items[b]!;
          if (ia.values[t]! <= 0 || ib.values[s]! <= 0) continue;
          const gain = ia.values[t]! + ib.values[s]! - ia.values[s]! - ib.values[t]!;
          if (gain <= eps) continue;
          if (ia.weight > room[t]! + ib.weight + tolerance || ib.weight > room[s]! + ia.weight + tolerance) continue;
          room[s] = room[s]! + ia.weight - ib.weight;
          room[t] = room[t]! + ib.weight - ia.weight;
          at[a] = t;
          at[b] = s;
          improved = true;
        }
      }
    }
    if (!improved) break;
  }
  return { years: at, value: sumValue(items, at) };
}

/** Depth-first branch and bound; `start` is the incumbent. */
function branchAndBound(
  items: readonly Item[],
  budget: number,
  years: number,
  tolerance: number,
  prices: readonly number[],
  start: Solution,
  nodeLimit: number,
): { solution: Solution; complete: boolean; nodes: number } {
  const n = items.length;
  // Suffix sums of each item's Lagrangian profit for the node bound.
  const suffix = new Float64Array(n + 1);
  for (let k = n - 1; k >= 0; k--) {
    const it = items[k]!;
    let g = 0;
    for (let t = 0; t < years; t++) g = Math.max(g, it.values[t]! - prices[t]! * it.weight);
    suffix[k] = suffix[k + 1]! + g;
  }
  const room = new Array<number>(years).fill(budget);
  const current = new Int32Array(n).fill(-1);
  let best = start.value;
  let bestYears = Int32Array.from(start.years);
  let nodes = 0;
  let aborted = false;

  const bound = (k: number): number => {
    let pooled = 0;
    let maxRoom = 0;
    let lagr = suffix[k]!;
    for (let t = 0; t < years; t++) {
      const r = Math.max(0, room[t]!);
      pooled += r;
      maxRoom = Math.max(maxRoom, r);
      lagr += prices[t]! * r;
    }
    return Math.min(lagr, pooledBound(items, k, pooled, maxRoom, tolerance));
  };

  const dfs = (k: number, value: number): void => {
    nodes++;
    if (nodes > nodeLimit) {
      aborted = true;
      return;
    }
    if (value > best + 1e-12 * Math.max(1, Math.abs(best))) {
      best = value;
      bestYears = Int32Array.from(current);
    }
    if (k === n) return;
    if (value + bound(k) <= best + 1e-12 * Math.max(1, Math.abs(best))) return;
    const it = items[k]!;
    for (const t of it.yearOrder) {
      if (it.weight > room[t]! + tolerance) continue;
      room[t] = room[t]! - it.weight;
      current[k] = t;
      dfs(k + 1, value + it.values[t]!);
      current[k] = -1;
      room[t] = room[t]! + it.weight;
      if (aborted) return;
    }
    dfs(k + 1, value);
  };
  dfs(0, 0);
  return { solution: { years: bestYears, value: sumValue(items, bestYears) }, complete: !aborted, nodes: Math.min(nodes, nodeLimit) };
}

// ---------------------------------------------------------------------------
// the plan

function checkSettings(settings: PhasePlanSettings): void {
  if (typeof settings !== 'object' || settings === null) throw new CalcInputError('settings', 'must give budgetPerYear and years');
  checkRange('budgetPerYear', settings.budgetPerYear, 0, maxMoneyAmount);
  checkInteger('years', settings.years, 1, maxPlanYears);
}

function yearList(years: readonly number[]): string {
  const labels = years.map((y) => y + 1);
  if (labels.length === 1) return `year ${labels[0]}`;
  const consecutive = labels.every((y, i) => i === 0 || y === labels[i - 1]! + 1);
  if (consecutive && labels.length > 2) return `years ${labels[0]}\u2013${labels[labels.length - 1]}`;
  return `years ${labels.slice(0, -1).join(', ')} and ${labels[labels.length - 1]}`;
}

/**
 * Plans which measures to do in which year to maximise the NPV at the plan
 * start, each year's net costs within `budgetPerYear` (not carried over).
 * `auto` runs the exact branch and bound when there are at most `exactLimit`
 * measures that could be chosen and it finishes within `nodeLimit` nodes;
 * otherwise the better of its best plan and the heuristic's, with the
 * relaxation bound and the gap. `exact` always runs the search (stopping at
 * `nodeLimit`, then `optimal` is false). Throws a {@link CalcInputError} for
 * a budget that is not a finite amount of 0 or more, years that are not a
 * whole number from 1 to 20, a measure figure out of range, or two measures
 * with one id.
 *
 * @example
 * planPhases(measures, { budgetPerYear: 1000, years: 2 }).years[0].measures //=> ['b', 'c']
 */
export function planPhases(measures: readonly PlanMeasure[], settings: PhasePlanSettings, options: PlanOptions = {}): PhasePlan {
  checkSettings(settings);
  const method = options.method ?? 'auto';
  if (method !== 'auto' && method !== 'exact' && method !== 'heuristic') {
    throw new CalcInputError('method', `must be auto, exact or heuristic (got ${String(method)})`);
  }
  const exactLimit = checkInteger('exactLimit', options.exactLimit ?? defaultExactLimit, 0, 10_000);
  const nodeLimit = checkInteger('nodeLimit', options.nodeLimit ?? defaultNodeLimit, 1, 1e9);
  const ids = new Set<string>();
  measures.forEach((m, i) => {
    checkMeasure(m, i);
    if (ids.has(m.id)) throw new CalcInputError(`measures[${i}].id`, `"${m.id}" is used by an earlier measure`);
    ids.add(m.id);
  });

  const budget = settings.budgetPerYear;
  const years = settings.years;
  const tolerance = 1e-9 * Math.max(1, budget);
  const values = measures.map((m) => valuesUnchecked(m, years));
  const weights = measures.map((m) => Math.max(0, m.cost));

  // Free measures (net cost 0 or less) take no budget: each goes in its best year.
  const chosen = new Array<number>(measures.length).fill(-1);
  const items: Item[] = [];
  measures.forEach((_, i) => {
    const v = values[i]!;
    const yearOrder = v
      .map((value, t) => ({ value, t }))
      .filter((x) => x.value > 0)
      .sort((a, b) => b.value - a.value || a.t - b.t)
      .map((x) => x.t);
    if (yearOrder.length === 0) return;
    const w = weights[i]!;
    if (w === 0) {
      chosen[i] = yearOrder[0]!;
      return;
    }
    if (w > budget + tolerance) return;
    const best = v[yearOrder[0]!]!;
    items.push({ measure: i, weight: w, values: v, best, density: best / w, yearOrder });
  });
  items.sort((a, b) => b.density - a.density || a.weight - b.weight || a.measure - b.measure);
  let freeValue = 0;
  chosen.forEach((t, i) => {
    if (t >= 0) freeValue += values[i]![t]!;
  });

  const pooled = pooledBound(items, 0, budget * years, budget, tolerance);
  const lagr = lagrangian(items, budget, years);
  const itemBound = Math.min(pooled, lagr.bound);

  const greedy = heuristic(items, budget, years, tolerance);
  let solution = greedy;
  let usedMethod: PlanMethod = 'heuristic';
  let optimal = false;
  let nodes = 0;
  if (method === 'exact' || (method === 'auto' && items.length <= exactLimit)) {
    const search = branchAndBound(items, budget, years, tolerance, lagr.prices, greedy, nodeLimit);
    nodes = search.nodes;
    if (search.complete || method === 'exact') {
      usedMethod = 'exact';
      optimal = search.complete;
      solution = search.solution;
    } else if (search.solution.value > greedy.value) {
      solution = search.solution;
    }
  }
  // A proven optimum is its own best bound.
  const itemsUpper = optimal ? solution.value : Math.max(itemBound, solution.value);
  items.forEach((it, k) => {
    chosen[it.measure] = solution.years[k]!;
  });

  const npv = freeValue + solution.value;
  const upperBound = freeValue + itemsUpper;
  const gapFraction = upperBound > 0 ? Math.max(0, (upperBound - npv) / upperBound) : 0;
  return describePlan(measures, settings, options, values, weights, chosen, {
    method: usedMethod,
    optimal,
    npv,
    upperBound,
    gapFraction,
    nodes,
  });
}

function describePlan(
  measures: readonly PlanMeasure[],
  settings: PhasePlanSettings,
  options: PlanOptions,
  values: readonly number[][],
  weights: readonly number[],
  chosen: readonly number[],
  head: Pick<PhasePlan, 'method' | 'optimal' | 'npv' | 'upperBound' | 'gapFraction' | 'nodes'>,
): PhasePlan {
  const years = settings.years;
  const budget = settings.budgetPerYear;
  const locale = options.locale ?? 'en-US';
  const money = (amount: number): string =>
    options.currency ? formatMoney(amount, options.currency, locale, 0) : formatNumber(amount, locale, 0);
  const ratio = (x: number): string => formatNumber(x, locale, 2);

  // Horizon: until the last saving of any measure done.
  let horizonYears = years;
  chosen.forEach((t, i) => {
    if (t >= 0) horizonYears = Math.max(horizonYears, t + measures[i]!.analysisYears);
  });
  const horizon: HorizonYear[] = [];
  let cumulative = 0;
  let cumulativeDiscounted = 0;
  for (let k = 1; k <= horizonYears; k++) {
    let cost = 0;
    let savings = 0;
    let discounted = 0;
    chosen.forEach((t, i) => {
      if (t < 0) return;
      const m = measures[i]!;
      const growth = 1 + m.discountRatePerYear;
      if (t === k - 1) {
        cost += m.cost;
        discounted -= m.cost / Math.pow(growth, k - 1);
      }
      if (k > t && k <= t + m.analysisYears) {
        const s = m.energySavingsPerYear * Math.pow(1 + m.escalationPerYear, k - 1) + m.maintenanceSavingsPerYear;
        savings += s;
        discounted += s / Math.pow(growth, k);
      }
    });
    const cashFlow = savings - cost;
    cumulative += cashFlow;
    cumulativeDiscounted += discounted;
    horizon.push({
      year: k,
      cost,
      savings,
      cashFlow,
      cumulativeCashFlow: cumulative,
      discountedCashFlow: discounted,
      cumulativeDiscountedCashFlow: cumulativeDiscounted,
    });
  }

  const phaseYears: PhaseYear[] = [];
  let savingsSoFar = 0;
  for (let t = 0; t < years; t++) {
    const ids: string[] = [];
    let spent = 0;
    let npv = 0;
    chosen.forEach((year, i) => {
      if (year !== t) return;
      const m = measures[i]!;
      ids.push(m.id);
      spent += weights[i]!;
      npv += values[i]![t]!;
      savingsSoFar += m.energySavingsPerYear + m.maintenanceSavingsPerYear;
    });
    const h = horizon[t]!;
    phaseYears.push({
      year: t + 1,
      measures: ids,
      cost: h.cost,
      budgetLeft: budget - spent,
      npv,
      savingsPerYear: savingsSoFar,
      savings: h.savings,
      cashFlow: h.cashFlow,
      cumulativeCashFlow: h.cumulativeCashFlow,
      discountedCashFlow: h.discountedCashFlow,
      cumulativeDiscountedCashFlow: h.cumulativeDiscountedCashFlow,
    });
  }

  // What each year's chosen measures are worth per unit of cost, for the reasons.
  const valueIn = new Array<number>(years).fill(0);
  const weightIn = new Array<number>(years).fill(0);
  chosen.forEach((t, i) => {
    if (t >= 0 && weights[i]! > 0) {
      valueIn[t] = valueIn[t]! + values[i]![t]!;
      weightIn[t] = weightIn[t]! + weights[i]!;
    }
  });
  const yearDensity = (ys: readonly number[]): number | null => {
    let v = 0;
    let w = 0;
    for (const t of ys) {
      v += valueIn[t]!;
      w += weightIn[t]!;
    }
    return w > 0 ? v / w : null;
  };
  const tolerance = 1e-9 * Math.max(1, budget);
  const deferred: DeferredMeasure[] = [];
  // No prototype: a measure id such as "__proto__" stays an ordinary key.
  const assignments = Object.create(null) as Record<string, number | null>;
  const planned: PlannedMeasure[] = [];
  measures.forEach((m, i) => {
    const t = chosen[i]!;
    const v = values[i]!;
    const w = weights[i]!;
    const ownDensity = w > 0 ? v[0]! / w : null;
    assignments[m.id] = t >= 0 ? t + 1 : null;
    planned.push({
      measureId: m.id,
      label: m.label,
      year: t >= 0 ? t + 1 : null,
      cost: m.cost,
      npvByYear: v,
      npv: t >= 0 ? v[t]! : 0,
      npvPerUnitCost: ownDensity,
    });
    if (t === 0) return;
    const add = (kind: DeferralKind, reason: string) =>
      deferred.push({ measureId: m.id, label: m.label, year: t >= 0 ? t + 1 : null, kind, reason });
    if (t > 0) {
      const earlier = Array.from({ length: t }, (_, s) => s);
      const roomy = earlier.filter((s) => w <= phaseYears[s]!.budgetLeft + tolerance && v[s]! > 0);
      if (roomy.length === 0) {
        const others = yearDensity(earlier);
        const mostLeft = Math.max(0, ...earlier.map((s) => phaseYears[s]!.budgetLeft));
        const budgetsOf = earlier.length === 1 ? `${yearList(earlier)}\u2019s budget` : `the budgets of ${yearList(earlier)}`;
        if (others !== null && ownDensity !== null && others >= ownDensity) {
          add(
            'waited-for-budget',
            `waited for year ${t + 1}: ${budgetsOf} went to measures with higher NPV per unit cost (${ratio(others)} vs ${ratio(ownDensity)})`,
          );
        } else {
          add(
            'waited-for-budget',
            `waited for year ${t + 1}: it did not fit beside the measures of ${yearList(earlier)} (at most ${money(mostLeft)} left, it costs ${money(m.cost)}), and that combination is worth more in total`,
          );
        }
      } else {
        const s = roomy.reduce((a, b) => (v[b]! > v[a]! ? b : a));
        if (v[t]! > v[s]! + 1e-9 * Math.max(1, Math.abs(v[s]!))) {
          add(
            'waited-worth-more',
            `waited for year ${t + 1}: it is worth more done then (NPV ${money(v[t]!)} vs ${money(v[s]!)} in year ${s + 1}), as energy prices rise faster than the discount rate`,
          );
        } else if (v[t]! >= v[s]! - 1e-9 * Math.max(1, Math.abs(v[s]!))) {
          add('waited-same-value', `waited for year ${t + 1}: doing it in year ${s + 1} is worth no more (NPV ${money(v[t]!)} either way)`);
        } else {
          add(
            'waited-for-budget',
            `waited for year ${t + 1}: year ${s + 1} still had room and would be worth more (NPV ${money(v[s]!)} vs ${money(v[t]!)}); the search stopped before finding that`,
          );
        }
      }
      return;
    }
    // Not done.
    if (m.energySavingsPerYear + m.maintenanceSavingsPerYear <= 0) {
      add('no-saving', 'not done: no saving (it does not lower the yearly bill)');
    } else if (!v.some((x) => x > 0)) {
      add('not-worth-it', `not done: costs more than it saves over ${m.analysisYears} years (NPV ${money(v[0]!)})`);
    } else if (w > budget + tolerance) {
      add('over-budget', `not done: costs ${money(m.cost)} and no year has that much budget (${money(budget)} a year)`);
    } else {
      const all = Array.from({ length: years }, (_, s) => s);
      const others = yearDensity(all);
      const mostLeft = Math.max(0, ...phaseYears.map((y) => y.budgetLeft));
      const budgetsOf = years === 1 ? 'the budget' : `the budgets of all ${years} years`;
      const compare =
        others !== null && ownDensity !== null && others >= ownDensity
          ? `measures with higher NPV per unit cost (${ratio(others)} vs ${ratio(ownDensity)})`
          : 'a combination of measures worth more in total';
      add('budget-spent', `not done: ${budgetsOf} went to ${compare}; at most ${money(mostLeft)} is left in a year, less than its cost of ${money(m.cost)}`);
    }
  });

  return {
    ...head,
    settings: { budgetPerYear: budget, years },
    years: phaseYears,
    horizon,
    assignments,
    deferred,
    measures: planned,
    conventions: [...planConventions],
  };
}
