import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  analyseInvestment,
  escalatedUniformPresentValueFactor,
  internalRateOfReturn,
  netPresentValue,
  presentValue,
  simplePaybackYears,
  uniformPresentValueFactor,
} from '../../src/calc/economics.ts';
import type { InvestmentInputs, IrrResult } from '../../src/calc/economics.ts';

const runs = { numRuns: 300, seed: 135 };

/** Money amounts: the whole accepted range, everyday sizes, and awkward tiny values. */
const money = fc.oneof(
  fc.double({ min: -1e12, max: 1e12, noNaN: true }),
  fc.double({ min: -1e5, max: 1e5, noNaN: true }),
  fc.constantFrom(0, -0, 1e-300, -1e-300, Number.MIN_VALUE, 1e12, -1e12),
);

const inputs: fc.Arbitrary<InvestmentInputs> = fc.record({
  netInvestment: money,
  energySavingsFirstYear: money,
  demandSavingsFirstYear: money,
  maintenanceSavingsPerYear: money,
  energyEscalationPerYear: fc.double({ min: -0.5, max: 0.5, noNaN: true }),
  discountRatePerYear: fc.double({ min: 0, max: 0.5, noNaN: true }),
  analysisYears: fc.integer({ min: 1, max: 40 }),
});

/** Everyday-sized inputs, for properties that compare two results. */
const everydayInputs: fc.Arbitrary<InvestmentInputs> = fc.record({
  netInvestment: fc.double({ min: -1e5, max: 1e6, noNaN: true }),
  energySavingsFirstYear: fc.double({ min: -1e4, max: 1e5, noNaN: true }),
  demandSavingsFirstYear: fc.double({ min: 0, max: 1e4, noNaN: true }),
  maintenanceSavingsPerYear: fc.double({ min: -1e3, max: 1e4, noNaN: true }),
  energyEscalationPerYear: fc.double({ min: -0.5, max: 0.5, noNaN: true }),
  discountRatePerYear: fc.double({ min: 0, max: 0.5, noNaN: true }),
  analysisYears: fc.integer({ min: 1, max: 40 }),
});

const cashFlows = fc.array(
  fc.oneof(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: -1000, max: 1000 })),
  { minLength: 1, maxLength: 41 },
);

/** Every number reachable inside `value` (objects and arrays walked). */
function numbersIn(value: unknown): number[] {
  if (typeof value === 'number') return [value];
  if (Array.isArray(value)) return value.flatMap(numbersIn);
  if (value !== null && typeof value === 'object') return Object.values(value).flatMap(numbersIn);
  return [];
}

function rates(result: IrrResult): number[] {
  if (result.kind === 'unique') return [result.ratePerYear];
  if (result.kind === 'multiple') return result.ratesPerYear;
  return [];
}

function npvScale(rate: number, flows: readonly number[]): number {
  return flows.reduce((sum, amount, t) => sum + Math.abs(amount) / Math.pow(1 + rate, t), 0);
}

function signChanges(flows: readonly number[]): number {
  const signs = flows.filter((amount) => amount !== 0).map(Math.sign);
  return signs.slice(1).filter((sign, i) => sign !== signs[i]).length;
}

/** `null` payback read as "never" for ordering. */
function orderable(payback: number | null): number {
  return payback ?? Number.POSITIVE_INFINITY;
}

