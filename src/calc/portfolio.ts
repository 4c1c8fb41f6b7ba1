/**
 * Repeated layouts and portfolios: the figures a landlord decides on when one
 * surveyed unit stands for many, and when several buildings are planned
 * together.
 *
 * **Layouts.** {@link calculateLayout} takes the survey of one typical unit
 * (its `layout` says how many units share it and which differ) and gives the
 * totals for every unit. Everything that scales with fixtures — watts, kWh,
 * volt-amperes, kW, energy/demand/maintenance money, project cost with markup,
 * tax, disposal and rebates, CO2 — is linear in an entry's fixture count in
 * `calculateSurvey` (count × per-fixture figure; markup and tax are fractions
 * of linear parts; relamping is lamps × rate), so each entry's all-units
 * figures are its per-fixture figures × its fixtures across all units
 * ({@link fixturesAcrossUnits}). An entry counted 0 in the surveyed unit but
 * present in a differing unit has no per-fixture figures to scale, so it is
 * recalculated with one fixture. Ratios (payback) are recomputed from the
 * sums, never scaled. What belongs to one room (illuminance, power density,
 * circuit loads, warnings) stays per unit, on the survey's own result.
 *
 * **Portfolios.** {@link calculatePortfolio} sums the layouts of its surveys
 * site by site. Sites may differ in discount rate and study period, so the
 * roll-up net present value is the sum of each site's own NPV (present values
 * add: NIST Handbook 135, net savings of independent projects evaluated
 * separately), while simple payback and IRR come from the yearly cash flows
 * of all sites summed over the longest study period.
 */
import type { Portfolio, Survey } from '../survey/model.ts';
import { addCosts, zeroCost, type ProjectCost } from './costs.ts';
import { analyseInvestment, internalRateOfReturn, type InvestmentResult, type IrrResult } from './economics.ts';
import { kvaTotal } from './electrical.ts';
import type { EnergySavings } from './energy.ts';
import { CalcInputError, checkInteger } from './errors.ts';
import { fixturesAcrossUnits, unitsOf } from './layout.ts';
import {
  calculateSurvey,
  moneyFigures,
  type EntryResult,
  type LoadTotals,
  type MoneyFigures,
  type SideFigures,
  type SurveyResult,
  type SurveyTotals,
} from './survey.ts';
import type { Severity } from './warnings.ts';

/** Most units one layout may stand for (the file schema's limit). */
export const maxLayoutUnits = 10_000;

/** Totals of a survey across every unit of its layout. */
export interface LayoutResult {
  surveyId: string;
  /** Units the survey stands for (1 without a layout). */
  units: number;
  /** Units recorded as differing from the surveyed one. */
  differingUnits: number;
  /** Totals of the surveyed (typical) unit: the survey's own `totals`. */
  perUnit: SurveyTotals;
  /**
   * Totals of all units, as if every unit had been surveyed room by room:
   * `rooms` and `entries` are the surveyed unit's × units.
   */
  totals: SurveyTotals;
  /** Life-cycle economics on the all-units cash flows (same method as the survey's `economics`). */
  economics: InvestmentResult;
  /** Fixtures of each entry across all units, by entry id. */
  fixturesByEntry: Map<string, number>;
  /**
   * Each entry's figures across all units, by entry id: `count`, watts, kWh,
   * volt-amperes, amps, savings, money and CO2 scaled; per-fixture figures,
   * hours, power factor, lumen checks and warnings as in the surveyed unit.
   */
  entries: Map<string, EntryResult>;
  /** The survey's own (per-unit) result, for room-level figures, circuits and warnings. */
  unitResult: SurveyResult;
}

