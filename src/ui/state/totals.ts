/**
 * The headline figures of a survey as the overview writes them, keyed by the
 * test id of each figure (the browser test formats `lampwalk calc` output
 * with this and compares it with the screen).
 */
import type { SurveyResult } from '../../calc/survey.ts';
import type { Survey } from '../../survey/model.ts';
import type { UiFigures } from './format.ts';

/**
 * The overview's figures by test id.
 *
 * @example totalsText(survey, calculateSurvey(survey), uiFigures(survey))['total-kwh'] //=> '10,637 kWh/yr'
 */
export function totalsText(survey: Survey, result: SurveyResult, fig: UiFigures): Record<string, string> {
  const t = result.totals;
  return {
    'total-kwh': fig.kwhPerYear(t.savings.kwhPerYear),
    'total-kw': fig.kw(t.savings.peakKw),
    'total-money': `${fig.money(t.money.totalPerYear)}/yr`,
    'total-cost': fig.money(t.money.cost.net),
    'total-payback': fig.payback(t.money.simplePaybackYears),
    'total-npv': fig.money(result.economics.netPresentValue),
    'total-irr': fig.irr(result.economics.internalRateOfReturn),
    'total-co2': fig.co2PerYear(t.co2KgPerYear),
    'total-analysis-years': String(survey.money.analysisYears),
  };
}

