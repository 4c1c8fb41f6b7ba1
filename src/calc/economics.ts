/**
 * Life-cycle economics of a retrofit, in real (constant-money) terms, after
 * NIST Handbook 135 (Life-Cycle Costing Manual for the Federal Energy
 * Management Program) and the definitions in 10 CFR 436 Subpart A:
 *
 * - single present value   PV   = F / (1 + d)^t
 * - uniform present value  UPV  = [(1 + d)^n − 1] / [d (1 + d)^n]          (d = 0: n)
 * - escalated UPV          UPV* = Σ_{t=1..n} ((1 + e) / (1 + d))^t
 *                               = (1 + e)/(d − e) · [1 − ((1 + e)/(1 + d))^n]   (d = e: n)
 * - net savings            NS   = PV(savings) − PV(investment)
 * - savings-to-investment  SIR  = PV(savings) / PV(investment)
 * - adjusted IRR           AIRR = (1 + d) · SIR^(1/n) − 1
 *
 * Cash flows are yearly and end-of-year: index 0 is "now" (not discounted),
 * index t is discounted by (1 + d)^t, as in numpy-financial's `npv`.
 *
 * Every function validates its inputs (a {@link CalcInputError} names the
 * field) and never returns NaN or ±Infinity: results that have no meaning
 * (a ratio over a zero investment, a payback that never comes) are `null`,
 * and the internal rate of return is a tagged union that says when there is
 * no rate or more than one.
 */
import { CalcInputError, checkInteger, checkRange } from './errors.ts';

/** Largest money amount accepted anywhere in this module (any currency). */
export const maxMoneyAmount = 1e12;
/** Lowest discount rate (per year) the general-purpose functions accept; also the bottom of the IRR search. */
export const minRatePerYear = -0.99;
/** Highest discount rate (per year) the general-purpose functions accept; also the top of the IRR search. */
export const maxRatePerYear = 10;
/** Longest horizon, in years, for the general-purpose factor and cash-flow functions. */
export const maxYears = 100;

// ---------------------------------------------------------------------------
// validation helpers

function checkMoney(field: string, value: number): number {
  return checkRange(field, value, -maxMoneyAmount, maxMoneyAmount);
}

function checkRate(field: string, value: number): number {
  return checkRange(field, value, minRatePerYear, maxRatePerYear);
}

function checkCashFlows(cashFlows: readonly number[]): readonly number[] {
  if (!Array.isArray(cashFlows)) {
    throw new CalcInputError('cashFlows', 'must be a list of yearly amounts');
  }
  if (cashFlows.length < 1 || cashFlows.length > maxYears + 1) {
    throw new CalcInputError('cashFlows', `must hold between 1 and ${maxYears + 1} yearly amounts (got ${cashFlows.length})`);
  }
  cashFlows.forEach((amount, year) => checkMoney(`cashFlows[${year}]`, amount));
  return cashFlows;
}

/** `value` when it is a finite number, otherwise `null` (guards ratios over tiny denominators). */
function finiteOrNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

// ---------------------------------------------------------------------------
// discount factors

/**
 * Present value of one amount received `years` from now (NIST Handbook 135
 * single present value, PV = F / (1 + d)^t). `years` may be fractional.
 *
 * @example presentValue(1000, 0.03, 10) //=> 744.09…
 */
export function presentValue(futureAmount: number, discountRatePerYear: number, years: number): number {
  checkMoney('futureAmount', futureAmount);
  checkRate('discountRatePerYear', discountRatePerYear);
  checkRange('years', years, 0, maxYears);
  return futureAmount * Math.exp(-years * Math.log1p(discountRatePerYear));
}

/**
 * Uniform present value factor: what 1 per year, paid at the end of each of
 * `years` years, is worth now (NIST Handbook 135 UPV,
 * [(1 + d)^n − 1] / [d (1 + d)^n]; equal to n when d = 0). Evaluated as
 * (1 − (1 + d)^−n) / d with `expm1`/`log1p` so it stays accurate for rates
 * near zero.
 *
 * @example uniformPresentValueFactor(0.03, 20) //=> 14.877…
 */
export function uniformPresentValueFactor(discountRatePerYear: number, years: number): number {
  checkRate('discountRatePerYear', discountRatePerYear);
  checkInteger('years', years, 0, maxYears);
  return upvUnchecked(discountRatePerYear, years);
}