/** One site (survey) of a portfolio, in the units the comparison shows. */
export interface SiteSummary {
  surveyId: string;
  name: string;
  units: number;
  differingUnits: number;
  fixtures: number;
  existingKw: number;
  proposedKw: number;
  existingKwhPerYear: number;
  proposedKwhPerYear: number;
  /** kWh saved a year including HVAC interaction. */
  kwhSavedPerYear: number;
  /** Connected load removed. */
  kwSaved: number;
  /** Coincident peak demand removed. */
  peakKwSaved: number;
  /** Energy + demand + maintenance savings in year 1. */
  firstYearSavings: number;
  /** Project cost net of rebates. */
  netCost: number;
  simplePaybackYears: number | null;
  /** At the site's own discount rate and study period. */
  netPresentValue: number;
  internalRateOfReturn: IrrResult;
  discountRatePerYear: number;
  analysisYears: number;
  co2AvoidedKgPerYear: number;
  /** Warnings of the surveyed unit (a warning is about the fixture type, not multiplied by units). */
  warningCounts: Record<Severity, number>;
  /** Full layout figures, for screens and exports that need more. */
  layout: LayoutResult;
}

/** Roll-up economics of a portfolio. */
export interface PortfolioEconomics {
  /** Σ net cost of the sites (year-0 outlay). */
  netInvestment: number;
  firstYearSavings: number;
  /** Σ site NPVs, each at its own discount rate and period (NIST Handbook 135: present values add). */
  netPresentValue: number;
  /** Σ site present values of savings. */
  presentValueOfSavings: number;
  /** Σ PV(savings) / Σ net investment; null when the investment is ≤ 0. */
  savingsToInvestmentRatio: number | null;
  /** Σ net cost / Σ first-year savings; 0 when nothing to repay, null when savings are not positive. */
  simplePaybackYears: number | null;
  /** IRR of {@link cashFlows}. */
  internalRateOfReturn: IrrResult;
  /** Σ of the sites' yearly net cash flows, years 0..{@link analysisYears} (a site adds nothing after its own period). */
  cashFlows: number[];
  /** Longest study period among the sites (0 for an empty portfolio). */
  analysisYears: number;
  /** Each distinct discount rate used by the sites, ascending. */
  discountRatesPerYear: number[];
}

export interface PortfolioResult {
  portfolioId: string;
  name: string;
  /** The one currency of every site; null for an empty portfolio. */
  currency: string | null;
  sites: SiteSummary[];
  /** Σ of the sites' all-units totals. */
  totals: SurveyTotals;
  units: number;
  warningCounts: Record<Severity, number>;
  economics: PortfolioEconomics;
}

// ---------------------------------------------------------------------------
// scaling and summing

function scaleSide(s: SideFigures, k: number): SideFigures {
  return { ...s, watts: s.watts * k, kwhPerYear: s.kwhPerYear * k, voltAmperes: s.voltAmperes * k, amps: s.amps * k };
}

function scaleSavings(s: EnergySavings, k: number): EnergySavings {
  return {
    lightingKwhPerYear: s.lightingKwhPerYear * k,
    kwhPerYear: s.kwhPerYear * k,
    connectedKw: s.connectedKw * k,
    peakKw: s.peakKw * k,
    gasThermsPerYear: s.gasThermsPerYear * k,
  };
}

function scaleCost(c: ProjectCost, k: number): ProjectCost {
  return {
    materials: c.materials * k,
    labour: c.labour * k,
    disposal: c.disposal * k,
    markup: c.markup * k,
    tax: c.tax * k,
    gross: c.gross * k,
    rebates: c.rebates * k,
    net: c.net * k,
  };
}

/** An entry result for `fixtures` fixtures, from one computed for `count` fixtures (count > 0). */
function scaleEntry(r: EntryResult, fixtures: number): EntryResult {
  if (r.count === fixtures) return r;
  const k = fixtures / r.count;
  const m = r.money;
  return {
    ...r,
    count: fixtures,
    existing: scaleSide(r.existing, k),
    proposed: scaleSide(r.proposed, k),
    savings: scaleSavings(r.savings, k),
    money: moneyFigures(m.energyPerYear * k, m.demandPerYear * k, m.maintenancePerYear * k, scaleCost(m.cost, k)),
    co2KgPerYear: r.co2KgPerYear * k,
  };
}

