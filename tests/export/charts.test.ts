import { describe, expect, it } from 'vitest';
import { analyseInvestment } from '../../src/calc/economics.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { breakEvenYears, kwhChartRows, maxChartRooms, niceStep } from '../../src/export/charts.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { syntheticSurvey } from '../../bench/synthetic.ts';

describe('chart helpers', () => {
  it('finds the zero crossing of the cumulative cash flow', () => {
    // With level savings and no escalation the cumulative line crosses zero exactly at the
    // simple payback, net investment / first-year savings (NIST Handbook 135 simple payback definition).
    const flat = analyseInvestment({
      netInvestment: 1000,
      energySavingsFirstYear: 400,
      demandSavingsFirstYear: 0,
      maintenanceSavingsPerYear: 0,
      energyEscalationPerYear: 0,
      discountRatePerYear: 0.03,
      analysisYears: 10,
    });
    expect(breakEvenYears(flat.cashFlows)).toBeCloseTo(flat.simplePaybackYears!, 12);
    expect(breakEvenYears(flat.cashFlows)).toBeCloseTo(2.5, 12);
    expect(breakEvenYears([{ year: 0, cumulative: 5 }])).toBe(0);
    expect(breakEvenYears([{ year: 0, cumulative: -5 }, { year: 1, cumulative: -1 }])).toBeNull();
  });

  it('picks nice tick steps', () => {
    expect(niceStep(4200, 5)).toBe(1000);
    expect(niceStep(10692, 5)).toBe(2500);
    expect(niceStep(0, 5)).toBe(1);
  });

  it('charts every room of a small survey, and the largest rooms of a big one with the rest summed', () => {
    const small = calculateSurvey(demoSurvey());
    expect(kwhChartRows(small).rows.map((r) => r.label)).toEqual(small.rooms.map((r) => r.name));
    expect(kwhChartRows(small).others).toBeNull();
    const big = calculateSurvey(syntheticSurvey(300, 10, 3));
    const { rows, others } = kwhChartRows(big);
    expect(rows).toHaveLength(maxChartRooms);
    expect(others!.rooms).toBe(big.rooms.length - maxChartRooms);
    const total = rows.reduce((s, r) => s + r.existing, 0) + others!.existing;
    expect(total).toBeCloseTo(big.totals.existing.kwhPerYear, 6);
  });
});