function upvUnchecked(d: number, n: number): number {
  if (d === 0) return n;
  return -Math.expm1(-n * Math.log1p(d)) / d;
}

/**
 * Uniform present value factor for an amount that escalates at `e` per year
 * (NIST Handbook 135 UPV*): Σ_{t=1..n} ((1 + e)/(1 + d))^t, i.e. a base-year
 * amount A0 paid as A0·(1 + e)^t at the end of year t. Closed form
 * (1 + e)/(d − e) · [1 − ((1 + e)/(1 + d))^n], written with `expm1` of the
 * log-ratio so it is exact in the limit d = e, where it equals n.
 *
 * Note: an amount already expressed in year-1 money (A1 = A0·(1 + e)) has
 * present value A1 · UPV* / (1 + e).
 *
 * @example escalatedUniformPresentValueFactor(0.03, 0.01, 10) //=> 8.9918…
 */
export function escalatedUniformPresentValueFactor(
  discountRatePerYear: number,
  escalationPerYear: number,
  years: number,
): number {
  checkRate('discountRatePerYear', discountRatePerYear);
  checkRate('escalationPerYear', escalationPerYear);
  checkInteger('years', years, 0, maxYears);
  const logRatio = Math.log1p(escalationPerYear) - Math.log1p(discountRatePerYear);
  if (logRatio === 0) return years;
  const ratio = Math.exp(logRatio);
  return (ratio * Math.expm1(years * logRatio)) / Math.expm1(logRatio);
}

// ---------------------------------------------------------------------------
// net present value

/** Σ c_t / (1 + r)^t by Horner's rule in v = 1/(1 + r). Inputs already validated. */
function npvUnchecked(rate: number, cashFlows: readonly number[]): number {
  const v = 1 / (1 + rate);
  let sum = 0;
  for (let t = cashFlows.length - 1; t >= 0; t--) sum = sum * v + (cashFlows[t] ?? 0);
  return sum;
}

/**
 * Net present value of yearly cash flows, first one now: Σ c_t / (1 + r)^t
 * for t = 0..n (the numpy-financial `npv` convention; a spreadsheet NPV
 * discounts its first value by one year instead).
 *
 * @example netPresentValue(0.08, [-40000, 5000, 8000, 12000, 30000]) //=> 3065.2226…
 */
export function netPresentValue(discountRatePerYear: number, cashFlows: readonly number[]): number {
  checkRate('discountRatePerYear', discountRatePerYear);
  checkCashFlows(cashFlows);
  return npvUnchecked(discountRatePerYear, cashFlows);
}

// ---------------------------------------------------------------------------
// internal rate of return

/**
 * Outcome of the IRR search: one rate, several (all of them, ascending, with
 * a plain-words note), or none (with the reason).
 */
export type IrrResult =
  | { kind: 'unique'; ratePerYear: number }
  | { kind: 'multiple'; ratesPerYear: number[]; note: string }
  | { kind: 'none'; reason: string };

/** Intervals in the IRR scan grid (the grid has one more point). */
const irrGridIntervals = 320;
/** Bracket width at which root refinement stops. */
const irrTolerance = 1e-10;

/**
 * Scan rates, geometrically spaced in (1 + r) from 0.01 to 11, i.e. r from
 * −99 % to +1000 % per year. Neighbouring points differ by about 2.2 % in
 * (1 + r); two roots closer than that can share a cell without a sign change
 * between grid points, and are found by {@link probeLocalMinimum} instead.
 */
const irrGridRates: readonly number[] = (() => {
  const lowGrowth = 1 + minRatePerYear;
  const logSpan = Math.log((1 + maxRatePerYear) / lowGrowth);
  const rates: number[] = [];
  for (let k = 0; k <= irrGridIntervals; k++) {
    rates.push(k === irrGridIntervals ? maxRatePerYear : lowGrowth * Math.exp((logSpan * k) / irrGridIntervals) - 1);
  }
  return rates;
})();

/** Sign changes between consecutive non-zero cash flows (Descartes' rule of signs bound). */
function signChanges(cashFlows: readonly number[]): number {
  let changes = 0;
  let previous = 0;
  for (const amount of cashFlows) {
    if (amount === 0) continue;
    const sign = Math.sign(amount);
    if (previous !== 0 && sign !== previous) changes++;
    previous = sign;
  }
  return changes;
}