/** The parts of totals that are sums (everything but the ratios). */
interface Sums {
  existing: LoadTotals;
  proposed: LoadTotals;
  savings: EnergySavings;
  energy: number;
  demand: number;
  maintenance: number;
  cost: ProjectCost;
  co2: number;
  fixtures: number;
  entries: number;
  rooms: number;
}

function emptySums(): Sums {
  return {
    existing: { watts: 0, kwhPerYear: 0, voltAmperes: 0 },
    proposed: { watts: 0, kwhPerYear: 0, voltAmperes: 0 },
    savings: { lightingKwhPerYear: 0, kwhPerYear: 0, connectedKw: 0, peakKw: 0, gasThermsPerYear: 0 },
    energy: 0,
    demand: 0,
    maintenance: 0,
    cost: zeroCost,
    co2: 0,
    fixtures: 0,
    entries: 0,
    rooms: 0,
  };
}

function addLoads(a: LoadTotals, b: LoadTotals): LoadTotals {
  return { watts: a.watts + b.watts, kwhPerYear: a.kwhPerYear + b.kwhPerYear, voltAmperes: a.voltAmperes + b.voltAmperes };
}

function addSavings(a: EnergySavings, b: EnergySavings): EnergySavings {
  return {
    lightingKwhPerYear: a.lightingKwhPerYear + b.lightingKwhPerYear,
    kwhPerYear: a.kwhPerYear + b.kwhPerYear,
    connectedKw: a.connectedKw + b.connectedKw,
    peakKw: a.peakKw + b.peakKw,
    gasThermsPerYear: a.gasThermsPerYear + b.gasThermsPerYear,
  };
}

function addInto(s: Sums, part: { existing: LoadTotals; proposed: LoadTotals; savings: EnergySavings; money: MoneyFigures; co2KgPerYear: number }): void {
  s.existing = addLoads(s.existing, part.existing);
  s.proposed = addLoads(s.proposed, part.proposed);
  s.savings = addSavings(s.savings, part.savings);
  s.energy += part.money.energyPerYear;
  s.demand += part.money.demandPerYear;
  s.maintenance += part.money.maintenancePerYear;
  s.cost = addCosts(s.cost, part.money.cost);
  s.co2 += part.co2KgPerYear;
}

function totalsOf(s: Sums): SurveyTotals {
  return {
    existing: { ...s.existing, kva: kvaTotal(Math.max(0, s.existing.voltAmperes)) },
    proposed: { ...s.proposed, kva: kvaTotal(Math.max(0, s.proposed.voltAmperes)) },
    savings: s.savings,
    money: moneyFigures(s.energy, s.demand, s.maintenance, s.cost),
    co2KgPerYear: s.co2,
    fixtures: s.fixtures,
    entries: s.entries,
    rooms: s.rooms,
  };
}

/** Prefixes a calculation error's field (`surveyIds[2].rooms[0]…`). */
function prefixed(prefix: string, err: unknown): unknown {
  return err instanceof CalcInputError ? new CalcInputError(`${prefix}.${err.field}`, err.problem) : err;
}

// ---------------------------------------------------------------------------
// layouts

/**
 * Totals of a survey across every unit of its layout (see the module
 * comment for what scales and what stays per unit). Without a layout the
 * totals equal the survey's own. Pass the survey's current `result` to save
 * recalculating it (it must be the result of this very survey).
 *
 * Throws a {@link CalcInputError} naming the field for a bad layout
 * (`layout.unitCount`, `layout.exceptions[1].entryCounts[0].entryId`, more
 * differing units than units) and for any error of the survey itself.
 *
 * @example
 * // The demo survey (40 fixtures) as one of 24 identical flats:
 * calculateLayout({ ...demoSurvey(), layout: { unitCount: 24, exceptions: [] } }).totals.fixtures //=> 960
 */
