/**
 * The figures of a portfolio as its screen writes them, keyed by test id
 * (the browser test formats `calculatePortfolio` on an exported backup with
 * these and compares them with the screen). Pure: no DOM.
 */
import type { PortfolioResult, SiteSummary } from '../../calc/portfolio.ts';
import type { Severity } from '../../calc/warnings.ts';
import type { Survey } from '../../survey/model.ts';
import { uiFigures, type UiFigures } from './format.ts';

/**
 * Formatters for a portfolio: the user's locale and units, the sites' one currency.
 *
 * @example portfolioFigures('en-US', 'si', 'EUR').money(1200) //=> '€1,200'
 */
export function portfolioFigures(locale: string, units: Survey['units'], currency: string): UiFigures {
  return uiFigures({ locale, units, money: { currency } });
}

/**
 * "2 danger, 1 caution", or "none".
 *
 * @example warningText({ danger: 0, caution: 2, advice: 1 }) //=> '2 caution, 1 advice'
 */
export function warningText(counts: Readonly<Record<Severity, number>>): string {
  const parts = (['danger', 'caution', 'advice'] as const).filter((severity) => counts[severity] > 0).map((severity) => `${counts[severity]} ${severity}`);
  return parts.length > 0 ? parts.join(', ') : 'none';
}

/**
 * The roll-up figures by test id.
 *
 * @example portfolioTotalsText(calculatePortfolio(portfolio, surveys), fig)['pf-kwh'] //=> '48,210 kWh/yr'
 */
export function portfolioTotalsText(result: PortfolioResult, fig: UiFigures): Record<string, string> {
  const t = result.totals;
  const e = result.economics;
  return {
    'pf-sites': fig.number(result.sites.length),
    'pf-units': fig.number(result.units),
    'pf-fixtures': fig.number(t.fixtures),
    'pf-kwh': fig.kwhPerYear(t.savings.kwhPerYear),
    'pf-kw': fig.kw(t.savings.connectedKw),
    'pf-money': `${fig.money(e.firstYearSavings)}/yr`,
    'pf-cost': fig.money(e.netInvestment),
    'pf-payback': fig.payback(e.simplePaybackYears),
    'pf-npv': fig.money(e.netPresentValue),
    'pf-co2': fig.co2PerYear(t.co2KgPerYear),
    'pf-warnings': warningText(result.warningCounts),
  };
}

/** The columns of the site comparison, in order: test id suffix and heading. */
export const siteColumns = [
  { id: 'units', heading: 'Units' },
  { id: 'fixtures', heading: 'Fixtures' },
  { id: 'kwh', heading: 'Energy saved' },
  { id: 'kw', heading: 'Load removed' },
  { id: 'money', heading: 'Savings' },
  { id: 'cost', heading: 'Net cost' },
  { id: 'payback', heading: 'Payback' },
  { id: 'npv', heading: 'NPV' },
  { id: 'co2', heading: 'CO2 avoided' },
  { id: 'warnings', heading: 'Warnings' },
] as const;

export type SiteColumn = (typeof siteColumns)[number]['id'];

/**
 * One site's row of the comparison, by column.
 *
 * @example siteRowText(result.sites[0], fig).units //=> '12 (1 differs)'
 */
export function siteRowText(site: SiteSummary, fig: UiFigures): Record<SiteColumn, string> {
  return {
    units: site.differingUnits > 0 ? `${fig.number(site.units)} (${fig.number(site.differingUnits)} ${site.differingUnits === 1 ? 'differs' : 'differ'})` : fig.number(site.units),
    fixtures: fig.number(site.fixtures),
    kwh: fig.kwhPerYear(site.kwhSavedPerYear),
    kw: fig.kw(site.kwSaved),
    money: `${fig.money(site.firstYearSavings)}/yr`,
    cost: fig.money(site.netCost),
    payback: fig.payback(site.simplePaybackYears),
    npv: `${fig.money(site.netPresentValue)} (${fig.number(site.analysisYears)} yr)`,
    co2: fig.co2PerYear(site.co2AvoidedKgPerYear),
    warnings: warningText(site.warningCounts),
  };
}
