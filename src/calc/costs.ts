/**
 * Money for one fixture entry: what the swap costs to do, what the energy and
 * demand savings are worth, and what relamping it avoids.
 *
 * Project cost = (materials + labour + disposal) × (1 + markup) + tax − rebates,
 * with tax on materials (after markup) or on everything, per the survey. The
 * formula is linear in the entry, so entry costs add up to the survey total.
 */
import type { MoneyAssumptions } from '../survey/model.ts';

export interface ProjectCost {
  materials: number;
  labour: number;
  disposal: number;
  markup: number;
  tax: number;
  /** materials + labour + disposal + markup + tax */
  gross: number;
  rebates: number;
  /** gross − rebates */
  net: number;
}

export const zeroCost: ProjectCost = { materials: 0, labour: 0, disposal: 0, markup: 0, tax: 0, gross: 0, rebates: 0, net: 0 };

export interface CostInputs {
  materials: number;
  labour: number;
  disposal: number;
  rebates: number;
}

/**
 * Applies markup and tax to the raw cost parts.
 *
 * @example projectCost({ materials: 100, labour: 50, disposal: 10, rebates: 20 }, { markupFraction: 0.1, taxFraction: 0.05, taxBase: 'materials' })
 * //=> { materials: 100, labour: 50, disposal: 10, markup: 16, tax: 5.5, gross: 181.5, rebates: 20, net: 161.5 }
 */
export function projectCost(
  parts: CostInputs,
  money: Pick<MoneyAssumptions, 'markupFraction' | 'taxFraction' | 'taxBase'>,
): ProjectCost {
  const base = parts.materials + parts.labour + parts.disposal;
  const markup = base * money.markupFraction;
  const taxable = money.taxBase === 'materials' ? parts.materials * (1 + money.markupFraction) : base + markup;
  const tax = taxable * money.taxFraction;
  const gross = base + markup + tax;
  return {
    materials: parts.materials,
    labour: parts.labour,
    disposal: parts.disposal,
    markup,
    tax,
    gross,
    rebates: parts.rebates,
    net: gross - parts.rebates,
  };
}

/** Sums cost records field by field. */
export function addCosts(a: ProjectCost, b: ProjectCost): ProjectCost {
  return {
    materials: a.materials + b.materials,
    labour: a.labour + b.labour,
    disposal: a.disposal + b.disposal,
    markup: a.markup + b.markup,
    tax: a.tax + b.tax,
    gross: a.gross + b.gross,
    rebates: a.rebates + b.rebates,
    net: a.net + b.net,
  };
}

/**
 * Levelised yearly cost of replacing failed lamps: lamps × (hours / life) ×
 * (lamp price + labour for one relamp). A common practice for avoided
 * maintenance, with no published source; group relamping is not modelled.
 *
 * @example relampCostPerYear(40, 3000, 24000, 3, 10, 60) //=> 65
 */
export function relampCostPerYear(
  lamps: number,
  hoursPerYear: number,
  lifeHours: number,
  lampPrice: number,
  relampMinutes: number,
  labourRatePerHour: number,
): number {
  if (lifeHours <= 0 || lamps <= 0 || hoursPerYear <= 0) return 0;
  return lamps * (hoursPerYear / lifeHours) * (lampPrice + (relampMinutes / 60) * labourRatePerHour);
}

/**
 * Yearly cost of energy and demand savings in year 1.
 * Demand savings = peak kW reduction × demand charge × 12 months.
 *
 * @example energyCostSavings(2000, 0.5, 0.15, 12) //=> { energy: 300, demand: 72 }
 */
export function energyCostSavings(
  kwhSavedPerYear: number,
  peakKwSaved: number,
  energyRatePerKwh: number,
  demandChargePerKwMonth: number,
): { energy: number; demand: number } {
  return { energy: kwhSavedPerYear * energyRatePerKwh, demand: peakKwSaved * demandChargePerKwMonth * 12 };
}