export function calculateLayout(survey: Survey, result?: SurveyResult): LayoutResult {
  if (survey.layout) checkInteger('layout.unitCount', survey.layout.unitCount, 1, maxLayoutUnits);
  const fixtures = fixturesAcrossUnits(survey);
  const units = unitsOf(survey);
  if (result !== undefined && result.surveyId !== survey.id) {
    throw new RangeError(`the result given is for survey "${result.surveyId}", not "${survey.id}"`);
  }
  const unitResult = result ?? calculateSurvey(survey);

  // Entries counted 0 here but fitted in a differing unit: figures for one fixture.
  const needOne = new Set<string>();
  for (const room of survey.rooms) {
    for (const entry of room.entries) if (entry.count === 0 && (fixtures.get(entry.id) ?? 0) > 0) needOne.add(entry.id);
  }
  let oneFixture: Map<string, EntryResult> | null = null;
  if (needOne.size > 0) {
    // Only those entries, in their own rooms: an entry's figures depend on its room and the survey, not on other entries.
    const withOne: Survey = {
      ...survey,
      rooms: survey.rooms.flatMap((room) => {
        const entries = room.entries.filter((entry) => needOne.has(entry.id)).map((entry) => ({ ...entry, count: 1 }));
        return entries.length > 0 ? [{ ...room, entries }] : [];
      }),
    };
    oneFixture = new Map();
    for (const room of calculateSurvey(withOne).rooms) for (const r of room.entries) if (needOne.has(r.entryId)) oneFixture.set(r.entryId, r);
  }

  const sums = emptySums();
  const entries = new Map<string, EntryResult>();
  for (const room of unitResult.rooms) {
    for (const r of room.entries) {
      const n = fixtures.get(r.entryId) ?? 0;
      const base = r.count > 0 ? r : (oneFixture?.get(r.entryId) ?? r);
      const scaled = base.count > 0 ? scaleEntry(base, n) : base;
      entries.set(r.entryId, scaled);
      addInto(sums, scaled);
      sums.fixtures += n;
    }
  }
  sums.entries = unitResult.totals.entries * units;
  sums.rooms = unitResult.totals.rooms * units;
  const totals = survey.layout ? totalsOf(sums) : unitResult.totals;

  const m = survey.money;
  const economics = survey.layout
    ? analyseInvestment({
        netInvestment: totals.money.cost.net,
        energySavingsFirstYear: totals.money.energyPerYear,
        demandSavingsFirstYear: totals.money.demandPerYear,
        maintenanceSavingsPerYear: totals.money.maintenancePerYear,
        energyEscalationPerYear: m.energyEscalationPerYear,
        discountRatePerYear: m.discountRatePerYear,
        analysisYears: m.analysisYears,
      })
    : unitResult.economics;

  return {
    surveyId: survey.id,
    units,
    differingUnits: survey.layout?.exceptions.length ?? 0,
    perUnit: unitResult.totals,
    totals,
    economics,
    fixturesByEntry: fixtures,
    entries,
    unitResult,
  };
}

// ---------------------------------------------------------------------------
// portfolios

function siteSummary(survey: Survey, layout: LayoutResult): SiteSummary {
  const t = layout.totals;
  return {
    surveyId: survey.id,
    name: survey.name,
    units: layout.units,
    differingUnits: layout.differingUnits,
    fixtures: t.fixtures,
    existingKw: t.existing.watts / 1000,
    proposedKw: t.proposed.watts / 1000,
    existingKwhPerYear: t.existing.kwhPerYear,
    proposedKwhPerYear: t.proposed.kwhPerYear,
    kwhSavedPerYear: t.savings.kwhPerYear,
    kwSaved: t.savings.connectedKw,
    peakKwSaved: t.savings.peakKw,
    firstYearSavings: t.money.totalPerYear,
    netCost: t.money.cost.net,
    simplePaybackYears: t.money.simplePaybackYears,
    netPresentValue: layout.economics.netPresentValue,
    internalRateOfReturn: layout.economics.internalRateOfReturn,
    discountRatePerYear: survey.money.discountRatePerYear,
    analysisYears: survey.money.analysisYears,
    co2AvoidedKgPerYear: t.co2KgPerYear,
    warningCounts: { ...layout.unitResult.warningCounts },
    layout,
  };
}