/**
 * Brent's method (inverse quadratic interpolation and secant steps, falling
 * back to bisection; after Numerical Recipes `zbrent`) on [low, high], where
 * NPV has opposite, non-zero signs at the two ends. Stops when the bracket is
 * narrower than {@link irrTolerance}.
 */
function refineRoot(cashFlows: readonly number[], low: number, high: number, npvLow: number, npvHigh: number): number {
  let a = low;
  let b = high;
  let c = high;
  let fa = npvLow;
  let fb = npvHigh;
  let fc = fb;
  let d = b - a;
  let e = d;
  for (let iteration = 0; iteration < 200; iteration++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tolerance = 2 * Number.EPSILON * Math.abs(b) + 0.5 * irrTolerance;
    const halfWidth = 0.5 * (c - b);
    if (Math.abs(halfWidth) <= tolerance || fb === 0) return b;
    if (Math.abs(e) >= tolerance && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * halfWidth * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * halfWidth * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      p = Math.abs(p);
      if (2 * p < Math.min(3 * halfWidth * q - Math.abs(tolerance * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = halfWidth;
        e = d;
      }
    } else {
      d = halfWidth;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tolerance ? d : halfWidth >= 0 ? tolerance : -tolerance;
    fb = npvUnchecked(b, cashFlows);
  }
  return b;
}

/** Σ |c_t| / (1 + r)^t: the size NPV is measured against when asking "is it zero?". */
function npvScale(rate: number, cashFlows: readonly number[]): number {
  const v = 1 / (1 + rate);
  let sum = 0;
  for (let t = cashFlows.length - 1; t >= 0; t--) sum = sum * v + Math.abs(cashFlows[t] ?? 0);
  return sum;
}

/**
 * Looks inside [low, high] (a grid cell pair where NPV keeps one sign `sign`
 * but |NPV| has a local minimum) for a pair of close roots or a double root:
 * golden-section search for the minimum of sign·NPV; if it dips below zero
 * both halves are refined, if it only touches zero the touching point is a
 * (double) root.
 */
function probeLocalMinimum(cashFlows: readonly number[], low: number, high: number, sign: number): number[] {
  const invPhi = (Math.sqrt(5) - 1) / 2;
  const g = (r: number): number => sign * npvUnchecked(r, cashFlows);
  let a = low;
  let b = high;
  let c = b - invPhi * (b - a);
  let d = a + invPhi * (b - a);
  let gc = g(c);
  let gd = g(d);
  for (let i = 0; i < 80 && b - a > irrTolerance; i++) {
    if (gc < 0 || gd < 0) {
      const dip = gc < 0 ? c : d;
      const npvLow = npvUnchecked(low, cashFlows);
      const npvDip = npvUnchecked(dip, cashFlows);
      const npvHigh = npvUnchecked(high, cashFlows);
      return [refineRoot(cashFlows, low, dip, npvLow, npvDip), refineRoot(cashFlows, dip, high, npvDip, npvHigh)];
    }
    if (gc < gd) {
      b = d;
      d = c;
      gd = gc;
      c = b - invPhi * (b - a);
      gc = g(c);
    } else {
      a = c;
      c = d;
      gc = gd;
      d = a + invPhi * (b - a);
      gd = g(d);
    }
  }
  const best = gc < gd ? c : d;
  const bestValue = Math.min(gc, gd);
  if (bestValue === 0 || bestValue <= 1e-12 * npvScale(best, cashFlows)) return [best];
  return [];
}

function formatPercent(ratePerYear: number): string {
  const text = (ratePerYear * 100).toFixed(2);
  return `${text === '-0.00' ? '0.00' : text} %`;
}

/** IRR of already-validated cash flows. */
function irrUnchecked(cashFlows: readonly number[]): IrrResult {
  const changes = signChanges(cashFlows);
  if (cashFlows.every((amount) => amount === 0)) {
    return { kind: 'none', reason: 'every cash flow is zero, so no rate of return is defined' };
  }
  if (changes === 0) {
    return {
      kind: 'none',
      reason: 'all non-zero cash flows have the same sign (nothing invested, or nothing ever returned), so NPV is never zero',
    };
  }

  const low = minRatePerYear;
  const high = maxRatePerYear;

  if (changes === 1) {
    // Descartes: exactly one root in (−100 %, ∞), a simple one, so NPV changes
    // sign there and Brent's method over the whole search range finds it.
    const fLow = npvUnchecked(low, cashFlows);
    const fHigh = npvUnchecked(high, cashFlows);
    if (fLow === 0) return { kind: 'unique', ratePerYear: low };
    if (fHigh === 0) return { kind: 'unique', ratePerYear: high };
    if (Math.sign(fLow) !== Math.sign(fHigh)) {
      return { kind: 'unique', ratePerYear: refineRoot(cashFlows, low, high, fLow, fHigh) };
    }
    // Same sign at both ends: the one root is outside the range. As r → ∞ NPV
    // tends to the first non-zero flow, so compare the top end with that.
    const firstNonZero = cashFlows.find((amount) => amount !== 0) ?? 0;
    const rootIsBelow = Math.sign(fHigh) === Math.sign(firstNonZero);
    return {
      kind: 'none',
      reason: rootIsBelow
        ? `the only rate at which NPV is zero is below ${formatPercent(low)} per year: the returns never come close to recovering the outlay`
        : `the only rate at which NPV is zero is above ${formatPercent(high)} per year: the outlay is repaid almost at once`,
    };
  }

  // Two or more sign changes: scan the grid for sign changes and for places
  // where NPV comes close to zero without crossing it.
  const values = irrGridRates.map((rate) => npvUnchecked(rate, cashFlows));
  const roots: number[] = [];
  for (let i = 0; i < irrGridRates.length; i++) {
    const rate = irrGridRates[i] ?? 0;
    const value = values[i] ?? 0;
    if (value === 0) {
      roots.push(rate);
      continue;
    }
    if (i > 0) {
      const previousValue = values[i - 1] ?? 0;
      if (previousValue !== 0 && Math.sign(previousValue) !== Math.sign(value)) {
        roots.push(refineRoot(cashFlows, irrGridRates[i - 1] ?? low, rate, previousValue, value));
      }
    }
    if (i > 0 && i < irrGridRates.length - 1) {
      const before = values[i - 1] ?? 0;
      const after = values[i + 1] ?? 0;
      const sign = Math.sign(value);
      if (Math.sign(before) === sign && Math.sign(after) === sign && sign * value <= sign * before && sign * value <= sign * after) {
        roots.push(...probeLocalMinimum(cashFlows, irrGridRates[i - 1] ?? low, irrGridRates[i + 1] ?? high, sign));
      }
    }
  }
  roots.sort((a, b) => a - b);
  const distinct: number[] = [];
  for (const root of roots) {
    const last = distinct[distinct.length - 1];
    if (last === undefined || root - last > 1e-8) distinct.push(root);
  }

  const [only] = distinct;
  if (only === undefined) {
    return {
      kind: 'none',
      reason: `the cash flows change sign ${changes} times, but NPV is not zero anywhere between ${formatPercent(low)} and ${formatPercent(high)} per year`,
    };
  }
  if (distinct.length === 1) return { kind: 'unique', ratePerYear: only };
  return {
    kind: 'multiple',
    ratesPerYear: distinct,
    note:
      `NPV is zero at ${distinct.length} rates (${distinct.map(formatPercent).join(', ')}). ` +
      `The cash flows change sign ${changes} times, so by Descartes' rule of signs up to ${changes} such rates can exist ` +
      'and none of them is "the" rate of return. Judge this project by NPV or AIRR instead.',
  };
}

/**
 * Internal rate of return: the rate r at which Σ c_t / (1 + r)^t = 0, with
 * c_0 now (numpy-financial convention), searched between −99 % and +1000 %
 * per year.
 *
 * Method. NPV is a polynomial in v = 1/(1 + r), so by Descartes' rule of
 * signs the number of rates (r > −100 %) is at most the number of sign
 * changes in the cash flows, and differs from it by an even number.
 * - No sign change: no rate exists (`none`).
 * - One sign change (the usual "pay, then save" project): exactly one rate;
 *   it is bracketed by the ends of the search range and found by Brent's
 *   method to 1e-10. If both ends have the same sign it lies outside the range
 *   (`none`, saying on which side).
 * - Several sign changes: NPV is evaluated on a 321-point grid, geometric in
 *   (1 + r); every sign change is refined by Brent's method to 1e-10, and every
 *   local minimum of |NPV| that does not cross zero is probed by a
 *   golden-section search, which splits close root pairs and catches double
 *   roots. More than one rate is reported as `multiple` with all of them;
 *   none is picked silently.
 * A negative rate is a valid `unique` answer: the savings recover less than
 * the outlay even before discounting.
 *
 * @example internalRateOfReturn([-100, 39, 59, 55, 20]) //=> { kind: 'unique', ratePerYear: 0.28094… }
 */
export function internalRateOfReturn(cashFlows: readonly number[]): IrrResult {
  checkCashFlows(cashFlows);
  return irrUnchecked(cashFlows);
}

// ---------------------------------------------------------------------------
// payback

/**
 * Years for the first-year savings to repay the net investment, without
 * discounting (net investment / first-year savings). `0` when there is
 * nothing to repay (net investment ≤ 0, e.g. rebates cover the cost); `null`
 * when the savings are not positive or the payback is too large to be a
 * finite number.
 *
 * @example simplePaybackYears(1200, 400) //=> 3
 */
export function simplePaybackYears(netInvestment: number, firstYearSavings: number): number | null {
  checkMoney('netInvestment', netInvestment);
  checkMoney('firstYearSavings', firstYearSavings);
  return simplePaybackUnchecked(netInvestment, firstYearSavings);
}

function simplePaybackUnchecked(netInvestment: number, firstYearSavings: number): number | null {
  if (netInvestment <= 0) return 0;
  if (firstYearSavings <= 0) return null;
  return finiteOrNull(netInvestment / firstYearSavings);
}

// ---------------------------------------------------------------------------
// whole-investment analysis

export interface InvestmentInputs {
  /** Year-0 project cost net of rebates (may be 0 or negative when rebates exceed cost). */
  netInvestment: number;
  /** Energy cost savings in year 1 (money); escalates at `energyEscalationPerYear` from year 2. */
  energySavingsFirstYear: number;
  /** Demand-charge savings in year 1 (money); escalates like energy. */
  demandSavingsFirstYear: number;
  /** Maintenance savings per year (money), constant in real terms. */
  maintenanceSavingsPerYear: number;
  /** Real differential escalation of energy prices, −0.5..0.5. */
  energyEscalationPerYear: number;
  /** Real discount rate, 0..0.5. */
  discountRatePerYear: number;
  /** Study period in whole years, 1..40. */
  analysisYears: number;
}

export interface CashFlowYear {
  year: number;
  /** Savings in this year (0 in year 0). */
  savings: number;
  /** Savings minus investment in this year (year 0: −net investment). */
  netCashFlow: number;
  /** Running sum of `netCashFlow`. */
  cumulative: number;
  /** `netCashFlow` / (1 + d)^year. */
  discountedNetCashFlow: number;
  /** Running sum of `discountedNetCashFlow`; in the last year it equals the NPV. */
  cumulativeDiscounted: number;
}

export interface InvestmentResult {
  firstYearSavings: number;
  /** Undiscounted sum of savings over the study period. */
  lifetimeSavings: number;
  presentValueOfSavings: number;
  /** NIST "net savings": NS = PV(savings) − PV(investment). */
  netPresentValue: number;
  /** PV(savings) / net investment; `null` when the net investment is ≤ 0. */
  savingsToInvestmentRatio: number | null;
  /** AIRR = (1 + d)·SIR^(1/n) − 1; `null` when SIR is `null` or ≤ 0. */
  adjustedInternalRateOfReturn: number | null;
  internalRateOfReturn: IrrResult;
  simplePaybackYears: number | null;
  /** First point where cumulative PV of savings reaches the investment, linear inside the year; `null` if not within the period. */
  discountedPaybackYears: number | null;
  /** (lifetime savings − net investment) / net investment; `null` when the net investment is ≤ 0. */
  returnOnInvestment: number | null;
  /** Years 0..n, for charts. */
  cashFlows: CashFlowYear[];
}

/**
 * Full life-cycle economics of one investment, in real terms (NIST Handbook
 * 135 measures: net savings, SIR, AIRR, plus IRR, simple and discounted
 * payback, ROI and the yearly cash-flow table).
 *
 * Year t (1..n) saves (energy + demand)·(1 + e)^(t−1) + maintenance, at the
 * end of the year; the net investment is paid at t = 0. The present value of
 * savings therefore equals
 * (energy + demand)·UPV*(d, e, n)/(1 + e) + maintenance·UPV(d, n).
 *
 * @example
 * analyseInvestment({ netInvestment: 1000, energySavingsFirstYear: 250, demandSavingsFirstYear: 0,
 *   maintenanceSavingsPerYear: 0, energyEscalationPerYear: 0, discountRatePerYear: 0.03, analysisYears: 10 })
 * //=> { firstYearSavings: 250, lifetimeSavings: 2500, presentValueOfSavings: 2132.55…, netPresentValue: 1132.55…,
 * //     savingsToInvestmentRatio: 2.1325…, simplePaybackYears: 4, returnOnInvestment: 1.5, … }
 */
export function analyseInvestment(inputs: InvestmentInputs): InvestmentResult {
  const netInvestment = checkMoney('netInvestment', inputs.netInvestment);
  const energy = checkMoney('energySavingsFirstYear', inputs.energySavingsFirstYear);
  const demand = checkMoney('demandSavingsFirstYear', inputs.demandSavingsFirstYear);
  const maintenance = checkMoney('maintenanceSavingsPerYear', inputs.maintenanceSavingsPerYear);
  const escalation = checkRange('energyEscalationPerYear', inputs.energyEscalationPerYear, -0.5, 0.5);
  const discountRate = checkRange('discountRatePerYear', inputs.discountRatePerYear, 0, 0.5);
  const years = checkInteger('analysisYears', inputs.analysisYears, 1, 40);

  const escalating = energy + demand;
  const firstYearSavings = escalating + maintenance;
  const outlay = 0 - netInvestment; // `0 - x` rather than `-x`: never produces −0

  const flows: number[] = [outlay];
  const cashFlows: CashFlowYear[] = [
    { year: 0, savings: 0, netCashFlow: outlay, cumulative: outlay, discountedNetCashFlow: outlay, cumulativeDiscounted: outlay },
  ];
  let lifetimeSavings = 0;
  let presentValueOfSavings = 0;
  let cumulative = outlay;
  let cumulativeDiscounted = outlay;
  let discountedPaybackYears: number | null = netInvestment <= 0 ? 0 : null;

  for (let year = 1; year <= years; year++) {
    const savings = escalating * Math.pow(1 + escalation, year - 1) + maintenance;
    const discounted = savings / Math.pow(1 + discountRate, year);
    if (discountedPaybackYears === null && presentValueOfSavings + discounted >= netInvestment && discounted > 0) {
      discountedPaybackYears = year - 1 + (netInvestment - presentValueOfSavings) / discounted;
    }
    lifetimeSavings += savings;
    presentValueOfSavings += discounted;
    cumulative += savings;
    cumulativeDiscounted += discounted;
    flows.push(savings);
    cashFlows.push({
      year,
      savings,
      netCashFlow: savings,
      cumulative,
      discountedNetCashFlow: discounted,
      cumulativeDiscounted,
    });
  }

  const savingsToInvestmentRatio = netInvestment > 0 ? finiteOrNull(presentValueOfSavings / netInvestment) : null;
  const adjustedInternalRateOfReturn =
    savingsToInvestmentRatio !== null && savingsToInvestmentRatio > 0
      ? finiteOrNull((1 + discountRate) * Math.pow(savingsToInvestmentRatio, 1 / years) - 1)
      : null;
  const returnOnInvestment = netInvestment > 0 ? finiteOrNull((lifetimeSavings - netInvestment) / netInvestment) : null;

  return {
    firstYearSavings,
    lifetimeSavings,
    presentValueOfSavings,
    netPresentValue: presentValueOfSavings - netInvestment,
    savingsToInvestmentRatio,
    adjustedInternalRateOfReturn,
    internalRateOfReturn: irrUnchecked(flows),
    simplePaybackYears: simplePaybackUnchecked(netInvestment, firstYearSavings),
    discountedPaybackYears,
    returnOnInvestment,
    cashFlows,
  };
}
