import { describe, expect, it } from 'vitest';
import { energyCostSavings, projectCost, relampCostPerYear } from '../../src/calc/costs.ts';

describe('project cost', () => {
  it('applies markup to all parts and tax to marked-up materials', () => {
    // common practice, no published source: cost-plus pricing with sales tax on materials
    const c = projectCost({ materials: 100, labour: 50, disposal: 10, rebates: 20 }, { markupFraction: 0.1, taxFraction: 0.05, taxBase: 'materials' });
    expect(c.markup).toBeCloseTo(16, 12);
    expect(c.tax).toBeCloseTo(5.5, 12); // 100 × 1.1 × 0.05
    expect(c.gross).toBeCloseTo(181.5, 12);
    expect(c.net).toBeCloseTo(161.5, 12);
  });

  it('can tax everything', () => {
    const c = projectCost({ materials: 100, labour: 50, disposal: 10, rebates: 0 }, { markupFraction: 0.1, taxFraction: 0.05, taxBase: 'everything' });
    expect(c.tax).toBeCloseTo(176 * 0.05, 12);
    expect(c.net).toBeCloseTo(176 * 1.05, 12);
  });

  it('is linear: two halves cost the same as the whole', () => {
    const money = { markupFraction: 0.2, taxFraction: 0.08, taxBase: 'materials' } as const;
    const whole = projectCost({ materials: 200, labour: 80, disposal: 12, rebates: 40 }, money);
    const half = projectCost({ materials: 100, labour: 40, disposal: 6, rebates: 20 }, money);
    expect(half.net * 2).toBeCloseTo(whole.net, 9);
  });
});

describe('avoided relamping', () => {
  it('levelises lamp replacements over the lamp life', () => {
    // 40 lamps × 3,000 h / 24,000 h = 5 lamps a year × (3 + 10/60 h × 60/h) = 5 × 13 = 65
    expect(relampCostPerYear(40, 3000, 24000, 3, 10, 60)).toBeCloseTo(65, 12);
    expect(relampCostPerYear(0, 3000, 24000, 3, 10, 60)).toBe(0);
  });
});

describe('energy and demand cost', () => {
  it('values kWh at the energy rate and peak kW at the demand charge for 12 months', () => {
    expect(energyCostSavings(2000, 0.5, 0.15, 12)).toEqual({ energy: 300, demand: 72 });
  });
});