/**
 * Rolls a portfolio up over its surveys (given in any order; `surveys` may
 * hold others too): each site's all-units figures ({@link calculateLayout}),
 * their sum, and the roll-up economics (see the module comment).
 *
 * Throws a {@link CalcInputError} with field `surveyIds[i]` when a survey is
 * missing or uses another currency than the first site, and
 * `surveyIds[i].<field>` for an error inside that survey. An empty portfolio
 * gives zero totals, a null currency and a null payback.
 *
 * @example
 * calculatePortfolio({ ...portfolio, surveyIds: ['a', 'b'] }, [surveyA, surveyB]).totals.savings.kwhPerYear
 * //=> calculateLayout(surveyA).totals.savings.kwhPerYear + calculateLayout(surveyB).totals.savings.kwhPerYear
 */
export function calculatePortfolio(portfolio: Portfolio, surveys: readonly Survey[]): PortfolioResult {
  const byId = new Map<string, Survey>();
  for (const s of surveys) if (!byId.has(s.id)) byId.set(s.id, s);
  let currency: string | null = null;
  const seen = new Set<string>();
  const sites: SiteSummary[] = [];
  portfolio.surveyIds.forEach((id, i) => {
    const field = `surveyIds[${i}]`;
    if (seen.has(id)) throw new CalcInputError(field, `lists survey "${id}" a second time`);
    seen.add(id);
    const survey = byId.get(id);
    if (!survey) throw new CalcInputError(field, `names a survey that is not there ("${id}")`);
    if (currency === null) currency = survey.money.currency;
    else if (survey.money.currency !== currency) {
      throw new CalcInputError(
        field,
        `survey "${survey.name}" is in ${survey.money.currency} but surveyIds[0] is in ${currency}; a portfolio needs one currency`,
      );
    }
    let layout: LayoutResult;
    try {
      layout = calculateLayout(survey);
    } catch (err) {
      throw prefixed(field, err);
    }
    sites.push(siteSummary(survey, layout));
  });

  const sums = emptySums();
  const warningCounts: Record<Severity, number> = { danger: 0, caution: 0, advice: 0 };
  let units = 0;
  let npv = 0;
  let pvSavings = 0;
  let years = 0;
  for (const site of sites) {
    const t = site.layout.totals;
    addInto(sums, t);
    sums.fixtures += t.fixtures;
    sums.entries += t.entries;
    sums.rooms += t.rooms;
    units += site.units;
    npv += site.layout.economics.netPresentValue;
    pvSavings += site.layout.economics.presentValueOfSavings;
    years = Math.max(years, site.analysisYears);
    for (const k of ['danger', 'caution', 'advice'] as const) warningCounts[k] += site.warningCounts[k];
  }
  const totals = totalsOf(sums);
  // Nothing to pay back in an empty portfolio is no payback at all, not "paid back at once".
  if (sites.length === 0) totals.money.simplePaybackYears = null;

  // Yearly net cash flows summed over the longest period: a site adds nothing after its own.
  const cashFlows = new Array<number>(years + 1).fill(0);
  for (const site of sites) for (const row of site.layout.economics.cashFlows) cashFlows[row.year]! += row.netCashFlow;

  const netInvestment = totals.money.cost.net;
  const ratio = netInvestment > 0 ? pvSavings / netInvestment : null;
  return {
    portfolioId: portfolio.id,
    name: portfolio.name,
    currency,
    sites,
    totals,
    units,
    warningCounts,
    economics: {
      netInvestment,
      firstYearSavings: totals.money.totalPerYear,
      netPresentValue: npv,
      presentValueOfSavings: pvSavings,
      savingsToInvestmentRatio: ratio !== null && Number.isFinite(ratio) ? ratio : null,
      simplePaybackYears: totals.money.simplePaybackYears,
      internalRateOfReturn: internalRateOfReturn(cashFlows),
      cashFlows,
      analysisYears: years,
      discountRatesPerYear: [...new Set(sites.map((s) => s.discountRatePerYear))].sort((a, b) => a - b),
    },
  };
}