describe('economics properties (fast-check)', () => {
  it('never returns NaN or Infinity for any valid investment', () => {
    fc.assert(
      fc.property(inputs, (input) => {
        const result = analyseInvestment(input);
        const numbers = numbersIn(result);
        expect(numbers.length).toBeGreaterThan(10);
        for (const n of numbers) expect(Number.isFinite(n)).toBe(true);
        expect(result.cashFlows).toHaveLength(input.analysisYears + 1);
      }),
      runs,
    );
  });

  it('never returns NaN or Infinity from the factor and NPV functions over their whole domain', () => {
    const rate = fc.double({ min: -0.99, max: 10, noNaN: true });
    const years = fc.integer({ min: 0, max: 100 });
    fc.assert(
      fc.property(money, rate, rate, years, cashFlows, (amount, d, e, n, flows) => {
        expect(Number.isFinite(presentValue(amount, d, n))).toBe(true);
        expect(Number.isFinite(uniformPresentValueFactor(d, n))).toBe(true);
        expect(Number.isFinite(escalatedUniformPresentValueFactor(d, e, n))).toBe(true);
        expect(Number.isFinite(netPresentValue(d, flows))).toBe(true);
        expect(numbersIn(internalRateOfReturn(flows)).every(Number.isFinite)).toBe(true);
      }),
      runs,
    );
  });

  it('simple payback does not fall as the cost rises (null = never)', () => {
    fc.assert(
      fc.property(money, money, money, (costA, costB, savings) => {
        const low = Math.min(costA, costB);
        const high = Math.max(costA, costB);
        expect(orderable(simplePaybackYears(low, savings))).toBeLessThanOrEqual(orderable(simplePaybackYears(high, savings)));
      }),
      runs,
    );
  });

  it('simple and discounted payback of a whole investment do not fall as the cost rises', () => {
    fc.assert(
      fc.property(everydayInputs, fc.double({ min: 0, max: 1e6, noNaN: true }), (input, extra) => {
        const cheaper = analyseInvestment(input);
        const dearer = analyseInvestment({ ...input, netInvestment: input.netInvestment + extra });
        expect(orderable(cheaper.simplePaybackYears)).toBeLessThanOrEqual(orderable(dearer.simplePaybackYears));
        expect(orderable(cheaper.discountedPaybackYears)).toBeLessThanOrEqual(orderable(dearer.discountedPaybackYears));
      }),
      runs,
    );
  });

  it('NPV falls by exactly the extra investment', () => {
    fc.assert(
      fc.property(everydayInputs, fc.double({ min: 1, max: 1e6, noNaN: true }), (input, extra) => {
        const cheaper = analyseInvestment(input);
        const dearer = analyseInvestment({ ...input, netInvestment: input.netInvestment + extra });
        expect(dearer.netPresentValue).toBeLessThan(cheaper.netPresentValue);
        // NIST Handbook 135: NS = PV(savings) − PV(investment), investment at t = 0
        const drop = cheaper.netPresentValue - dearer.netPresentValue;
        expect(Math.abs(drop - extra)).toBeLessThanOrEqual(1e-9 * (Math.abs(cheaper.presentValueOfSavings) + Math.abs(input.netInvestment) + extra));
      }),
      runs,
    );
  });

  it('NPV is zero (relative to the flows) at every rate reported, and Descartes bounds their number', () => {
    fc.assert(
      fc.property(cashFlows, (flows) => {
        const result = internalRateOfReturn(flows);
        const found = rates(result);
        for (const r of found) {
          expect(r).toBeGreaterThanOrEqual(-0.99);
          expect(r).toBeLessThanOrEqual(10);
          expect(Math.abs(netPresentValue(r, flows))).toBeLessThanOrEqual(1e-8 * npvScale(r, flows));
        }
        // Descartes' rule of signs: no more rates than sign changes; 'multiple' only with two or more
        const changes = signChanges(flows);
        expect(found.length).toBeLessThanOrEqual(changes);
        if (result.kind === 'multiple') expect(found.length).toBeGreaterThanOrEqual(2);
        if (changes <= 1) expect(result.kind).not.toBe('multiple');
      }),
      runs,
    );
  });

  it('NPV is zero at the unique IRR of a whole investment', () => {
    fc.assert(
      fc.property(everydayInputs, (input) => {
        const result = analyseInvestment(input);
        const flows = result.cashFlows.map((row) => row.netCashFlow);
        for (const r of rates(result.internalRateOfReturn)) {
          expect(Math.abs(netPresentValue(r, flows))).toBeLessThanOrEqual(1e-8 * npvScale(r, flows));
        }
      }),
      runs,
    );
  });

  it('NS > 0, SIR > 1 and AIRR > d agree, as 10 CFR 436.18(c) treats them as equivalent tests', () => {
    fc.assert(
      fc.property(everydayInputs, (input) => {
        const result = analyseInvestment(input);
        if (input.netInvestment < 1 || result.savingsToInvestmentRatio === null) return;
        // skip knife-edge cases where rounding decides the sign
        if (Math.abs(result.netPresentValue) < 1e-6 * (Math.abs(result.presentValueOfSavings) + input.netInvestment)) return;
        const positive = result.netPresentValue > 0;
        expect(result.savingsToInvestmentRatio > 1).toBe(positive);
        if (result.adjustedInternalRateOfReturn !== null) {
          expect(result.adjustedInternalRateOfReturn > input.discountRatePerYear).toBe(positive);
        } else {
          expect(positive).toBe(false); // AIRR is only missing when SIR ≤ 0
        }
      }),
      runs,
    );
  });

  it('with constant positive savings, discounted payback is never shorter than simple payback', () => {
    fc.assert(
      fc.property(everydayInputs, (input) => {
        const flat = { ...input, energyEscalationPerYear: 0, energySavingsFirstYear: Math.abs(input.energySavingsFirstYear) + 1 };
        const result = analyseInvestment(flat);
        if (result.discountedPaybackYears === null || result.simplePaybackYears === null) return;
        // common practice, no published source: discounting only delays recovery
        expect(result.discountedPaybackYears).toBeGreaterThanOrEqual(result.simplePaybackYears - 1e-9);
      }),
      runs,
    );
  });
});
